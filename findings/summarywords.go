package findings

import (
	"fmt"
	"slices"
	"strings"
	"time"

	"github.com/lossline/lossline/actions"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// WordUnits formats values for the summary in words, each with its unit
// ("3.62 mm", "0.296 mm/y"), in the report's display units.
type WordUnits struct {
	Thickness func(mm float64) string
	Rate      func(mmPerY float64) string
}

// SummaryWords is the summary in words: generated sentences, each group in
// the order an owner reads them. Every number in a sentence is one of the
// findings' own, with its unit.
type SummaryWords struct {
	Urgent  []string // what needs action first, and why
	Due     []string // what is due when: next inspections, repair windows
	NotDone []string // scope items not done, CMLs not measured at this visit
	Changed []string // what changed since the previous visit
}

// Sentences are all the groups in reading order.
func (w SummaryWords) Sentences() []string {
	return slices.Concat(w.Urgent, w.Due, w.NotDone, w.Changed)
}

// namesShown is how many CMLs a sentence names before it counts the rest.
const namesShown = 4

// Summarize writes the summary in words from the findings. It reads no clock:
// "now" is the survey's date.
func (f *Findings) Summarize(u WordUnits) SummaryWords {
	var w SummaryWords
	w.Urgent = f.urgentWords(u)
	w.Due = f.dueWords()
	w.NotDone = f.notDoneWords()
	w.Changed = f.changedWords(u)
	return w
}

func (f *Findings) urgentWords(u WordUnits) []string {
	var out []string
	var below, soon []*survey.Assessed
	for _, it := range f.Items {
		switch wallloss.WindowOf(it.Result) {
		case wallloss.WindowNow:
			below = append(below, it)
		case wallloss.WindowUnder2, wallloss.Window2To5:
			soon = append(soon, it)
		}
	}
	for k, it := range below {
		if k == namesShown {
			out = append(out, fmt.Sprintf("%s also at or below their required thickness; they head the ranked list.",
				count(len(below)-namesShown, "more CML is", "more CMLs are")))
			break
		}
		r := it.Result
		s := fmt.Sprintf("CML %s on %s / %s is at or below its required thickness: %s measured on %s against %s required",
			it.CML.ID, it.Asset.Name, it.Component.Name, thick(u, r.ThicknessMM), date(r.CurrentDate), thick(u, r.RequiredMM()))
		if r.RateMMPerY != nil && *r.RateMMPerY > 0 {
			s += fmt.Sprintf(", losing %s", u.Rate(*r.RateMMPerY))
		}
		out = append(out, s+". It calls for action now: "+actions.ActNow+".")
	}
	if len(below) == 0 {
		out = append(out, "No CML is at or below its required thickness.")
	}
	if len(soon) > 0 {
		var names []string
		for _, it := range soon {
			names = append(names, fmt.Sprintf("%s (%s years)", it.CML.ID, lifeWords(it.Result)))
		}
		out = append(out, fmt.Sprintf("%s under 5 years of remaining life: %s.",
			count(len(soon), "CML has", "CMLs have"), list(names)))
		return out
	}
	// The shortest remaining life among the rest, so the reader knows how far
	// the next CML is from the 5-year mark (the ranking may put a CML first
	// for its component's local damage: its own wall life is not the shortest).
	var next *survey.Assessed
	for _, it := range f.Items {
		l := it.Result.PlanningLifeY()
		if wallloss.WindowOf(it.Result) == wallloss.WindowNow || l == nil {
			continue
		}
		if next == nil || *l < *next.Result.PlanningLifeY() {
			next = it
		}
	}
	switch {
	case next == nil:
	case len(below) > 0:
		out = append(out, fmt.Sprintf("No other CML has under 5 years of remaining life; the next shortest is %s with %s years.",
			next.CML.ID, lifeWords(next.Result)))
	default:
		out = append(out, fmt.Sprintf("No CML has under 5 years of remaining life; the shortest is %s with %s years.",
			next.CML.ID, lifeWords(next.Result)))
	}
	return append(append(out, f.localWords()...), f.protectionWords()...)
}

// localWords names the local-damage assessments at their limit or with
// under 5 years left: they rank with the CMLs whatever the wall readings say.
func (f *Findings) localWords() []string {
	var out []string
	for _, a := range f.Survey.Assets {
		for _, c := range a.Components {
			if c.Design.Local == nil {
				continue
			}
			for _, la := range c.Design.Local.Assessments {
				switch {
				case la.LifeY == nil || *la.LifeY >= 5:
				case *la.LifeY <= 0:
					out = append(out, fmt.Sprintf("Local damage on %s / %s has reached its limit (%s: %s). It calls for action now: "+actions.ActNow+".",
						a.Name, c.Name, la.Method, strings.TrimSuffix(la.Result, ".")))
				default:
					out = append(out, fmt.Sprintf("Local damage on %s / %s leaves %.1f years before its limit (%s).",
						a.Name, c.Name, *la.LifeY, la.Method))
				}
			}
		}
	}
	return out
}

// protectionWords names the cathodic-protection test points that do not
// meet their criterion at their latest visit.
func (f *Findings) protectionWords() []string {
	var names []string
	for _, p := range f.Survey.FailingTestPoints() {
		names = append(names, fmt.Sprintf("%s on %s / %s (%s)", p.Point, p.Asset, p.Component, p.Status))
	}
	if len(names) == 0 {
		return nil
	}
	return []string{fmt.Sprintf("Cathodic protection: %s at the latest visit: %s.",
		count(len(names), "test point does not meet its criterion", "test points do not meet their criterion"), list(names))}
}

// lifeWords is the remaining life in years, with the lower bound where the
// dates use it.
func lifeWords(r wallloss.Result) string {
	if r.RemainingLifeY == nil {
		return "unknown"
	}
	s := fmt.Sprintf("%.1f", *r.RemainingLifeY)
	if r.RemainingLifeLowY != nil && *r.RemainingLifeLowY != *r.RemainingLifeY {
		s += fmt.Sprintf(", lower bound %.1f", *r.RemainingLifeLowY)
	}
	return s
}

func (f *Findings) dueWords() []string {
	var out []string
	day := f.Survey.Date
	// Each component's earliest next inspection, soonest first.
	type due struct {
		what string
		cml  string
		at   time.Time
	}
	var dues []due
	for _, a := range f.Survey.Assets {
		for _, c := range a.Components {
			var first *survey.Assessed
			for _, m := range c.CMLs {
				it := f.Item(m)
				if it == nil || it.Result.NextInspection == nil {
					continue
				}
				if first == nil || it.Result.NextInspection.Before(*first.Result.NextInspection) {
					first = it
				}
			}
			if first != nil {
				dues = append(dues, due{a.Name + " / " + c.Name, first.CML.ID, *first.Result.NextInspection})
			}
		}
	}
	slices.SortStableFunc(dues, func(x, y due) int { return x.at.Compare(y.at) })
	var now, later []string
	for _, x := range dues {
		if !x.at.After(day) {
			now = append(now, fmt.Sprintf("%s (CML %s)", x.what, x.cml))
		} else {
			later = append(later, fmt.Sprintf("%s by %s (CML %s)", x.what, x.at.Format(time.DateOnly), x.cml))
		}
	}
	if len(now) > 0 {
		out = append(out, fmt.Sprintf("Inspection due now, on or before the survey date %s: %s.", day.Format(time.DateOnly), list(now)))
	}
	if len(later) > 0 {
		lead := "Next inspections, soonest first"
		if len(later) > namesShown {
			lead = fmt.Sprintf("The soonest next inspections (%d of %d components)", namesShown, len(later))
			later = later[:namesShown]
		}
		out = append(out, lead+": "+strings.Join(later, "; ")+".")
	}
	// Repair windows: how many CMLs fall in each band short of 10 years.
	counts := map[wallloss.Window][]string{}
	var localNow []string
	for _, it := range f.Items {
		w := wallloss.WindowOf(it.Result)
		if life, ok := it.Component.LocalLifeY(); ok && life <= 0 && w != wallloss.WindowNow {
			// The wall's window alone would read as fine: the CML ranks as
			// at or below required by its component's local damage.
			localNow = append(localNow, it.CML.ID)
			continue
		}
		counts[w] = append(counts[w], it.CML.ID)
	}
	var parts []string
	for _, w := range []wallloss.Window{wallloss.WindowNow, wallloss.WindowUnder2, wallloss.Window2To5, wallloss.Window5To10, wallloss.WindowUnknown} {
		if ids := counts[w]; len(ids) > 0 {
			name := w.String()
			switch w {
			case wallloss.WindowNow:
				name = "now (at or below required)"
			case wallloss.WindowUnknown:
				name = "unknown (no remaining life can be computed)"
			}
			parts = append(parts, fmt.Sprintf("%s: %s", name, list(ids)))
		}
		if w == wallloss.WindowNow && len(localNow) > 0 {
			parts = append(parts, "now (local damage at its limit): "+list(localNow))
		}
	}
	if len(parts) > 0 {
		rest := countAll(counts, wallloss.WindowOver10, wallloss.WindowNoLoss)
		tail := "."
		if rest > 0 {
			tail = fmt.Sprintf("; the other %s 10 years or more, or show no measurable loss.", count(rest, "CML has", "CMLs have"))
		}
		out = append(out, "Repair windows: "+strings.Join(parts, "; ")+tail)
	}
	return out
}

func countAll(m map[wallloss.Window][]string, ws ...wallloss.Window) int {
	n := 0
	for _, w := range ws {
		n += len(m[w])
	}
	return n
}

var inlineMarks = strings.NewReplacer("**", "", "__", "", "`", "")

func (f *Findings) notDoneWords() []string {
	var out []string
	var items []string
	for _, a := range f.Survey.Assets {
		for _, c := range a.Components {
			if c.OutOfScope {
				items = append(items, fmt.Sprintf("%s / %s was out of scope at this visit", a.Name, c.Name))
			}
			for _, s := range c.Scope {
				if !s.Done {
					items = append(items, fmt.Sprintf("%s / %s: %s", a.Name, c.Name, inlineMarks.Replace(s.Text)))
				}
			}
		}
	}
	switch {
	case len(items) == 0:
		out = append(out, "Every item of the scope checklists was done.")
	case len(items) > 2*namesShown:
		out = append(out, fmt.Sprintf("Not covered by the results: %s; and %d more items not done, each in its component's scope checklist.",
			strings.Join(items[:2*namesShown], "; "), len(items)-2*namesShown))
	default:
		out = append(out, fmt.Sprintf("Not covered by the results: %s.", strings.Join(items, "; ")))
	}
	var carried []string
	for _, c := range f.Survey.Carried {
		if c.FromScope && c.Closed == nil {
			carried = append(carried, fmt.Sprintf("%s / %s: %s (visit of %s)", c.Asset, c.Component, inlineMarks.Replace(c.Text), c.Raised.Format(time.DateOnly)))
		}
	}
	if len(carried) > 0 {
		out = append(out, fmt.Sprintf("Left not done by an earlier visit and not in this survey's checklist, so still open and overdue: %s.",
			list(carried)))
	}
	var stale []string
	for _, it := range f.Items {
		if it.Result.FromEarlierVisit() {
			stale = append(stale, fmt.Sprintf("%s (reading of %s)", it.CML.ID, date(it.Result.CurrentDate)))
		}
	}
	if len(stale) > 0 {
		out = append(out, fmt.Sprintf("%s not measured at this visit; %s: %s.",
			count(len(stale), "CML was", "CMLs were"), map[bool]string{true: "its results date from its last reading", false: "their results date from their last readings"}[len(stale) == 1], list(stale)))
	}
	return out
}

func (f *Findings) changedWords(u WordUnits) []string {
	var crossed, accel, shorter []string
	var newCML, compared int
	for _, c := range f.Changes {
		if c.Previous != nil {
			compared++
		}
		id := c.Item.CML.ID
		for _, code := range c.Codes {
			switch code.Kind {
			case survey.ChangeCrossedRequired:
				crossed = append(crossed, id)
			case survey.ChangeAccelerating:
				s := id
				if n := len(c.Intervals); n > 0 && c.Item.Result.RateLongMMPerY != nil {
					s += fmt.Sprintf(" (%s over the latest interval against %s long-term)",
						u.Rate(c.Intervals[n-1].RateMMPerY), u.Rate(*c.Item.Result.RateLongMMPerY))
				}
				accel = append(accel, s)
			case survey.ChangeShorterWindow:
				// Named only when the CML now needs repair within 10 years.
				if w := wallloss.WindowOf(c.Item.Result); c.Previous != nil && w < wallloss.WindowOver10 && w != wallloss.WindowNow {
					shorter = append(shorter, fmt.Sprintf("%s (%s → %s)", id, wallloss.WindowOf(*c.Previous), wallloss.WindowOf(c.Item.Result)))
				}
			case survey.ChangeNewCML:
				newCML++
			}
		}
	}
	if compared == 0 {
		return []string{"No CML has an earlier visit to compare with: every rate is a single-visit estimate."}
	}
	var parts []string
	if len(crossed) > 0 {
		parts = append(parts, fmt.Sprintf("%s crossed the required thickness (%s)", count(len(crossed), "CML", "CMLs"), list(crossed)))
	}
	if len(accel) > 0 {
		parts = append(parts, fmt.Sprintf("%s corroding faster than before: %s", count(len(accel), "CML is", "CMLs are"), list(accel)))
	}
	if len(shorter) > 0 {
		parts = append(parts, fmt.Sprintf("%s moved into a shorter repair window under 10 years: %s", count(len(shorter), "CML", "CMLs"), list(shorter)))
	}
	if len(parts) == 0 {
		parts = append(parts, "no CML crossed the required thickness, corroded faster than before or moved into a shorter repair window")
	}
	out := []string{fmt.Sprintf("Since the previous visit (%s compared), %s.", count(compared, "CML", "CMLs"), strings.Join(parts, "; "))}
	if newCML > 0 {
		out = append(out, fmt.Sprintf("%s first measured at this visit.", count(newCML, "CML was", "CMLs were")))
	}
	return out
}

// count writes n with the singular or plural words.
func count(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}

// list joins names, naming at most namesShown and counting the rest.
func list(names []string) string {
	if len(names) > namesShown {
		return strings.Join(names[:namesShown], ", ") + fmt.Sprintf(" and %d more", len(names)-namesShown)
	}
	return strings.Join(names, ", ")
}

func thick(u WordUnits, mm *float64) string {
	if mm == nil {
		return "no value"
	}
	return u.Thickness(*mm)
}

func date(t *time.Time) string {
	if t == nil {
		return "no date"
	}
	return t.Format(time.DateOnly)
}
