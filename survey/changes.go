package survey

import (
	"slices"
	"time"

	"github.com/lossline/lossline/survey/wallloss"
)

// ChangeKind is what changed at a CML since its previous visit (our own names).
type ChangeKind int

// Change kinds.
const (
	ChangeNewCML          ChangeKind = iota + 1 // first measured at this visit
	ChangeNotRemeasured                         // not measured at this visit
	ChangeCrossedRequired                       // above required before, at or below now
	ChangeAccelerating                          // latest interval's rate well above the long-term rate
	ChangeShorterWindow                         // moved into a more urgent repair window
	ChangeLongerWindow                          // moved into a less urgent repair window
	ChangeGainedFlag                            // a flag the previous result did not carry
	ChangeLostFlag                              // a flag the previous result carried
	ChangeOutOfScope                            // outside the scope of this visit (front matter scope:)
)

// ChangeCode is one change at a CML; Flag is set for gained and lost flags.
type ChangeCode struct {
	Kind ChangeKind
	Flag wallloss.Flag
}

var changeCodes = map[ChangeKind]string{
	ChangeNewCML: "new-cml", ChangeNotRemeasured: "not-remeasured", ChangeCrossedRequired: "crossed-required",
	ChangeAccelerating: "accelerating", ChangeShorterWindow: "shorter-window", ChangeLongerWindow: "longer-window",
	ChangeGainedFlag: "gained-flag:", ChangeLostFlag: "lost-flag:", ChangeOutOfScope: "out-of-scope",
}

var changeWords = map[ChangeKind]string{
	ChangeNewCML: "new CML, first measured at this visit", ChangeNotRemeasured: "not measured at this visit",
	ChangeCrossedRequired: "CROSSED THE REQUIRED THICKNESS", ChangeAccelerating: "ACCELERATING",
	ChangeShorterWindow: "moved into a shorter repair window", ChangeLongerWindow: "moved into a longer repair window",
	ChangeGainedFlag: "now flagged ", ChangeLostFlag: "no longer flagged ", ChangeOutOfScope: "out of scope at this visit",
}

// String is the stable code results.json writes ("gained-flag:" and
// "lost-flag:" are followed by the flag).
func (c ChangeCode) String() string { return changeCodes[c.Kind] + string(c.Flag) }

// Describe says the change in words.
func (c ChangeCode) Describe() string { return changeWords[c.Kind] + string(c.Flag) }

// Serious reports whether the change calls for attention before anything else.
func (c ChangeCode) Serious() bool {
	return c.Kind == ChangeCrossedRequired || c.Kind == ChangeAccelerating
}

// Has reports whether codes hold a change of kind k.
func Has(codes []ChangeCode, k ChangeKind) bool {
	for _, c := range codes {
		if c.Kind == k {
			return true
		}
	}
	return false
}

// IntervalRate is the metal-loss rate between two consecutive visits
// (negative where the later reading is thicker).
type IntervalRate struct {
	Start, End time.Time
	RateMMPerY float64
}

// Change is what a CML's latest visit changed.
type Change struct {
	Item      *Assessed
	Intervals []IntervalRate
	// Previous is the CML as it was assessed at its previous visit, with the
	// same design data and settings; nil for a CML with one visit.
	Previous      *wallloss.Result
	Codes         []ChangeCode
	WindowBefore  wallloss.Window
	PhotosBefore  []*Photo // from the newest earlier survey that has photos of the CML
	PhotosCurrent []*Photo
}

// flagsThatFollowVisits change with the number of visits alone, so gaining or
// losing them says nothing about the wall.
var flagsThatFollowVisits = []wallloss.Flag{wallloss.FlagSingleVisit, wallloss.FlagEstimate, wallloss.FlagNominalBased, wallloss.FlagNoRate,
	wallloss.FlagFitNeedsThree, wallloss.FlagNotMeasuredLatest, wallloss.FlagOutOfScope}

// Changes compares each CML's latest visit with the one before, in rank order;
// the photos of each CML come from photos.
// A CML is accelerating when its latest interval's rate exceeds its long-term
// rate by more than accelerationPct percent.
func Changes(s *Survey, items []*Assessed, photos *PhotoIndex, p wallloss.Policy, accelerationPct float64) []Change {
	out := make([]Change, 0, len(items))
	for _, it := range items {
		c := Change{Item: it, WindowBefore: wallloss.WindowUnknown}
		visits := it.CML.Visits
		c.Intervals = intervalRates(it.Component, it.CML)
		r := it.Result
		switch {
		case len(visits) == 0:
		case r.HasFlag(wallloss.FlagOutOfScope):
			c.Codes = append(c.Codes, ChangeCode{Kind: ChangeOutOfScope})
		case r.HasFlag(wallloss.FlagNotMeasuredLatest):
			c.Codes = append(c.Codes, ChangeCode{Kind: ChangeNotRemeasured})
		case len(visits) == 1:
			c.Codes = append(c.Codes, ChangeCode{Kind: ChangeNewCML})
		}
		if len(visits) >= 2 && !r.FromEarlierVisit() {
			loc := Located{Asset: it.Asset, Component: it.Component, CML: it.CML}
			prevVisits := visits[:len(visits)-1]
			prev := wallloss.Assess(inputFor(loc, prevVisits, prevVisits[len(prevVisits)-1].Date.Time), p)
			c.Previous = &prev
			c.WindowBefore = wallloss.WindowOf(prev)
			c.Codes = append(c.Codes, compare(prev, r, c.Intervals, accelerationPct)...)
		}
		c.PhotosCurrent = photos.OfCML(it.CML)
		if s.History != nil {
			c.PhotosBefore = s.History.PreviousPhotos[it.CML]
		}
		out = append(out, c)
	}
	return out
}

// compare lists what differs between the previous and the current result.
func compare(prev, cur wallloss.Result, intervals []IntervalRate, accelerationPct float64) []ChangeCode {
	var codes []ChangeCode
	if prev.Class != wallloss.AtOrBelowRequired && cur.Class == wallloss.AtOrBelowRequired {
		codes = append(codes, ChangeCode{Kind: ChangeCrossedRequired})
	}
	if len(intervals) >= 2 && cur.RateLongMMPerY != nil && *cur.RateLongMMPerY > 0 &&
		intervals[len(intervals)-1].RateMMPerY > *cur.RateLongMMPerY*(1+accelerationPct/100) {
		codes = append(codes, ChangeCode{Kind: ChangeAccelerating})
	}
	wb, wa := wallloss.WindowOf(prev), wallloss.WindowOf(cur)
	if wb != wallloss.WindowUnknown && wa != wallloss.WindowUnknown && wb != wa {
		if wa < wb {
			codes = append(codes, ChangeCode{Kind: ChangeShorterWindow})
		} else {
			codes = append(codes, ChangeCode{Kind: ChangeLongerWindow})
		}
	}
	for _, f := range cur.Flags {
		if !prev.HasFlag(f) && !slices.Contains(flagsThatFollowVisits, f) {
			codes = append(codes, ChangeCode{Kind: ChangeGainedFlag, Flag: f})
		}
	}
	for _, f := range prev.Flags {
		if !cur.HasFlag(f) && !slices.Contains(flagsThatFollowVisits, f) {
			codes = append(codes, ChangeCode{Kind: ChangeLostFlag, Flag: f})
		}
	}
	return codes
}
