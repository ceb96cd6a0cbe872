package actions

import (
	"cmp"
	"fmt"
	"slices"
	"strings"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/electrochem"
	"github.com/lossline/lossline/survey/wallloss"
)

// Kind is where an action comes from.
type Kind string

// Kinds of action. The id of a computed action is its kind's prefix and its
// subject (see Action.ID).
const (
	BelowRequired    Kind = "at or below required"      // REQ-<CML>
	NextInspection   Kind = "next inspection"           // INSP-<hash of asset, component>
	PlannedRepair    Kind = "planned repair"            // REP-<hash of asset, component>
	ScopeNotDone     Kind = "scope not done"            // SCOPE-<hash of asset, component, item>
	ConfirmRate      Kind = "confirm rate"              // RATE-<CML>
	ProtectionNotMet Kind = "protection not met"        // CP-<hash of asset, component, test point>
	LocalLimit       Kind = "local damage at its limit" // LOCAL-<hash of asset, component, design key>
	Written          Kind = "inspector's action"        // as written, or W-<hash>
)

// Priority orders actions of the same due date; Immediate is the most urgent.
type Priority int

// Priorities, most urgent first; their names are survey.ActionPriorities.
const (
	Immediate Priority = iota
	High
	Medium
	Low
)

func (p Priority) String() string { return survey.ActionPriorities[p] }

// ParsePriority reads a priority name as the checklist writes it.
func ParsePriority(s string) (Priority, bool) {
	i := slices.Index(survey.ActionPriorities, strings.ToLower(strings.TrimSpace(s)))
	return Priority(max(i, 0)), i >= 0
}

// Status is where an action stands on the survey date.
type Status string

// Statuses.
const (
	Open    Status = "open"
	Overdue Status = "overdue" // open, due before the survey date
	Closed  Status = "closed"  // closed by this survey
)

// Action is one entry of the register.
type Action struct {
	ID        string
	Kind      Kind
	Priority  Priority
	Due       time.Time
	Asset     string
	Component string
	CML       string
	Reason    string // in words
	// Rule is the computed rule that raised it ("" for a written action);
	// File and Line the checklist line that wrote it or that it rests on.
	Rule   string
	File   string
	Line   int
	Raised time.Time // date of the survey that raised it
	Status Status
	Closed *survey.ActionClosure
}

// Carried reports whether an earlier survey raised the action.
func (a Action) Carried(surveyDate time.Time) bool { return a.Raised.Before(surveyDate) }

// Planned is a repair of the repair plan, in the plan year it is funded in.
type Planned struct {
	Asset     string
	Component *survey.Component
	Year      int       // plan year, 1 for the first
	Due       time.Time // end of that plan year, or the deadline if sooner
	Mandatory bool      // a CML is at or below required
	Why       string
}

// Input is what the register is computed from.
type Input struct {
	Survey  *survey.Survey
	Items   []*survey.Assessed // rank order
	Changes []survey.Change    // one per item
	Repairs []Planned          // funded rows of the repair plan; nil without a plan
	// CP are the cathodic-protection test points failing at their latest visit.
	CP []survey.FailingPoint
}

// ActNow is what an action due at once asks for, in the same words wherever
// the report says it.
const ActNow = "repair, re-rate after an engineering assessment of fitness for service, or take out of service"

// CorrectWithin is the time within which a test point that does not meet
// the protection criterion is investigated and corrected: three months,
// lossline's choice (common practice is to correct deficiencies found in a
// periodic survey promptly; an inspector's written action overrides it).
const CorrectWithin = 3 // months

// ConfirmWithin is the time within which an accelerating CML is to be
// re-measured, unless its next inspection is sooner: six months, lossline's
// choice (an inspector's written action overrides it).
const ConfirmWithin = 6 // months

// SoonYears is the time to a next inspection within which its action is
// high priority rather than medium: one year, lossline's choice.
const SoonYears = 1

// Register computes the actions of a survey, ordered by due date, then
// priority, then id; actions closed by this survey come last.
func Register(in Input) []Action {
	s := in.Survey
	var out []Action
	next := map[*survey.Component]*survey.Assessed{} // earliest next inspection
	below := map[*survey.Component]bool{}
	for _, it := range in.Items {
		r := it.Result
		if r.Class == wallloss.AtOrBelowRequired {
			below[it.Component] = true
			out = append(out, Action{
				ID: survey.IDBelowRequired + it.CML.ID, Kind: BelowRequired, Priority: Immediate, Due: s.Date,
				Asset: it.Asset.Name, Component: it.Component.Name, CML: it.CML.ID,
				Reason: fmt.Sprintf("reads %.2f mm on %s, at or below the required %.2f mm: "+ActNow,
					*r.ThicknessMM, r.CurrentDate.Format(time.DateOnly), *r.RequiredMM()),
				Rule: "a CML at or below its required thickness is acted on at once", File: it.CML.File, Line: it.CML.Line,
			})
			continue
		}
		if r.NextInspection != nil {
			if n, ok := next[it.Component]; !ok || r.NextInspection.Before(*n.Result.NextInspection) {
				next[it.Component] = it
			}
		}
	}
	for loc := range componentsOf(s) {
		c := loc.Component
		if life, ok := c.LocalLifeY(); ok && life <= 0 {
			below[c] = true // the local-damage action below stands for its inspection
		}
		due := s.Date.AddDate(SoonYears, 0, 0)
		if it := next[c]; it != nil && !below[c] {
			due = *it.Result.NextInspection
			p := Medium
			if due.Before(s.Date.AddDate(SoonYears, 0, 0)) {
				p = High
			}
			out = append(out, Action{
				ID: survey.IDNextInspection + hash(loc.Asset.Name, c.Name), Kind: NextInspection, Priority: p, Due: due,
				Asset: loc.Asset.Name, Component: c.Name, CML: it.CML.ID,
				Reason: fmt.Sprintf("next thickness inspection of the component; CML %s sets the date (%s)", it.CML.ID, it.Result.NextBasis),
				Rule:   "earliest next inspection of the component's CMLs", File: c.File, Line: c.Line,
			})
		} else if it != nil {
			due = *it.Result.NextInspection
		}
		if c.Design.Local != nil {
			for _, a := range c.Design.Local.Assessments {
				if a.LifeY == nil || *a.LifeY > 0 {
					continue
				}
				out = append(out, Action{
					ID: survey.IDLocalLimit + hash(loc.Asset.Name, c.Name, a.Key), Kind: LocalLimit, Priority: Immediate, Due: s.Date,
					Asset: loc.Asset.Name, Component: c.Name,
					Reason: fmt.Sprintf("%s: %s; %s", a.Method, plainText(a.Result), ActNow),
					Rule:   "local damage at its limit is acted on at once", File: c.File, Line: a.Line,
				})
			}
		}
		for _, sc := range c.Scope {
			if sc.Done {
				continue
			}
			id := survey.ScopeActionID(loc.Asset.Name, c.Name, sc.Text)
			reason, raised := "not done in this visit: "+plainText(sc.Text)+"; revisit by the next inspection", s.Date
			if since, ok := s.ScopeSince[id]; ok {
				reason, raised = fmt.Sprintf("not done in this visit, nor since the visit of %s: %s; revisit by the next inspection",
					since.Format(time.DateOnly), plainText(sc.Text)), since
			}
			out = append(out, Action{
				ID: id, Kind: ScopeNotDone, Priority: Medium, Due: due, Raised: raised,
				Asset: loc.Asset.Name, Component: c.Name, Reason: reason,
				Rule: "a scope item not ticked is revisited", File: c.File, Line: sc.Line,
			})
		}
	}
	for i, ch := range in.Changes {
		if i >= len(in.Items) || !accelerating(ch) {
			continue
		}
		it := in.Items[i]
		if it.Result.Class == wallloss.AtOrBelowRequired {
			continue
		}
		due := s.Date.AddDate(0, ConfirmWithin, 0)
		if n := it.Result.NextInspection; n != nil && n.Before(due) {
			due = *n
		}
		out = append(out, Action{
			ID: survey.IDConfirmRate + it.CML.ID, Kind: ConfirmRate, Priority: High, Due: due,
			Asset: it.Asset.Name, Component: it.Component.Name, CML: it.CML.ID,
			Reason: "latest interval's loss rate is well above the long-term rate: confirm by re-measurement before acting on it",
			Rule:   "an accelerating CML is re-measured", File: it.CML.File, Line: it.CML.Line,
		})
	}
	for _, rp := range in.Repairs {
		p := Medium
		if rp.Mandatory || rp.Year == 1 {
			p = High
		}
		reason := fmt.Sprintf("repair planned in plan year %d", rp.Year)
		if rp.Why != "" {
			reason += ": " + rp.Why
		}
		out = append(out, Action{
			ID: survey.IDPlannedRepair + hash(rp.Asset, rp.Component.Name), Kind: PlannedRepair, Priority: p, Due: rp.Due,
			Asset: rp.Asset, Component: rp.Component.Name, Reason: reason,
			Rule: "repairs funded by the repair plan", File: rp.Component.File, Line: rp.Component.Line,
		})
	}
	for _, p := range in.CP {
		prio, todo := High, "investigate and restore protection"
		if p.Status == electrochem.Undetermined {
			prio, todo = Medium, "take instant-off readings to judge it"
		}
		out = append(out, Action{
			ID: survey.IDProtectionNotMet + hash(p.Asset, p.Component, p.Point), Kind: ProtectionNotMet, Priority: prio,
			Due: s.Date.AddDate(0, CorrectWithin, 0), Asset: p.Asset, Component: p.Component,
			Reason: fmt.Sprintf("test point %s, %s: %s; %s", p.Point, p.Status, strings.Join(p.Reasons, "; "), todo),
			Rule:   "a test point failing its protection criterion is corrected", File: p.File, Line: p.Line,
		})
	}
	for _, w := range s.Actions {
		out = append(out, written(w, s.Date, nil))
	}
	for _, c := range s.Carried {
		a := written(c.WrittenAction, s.Date, c.Closed)
		if c.FromScope {
			// Left not done by an earlier visit and not in this checklist: it
			// was due by this visit.
			a.Kind, a.Rule = ScopeNotDone, "a scope item not done stays open until a later checklist ticks it or a closure names it"
			a.Reason = fmt.Sprintf("not done at the visit of %s and not in this survey's checklist: %s; do it, list it, or close it",
				c.Raised.Format(time.DateOnly), plainText(c.Text))
			a.Due = s.Date
			if a.Status == Open {
				a.Status = Overdue
			}
		}
		out = append(out, a)
	}
	for i := range out {
		if out[i].Raised.IsZero() {
			out[i].Raised = s.Date
		}
	}
	Sort(out)
	return out
}

// written is the register entry of an action the inspector wrote.
func written(w survey.WrittenAction, surveyDate time.Time, closed *survey.ActionClosure) Action {
	p, _ := ParsePriority(w.Priority)
	a := Action{ID: w.ID, Kind: Written, Priority: p, Due: w.Due, Asset: w.Asset, Component: w.Component, CML: w.CML,
		Reason: w.Text, File: w.File, Line: w.Line, Raised: w.Raised, Status: Open, Closed: closed}
	switch {
	case closed != nil:
		a.Status = Closed
	case w.Due.Before(surveyDate):
		a.Status = Overdue
	}
	return a
}

// Sort orders actions by due date, then priority, then id; closed ones last.
func Sort(as []Action) {
	for i := range as {
		if as[i].Status == "" {
			as[i].Status = Open
		}
	}
	slices.SortStableFunc(as, func(a, b Action) int {
		if c := cmp.Compare(statusOrder(a.Status), statusOrder(b.Status)); c != 0 {
			return c
		}
		if c := a.Due.Compare(b.Due); c != 0 {
			return c
		}
		if c := cmp.Compare(a.Priority, b.Priority); c != 0 {
			return c
		}
		return strings.Compare(a.ID, b.ID)
	})
}

func statusOrder(s Status) int {
	if s == Closed {
		return 1
	}
	return 0
}

func accelerating(ch survey.Change) bool {
	return slices.ContainsFunc(ch.Codes, func(c survey.ChangeCode) bool { return c.Kind == survey.ChangeAccelerating })
}

// hash is the first six hex digits (upper case) of the SHA-256 of the parts
// joined by NUL bytes: a short id that stays the same while the names do.
func hash(parts ...string) string { return survey.ActionHash(parts...) }

// plainText drops the Markdown emphasis marks of a checklist line.
func plainText(s string) string {
	return strings.NewReplacer("**", "", "__", "", "`", "").Replace(s)
}

// componentsOf yields every component in checklist order with its asset.
func componentsOf(s *survey.Survey) func(func(survey.Located) bool) {
	return func(yield func(survey.Located) bool) {
		for _, a := range s.Assets {
			for _, c := range a.Components {
				if !yield(survey.Located{Asset: a, Component: c}) {
					return
				}
			}
		}
	}
}
