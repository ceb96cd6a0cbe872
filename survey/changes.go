package survey

import (
	"slices"
	"time"

	"github.com/lossline/lossline/survey/wallloss"
)

// Change codes: what changed at a CML since its previous visit (our own names).
const (
	ChangeNewCML          = "new-cml"          // first measured at this visit
	ChangeNotRemeasured   = "not-remeasured"   // not measured at this visit
	ChangeCrossedRequired = "crossed-required" // above required before, at or below now
	ChangeAccelerating    = "accelerating"     // latest interval's rate well above the long-term rate
	ChangeShorterWindow   = "shorter-window"   // moved into a more urgent repair window
	ChangeLongerWindow    = "longer-window"    // moved into a less urgent repair window
	ChangeGainedFlag      = "gained-flag:"     // followed by the flag
	ChangeLostFlag        = "lost-flag:"       // followed by the flag
)

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
	Codes         []string
	WindowBefore  wallloss.Window
	PhotosBefore  []*Photo // from the newest earlier survey that has photos of the CML
	PhotosCurrent []*Photo
}

// flagsThatFollowVisits change with the number of visits alone, so gaining or
// losing them says nothing about the wall.
var flagsThatFollowVisits = []string{wallloss.FlagSingleVisit, wallloss.FlagEstimate, wallloss.FlagNominalBased, wallloss.FlagNoRate,
	wallloss.FlagFitNeedsThree, wallloss.FlagNotMeasuredLatest}

// Changes compares each CML's latest visit with the one before, in rank order.
// A CML is accelerating when its latest interval's rate exceeds its long-term
// rate by more than accelerationPct percent.
func Changes(s *Survey, items []*Assessed, p wallloss.Policy, accelerationPct float64) []Change {
	photos := map[string]*Photo{}
	for _, ph := range s.Photos {
		photos[ph.Name] = ph
	}
	var out []Change
	for _, it := range items {
		c := Change{Item: it, WindowBefore: wallloss.WindowUnknown}
		visits := it.CML.Visits
		for i := 1; i < len(visits); i++ {
			a, b := visits[i-1], visits[i]
			c.Intervals = append(c.Intervals, IntervalRate{Start: a.Date.Time, End: b.Date.Time,
				RateMMPerY: (a.Governing() - b.Governing()) / wallloss.YearsBetween(a.Date.Time, b.Date.Time)})
		}
		r := it.Result
		switch {
		case len(visits) == 0:
		case r.HasFlag(wallloss.FlagNotMeasuredLatest):
			c.Codes = append(c.Codes, ChangeNotRemeasured)
		case len(visits) == 1:
			c.Codes = append(c.Codes, ChangeNewCML)
		}
		if len(visits) >= 2 && !r.HasFlag(wallloss.FlagNotMeasuredLatest) {
			loc := Located{Asset: it.Asset, Component: it.Component, CML: it.CML}
			prevVisits := visits[:len(visits)-1]
			prev := wallloss.Assess(inputFor(loc, prevVisits, prevVisits[len(prevVisits)-1].Date.Time), p)
			c.Previous = &prev
			c.WindowBefore = wallloss.WindowOf(prev)
			c.Codes = append(c.Codes, compare(prev, r, c.Intervals, accelerationPct)...)
		}
		for _, ref := range it.CML.PhotoRefs {
			if ph := photos[ref]; ph != nil {
				c.PhotosCurrent = append(c.PhotosCurrent, ph)
			}
		}
		if s.History != nil {
			c.PhotosBefore = s.History.PreviousPhotos[it.CML]
		}
		out = append(out, c)
	}
	return out
}

// compare lists what differs between the previous and the current result.
func compare(prev, cur wallloss.Result, intervals []IntervalRate, accelerationPct float64) []string {
	var codes []string
	if prev.Class != wallloss.AtOrBelowRequired && cur.Class == wallloss.AtOrBelowRequired {
		codes = append(codes, ChangeCrossedRequired)
	}
	if len(intervals) >= 2 && cur.RateLongMMPerY != nil && *cur.RateLongMMPerY > 0 &&
		intervals[len(intervals)-1].RateMMPerY > *cur.RateLongMMPerY*(1+accelerationPct/100) {
		codes = append(codes, ChangeAccelerating)
	}
	wb, wa := wallloss.WindowOf(prev), wallloss.WindowOf(cur)
	if wb != wallloss.WindowUnknown && wa != wallloss.WindowUnknown && wb != wa {
		if wa < wb {
			codes = append(codes, ChangeShorterWindow)
		} else {
			codes = append(codes, ChangeLongerWindow)
		}
	}
	for _, f := range cur.Flags {
		if !prev.HasFlag(f) && !slices.Contains(flagsThatFollowVisits, f) {
			codes = append(codes, ChangeGainedFlag+f)
		}
	}
	for _, f := range prev.Flags {
		if !cur.HasFlag(f) && !slices.Contains(flagsThatFollowVisits, f) {
			codes = append(codes, ChangeLostFlag+f)
		}
	}
	return codes
}
