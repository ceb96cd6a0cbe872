package survey

import (
	"crypto/sha256"
	"encoding/hex"
	"regexp"
	"slices"
	"strings"
	"time"
)

// WrittenAction is an action the inspector writes in the checklist:
//
//   - action: WHAT; due: DATE; priority: PRIORITY; cml: CML; id: NAME
//
// due and priority are required; cml and id are optional. Written under a
// `##` component it is about that component; before the first heading, about
// the whole survey.
type WrittenAction struct {
	ID        string // as given after id:, else derived (see writtenActionID)
	Text      string
	Due       time.Time
	Priority  string // immediate, high, medium or low
	Asset     string
	Component string
	CML       string
	Raised    time.Time // date of the survey that wrote it
	File      string
	Line      int
}

// ActionClosure closes an action carried from an earlier survey:
//
//   - close ID: DATE what was done
type ActionClosure struct {
	ID   string
	Date time.Time
	Note string
	File string
	Line int
}

// CarriedAction is an action written in an earlier survey and not closed
// before this one; Closed is set when this survey closes it. FromScope marks
// a scope item an earlier survey left not done and this one does not list:
// it stays open until a later checklist ticks it or a closure names it.
type CarriedAction struct {
	WrittenAction
	Closed    *ActionClosure
	FromScope bool
}

// ScopeActionID is the id of the action a scope item not done raises:
// IDScopeNotDone and the first six hex digits of the SHA-256 of the asset,
// component and item text, so it stays the same from survey to survey.
func ScopeActionID(asset, component, text string) string {
	return IDScopeNotDone + ActionHash(asset, component, text)
}

// ActionHash is the first six hex digits (upper case) of the SHA-256 of
// the parts joined by NUL: the subject of a computed action's id.
func ActionHash(parts ...string) string {
	h := sha256.Sum256([]byte(strings.Join(parts, "\x00")))
	return strings.ToUpper(hex.EncodeToString(h[:3]))
}

// ActionPriorities are the priorities of an action, most urgent first.
var ActionPriorities = []string{"immediate", "high", "medium", "low"}

var (
	actionItem  = regexp.MustCompile(`(?i)^action\s*:\s*(.*)$`)
	closeItem   = regexp.MustCompile(`(?i)^close\s+(\S+?)\s*:\s*(.*)$`)
	actionField = regexp.MustCompile(`^([A-Za-z]+)\s*:\s*(.*)$`)
	// closeSlip is a list item meant to close an action but not written
	// `close ID: DATE what was done`: `close: ID DATE …`, `closed ID: DATE …`,
	// or the colon left out before the date.
	// Each needs a date, so a note such as `closed valve V-3: …` stays a note.
	closeSlip = regexp.MustCompile(`(?i)^(?:close[sd]?\s*:\s*\S+\s+\d{4}-\d\d-\d\d|close[sd]\s+\S+?\s*:\s*\d{4}-\d\d-\d\d|close[sd]?\s+\S+\s+\d{4}-\d\d-\d\d)`)
	// actionSlip is `actions:` for `action:`.
	actionSlip = regexp.MustCompile(`(?i)^actions\s*:`)
)

// actionLine reads a list item that is an action or closes one; it reports
// whether it was one.
func (r *checklistReader) actionLine(src string, line int) bool {
	src = strings.TrimSpace(src)
	if m := closeItem.FindStringSubmatch(src); m != nil {
		c := ActionClosure{ID: m[1], File: r.file, Line: line}
		date, note, _ := strings.Cut(strings.TrimSpace(m[2]), " ")
		t, err := parseFrontMatterDate(date)
		if err != nil {
			r.problems.Errorf(r.file, line, "close %s: %q is not a date: write `close ID: DATE what was done`", c.ID, date)
			return true
		}
		c.Date, c.Note = t, strings.TrimSpace(note)
		if c.Note == "" {
			r.problems.Errorf(r.file, line, "close %s: say what was done after the date", c.ID)
		}
		if !r.survey.Date.IsZero() && t.After(r.survey.Date) {
			r.problems.Errorf(r.file, line, "close %s: %s is after the survey date %s", c.ID, date, r.survey.Date.Format(time.DateOnly))
		}
		r.survey.Closures = append(r.survey.Closures, c)
		return true
	}
	if closeSlip.MatchString(src) {
		r.problems.Errorf(r.file, line, "this looks like closing an action: write `close ID: DATE what was done` (e.g. `close P-DIG: 2026-11-18 excavated and measured`)")
		return true
	}
	if actionSlip.MatchString(src) {
		r.problems.Errorf(r.file, line, "this looks like an action: write `action: what is to be done; due: DATE; priority: PRIORITY`")
		return true
	}
	m := actionItem.FindStringSubmatch(src)
	if m == nil {
		return false
	}
	parts := strings.Split(m[1], ";")
	a := WrittenAction{Text: strings.TrimSpace(parts[0]), Raised: r.survey.Date, File: r.file, Line: line}
	if r.asset != nil {
		a.Asset = r.asset.Name
	}
	if r.comp != nil {
		a.Component = r.comp.Name
	}
	if a.Text == "" {
		r.problems.Errorf(r.file, line, "action: say what is to be done")
	}
	var due string
	for _, p := range parts[1:] {
		p = strings.TrimSpace(p)
		f := actionField.FindStringSubmatch(p)
		if f == nil {
			r.problems.Errorf(r.file, line, "action: %q is not `key: value` (keys: due, priority, cml, id)", p)
			continue
		}
		v := strings.TrimSpace(f[2])
		switch strings.ToLower(f[1]) {
		case "due":
			due = v
			t, err := parseFrontMatterDate(v)
			if err != nil {
				r.problems.Errorf(r.file, line, "action: due %q is not a date such as 2027-03-01", v)
				continue
			}
			if !r.survey.Date.IsZero() && t.Before(r.survey.Date) {
				r.problems.Errorf(r.file, line, "action: due %s is before the survey date %s", v, r.survey.Date.Format(time.DateOnly))
			}
			a.Due = t
		case "priority":
			a.Priority = strings.ToLower(v)
			if !slices.Contains(ActionPriorities, a.Priority) {
				r.problems.Errorf(r.file, line, "action: priority %q is not one of %s", v, strings.Join(ActionPriorities, ", "))
			}
		case "cml":
			a.CML = v
		case "id":
			a.ID = v
			if p := computedIDPrefix(v); p != "" {
				r.problems.Errorf(r.file, line, "action: id %s starts like the ids of computed actions (%s…): choose another, such as W-%s", v, p, strings.TrimPrefix(strings.ToUpper(v), p))
			}
		default:
			r.problems.Errorf(r.file, line, "action: unknown key %q (keys: due, priority, cml, id)", f[1])
		}
	}
	if due == "" {
		r.problems.Errorf(r.file, line, "action: give a due date (`; due: 2027-03-01`)")
	}
	if a.Priority == "" {
		r.problems.Errorf(r.file, line, "action: give a priority (`; priority: high`: %s)", strings.Join(ActionPriorities, ", "))
	}
	if a.ID == "" {
		a.ID = writtenActionID(a)
	}
	for _, o := range r.survey.Actions {
		if o.ID == a.ID {
			r.problems.Errorf(r.file, line, "action: id %s is already used at line %d", a.ID, o.Line)
		}
	}
	r.survey.Actions = append(r.survey.Actions, a)
	return true
}

// writtenActionID derives the id of a written action without one: "W-" and
// the first six hex digits of the SHA-256 of its asset, component, CML and
// text (lower case, single spaces), so that it stays the same in every later
// survey that carries it.
func writtenActionID(a WrittenAction) string {
	key := strings.Join([]string{a.Asset, a.Component, a.CML, strings.Join(strings.Fields(strings.ToLower(a.Text)), " ")}, "\x00")
	h := sha256.Sum256([]byte(key))
	return "W-" + strings.ToUpper(hex.EncodeToString(h[:3]))
}

// checkActionCMLs checks that each written action's cml: is a CML of the
// checklist (of its component, when written under one).
func (r *checklistReader) checkActionCMLs() {
	for _, a := range r.survey.Actions {
		if a.CML == "" {
			continue
		}
		found := false
		for loc := range r.survey.CMLs() {
			if loc.CML.ID == a.CML && (a.Component == "" || loc.Component.Name == a.Component) {
				found = true
				break
			}
		}
		if !found {
			r.problems.Errorf(r.file, a.Line, "action: cml %s is not a CML of %s", a.CML, quotedOr(a.Component, "this checklist"))
		}
	}
}

func quotedOr(a, b string) string {
	if a != "" {
		return `"` + a + `"`
	}
	return b
}

// carryActions works out the actions carried into s from its earlier
// surveys: taking the surveys oldest first, each adds the actions it writes
// and closes those it names. Those still open reach s, which may close them;
// a closure of s naming no open action is an error at its line.
func carryActions(s *Survey) ProblemList {
	var problems ProblemList
	var open []CarriedAction
	if s.History != nil {
		earlier := slices.Clone(s.History.Earlier)
		slices.SortStableFunc(earlier, func(a, b *Survey) int { return a.Date.Compare(b.Date) })
		for _, e := range earlier {
			for _, c := range e.Closures {
				open = slices.DeleteFunc(open, func(a CarriedAction) bool { return a.ID == c.ID })
			}
			for _, a := range e.Actions {
				open = append(open, CarriedAction{WrittenAction: a})
			}
			open = carryScope(open, e)
		}
	}
	// This survey's checklist: a ticked item closes the carried one; an item
	// not done again is this survey's own action (since the earlier date).
	s.ScopeSince = map[string]time.Time{}
	for loc := range componentsOfSurvey(s) {
		for _, it := range loc.Component.Scope {
			id := ScopeActionID(loc.Asset.Name, loc.Component.Name, it.Text)
			i := slices.IndexFunc(open, func(a CarriedAction) bool { return a.FromScope && a.ID == id })
			switch {
			case i < 0:
			case it.Done:
				open[i].Closed = &ActionClosure{ID: id, Date: s.Date, Note: "done at this visit (ticked in the checklist)", File: loc.Component.File, Line: it.Line}
			default:
				s.ScopeSince[id] = open[i].Raised
				open = slices.Delete(open, i, i+1)
			}
		}
	}
	for _, c := range s.Closures {
		i := slices.IndexFunc(open, func(a CarriedAction) bool { return a.ID == c.ID })
		switch {
		case i < 0:
			problems.Errorf(c.File, c.Line, "close %s: no open action of an earlier survey has this id%s", c.ID, openIDs(open))
		case open[i].Closed != nil:
			problems.Errorf(c.File, c.Line, "close %s: already closed at line %d", c.ID, open[i].Closed.Line)
		case c.Date.Before(open[i].Raised):
			problems.Errorf(c.File, c.Line, "close %s: %s is before the action was raised (%s)", c.ID, c.Date.Format(time.DateOnly), open[i].Raised.Format(time.DateOnly))
		default:
			cc := c
			open[i].Closed = &cc
		}
	}
	for _, a := range s.Actions {
		if slices.ContainsFunc(open, func(o CarriedAction) bool { return o.ID == a.ID }) {
			problems.Errorf(a.File, a.Line, "action: id %s is an open action of an earlier survey; close it or give this one another id", a.ID)
		}
	}
	s.Carried = open
	return problems
}

// carryScope adds the scope items earlier survey e left not done to the
// open actions (the first survey that left an item not done raised it) and
// removes those e ticked.
func carryScope(open []CarriedAction, e *Survey) []CarriedAction {
	for loc := range componentsOfSurvey(e) {
		for _, it := range loc.Component.Scope {
			id := ScopeActionID(loc.Asset.Name, loc.Component.Name, it.Text)
			i := slices.IndexFunc(open, func(a CarriedAction) bool { return a.FromScope && a.ID == id })
			switch {
			case it.Done && i >= 0:
				open = slices.Delete(open, i, i+1)
			case !it.Done && i < 0:
				open = append(open, CarriedAction{FromScope: true, WrittenAction: WrittenAction{
					ID: id, Text: it.Text, Due: e.Date, Priority: "medium", Asset: loc.Asset.Name, Component: loc.Component.Name,
					Raised: e.Date, File: loc.Component.File, Line: it.Line}})
			}
		}
	}
	return open
}

// componentsOfSurvey yields every component of s with its asset.
func componentsOfSurvey(s *Survey) func(func(Located) bool) {
	return func(yield func(Located) bool) {
		for _, a := range s.Assets {
			for _, c := range a.Components {
				if !yield(Located{Asset: a, Component: c}) {
					return
				}
			}
		}
	}
}

func openIDs(open []CarriedAction) string {
	if len(open) == 0 {
		return " (none is open)"
	}
	ids := make([]string, len(open))
	for i, a := range open {
		ids[i] = a.ID
	}
	return " (open: " + strings.Join(ids, ", ") + ")"
}

// Prefixes of the ids of the computed actions, which the actions package
// builds; a written id may not start with one.
const (
	IDBelowRequired    = "REQ-"
	IDNextInspection   = "INSP-"
	IDLocalLimit       = "LOCAL-"
	IDScopeNotDone     = "SCOPE-"
	IDConfirmRate      = "RATE-"
	IDPlannedRepair    = "REP-"
	IDProtectionNotMet = "CP-"
)

// computedIDPrefixes open the ids of the computed actions; a written id
// starting so could name one of them.
var computedIDPrefixes = []string{IDBelowRequired, IDNextInspection, IDLocalLimit, IDScopeNotDone, IDConfirmRate, IDPlannedRepair, IDProtectionNotMet}

// computedIDPrefix is the computed actions' prefix id starts with, or "".
func computedIDPrefix(id string) string {
	u := strings.ToUpper(id)
	for _, p := range computedIDPrefixes {
		if strings.HasPrefix(u, p) {
			return p
		}
	}
	return ""
}
