package report

import (
	"fmt"
	"math"
	"time"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// Results is the content of results.json: the contract other tools read.
// Thicknesses are in mm, rates in mm/y, lives in years, whatever the survey's
// display units; null where a value cannot be computed.
type Results struct {
	Survey        SurveyInfo     `json:"survey"`
	Items         []Item         `json:"items"`
	Dropped       []Dropped      `json:"dropped"`
	DesignChanges []DesignChange `json:"design_changes"`
	Photos        []PhotoInfo    `json:"photos"`
	Skipped       []SkippedInfo  `json:"skipped_files"`
	Warnings      []Warning      `json:"warnings"`
	Actions       []ActionInfo   `json:"actions"` // the register of actions, by due date
	// Electro holds coupons, probes, CP test points, anodes and coatings
	// (electro_results.go); CPFailing the test points failing at their latest visit.
	Electro     []ElectroComponent `json:"electro"`
	CPFailing   []FailingPointJS   `json:"cp_failing_points"`
	Grids       []GridResult       `json:"grids"`        // grids of readings (results_local.go)
	LocalDamage []LocalResult      `json:"local_damage"` // local-damage assessments per component
}

// PhotoInfo is one photo: when and where it was taken and where it was placed.
type PhotoInfo struct {
	File        string   `json:"file"`
	Taken       *string  `json:"taken"`
	Latitude    *float64 `json:"latitude"`
	Longitude   *float64 `json:"longitude"`
	Orientation int      `json:"orientation"`
	Asset       string   `json:"asset"`
	Component   string   `json:"component"`
	CML         string   `json:"cml"`
	DistanceM   *float64 `json:"distance_m"`
	Basis       string   `json:"basis"`
}

// SkippedInfo is a file of the photos folder that was not used.
type SkippedInfo struct {
	File   string `json:"file"`
	Reason string `json:"reason"`
}

// Interval is the metal-loss rate between two consecutive visits.
type Interval struct {
	Start      string  `json:"start"`
	End        string  `json:"end"`
	RateMMPerY float64 `json:"rate_mm_per_y"`
}

// Dropped is a CML of an earlier survey that this one no longer lists.
type Dropped struct {
	CML         string  `json:"cml"`
	Asset       string  `json:"asset"`
	Component   string  `json:"component"`
	LastDate    string  `json:"last_date"`
	ThicknessMM float64 `json:"thickness_mm"`
	File        string  `json:"file"`
	Line        int     `json:"line"`
}

// DesignChange is a nominal or required thickness that changed between surveys.
type DesignChange struct {
	Asset     string  `json:"asset"`
	Component string  `json:"component"`
	Field     string  `json:"field"`
	OldMM     float64 `json:"old_mm"`
	NewMM     float64 `json:"new_mm"`
	OldFile   string  `json:"old_file"`
	OldLine   int     `json:"old_line"`
}

// SurveyInfo is the checklist's front matter.
type SurveyInfo struct {
	Title     string `json:"title"`
	Site      string `json:"site"`
	Date      string `json:"date"`
	Inspector string `json:"inspector"`
	Units     string `json:"units"`
}

// Item is one CML, in rank order.
type Item struct {
	Rank              int        `json:"rank"`
	Asset             string     `json:"asset"`
	Component         string     `json:"component"`
	CML               string     `json:"cml"`
	Location          string     `json:"location"`
	ThicknessDate     *string    `json:"thickness_date"`
	ThicknessMM       *float64   `json:"thickness_mm"`
	RequiredMM        *float64   `json:"required_mm"`
	NominalMM         *float64   `json:"nominal_mm"`
	RateLongMMPerY    *float64   `json:"rate_long_mm_per_y"`
	RateShortMMPerY   *float64   `json:"rate_short_mm_per_y"`
	RateMMPerY        *float64   `json:"rate_mm_per_y"`
	RateModel         string     `json:"rate_model"`
	RemainingLifeY    *float64   `json:"remaining_life_y"`
	RemainingLifeLowY *float64   `json:"remaining_life_low_y"`
	RetirementDate    *string    `json:"retirement_date"`
	NextInspection    *string    `json:"next_inspection"`
	NextInspectionWhy *string    `json:"next_inspection_basis"`
	NextExternal      *string    `json:"next_external_inspection"`
	IntervalRule      string     `json:"interval_rule"`
	RequiredMethod    string     `json:"required_method"`
	Estimate          bool       `json:"estimate"`
	Consequence       *string    `json:"consequence"`
	Likelihood        string     `json:"likelihood"`
	RiskScore         int        `json:"risk_score"`
	RiskLevel         string     `json:"risk_level"`
	RepairWindow      string     `json:"repair_window"` // in words, as the report prints it
	Flags             []string   `json:"flags"`
	Photos            []string   `json:"photos"`
	Intervals         []Interval `json:"intervals"`
	Change            []string   `json:"change"`
	PreviousDate      *string    `json:"previous_date"`
	PreviousMM        *float64   `json:"previous_thickness_mm"`
	PreviousRate      *float64   `json:"previous_rate_mm_per_y"`
	Latitude          *float64   `json:"latitude"`
	Longitude         *float64   `json:"longitude"`
	// BreachModel says what the probabilities of breach rest on; Breach is
	// the probability of reaching the required thickness by the end of each
	// plan year (null without a probability: single-visit estimates, no
	// required thickness).
	BreachModel string       `json:"breach_model"`
	Breach      []BreachYear `json:"breach_probability"`
	// RateGoverning: which of wall, coupon and probe rate governs, and why
	// (electro_results.go); null without coupons or probes.
	RateGoverning *RateGoverning `json:"rate_governing"`
	// LocalDamageLifeY is the shortest life of the component's local-damage
	// assessments (0: limit reached); LocalDamage their results in one line.
	LocalDamageLifeY *float64 `json:"local_damage_life_y"`
	LocalDamage      string   `json:"local_damage"`
}

// BreachYear is the probability of reaching the required thickness by a date.
type BreachYear struct {
	By          string  `json:"by"`
	Probability float64 `json:"probability"`
}

// Warning is a problem that did not stop the report.
type Warning struct {
	File    string `json:"file"`
	Line    int    `json:"line"`
	Message string `json:"message"`
}

// BuildResults assembles the results of an assessed survey. warnings are the
// reader's warnings plus any raised while rendering.
func BuildResults(f *findings.Findings, warnings survey.ProblemList) Results {
	r := resultsFrame(f, warnings)
	r.Items = make([]Item, len(f.Items))
	for i, it := range f.Items {
		r.Items[i] = buildItem(f, i, it)
	}
	return r
}

// resultsFrame is everything of the results but the items (left empty), which
// WriteJSON streams one by one.
func resultsFrame(f *findings.Findings, warnings survey.ProblemList) Results {
	s := f.Survey
	r := Results{
		Survey: SurveyInfo{Title: s.Title, Site: s.Site, Date: s.Date.Format(dateLayout), Inspector: s.Inspector, Units: string(s.Units)},
		Items:  []Item{}, Dropped: []Dropped{}, DesignChanges: []DesignChange{}, Warnings: []Warning{},
		Photos: []PhotoInfo{}, Skipped: []SkippedInfo{}, Actions: actionsOf(f),
	}
	for _, ph := range s.Photos {
		pl := ph.Placement
		info := PhotoInfo{File: ph.Name, Orientation: ph.Orientation, Asset: pl.Asset, Component: pl.Component, CML: pl.CML,
			DistanceM: round(pl.DistanceM, 1), Basis: pl.Basis}
		if ph.Taken != nil {
			t := ph.Taken.Format("2006-01-02T15:04:05")
			info.Taken = &t
		}
		if ph.GPS != nil {
			info.Latitude, info.Longitude = &ph.GPS.Lat, &ph.GPS.Lon
		}
		r.Photos = append(r.Photos, info)
	}
	for _, sk := range s.Skipped {
		r.Skipped = append(r.Skipped, SkippedInfo{File: sk.Name, Reason: sk.Reason})
	}
	if h := s.History; h != nil {
		for _, d := range h.Dropped {
			r.Dropped = append(r.Dropped, Dropped{CML: d.ID, Asset: d.Asset, Component: d.Component, LastDate: d.Last.Date.String(),
				ThicknessMM: *round(ptrTo(d.Last.Governing()), 4), File: d.Last.File, Line: d.Last.Line})
		}
		for _, c := range h.DesignChanges {
			r.DesignChanges = append(r.DesignChanges, DesignChange{Asset: c.Asset, Component: c.Component, Field: c.Field,
				OldMM: *round(&c.OldMM, 4), NewMM: *round(&c.NewMM, 4), OldFile: c.OldFile, OldLine: c.OldLine})
		}
	}
	for _, w := range warnings {
		r.Warnings = append(r.Warnings, Warning{File: w.File, Line: w.Line, Message: w.Message})
	}
	r.Electro, r.CPFailing = electroResults(f)
	r.Grids, r.LocalDamage = localResults(s)
	return r
}

// buildItem is the result of the i-th CML of the ranking.
func buildItem(f *findings.Findings, i int, it *survey.Assessed) Item {
	res, d := it.Result, it.Component.Design
	item := Item{
		Rank: it.Rank, Asset: it.Asset.Name, Component: it.Component.Name, CML: it.CML.ID, Location: it.CML.Location,
		ThicknessDate:     dateOf(res.CurrentDate),
		ThicknessMM:       round(res.ThicknessMM, 4),
		RequiredMM:        round(d.RequiredMM, 4),
		NominalMM:         round(d.NominalMM, 4),
		RateLongMMPerY:    round(res.RateLongMMPerY, 6),
		RateShortMMPerY:   round(res.RateShortMMPerY, 6),
		RateMMPerY:        round(res.RateMMPerY, 6),
		RateModel:         string(res.RateModel),
		RemainingLifeY:    round(res.RemainingLifeY, 3),
		RemainingLifeLowY: round(res.RemainingLifeLowY, 3),
		NextExternal:      dateOf(res.NextExternal),
		IntervalRule:      res.Rule.Code(),
		RequiredMethod:    requiredMethod(d),
		Estimate:          res.HasFlag(wallloss.FlagEstimate),
		RetirementDate:    dateOf(res.Retirement),
		NextInspection:    dateOf(res.NextInspection),
		Flags:             codes(res.Flags),
		Photos:            photoNames(f.Photos.OfCML(it.CML)),
	}
	if b := res.NextBasis.String(); b != "" {
		item.NextInspectionWhy = &b
	}
	item.RateGoverning = rateGoverning(res)
	item.RepairWindow = repairWindow(it.Result)
	item.LocalDamageLifeY, item.LocalDamage = localOfItem(it.Component)
	if c := d.Consequence.String(); c != "" {
		item.Consequence = &c
	}
	if g := it.CML.GPS; g != nil {
		item.Latitude, item.Longitude = &g.Lat, &g.Lon
	}
	risk := f.Risk(it)
	item.Likelihood, item.RiskScore, item.RiskLevel = risk.Likelihood.String(), risk.Score(), risk.Level()
	ch := f.Changes[i]
	item.Intervals, item.Change = []Interval{}, codes(ch.Codes)
	for _, iv := range ch.Intervals {
		item.Intervals = append(item.Intervals, Interval{Start: iv.Start.Format(dateLayout), End: iv.End.Format(dateLayout), RateMMPerY: *round(&iv.RateMMPerY, 6)})
	}
	if n := len(it.CML.Visits); n >= 2 {
		prev := it.CML.Visits[n-2]
		item.PreviousDate = dateOf(&prev.Date.Time)
		item.PreviousMM = round(ptrTo(prev.Governing()), 4)
		if ch.Previous != nil {
			item.PreviousRate = round(ch.Previous.RateMMPerY, 6)
		}
	}
	b := f.BreachOf(it)
	item.BreachModel = b.Model()
	if b.P != nil {
		item.Breach = make([]BreachYear, len(b.P))
		for j, p := range b.P {
			item.Breach[j] = BreachYear{By: b.By[j].Format(dateLayout), Probability: *round(&p, 6)}
		}
	}
	return item
}

const dateLayout = "2006-01-02"

// requiredMethod names where the required thickness came from.
func requiredMethod(d survey.Design) string {
	switch {
	case d.RequiredCalc != nil:
		return d.RequiredCalc.Method
	case d.RequiredMM != nil:
		return "as written"
	}
	return ""
}

// codes writes typed codes as their stable strings (never null).
func codes[T any](cs []T) []string {
	out := make([]string, len(cs))
	for i, c := range cs {
		out[i] = fmt.Sprint(c)
	}
	return out
}

func ptrTo(v float64) *float64 { return &v }

func dateOf(t *time.Time) *string {
	if t == nil {
		return nil
	}
	s := t.Format(dateLayout)
	return &s
}

// round keeps d decimals; results.json carries more digits than the report
// prints so a reader can recompute, but not float noise.
func round(v *float64, d int) *float64 {
	if v == nil {
		return nil
	}
	p := math.Pow(10, float64(d))
	x := math.Round(*v*p) / p
	return &x
}

// photoNames lists photos by their names under photos/ (never null).
func photoNames(photos []*survey.Photo) []string {
	out := make([]string, len(photos))
	for i, ph := range photos {
		out[i] = ph.Name
	}
	return out
}
