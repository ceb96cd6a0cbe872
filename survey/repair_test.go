package survey

import (
	"math"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey/wallloss"
)

const repairSurvey = `---
title: Repair
site: Yard
date: 2025-01-01
inspector: Test
units: mm
---
## Shell

- nominal: 12.0
- required: 6.0
- rate model: long
- repaired: 2021-01-01; new 12.0; at C1; plate replaced

| CML | 2015-01-01 | 2020-01-01 | 2025-01-01 |
|---|---|---|---|
| C1 | 10.0 | 9.0 | 11.6 |
| C2 | 10.0 | 9.0 | 8.2 |
`

// The long-term corrosion rate is (t_previous − t_actual) / years between
// (API 570, 4th ed. 2016, 7.1.1.1, from memory); after a replacement the new
// plate's thickness is the baseline (common practice). Hand-worked:
//   - C1 before the repair, 2015-01-01 to 2020-01-01 (1826 days = 4.9993 y):
//     (10.0 − 9.0) / 4.9993 = 0.20003 mm/y;
//   - C1 after it, 2021-01-01 to 2025-01-01 (1461 days = 4.0000 y):
//     (12.0 − 11.6) / 4.0 = 0.1000 mm/y, remaining life (11.6 − 6.0) / 0.1 = 56 y;
//   - C2, not repaired, 2015-01-01 to 2025-01-01 (3653 days = 10.0014 y):
//     (10.0 − 8.2) / 10.0014 = 0.17998 mm/y.
func TestRepairStartsANewSeries(t *testing.T) {
	s, problems := ParseChecklist("survey.md", []byte(repairSurvey))
	if problems = append(problems, ComputeRequired(s)...); len(problems) != 0 {
		t.Fatal(problems)
	}
	rep := s.Assets[0].Components[0].Design.Repairs
	if len(rep) != 1 || *rep[0].NewMM != 12.0 || rep[0].What != "plate replaced" || rep[0].Line != 13 || rep[0].CMLs[0] != "C1" {
		t.Fatalf("repair read as %+v", rep)
	}
	items := Assess(s, wallloss.DefaultPolicy)
	got := map[string]wallloss.Result{}
	for _, it := range items {
		got[it.CML.ID] = it.Result
	}
	near := func(name string, v *float64, want, tol float64) {
		t.Helper()
		if v == nil || math.Abs(*v-want) > tol {
			t.Errorf("%s = %v, want %g", name, v, want)
		}
	}
	near("C1 rate after the repair", got["C1"].RateMMPerY, 0.1000, 5e-5)
	near("C1 remaining life", got["C1"].RemainingLifeY, 56.0, 0.05)
	if got["C1"].HasFlag(wallloss.FlagThicknessIncrease) {
		t.Error("C1: the reading before the repair was compared with the one after it")
	}
	near("C2 rate (no repair)", got["C2"].RateMMPerY, 0.17998, 5e-5)

	// At the 2020 visit the repair had not happened: all readings count.
	c, m := s.Assets[0].Components[0], s.Assets[0].Components[0].CMLs[0]
	in := inputFor(Located{Asset: s.Assets[0], Component: c, CML: m}, m.Visits[:2], m.Visits[1].Date.Time)
	before := wallloss.Assess(in, wallloss.DefaultPolicy)
	near("C1 rate before the repair", before.RateMMPerY, 0.20003, 5e-5)

	iv := intervalRates(c, m)
	if len(iv) != 1 || iv[0].Start.Format("2006-01-02") != "2021-01-01" || math.Abs(iv[0].RateMMPerY-0.1) > 5e-5 {
		t.Errorf("C1 intervals %+v, want one from the repair at 0.1 mm/y", iv)
	}
	if n, r := UsedReadings(c, m, s.Date); n != 2 || r == nil {
		t.Errorf("readings left out: %d, want 2", n)
	}
}

func TestRepairProblems(t *testing.T) {
	for _, c := range []struct{ name, new, want string }{
		{"bad date", "- repaired: 1.1.2021; new 12.0", `survey.md:13: repaired: "1.1.2021" is not a date`},
		{"bad thickness", "- repaired: 2021-01-01; new 12,0", "survey.md:13: repaired: new:"},
		{"after the survey", "- repaired: 2025-06-01; new 12.0", "survey.md:13: repaired: 2025-06-01 is after the survey date 2025-01-01"},
		{"unknown CML", "- repaired: 2021-01-01; new 12.0; at C9", `survey.md:13: repaired: CML C9 is not a CML of "Shell"`},
		// Slips that would silently restart a CML's rates (common practice:
		// a repair dated before the item existed, or a thickness a third or
		// three times the nominal, is a typing slip; the ratio is the
		// plausibility warnings' one).
		{"before installed", "- installed: 2010-01\n- repaired: 2005-01-01; new 12.0; at C1", "survey.md:14: repaired: 2005-01-01 is before the component was installed (2010-01)"},
		{"new in inches", "- repaired: 2021-01-01; new 0.47; at C1", "survey.md:13: repaired: new 0.47 mm is not within a third to 3 times the nominal 12 mm"},
		{"new ten times", "- repaired: 2021-01-01; new 120; at C1", "survey.md:13: repaired: new 120 mm is not within a third to 3 times the nominal 12 mm"},
	} {
		src := strings.Replace(repairSurvey, "- repaired: 2021-01-01; new 12.0; at C1; plate replaced", c.new, 1)
		_, problems := ParseChecklist("survey.md", []byte(src))
		found := false
		for _, p := range problems {
			found = found || strings.HasPrefix(p.String(), c.want)
		}
		if !found {
			t.Errorf("%s: want %q, got %v", c.name, c.want, problems)
		}
	}
}

// A repair dated before every reading of its CMLs makes its thickness the
// start of their rates: warned, so a slip in the year shows.
func TestRepairBeforeTheReadings(t *testing.T) {
	for _, c := range []struct{ name, new, want string }{
		{"before the first reading", "- repaired: 2010-01-01; new 12.0; at C1", "survey.md:13: warning: repaired: 2010-01-01 is before the first reading of C1 (2015-01-01)"},
		{"between readings", "- repaired: 2021-01-01; new 12.0; at C1", ""},
	} {
		src := strings.Replace(repairSurvey, "- repaired: 2021-01-01; new 12.0; at C1; plate replaced", c.new, 1)
		s, problems := ParseChecklist("survey.md", []byte(src))
		if problems.HasErrors() {
			t.Fatalf("%s: %v", c.name, problems)
		}
		got := repairBeforeReadings(s)
		switch {
		case c.want == "" && len(got) > 0:
			t.Errorf("%s: want no warning, got %v", c.name, got)
		case c.want != "":
			wantProblem(t, c.name, got, c.want)
		}
	}
}
