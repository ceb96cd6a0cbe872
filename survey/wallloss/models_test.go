package wallloss

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"
)

// Gauge tolerance (common practice; ASTM E797/E797M-21 on UT thickness
// measurement accuracy): changes within it are
// noise; an increase beyond it is flagged; a reading more than it above
// nominal is suspect; a loss within it over the interval is "no measurable loss".
func TestTolerance(t *testing.T) {
	p := Policy{IntervalCapYears: 10, ToleranceMM: 0.28}
	noise := Assess(Input{Readings: []Reading{{day("2016-04-01"), 9.70}, {day("2021-04-01"), 9.85}}, RequiredMM: ptr(6.0)}, p)
	if noise.HasFlag(FlagThicknessIncrease) || noise.Class != NoMeasurableLoss || !noise.HasFlag(FlagNoMeasurableLoss) {
		t.Errorf("+0.15 mm within 0.28: flags %v class %v", noise.Flags, noise.Class)
	}
	sameDay(t, "no measurable loss: next at the cap", noise.NextInspection, "2031-04-01")
	up := Assess(Input{Readings: []Reading{{day("2016-04-01"), 9.70}, {day("2021-04-01"), 10.05}}, RequiredMM: ptr(6.0)}, p)
	if !up.HasFlag(FlagThicknessIncrease) {
		t.Errorf("+0.35 mm beyond 0.28: flags %v", up.Flags)
	}
	small := Assess(Input{Readings: []Reading{{day("2016-04-01"), 9.70}, {day("2021-04-01"), 9.50}}, RequiredMM: ptr(6.0)}, p)
	if small.Class != NoMeasurableLoss || small.RemainingLifeY != nil {
		t.Errorf("0.20 mm loss within 0.28: class %v life %v, want no measurable loss instead of %0.f years", small.Class, small.RemainingLifeY, 3.5/0.04)
	}
	lost := Assess(Input{Readings: []Reading{{day("2016-04-01"), 9.70}, {day("2021-04-01"), 9.30}}, RequiredMM: ptr(6.0)}, p)
	if lost.Class != FiniteLife {
		t.Errorf("0.40 mm loss: class %v", lost.Class)
	}
	above := Assess(Input{Readings: []Reading{{day("2021-04-01"), 10.40}}, NominalMM: ptr(10.0), RequiredMM: ptr(6.0)}, p)
	if !above.HasFlag(FlagAboveNominal) {
		t.Errorf("reading 0.40 mm above nominal: flags %v", above.Flags)
	}
}

// Regression of thickness on time (HSE RR016 recommends it with three or more
// surveys), worked by hand: (0, 10.00), (3, 9.71), (6, 9.38), (9, 9.12)
// → slope −0.09900 mm/y, SE(slope) 0.003037. gonum's stat.LinearRegression is
// the independent reference for the line.
func TestFitLine(t *testing.T) {
	dates := []string{"2010-01-01", "2013-01-01", "2016-01-01", "2019-01-01"}
	thick := []float64{10.00, 9.71, 9.38, 9.12}
	var rs []Reading
	var xs []float64
	for i, d := range dates {
		rs = append(rs, Reading{day(d), thick[i]})
		xs = append(xs, YearsBetween(day(dates[0]), day(d)))
	}
	f, ok := FitLine(rs)
	if !ok {
		t.Fatal("no fit")
	}
	alpha, beta := stat.LinearRegression(xs, thick, nil, false)
	near(t, "slope vs gonum", &f.Slope, beta, 1e-9)
	near(t, "intercept vs gonum", &f.Intercept, alpha, 1e-9)
	// Published check with whole years (the dates above differ by 1-2 days a span).
	near(t, "slope vs the hand-worked line", &f.Slope, -0.09900, 2e-3)
	// SE(slope) = sqrt(Σe²/(n−2) / Σ(x−x̄)²), computed here from gonum's line.
	var sse, sxx float64
	mx := stat.Mean(xs, nil)
	for i := range xs {
		e := thick[i] - (alpha + beta*xs[i])
		sse += e * e
		sxx += (xs[i] - mx) * (xs[i] - mx)
	}
	near(t, "SE(slope)", &f.SESlope, math.Sqrt(sse/2/sxx), 1e-9)
	near(t, "SE vs the hand-worked line", &f.SESlope, 0.003037, 2e-2)
}

// The one-sided 95 % Student t quantile against gonum's distuv.StudentsT.
func TestStudentT95(t *testing.T) {
	for df := 1; df <= 300; df++ {
		want := distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(df)}.Quantile(0.95)
		got := StudentT95(df)
		if math.Abs(got-want) > 5e-4*want {
			t.Errorf("t(0.95, %d) = %.5f, gonum %.5f", df, got, want)
		}
	}
}

// The fit model: remaining life at the central rate and at the rate's one-sided
// 95 % upper bound (rate + t·SE), checked against gonum.
func TestAssessFit(t *testing.T) {
	rs := []Reading{{day("2010-01-01"), 10.00}, {day("2013-01-01"), 9.71}, {day("2016-01-01"), 9.38}, {day("2019-01-01"), 9.12}}
	res := Assess(Input{Readings: rs, RequiredMM: ptr(6.0), RateModel: ModelFit}, Policy{IntervalCapYears: 10})
	f, _ := FitLine(rs)
	tq := distuv.StudentsT{Mu: 0, Sigma: 1, Nu: 2}.Quantile(0.95)
	near(t, "rate", res.RateMMPerY, -f.Slope, 1e-12)
	near(t, "remaining life", res.RemainingLifeY, (9.12-6)/-f.Slope, 1e-9)
	near(t, "remaining life, lower bound", res.RemainingLifeLowY, (9.12-6)/(-f.Slope+tq*f.SESlope), 1e-3)
	if *res.RemainingLifeLowY >= *res.RemainingLifeY {
		t.Error("lower bound not below the central life")
	}
	// Dates follow the lower bound: next inspection at half of it, at most the cap.
	res = Assess(Input{Readings: rs, RequiredMM: ptr(8.2), RateModel: ModelFit}, Policy{IntervalCapYears: 10})
	sameDay(t, "next inspection", res.NextInspection, AddYears(day("2019-01-01"), *res.RemainingLifeLowY/2).Format("2006-01-02"))
	if *res.RemainingLifeLowY/2 >= 10 {
		t.Fatal("test case should fall under the cap")
	}
	// Two visits: fit falls back to max and says so.
	two := Assess(Input{Readings: rs[:2], RequiredMM: ptr(6.0), RateModel: ModelFit}, Policy{IntervalCapYears: 10})
	if !two.HasFlag(FlagFitNeedsThree) || two.RateModel != ModelMax {
		t.Errorf("two visits with fit: model %s flags %v", two.RateModel, two.Flags)
	}
}

// ISO 9224:2012 §6 long-term model D = r_corr·t^b, linear past 20 years
// (b values from memory), worked by hand for r_corr = 50 µm/a.
func TestISO9224(t *testing.T) {
	for _, c := range []struct{ b, years, want float64 }{
		{0.523, 10, 166.713}, {0.523, 20, 239.557}, {0.523, 30, 302.201}, {0.523, 50, 427.489},
		{0.575, 10, 187.919}, {0.575, 20, 279.938}, {0.575, 30, 360.421}, {0.575, 50, 521.385},
	} {
		got := ISO9224Loss(50, c.b, c.years)
		near(t, "D", &got, c.want, 1e-5)
	}
	zinc := ISO9224Loss(2, 0.813, 30) // zinc, r = 2 µm/a, t = 30 y → 32.130 µm
	near(t, "zinc", &zinc, 32.130, 1e-4)
	// The life function inverts the loss function, before and after 20 years.
	for _, age := range []float64{0, 5, 19, 25} {
		life := ISO9224Life(50, 0.575, age, 300)
		got := ISO9224Loss(50, 0.575, age+life) - ISO9224Loss(50, 0.575, age)
		near(t, "inverse", &got, 300, 1e-9)
	}
	// A single-visit CML in C3 (r_corr ≤ 50 µm/a, ISO 9223 Table 2), 10 years old,
	// 3 mm above required.
	res := Assess(Input{Readings: []Reading{{day("2025-06-01"), 15.0}}, RequiredMM: ptr(12.0), Installed: ptr(day("2015-06-01")),
		Corrosivity: "C3"}, Policy{IntervalCapYears: 10})
	age := YearsBetween(day("2015-06-01"), day("2025-06-01"))
	near(t, "ISO 9224 life", res.RemainingLifeY, ISO9224Life(50, 0.575, age, 3000), 1e-9)
	if res.RateModel != ModelISO9224 || !res.HasFlag(FlagEstimate) {
		t.Errorf("model %s flags %v", res.RateModel, res.Flags)
	}
	near(t, "reported rate recomputes the life", res.RateMMPerY, 3.0 / *res.RemainingLifeY, 1e-12)
	// Zinc (galvanizing): C3 upper first-year rate 2.1 µm/a, b = 0.873.
	zres := Assess(Input{Readings: []Reading{{day("2025-06-01"), 0.100}}, RequiredMM: ptr(0.020), Installed: ptr(day("2015-06-01")),
		Corrosivity: "C3", Metal: Zinc}, Policy{IntervalCapYears: 10})
	near(t, "zinc ISO 9224 life", zres.RemainingLifeY, ISO9224Life(2.1, 0.873, age, 80), 1e-9)
	if _, err := ParseCorrosivity("C7"); err == nil {
		t.Error("C7 accepted")
	}
}

func TestAssumedRate(t *testing.T) {
	res := Assess(Input{Readings: []Reading{{day("2025-06-01"), 8.0}}, RequiredMM: ptr(4.0), AssumedRateMMPerY: ptr(0.2)}, DefaultPolicy)
	near(t, "life", res.RemainingLifeY, 20, 1e-12)
	if res.RateModel != ModelAssumed || !res.HasFlag(FlagEstimate) {
		t.Errorf("model %s flags %v", res.RateModel, res.Flags)
	}
}

// Interval rules against the codes' worked numbers.
func TestIntervalRules(t *testing.T) {
	cases := []struct {
		rule       string
		life, want float64
		source     string
	}{
		// API 510 (10th ed., 2014) §6.5.1.1: RL = 2.5 y < 4 y → min(RL, 2 y) = 2.0 y, not 1.25 y.
		{"API 510", 2.5, 2.0, "API 510"},
		{"API 510", 30, 10, "API 510: lesser of RL/2 and 10 y"},
		{"API 510", 6, 3, "API 510: RL/2"},
		// API 570 Table 2: Class 1 5 y, Class 2 and 3 10 y (API 570 5th ed. 2024: RL 20.275 → 10 y, Class 1 → 5 y).
		{"API 570 class 2", 20.275, 10, "API 570 Table 2"},
		{"API 570 class 1", 20.275, 5, "API 570 Table 2"},
		{"API 570 class 3", 8, 4, "API 570: RL/2"},
		// API 653 (5th ed., 2014) §6.3.3.2: RCA = 0.0318 in, N = 0.0024 in/y → RCA/(2N) = 6.625 y.
		{"API 653 shell", 0.0318 / 0.0024, 6.625, "API 653 §6.3.3.2"},
		{"API 653 shell", 40, 15, "API 653 §6.3.3.2 15-year limit"},
		// API 653 (5th ed., 2014) §4.4.7 and Table 4.4: (0.180 − 0.10)/(0.004 + 0.006) = 8.0 y.
		{"API 653 bottom", (0.180 - 0.10) / 0.010, 8.0, "API 653 §4.4.7"},
		{"API 653 bottom", 25, 20, "API 653: 20 y without RPB"},
		{"fixed 5 years", 12, 5, "owner's fixed interval"},
		{"fixed 5 years", 3, 3, "fixed interval never past the remaining life"},
		{"half life", 30, 10, "lossline default"},
	}
	for _, c := range cases {
		r, err := ParseIntervalRule(c.rule)
		if err != nil {
			t.Fatal(err)
		}
		got, _ := r.Interval(c.life, 10)
		if math.Abs(got-c.want) > 1e-9 {
			t.Errorf("%s, RL %.4g: interval %.4g, want %.4g (%s)", c.rule, c.life, got, c.want, c.source)
		}
	}
	// With a release prevention barrier: (0.180 − 0.05)/0.010 = 13 y (API 653 Table 4.4).
	r := IntervalRule{Kind: RuleAPI653Floor, Barrier: true}
	if got, _ := r.Interval((0.180-0.05)/0.010, 10); math.Abs(got-13) > 1e-9 {
		t.Errorf("bottom with RPB: %v, want 13", got)
	}
	// API 653 §6.3.2.1 external interval RCA/(4N) = 3.3125 y.
	res := Assess(Input{
		Readings:   []Reading{{day("2013-06-01"), 0.375 * in}, {day("2023-06-01"), 0.351 * in}},
		RequiredMM: ptr(0.3192 * in),
		Rule:       &IntervalRule{Kind: RuleAPI653Shell},
	}, Policy{IntervalCapYears: 10})
	life := *res.RemainingLifeY
	sameDay(t, "external", res.NextExternal, AddYears(day("2023-06-01"), life/4).Format("2006-01-02"))
	if math.Abs(life/4-3.3125) > 2e-3 {
		t.Errorf("external interval %.4f y, want 3.3125", life/4)
	}
	if _, err := ParseIntervalRule("API 570 class 5"); err == nil {
		t.Error("class 5 accepted")
	}
}

// A higher rate never gives a longer remaining life (property over many rates).
func TestHigherRateNeverLivesLonger(t *testing.T) {
	prevLife := math.Inf(1)
	for prev := 8.05; prev < 12; prev += 0.05 {
		res := Assess(Input{Readings: []Reading{{day("2020-01-01"), prev}, {day("2025-01-01"), 8.0}}, RequiredMM: ptr(5.0)}, Policy{IntervalCapYears: 10})
		if res.RemainingLifeY == nil {
			continue
		}
		if *res.RemainingLifeY > prevLife+1e-12 {
			t.Fatalf("previous %.2f mm: life %.3f y longer than at a lower rate (%.3f y)", prev, *res.RemainingLifeY, prevLife)
		}
		prevLife = *res.RemainingLifeY
	}
}
