package findings

import (
	"fmt"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

var testWordUnits = WordUnits{
	Thickness: func(mm float64) string { return fmt.Sprintf("%.2f mm", mm) },
	Rate:      func(r float64) string { return fmt.Sprintf("%.3f mm/y", r) },
}

func summarizeChecklist(t *testing.T, src string) SummaryWords {
	t.Helper()
	s, problems := survey.ParseChecklist("survey.md", []byte(src))
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	return Compute(s, Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25}).Summarize(testWordUnits)
}

const wordsFront = "---\ntitle: t\nsite: Test yard\ninspector: i\nunits: mm\ndate: 2021-05-01\n---\n"

// The expected rates and lives follow API 570 (4th ed., 2016) §7.1.1:
// corrosion rate = (t_initial − t_actual) / years between readings, remaining
// life = (t_actual − t_required) / rate; years are days / 365.25 (common practice).
func TestSummaryWordsUrgentAndDue(t *testing.T) {
	w := summarizeChecklist(t, wordsFront+"# Tank A\n\n## Shell\n\n- nominal: 8\n- required: 5\n\n"+
		"| CML | 2016-05-01 | 2021-05-01 |\n|---|---|---|\n"+
		// 6.00 → 4.80 mm over 1826 days (4.999 y): 0.240 mm/y, below the 5.00 mm required.
		"| X-1 | 6.0 | 4.8 |\n"+
		// Y-1: 6.50 → 5.50 mm: 0.200 mm/y, remaining life 0.50 / 0.2000 = 2.5 years.
		"| Y-1 | 6.5 | 5.5 |\n"+
		// Z-1: 7.00 → 6.96 mm: 0.008 mm/y, remaining life 1.96 / 0.0080 = 244.9 years.
		"| Z-1 | 7.0 | 6.96 |\n\n"+
		"- [x] Readings at every CML\n- [ ] Roof plates (no access)\n\n"+
		// 8.00 → 7.90 mm: 0.020 mm/y, remaining life 2.90 / 0.0200 = 145 years; next
		// inspection at the lesser of half the remaining life (the API 570 half-life interval, from memory) and the 10-year cap of lossline's default rule.
		"# Tank B\n\n## Roof\n\n- nominal: 8\n- required: 5\n\n| CML | 2016-05-01 | 2021-05-01 |\n|---|---|---|\n| R-1 | 8.0 | 7.9 |\n")
	urgent := strings.Join(w.Urgent, " ")
	for _, want := range []string{
		"CML X-1 on Tank A / Shell is at or below its required thickness: 4.80 mm measured on 2021-05-01 against 5.00 mm required, losing 0.240 mm/y.",
		"1 CML has under 5 years of remaining life: Y-1 (2.5 years).",
	} {
		if !strings.Contains(urgent, want) {
			t.Errorf("urgent %q lacks %q", urgent, want)
		}
	}
	due := strings.Join(w.Due, " ")
	// X-1 is due now; the component's next inspection is its earliest CML's.
	for _, want := range []string{
		"Inspection due now, on or before the survey date 2021-05-01: Tank A / Shell (CML X-1).",
		"Next inspections, soonest first: Tank B / Roof by 2031-05-01 (CML R-1).",
		"Repair windows: now (at or below required): X-1; 2 to 5 years: Y-1; the other 2 CMLs have 10 years or more, or show no measurable loss.",
	} {
		if !strings.Contains(due, want) {
			t.Errorf("due %q lacks %q", due, want)
		}
	}
	if got := strings.Join(w.NotDone, " "); got != "Not covered by the results: Tank A / Shell: Roof plates (no access)." {
		t.Errorf("not done: %q", got)
	}
	// Two visits each: the previous visit is the first reading, with no rate.
	if len(w.Changed) == 0 || !strings.HasPrefix(w.Changed[0], "Since the previous visit (4 CMLs compared), 1 CML crossed the required thickness (X-1)") {
		t.Errorf("changed: %q", w.Changed)
	}
}

// An accelerating CML is named with its latest interval's rate against its
// long-term rate (API 570 §7.1.1 long- and short-term rates).
func TestSummaryWordsAccelerating(t *testing.T) {
	w := summarizeChecklist(t, wordsFront+"# Line L\n\n## Run 1\n\n- nominal: 10\n- required: 5\n\n"+
		"| CML | 2011-05-01 | 2016-05-01 | 2021-05-01 |\n|---|---|---|---|\n"+
		// 10.0 → 9.9 → 9.0 mm: long-term 1.0 / 10.001 y = 0.100 mm/y; latest 0.9 / 4.999 y = 0.180 mm/y (+80 %).
		"| L-1 | 10.0 | 9.9 | 9.0 |\n")
	changed := strings.Join(w.Changed, " ")
	want := "1 CML is corroding faster than before: L-1 (0.180 mm/y over the latest interval against 0.100 mm/y long-term)"
	if !strings.Contains(changed, want) {
		t.Errorf("changed %q lacks %q", changed, want)
	}
	if got := strings.Join(w.Urgent, " "); !strings.Contains(got, "No CML is at or below its required thickness.") ||
		!strings.Contains(got, "No CML has under 5 years of remaining life; the shortest is L-1 with") {
		t.Errorf("urgent: %q", got)
	}
	if got := strings.Join(w.NotDone, " "); got != "Every item of the scope checklists was done." {
		t.Errorf("not done: %q", got)
	}
}

// A first survey says there is nothing to compare, and no sentence claims a change.
func TestSummaryWordsFirstVisit(t *testing.T) {
	w := summarizeChecklist(t, wordsFront+"# Tank A\n\n## Shell\n\n- nominal: 8\n- required: 5\n\n"+
		"| CML | 2021-05-01 |\n|---|---|\n| X-1 | 7.9 |\n")
	if len(w.Changed) != 1 || w.Changed[0] != "No CML has an earlier visit to compare with: every rate is a single-visit estimate." {
		t.Errorf("changed: %q", w.Changed)
	}
	// One reading and no assumed rate: no remaining life, and no sentence
	// counts the CML among those with 10 years or more.
	if due := strings.Join(w.Due, " "); !strings.Contains(due, "Repair windows: unknown (no remaining life can be computed): X-1.") {
		t.Errorf("due: %q", due)
	}
}

// The same findings give the same words.
func TestSummaryWordsDeterministic(t *testing.T) {
	f := demo(t, Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25})
	a, b := f.Summarize(testWordUnits).Sentences(), f.Summarize(testWordUnits).Sentences()
	if strings.Join(a, "\n") != strings.Join(b, "\n") || len(a) == 0 {
		t.Errorf("two runs differ or are empty:\n%v\n%v", a, b)
	}
}

// Local damage and cathodic protection are named under Urgent whatever the
// wall readings say: a member past its engineer's section-loss limit (the I
// section by hand, parallel-axis theorem: bottom flange 20 → 16 mm loses
// 6.41 % of the area, past 5 %), and a test point whose instant-off
// potential −815 mV CSE misses −850 mV (NACE SP0169-2013 §6.2.2.1) with
// 70 mV of polarisation, short of 100 mV. The next shortest wall life is the
// shortest among all CMLs, not the second in the ranking.
func TestSummaryWordsLocalDamageAndProtection(t *testing.T) {
	src := wordsFront + "# Bridge\n\n## Girder\n\n- nominal: 20\n- required: 15\n- member: I\n" +
		"  - depth: 600 mm\n  - top flange: 300 x 20\n  - web: 12\n  - bottom flange: 300 x 20\n" +
		"  - measured bottom flange: 16\n  - allowed loss: 5 % of area\n  - set by: A. Engineer\n\n" +
		"| CML | 2016-05-01 | 2021-05-01 |\n|---|---|---|\n| G-1 | 20.0 | 19.9 |\n\n" +
		"## Shell\n\n- nominal: 8\n- required: 5\n\n| CML | 2016-05-01 | 2021-05-01 |\n|---|---|---|\n| S-1 | 7.0 | 6.5 |\n\n" +
		"# CP\n\n## Bed\n\n| test point | date | electrode | on (mV) | off (mV) | native (mV) |\n|---|---|---|---|---|---|\n" +
		"| TP-2 | 2021-05-01 | CSE | -930 | -815 | -745 |\n"
	s, problems := survey.ParseChecklist("survey.md", []byte(src))
	problems = append(problems, survey.ComputeRequired(s)...)
	problems = append(problems, survey.ComputeElectro(s)...)
	if problems = append(problems, survey.ComputeLocal(s)...); problems.HasErrors() {
		t.Fatal(problems)
	}
	w := Compute(s, Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25}).Summarize(testWordUnits)
	urgent := strings.Join(w.Urgent, " ")
	for _, want := range []string{
		// S-1: 0.5 mm in 5.0 y = 0.100 mm/y; (6.5 − 5)/0.1 = 15.0 y, shorter than G-1's (19.9 − 15)/0.02 = 245 y.
		"the shortest is S-1 with 15.0 years",
		"Local damage on Bridge / Girder has reached its limit (section loss of a member (I shape): loss area 6.4 %",
		"Cathodic protection: 1 test point does not meet its criterion at the latest visit: TP-2 on CP / Bed (not protected).",
	} {
		if !strings.Contains(urgent, want) {
			t.Errorf("urgent %q lacks %q", urgent, want)
		}
	}
}
