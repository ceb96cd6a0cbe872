package wallloss

import "testing"

// The projection is the remaining-life line of API 570 (5th ed., 2024)
// §7.1.1 read forwards, on the worked example of TestAssessAPI570WorkedExample:
// 0.246 in on 2023-06-01 at CR_ST = 0.0072010 in/y. To 2026-06-01 is 1096
// days (2024 is a leap year), 3.000684 y: 0.246 − 0.0072010 × 3.000684 =
// 0.224392 in (by hand). At the end of the remaining life (20.275 y) the
// line reaches t_required, 0.100 in.
func TestProjected(t *testing.T) {
	res := Assess(Input{
		Readings: []Reading{
			{day("2013-06-01"), 0.300 * in},
			{day("2018-06-01"), 0.282 * in},
			{day("2023-06-01"), 0.246 * in},
		},
		RequiredMM:  ptr(0.100 * in),
		LatestVisit: day("2023-06-01"),
	}, Policy{IntervalCapYears: 10})
	near(t, "projected to 2026-06-01", res.Projected(day("2026-06-01")), 0.224392*in, 1e-5)
	near(t, "projected to the retirement date", res.Projected(*res.Retirement), 0.100*in, 1e-3)
	near(t, "projected to a day before the reading", res.Projected(day("2020-01-01")), 0.246*in, 1e-12)
	near(t, "projected far beyond the wall", res.Projected(day("2100-01-01")), 0, 0)
	if got := (Result{}).Projected(day("2026-06-01")); got != nil {
		t.Errorf("no reading: projected %v", *got)
	}
	noRate := Assess(Input{Readings: []Reading{{day("2023-06-01"), 10}}, LatestVisit: day("2023-06-01")}, DefaultPolicy)
	if got := noRate.Projected(day("2026-06-01")); got != nil {
		t.Errorf("a single visit without an estimate: projected %v", *got)
	}
}
