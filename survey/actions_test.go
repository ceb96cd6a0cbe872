package survey

import (
	"path/filepath"
	"strings"
	"testing"
	"time"
)

const actionSurvey = `---
title: Actions
site: Yard
date: 2024-06-01
inspector: Test
units: mm
---
## Line A

- nominal: 8
- required: 4
- action: Refit the pipe shoe; due: 2025-06-01; priority: medium; cml: A1
- action: Excavate at A2; due: 2024-09-01; priority: high; id: DIG

| CML | 2024-06-01 |
|---|---|
| A1 | 7.5 |
| A2 | 7.0 |
`

func TestWrittenActionsRead(t *testing.T) {
	s, problems := ParseChecklist("survey.md", []byte(actionSurvey))
	if len(problems) != 0 {
		t.Fatal(problems)
	}
	if len(s.Actions) != 2 {
		t.Fatalf("%d actions, want 2", len(s.Actions))
	}
	a, b := s.Actions[0], s.Actions[1]
	if a.Text != "Refit the pipe shoe" || a.Priority != "medium" || a.CML != "A1" || a.Component != "Line A" || a.Line != 12 ||
		a.Due.Format("2006-01-02") != "2025-06-01" || !strings.HasPrefix(a.ID, "W-") || len(a.ID) != 8 {
		t.Errorf("first action: %+v", a)
	}
	if b.ID != "DIG" {
		t.Errorf("id: %q, want DIG", b.ID)
	}
	// The derived id depends on the place and the words only.
	again, _ := ParseChecklist("survey.md", []byte(strings.Replace(actionSurvey, "date: 2024-06-01", "date: 2024-07-01", 1)))
	if again.Actions[0].ID != a.ID {
		t.Errorf("derived id changed with the survey date: %s, %s", a.ID, again.Actions[0].ID)
	}
}

func TestWrittenActionProblems(t *testing.T) {
	line := "- action: Refit the pipe shoe; due: 2025-06-01; priority: medium; cml: A1"
	for _, c := range []struct{ name, new, want string }{
		{"no due date", "- action: Refit; priority: medium", "survey.md:12: action: give a due date"},
		{"bad due date", "- action: Refit; due: 1 June 2025; priority: medium", `survey.md:12: action: due "1 June 2025" is not a date`},
		{"due before the survey", "- action: Refit; due: 2024-01-01; priority: medium", "survey.md:12: action: due 2024-01-01 is before the survey date"},
		{"unknown priority", "- action: Refit; due: 2025-06-01; priority: urgent", `survey.md:12: action: priority "urgent" is not one of immediate, high, medium, low`},
		{"unknown key", "- action: Refit; due: 2025-06-01; priority: low; owner: me", `survey.md:12: action: unknown key "owner"`},
		{"unknown CML", "- action: Refit; due: 2025-06-01; priority: low; cml: A9", `survey.md:12: action: cml A9 is not a CML of "Line A"`},
		{"id used twice", "- action: Refit; due: 2025-06-01; priority: low; id: DIG", "survey.md:13: action: id DIG is already used at line 12"},
		{"closure without a date", "- close DIG: soon dug", `survey.md:12: close DIG: "soon" is not a date`},
		{"closure without a note", "- close DIG: 2024-06-01", "survey.md:12: close DIG: say what was done"},
		// Slips that would leave an action open without a sign (common practice).
		{"closure with the colon first", "- close: DIG 2024-06-01 dug", "survey.md:12: this looks like closing an action: write `close ID: DATE what was done`"},
		{"closed for close", "- closed DIG: 2024-06-01 dug", "survey.md:12: this looks like closing an action"},
		{"closure without a colon", "- close DIG 2024-06-01 dug", "survey.md:12: this looks like closing an action"},
		{"a note that starts with closed", "- Closed valve V-3: opened after the test", ""},
		{"id of a computed action", "- action: Refit; due: 2025-06-01; priority: low; id: REQ-A1", "survey.md:12: action: id REQ-A1 starts like the ids of computed actions (REQ-…): choose another, such as W-A1"},
		{"actions for action", "- actions: Refit; due: 2025-06-01; priority: low", "survey.md:12: this looks like an action"},
	} {
		src := strings.Replace(actionSurvey, line, c.new, 1)
		_, problems := ParseChecklist("survey.md", []byte(src))
		if c.want == "" {
			if problems.HasErrors() {
				t.Errorf("%s: want no error, got %v", c.name, problems)
			}
			continue
		}
		found := false
		for _, p := range problems {
			found = found || strings.HasPrefix(p.String(), c.want)
		}
		if !found {
			t.Errorf("%s: want %q, got %v", c.name, c.want, problems)
		}
	}
}

// An action written in one survey carries into the next, which closes it
// or leaves it open; a closure naming no open action is an error.
func TestActionsCarryOver(t *testing.T) {
	root := t.TempDir()
	write := func(dir, src string) string { return writeChecklist(t, root, dir, src) }
	write("2024", actionSurvey)
	next := `---
title: Actions
site: Yard
date: 2026-06-01
inspector: Test
units: mm
previous: ../2024
---
## Line A

- close DIG: 2024-08-15 excavated and measured below grade

| CML | 2026-06-01 |
|---|---|
| A1 | 7.3 |
| A2 | 6.8 |
`
	dir := write("2026", next)
	s, problems := LoadSeries(dir, nil, DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	if len(s.Carried) != 2 {
		t.Fatalf("%d carried, want 2: %+v", len(s.Carried), s.Carried)
	}
	for _, c := range s.Carried {
		switch c.ID {
		case "DIG":
			if c.Closed == nil || c.Closed.Note != "excavated and measured below grade" || c.Closed.Line != 11 {
				t.Errorf("DIG: %+v", c.Closed)
			}
		default:
			if c.Closed != nil || c.Text != "Refit the pipe shoe" {
				t.Errorf("%s should stay open: %+v", c.ID, c)
			}
		}
	}

	// A third survey no longer carries the closed action.
	write("2028", strings.NewReplacer("date: 2026-06-01", "date: 2028-06-01", "../2024", "../2026", "- close DIG: 2024-08-15 excavated and measured below grade\n", "", "2026-06-01", "2028-06-01").Replace(next))
	s3, problems := LoadSeries(filepath.Join(root, "2028"), nil, DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	if len(s3.Carried) != 1 || s3.Carried[0].ID == "DIG" {
		t.Errorf("2028 carries %+v, want only the open action", s3.Carried)
	}

	bad := write("bad", strings.Replace(next, "close DIG:", "close DUG:", 1))
	_, problems = LoadSeries(bad, nil, DefaultOptions)
	want := filepath.Join(bad, ChecklistFile) + ":11: close DUG: no open action of an earlier survey has this id (open: "
	found := false
	for _, p := range problems {
		found = found || strings.HasPrefix(p.String(), want)
	}
	if !found {
		t.Errorf("want %q, got %v", want, problems)
	}
}

// Scope items not done carry: the 2022 survey leaves three not done; 2024
// ticks one and lists another not done again; the third, which 2024 does not
// list, reaches 2024 carried (to be shown overdue) and a later checklist
// that ticks it closes it.
func TestScopeItemsCarryOver(t *testing.T) {
	root := t.TempDir()
	write := func(dir, src string) string { return writeChecklist(t, root, dir, src) }
	survey := func(date, previous, scope string) string {
		prev := ""
		if previous != "" {
			prev = "previous: ../" + previous + "\n"
		}
		return "---\ntitle: Scope\nsite: Yard\ndate: " + date + "\ninspector: Test\nunits: mm\n" + prev + "---\n# Tank\n\n## Shell\n\n- nominal: 8\n- required: 4\n\n" +
			"| CML | " + date + " |\n|---|---|\n| S1 | 7.5 |\n\n" + scope
	}
	write("2022", survey("2022-06-01", "", "- [ ] Magnetic-particle test at N3\n- [ ] Roof plates\n- [ ] Bottom scan\n"))
	dir := write("2024", survey("2024-06-01", "2022", "- [x] Magnetic-particle test at N3\n- [ ] Roof plates\n"))
	s, problems := LoadSeries(dir, nil, DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	bottom, roof := ScopeActionID("Tank", "Shell", "Bottom scan"), ScopeActionID("Tank", "Shell", "Roof plates")
	mpi := ScopeActionID("Tank", "Shell", "Magnetic-particle test at N3")
	if len(s.Carried) != 2 || s.Carried[0].ID != mpi || s.Carried[0].Closed == nil || s.Carried[0].Closed.Line != 20 ||
		s.Carried[1].ID != bottom || !s.Carried[1].FromScope || s.Carried[1].Closed != nil ||
		!s.Carried[1].Raised.Equal(time.Date(2022, 6, 1, 0, 0, 0, 0, time.UTC)) {
		t.Fatalf("2024 carries %+v, want the test at N3 closed by its tick at line 20 and the bottom scan open, raised 2022-06-01", s.Carried)
	}
	if since, ok := s.ScopeSince[roof]; !ok || since.Year() != 2022 {
		t.Errorf("roof plates not done since %v (%v), want 2022", since, ok)
	}
	// 2026 ticks both: the roof plates, left not done in 2022 and 2024, and the
	// bottom scan are closed by their ticks.
	dir = write("2026", survey("2026-06-01", "2024", "- [x] Bottom scan\n- [x] Roof plates\n"))
	s, problems = LoadSeries(dir, nil, DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	if len(s.Carried) != 2 || s.Carried[0].ID != roof || s.Carried[1].ID != bottom ||
		s.Carried[0].Closed == nil || s.Carried[1].Closed == nil || s.Carried[1].Closed.Line != 20 {
		t.Errorf("2026 carries %+v, want the roof plates (not done since 2022) and the bottom scan, both closed by their ticks", s.Carried)
	}
}
