package actions

import (
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/electrochem"
	"github.com/lossline/lossline/survey/wallloss"
)

func day(s string) time.Time {
	t, err := time.Parse(time.DateOnly, s)
	if err != nil {
		panic(err)
	}
	return t
}

// A survey with one CML below required, one scope item not done, one
// written action and two carried ones (one overdue, one closed).
func registerInput(t *testing.T) Input {
	t.Helper()
	src := `---
title: Register
site: Yard
date: 2026-06-01
inspector: Test
units: mm
---
# Tank

## Shell

- nominal: 10
- required: 5
- action: Re-measure C2 with the paint off; due: 2026-09-01; priority: low; cml: C2

| CML | 2016-06-01 | 2026-06-01 |
|---|---|---|
| C1 | 9.0 | 4.8 |
| C2 | 9.8 | 9.6 |

- [x] Readings
- [ ] Magnetic-particle test at the nozzle
`
	s, problems := survey.ParseChecklist("survey.md", []byte(src))
	if problems = append(problems, survey.ComputeRequired(s)...); problems.HasErrors() {
		t.Fatal(problems)
	}
	closed := &survey.ActionClosure{ID: "OLD-2", Date: day("2026-05-20"), Note: "done", Line: 3}
	s.Carried = []survey.CarriedAction{
		{WrittenAction: survey.WrittenAction{ID: "OLD-1", Text: "refit shoe", Due: day("2025-01-01"), Priority: "medium", Raised: day("2024-06-01")}},
		{WrittenAction: survey.WrittenAction{ID: "OLD-2", Text: "excavate", Due: day("2024-09-01"), Priority: "high", Raised: day("2024-06-01")}, Closed: closed},
	}
	items := survey.Assess(s, wallloss.DefaultPolicy)
	return Input{Survey: s, Items: items, Changes: survey.Changes(s, items, survey.IndexPhotos(s), wallloss.DefaultPolicy, 25)}
}

func TestRegisterOrderAndStatus(t *testing.T) {
	got := Register(registerInput(t))
	var ids []string
	for _, a := range got {
		ids = append(ids, a.ID)
	}
	// Open actions by due date, then priority; the closed one last. C1 is
	// below required (immediate, due the survey date), so its component's
	// inspection action is left to that; the scope item is revisited by the
	// next inspection of C2 (10-year cap of the half-life rule with no
	// measurable loss).
	want := []string{"OLD-1", "REQ-C1", "", "", "OLD-2"}
	if len(got) != len(want) {
		t.Fatalf("register %v, want %d actions", ids, len(want))
	}
	for i, w := range want {
		if w != "" && got[i].ID != w {
			t.Errorf("action %d is %s, want %s (%v)", i, got[i].ID, w, ids)
		}
	}
	if !slices.IsSortedFunc(got[:4], func(a, b Action) int { return a.Due.Compare(b.Due) }) {
		t.Errorf("open actions not by due date: %v", ids)
	}
	byID := map[string]Action{}
	for _, a := range got {
		byID[a.ID] = a
	}
	if a := byID["OLD-1"]; a.Status != Overdue || !a.Carried(day("2026-06-01")) {
		t.Errorf("OLD-1: %s, want overdue (due 2025-01-01, survey 2026-06-01)", a.Status)
	}
	if a := byID["OLD-2"]; a.Status != Closed || a.Closed.Note != "done" {
		t.Errorf("OLD-2: %s, want closed", a.Status)
	}
	if a := byID["REQ-C1"]; a.Priority != Immediate || !a.Due.Equal(day("2026-06-01")) || a.CML != "C1" {
		t.Errorf("REQ-C1: %+v", a)
	}
	w := got[2]
	if w.Kind != Written || w.Status != Open || w.Priority != Low || w.Line != 14 {
		t.Errorf("written action: %+v", w)
	}
	scope := got[3]
	if scope.Kind != ScopeNotDone || scope.Line != 22 || !scope.Due.Equal(day("2036-06-01")) {
		t.Errorf("scope action: %+v", scope)
	}
}

// Same due date: the more urgent priority first, then the id.
func TestSortSameDueByPriority(t *testing.T) {
	d := day("2027-01-01")
	as := []Action{{ID: "B", Due: d, Priority: Low}, {ID: "A", Due: d, Priority: Low}, {ID: "C", Due: d, Priority: High}, {ID: "D", Due: day("2026-12-31"), Priority: Low}}
	Sort(as)
	var got []string
	for _, a := range as {
		got = append(got, a.ID)
	}
	if !slices.Equal(got, []string{"D", "C", "A", "B"}) {
		t.Errorf("order %v, want D C A B", got)
	}
}

// Ids of computed actions stay the same while the names do.
func TestComputedIDsStable(t *testing.T) {
	a, b := Register(registerInput(t)), Register(registerInput(t))
	for i := range a {
		if a[i].ID != b[i].ID {
			t.Errorf("id %s then %s", a[i].ID, b[i].ID)
		}
	}
	if hash("Tank", "Shell") == hash("Tank", "Shell 2") || len(hash("x")) != 6 {
		t.Error("hash ids collide or have the wrong length")
	}
}

// A test point failing the −850 mV CSE instant-off criterion (NACE SP0169-2013
// §6.2.2.1) becomes a high-priority action due within CorrectWithin; one whose
// protection cannot be judged from "on" readings alone asks for instant-off
// readings, at medium priority.
func TestFailingTestPointsBecomeActions(t *testing.T) {
	in := registerInput(t)
	in.CP = []survey.FailingPoint{
		{Asset: "Tank", Component: "Bottom CP", Point: "TP-2", File: "survey.md", Line: 40,
			Status: electrochem.NotProtected, Reasons: []string{"instant-off −815 mV CSE is less negative than −850 mV"}},
		{Asset: "Tank", Component: "Bottom CP", Point: "TP-3", File: "survey.md", Line: 41,
			Status: electrochem.Undetermined, Reasons: []string{"only an on potential"}},
	}
	var cp []Action
	for _, a := range Register(in) {
		if a.Kind == ProtectionNotMet {
			cp = append(cp, a)
		}
	}
	if len(cp) != 2 {
		t.Fatalf("%d protection actions, want 2", len(cp))
	}
	due := day("2026-09-01") // survey date 2026-06-01 plus three months
	for _, a := range cp {
		if !a.Due.Equal(due) || a.Line == 0 {
			t.Errorf("%s due %s line %d, want due %s and the row's line", a.ID, a.Due.Format(time.DateOnly), a.Line, due.Format(time.DateOnly))
		}
	}
	if cp[0].Priority != High || !strings.Contains(cp[0].Reason, "restore protection") {
		t.Errorf("not protected: %v %q", cp[0].Priority, cp[0].Reason)
	}
	if cp[1].Priority != Medium || !strings.Contains(cp[1].Reason, "instant-off readings") {
		t.Errorf("not determined: %v %q", cp[1].Priority, cp[1].Reason)
	}
}

// A member whose section loss is past the responsible engineer's limit is an
// immediate action of its own, and stands for the component's inspection.
// The I section (parallel-axis theorem, by hand): 300 × 20 flanges, 560 × 12
// web; bottom flange 20 → 16 mm loses 6.41 % of the area, past a 5 % limit.
func TestLocalDamageAtItsLimit(t *testing.T) {
	src := `---
title: Member
site: Yard
date: 2026-06-01
inspector: Test
units: mm
---
# Bridge

## Girder

- nominal: 20
- required: 15
- member: I
  - depth: 600 mm
  - top flange: 300 x 20
  - web: 12
  - bottom flange: 300 x 20
  - measured bottom flange: 16
  - allowed loss: 5 % of area
  - set by: A. Engineer, structures

| CML | 2026-06-01 |
|---|---|
| G-1 | 16 |
`
	s, problems := survey.ParseChecklist("survey.md", []byte(src))
	problems = append(problems, survey.ComputeRequired(s)...)
	if problems = append(problems, survey.ComputeLocal(s)...); problems.HasErrors() {
		t.Fatal(problems)
	}
	items := survey.Assess(s, wallloss.DefaultPolicy)
	as := Register(Input{Survey: s, Items: items, Changes: survey.Changes(s, items, survey.IndexPhotos(s), wallloss.DefaultPolicy, 25)})
	var local, insp int
	for _, a := range as {
		switch a.Kind {
		case LocalLimit:
			local++
			if a.Priority != Immediate || !a.Due.Equal(s.Date) || a.Line != 14 || !strings.Contains(a.Reason, "EXCEEDED") {
				t.Errorf("local limit action %+v", a)
			}
		case NextInspection:
			insp++
		}
	}
	if local != 1 || insp != 0 {
		t.Errorf("%d local-limit and %d inspection actions, want 1 and 0", local, insp)
	}
}
