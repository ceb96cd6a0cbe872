package plan

import (
	"path/filepath"
	"slices"
	"testing"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// What the demo has due: A-03 below required since its reading, girder
// PB-1/G1's two CMLs due now (its section loss is past the engineer's limit), the scope
// items not done since the survey, and T1-04's next inspection on
// 2031-02-19 (half its 8.5-year remaining life, API 653 §6.3.3.2's RCA/(2N);
// checked by hand in cmd/lossline's end-to-end test) only once the window
// reaches it.
func TestDueOfDemo(t *testing.T) {
	s, problems := survey.LoadSeries(filepath.Join("..", "..", "testdata", "demo"), nil, survey.DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	items := survey.Assess(s, wallloss.DefaultPolicy)
	today := day("2026-12-01")
	ds := DueOf("demo", s, items, today, day("2027-06-01"))
	SortDue(ds)
	var kinds []DueKind
	for _, d := range ds {
		kinds = append(kinds, d.Kind)
		if !d.Overdue || d.Date.After(today) {
			t.Errorf("%+v: only overdue items before 2027-06-01", d)
		}
	}
	if n := len(ds); n != 8 || ds[0].Date != day("2026-11-18") || !slices.Contains(kinds, DueBelowRequired) {
		t.Fatalf("due by 2027-06-01: %+v", ds)
	}
	for _, d := range ds {
		if d.Kind == DueBelowRequired && (d.CML != "A-03" || d.Line == 0) {
			t.Errorf("below required: %+v", d)
		}
	}
	later := DueOf("demo", s, items, today, day("2031-03-01"))
	found := false
	for _, d := range later {
		if d.CML == "T1-04" && d.Kind == DueInspection {
			found = d.Date == day("2031-02-19") && !d.Overdue
		}
		if d.Date.After(day("2031-03-01")) {
			t.Errorf("%+v is after the window", d)
		}
	}
	if !found {
		t.Errorf("T1-04's next inspection 2031-02-19 not listed by 2031-03-01")
	}
}
