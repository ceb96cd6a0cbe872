package survey

import (
	"fmt"
	"slices"
	"strings"
	"time"

	"github.com/lossline/lossline/survey/wallloss"
)

// RepairEvent is a repair or replacement done on a component between visits,
// written `repaired: DATE; new THICKNESS; at CML CML; what was done`. Readings
// dated before it are kept and shown but no longer used for rates: the new
// thickness counts as a reading on its date and is the new baseline.
type RepairEvent struct {
	Date  VisitDate
	NewMM *float64 // thickness after the repair; nil when not written
	CMLs  []string // the CMLs repaired; empty for the whole component
	What  string   // what was done, as written
	Line  int
}

// Covers reports whether the repair applies to CML m.
func (e RepairEvent) Covers(m *CML) bool {
	if len(e.CMLs) == 0 {
		return true
	}
	return slices.ContainsFunc(e.CMLs, func(id string) bool { return id == m.ID || slices.Contains(m.Was, id) })
}

// readRepairKey reads `repaired: DATE; new THICKNESS; at CML …; what was done`
// (every part but the date optional, in any order after it).
func readRepairKey(d *Design, value string, units Unit) error {
	parts := strings.Split(value, ";")
	date, ok := ParseVisitDate(strings.TrimSpace(parts[0]))
	if !ok {
		return fmt.Errorf("repaired: %q is not a date such as 2024-05-10: write `repaired: DATE; new THICKNESS; at CML; what was done`", strings.TrimSpace(parts[0]))
	}
	e := RepairEvent{Date: date, Line: d.Lines["repaired"]}
	var what []string
	for _, p := range parts[1:] {
		p = strings.TrimSpace(p)
		low := strings.ToLower(p)
		switch {
		case strings.HasPrefix(low, "new "):
			v, err := ParseThickness(strings.TrimSpace(p[4:]), units)
			if err != nil {
				return thicknessError("repaired: new", strings.TrimSpace(p[4:]), err, "")
			}
			e.NewMM = &v
		case strings.HasPrefix(low, "at "):
			e.CMLs = append(e.CMLs, strings.FieldsFunc(p[3:], func(r rune) bool { return r == ' ' || r == ',' })...)
		case p != "":
			what = append(what, p)
		}
	}
	e.What = strings.Join(what, "; ")
	if slices.ContainsFunc(d.Repairs, func(x RepairEvent) bool { return x.Date.Time.Equal(e.Date.Time) && slices.Equal(x.CMLs, e.CMLs) }) {
		return fmt.Errorf("repaired: a repair on %s is already written", e.Date)
	}
	d.Repairs = append(d.Repairs, e)
	slices.SortStableFunc(d.Repairs, func(a, b RepairEvent) int { return a.Date.Time.Compare(b.Date.Time) })
	return nil
}

// readInstrumentKey reads `instrument: SERIAL`; the serial is checked against
// the front matter's list once the checklist is read.
func readInstrumentKey(d *Design, value string, _ Unit) error {
	d.Instrument = strings.TrimSpace(value)
	if d.Instrument == "" {
		return fmt.Errorf("instrument: give the serial of a gauge of the instruments list")
	}
	return nil
}

// checkRepairs checks that each repair names CMLs of its component, is dated
// no later than the survey and not before the component was installed, and
// that its new thickness is near the nominal (the plausibility rule's ratio).
func (r *checklistReader) checkRepairs() {
	for _, a := range r.survey.Assets {
		for _, c := range a.Components {
			for _, e := range c.Design.Repairs {
				if !r.survey.Date.IsZero() && e.Date.Time.After(r.survey.Date) {
					r.problems.Errorf(r.file, e.Line, "repaired: %s is after the survey date %s", e.Date, r.survey.Date.Format(time.DateOnly))
				}
				if in := c.Design.Installed; in != nil && e.Date.Time.Before(in.Time) {
					r.problems.Errorf(r.file, e.Line, "repaired: %s is before the component was installed (%s): check the year", e.Date, in)
				}
				if n := c.Design.NominalMM; n != nil && e.NewMM != nil && *n > 0 &&
					(*e.NewMM > *n*slipFarRatio || *e.NewMM < *n/slipFarRatio) {
					r.problems.Errorf(r.file, e.Line, "repaired: new %g mm is not within a third to %g times the nominal %g mm: a unit or decimal slip? Write the thickness after the repair in the checklist's unit", *e.NewMM, slipFarRatio, *n)
				}
				for _, id := range e.CMLs {
					if !slices.ContainsFunc(c.CMLs, func(m *CML) bool { return m.ID == id }) {
						r.problems.Errorf(r.file, e.Line, "repaired: CML %s is not a CML of %q", id, c.Name)
					}
				}
			}
		}
	}
}

// RepairOf is the latest repair of the component that covers the CML and is
// dated on or before latest; nil when there is none.
func RepairOf(c *Component, m *CML, latest time.Time) *RepairEvent {
	var out *RepairEvent
	if c == nil {
		return nil
	}
	for i, e := range c.Design.Repairs {
		if !e.Date.Time.After(latest) && e.Covers(m) {
			out = &c.Design.Repairs[i]
		}
	}
	return out
}

// afterRepair drops the readings dated before the repair and adds the
// thickness after it as a reading on the repair date (unless a reading was
// taken that day, which then counts as the one after the repair).
func afterRepair(rs []wallloss.Reading, e *RepairEvent) []wallloss.Reading {
	out := make([]wallloss.Reading, 0, len(rs)+1)
	for _, x := range rs {
		if !x.Date.Before(e.Date.Time) {
			out = append(out, x)
		}
	}
	if e.NewMM != nil && (len(out) == 0 || !out[0].Date.Equal(e.Date.Time)) {
		out = slices.Insert(out, 0, wallloss.Reading{Date: e.Date.Time, ThicknessMM: *e.NewMM})
	}
	return out
}

// UsedReadings counts a CML's readings left out of its rates by a repair, as
// of the given latest visit date.
func UsedReadings(c *Component, m *CML, latest time.Time) (leftOut int, repair *RepairEvent) {
	repair = RepairOf(c, m, latest)
	if repair == nil {
		return 0, nil
	}
	for _, v := range m.Visits {
		if v.Date.Time.Before(repair.Date.Time) {
			leftOut++
		}
	}
	return leftOut, repair
}

// RateReadings are a CML's governing readings, oldest first, that its rates
// rest on: those from its latest repair on, when one is recorded. c may be
// nil (no repairs).
func RateReadings(c *Component, m *CML) []wallloss.Reading {
	rs := make([]wallloss.Reading, len(m.Visits))
	for i, v := range m.Visits {
		rs[i] = wallloss.Reading{Date: v.Date.Time, ThicknessMM: v.Governing()}
	}
	if len(rs) == 0 {
		return rs
	}
	// Repairs are dated no later than the survey: the latest of them counts,
	// even when the CML was not read after it.
	if e := RepairOf(c, m, time.Date(9999, 1, 1, 0, 0, 0, 0, time.UTC)); e != nil {
		rs = afterRepair(rs, e)
	}
	return rs
}

// intervalRates are the metal-loss rates between consecutive readings of a
// CML's rate readings (from its latest repair on, the repair's thickness
// included); nil with fewer than two.
func intervalRates(c *Component, m *CML) []IntervalRate {
	if len(m.Visits) < 2 && (c == nil || len(c.Design.Repairs) == 0) {
		return nil
	}
	rs := RateReadings(c, m)
	if len(rs) < 2 {
		return nil
	}
	out := make([]IntervalRate, 0, len(rs)-1)
	for i := 1; i < len(rs); i++ {
		a, b := rs[i-1], rs[i]
		out = append(out, IntervalRate{Start: a.Date, End: b.Date, RateMMPerY: (a.ThicknessMM - b.ThicknessMM) / wallloss.YearsBetween(a.Date, b.Date)})
	}
	return out
}

// repairBeforeReadings warns at a repair dated before every reading of the
// CMLs it covers, once the earlier surveys are merged: its new thickness then
// becomes the first point of their rates, which a slip in the year makes
// wrong without a sign.
func repairBeforeReadings(s *Survey) ProblemList {
	var problems ProblemList
	for _, a := range s.Assets {
		for _, c := range a.Components {
			for _, e := range c.Design.Repairs {
				var first *VisitDate
				var at string
				for _, m := range c.CMLs {
					if !e.Covers(m) || len(m.Visits) == 0 {
						continue
					}
					if d := m.Visits[0].Date; first == nil || d.Time.Before(first.Time) {
						first, at = &d, m.ID
					}
				}
				if first != nil && e.Date.Time.Before(first.Time) {
					problems.Warnf(c.File, e.Line, "repaired: %s is before the first reading of %s (%s): the repair's thickness becomes the start of the CML's rates; check the year", e.Date, at, first)
				}
			}
		}
	}
	return problems
}
