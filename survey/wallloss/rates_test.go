package wallloss

import (
	"math"
	"slices"
	"testing"
	"time"
)

const in = 25.4 // mm per inch, exact

func day(s string) time.Time {
	t, err := time.Parse("2006-01-02", s)
	if err != nil {
		panic(err)
	}
	return t
}

func near(t *testing.T, what string, got *float64, want, relTol float64) {
	t.Helper()
	if got == nil {
		t.Errorf("%s = nil, want %.6g", what, want)
		return
	}
	if math.Abs(*got-want) > relTol*math.Abs(want) {
		t.Errorf("%s = %.7g, want %.7g", what, *got, want)
	}
}

func sameDay(t *testing.T, what string, got *time.Time, want string) {
	t.Helper()
	if got == nil {
		t.Errorf("%s = nil, want %s", what, want)
		return
	}
	if g := got.Format("2006-01-02"); g != want {
		t.Errorf("%s = %s, want %s", what, g, want)
	}
}

// API 570 (5th ed., 2024) §7.1.1 long-term and short-term rate and remaining
// life formulas, worked by hand on a Class 2 CML:
// 0.300 in (2013-06-01), 0.282 in (2018-06-01), 0.246 in (2023-06-01),
// t_required 0.100 in. With years = days/365.25 the spans are 9.99863 y and
// 4.99932 y, so CR_LT = 0.0054007 in/y, CR_ST = 0.0072010 in/y, RL = 20.275 y.
func TestAssessAPI570WorkedExample(t *testing.T) {
	res := Assess(Input{
		Readings: []Reading{
			{day("2013-06-01"), 0.300 * in},
			{day("2018-06-01"), 0.282 * in},
			{day("2023-06-01"), 0.246 * in},
		},
		RequiredMM:  ptr(0.100 * in),
		LatestVisit: day("2023-06-01"),
	}, Policy{IntervalCapYears: 10})
	near(t, "long-term rate", res.RateLongMMPerY, 0.0054007*in, 1e-4)
	near(t, "short-term rate", res.RateShortMMPerY, 0.0072010*in, 1e-4)
	near(t, "governing rate (the larger)", res.RateMMPerY, 0.0072010*in, 1e-4)
	near(t, "remaining life", res.RemainingLifeY, 20.275, 1e-4)
	// Half the remaining life (10.14 y) exceeds the 10-year cap (API 570 Table 2,
	// Class 2): next inspection 2023-06-01 + 10 calendar years.
	sameDay(t, "next inspection", res.NextInspection, "2033-06-01")
	if res.NextBasis.String() != "10-year limit" {
		t.Errorf("next-inspection basis = %q, want the 10-year limit", res.NextBasis)
	}
	// 20 calendar years, then 0.275 y × 365.25 = 100.4 days rounded down.
	sameDay(t, "retirement date", res.Retirement, "2043-09-09")
	if res.Class != FiniteLife || len(res.Flags) != 0 {
		t.Errorf("class %v flags %v, want finite life and no flags", res.Class, res.Flags)
	}

	// The same CML under a 5-year cap (API 570 Table 2, Class 1).
	res = Assess(Input{Readings: []Reading{{day("2013-06-01"), 0.300 * in}, {day("2023-06-01"), 0.246 * in}},
		RequiredMM: ptr(0.100 * in)}, Policy{IntervalCapYears: 5})
	sameDay(t, "class 1 next inspection", res.NextInspection, "2028-06-01")
}

// Nominal thickness at the installed date as the first reading of a CML with
// one visit (common practice, not code text; API 570 §7.1.2 leaves the
// first rate to owner data or early measurements), worked by hand:
// nominal 0.280 in installed 2015-01-01, first reading 0.262 in on 2023-01-01,
// 8.000 y → CR_LT = 0.002250 in/y, tagged nominal-based.
func TestAssessNominalBaseline(t *testing.T) {
	res := Assess(Input{
		Readings:   []Reading{{day("2023-01-01"), 0.262 * in}},
		NominalMM:  ptr(0.280 * in),
		Installed:  ptr(day("2015-01-01")),
		RequiredMM: ptr(0.100 * in),
	}, Policy{IntervalCapYears: 10})
	near(t, "long-term rate", res.RateLongMMPerY, 0.002250*in, 1e-6)
	if res.RateShortMMPerY != nil {
		t.Errorf("short-term rate = %v, want none from a single visit", *res.RateShortMMPerY)
	}
	near(t, "remaining life", res.RemainingLifeY, (0.262-0.100)/0.002250, 1e-6)
	for _, f := range []Flag{FlagSingleVisit, FlagNominalBased} {
		if !res.HasFlag(f) {
			t.Errorf("flags %v lack %s", res.Flags, f)
		}
	}

	// Without an installed date there is no rate (API 570 §7.1.2 asks for
	// a rate from similar service or a second reading instead).
	res = Assess(Input{Readings: []Reading{{day("2023-01-01"), 6.6}}, NominalMM: ptr(7.1), RequiredMM: ptr(3.0)}, DefaultPolicy)
	if res.RateMMPerY != nil || !res.HasFlag(FlagNoRate) || res.RemainingLifeY != nil || res.Class != LifeUnknown {
		t.Errorf("single visit without installed date: %+v", res)
	}
}

// A later reading above an earlier one: no code formula credits growth; the
// rate is taken as zero and, beyond the gauge tolerance, the CML is flagged for
// re-measurement (common practice; HSE Research Report RR016 (2002) advises
// checking scatter against the expected measurement error).
func TestAssessThicknessIncrease(t *testing.T) {
	noTol := Policy{IntervalCapYears: 10}
	res := Assess(Input{
		Readings:   []Reading{{day("2016-04-01"), 9.80}, {day("2021-04-01"), 9.70}, {day("2026-04-01"), 9.75}},
		RequiredMM: ptr(6.0),
	}, noTol)
	if !res.HasFlag(FlagThicknessIncrease) {
		t.Errorf("flags %v lack %s", res.Flags, FlagThicknessIncrease)
	}
	near(t, "short-term rate", res.RateShortMMPerY, 0, 0)
	// Long-term: 0.05 mm over 3652 days.
	near(t, "long-term rate", res.RateLongMMPerY, 0.05/(3652/365.25), 1e-9)
	near(t, "governing rate", res.RateMMPerY, 0.05/(3652/365.25), 1e-9)

	res = Assess(Input{Readings: []Reading{{day("2016-04-01"), 9.70}, {day("2026-04-01"), 9.75}}, RequiredMM: ptr(6.0)}, noTol)
	if res.Class != NoMeasurableLoss || res.Retirement != nil || res.RemainingLifeY != nil {
		t.Errorf("zero rate: class %v retirement %v life %v, want no measurable loss and no dates", res.Class, res.Retirement, res.RemainingLifeY)
	}
	sameDay(t, "zero-rate next inspection (the cap)", res.NextInspection, "2036-04-01")
}

// Current thickness at or below required: remaining life 0 (API 570 §7.1.1
// gives RL ≤ 0; the CML needs action now).
func TestAssessBelowRequired(t *testing.T) {
	for _, cur := range []float64{5.0, 4.9} {
		res := Assess(Input{Readings: []Reading{{day("2020-01-01"), 6.0}, {day("2025-01-01"), cur}}, RequiredMM: ptr(5.0)}, DefaultPolicy)
		near(t, "remaining life", res.RemainingLifeY, 0, 0)
		if !res.HasFlag(FlagBelowRequired) || res.Class != AtOrBelowRequired {
			t.Errorf("t=%v: flags %v class %v", cur, res.Flags, res.Class)
		}
		sameDay(t, "next inspection", res.NextInspection, "2025-01-01")
	}
}

// A thinner wall never lives longer, and a faster loss never lives longer.
func TestAssessMonotonic(t *testing.T) {
	life := func(prev, cur float64) float64 {
		res := Assess(Input{Readings: []Reading{{day("2020-01-01"), prev}, {day("2025-01-01"), cur}}, RequiredMM: ptr(4.0)}, DefaultPolicy)
		if res.RemainingLifeY == nil {
			return math.Inf(1)
		}
		return *res.RemainingLifeY
	}
	lastLife := math.Inf(1)
	for cur := 9.9; cur > 3.5; cur -= 0.1 {
		l := life(10, cur)
		if l > lastLife+1e-12 {
			t.Fatalf("wall %.1f mm lives %.3f y, longer than a thicker wall's %.3f y", cur, l, lastLife)
		}
		lastLife = l
	}
}

func TestAddYears(t *testing.T) {
	for _, c := range []struct {
		from  string
		years float64
		want  string
	}{
		{"2023-06-01", 10, "2033-06-01"},
		{"2024-02-29", 1, "2025-03-01"},   // Go's AddDate normalises Feb 29 + 1 y
		{"2023-06-01", 0.5, "2023-11-30"}, // 182.625 days, rounded down
		{"2023-06-01", 0, "2023-06-01"},
	} {
		got := AddYears(day(c.from), c.years)
		if g := got.Format("2006-01-02"); g != c.want {
			t.Errorf("AddYears(%s, %v) = %s, want %s", c.from, c.years, g, c.want)
		}
	}
}

func TestCompareUrgency(t *testing.T) {
	mk := func(id string, class LifeClass, life float64, cons int) Ranked {
		r := Result{Class: class}
		if class == FiniteLife || class == AtOrBelowRequired {
			r.RemainingLifeY = ptr(life)
		}
		return RankedOf(&r, cons, id)
	}
	items := []Ranked{
		mk("E", LifeUnknown, 0, 4),
		mk("D", NoMeasurableLoss, 0, 1),
		mk("C2", FiniteLife, 7, 2),
		mk("C1", FiniteLife, 7, 3),
		mk("B", FiniteLife, 2, 1),
		mk("A", AtOrBelowRequired, 0, 1),
		mk("A0", AtOrBelowRequired, 0, 1),
	}
	slices.SortFunc(items, CompareUrgency)
	var got []string
	for _, it := range items {
		got = append(got, it.ID)
	}
	want := []string{"A", "A0", "B", "C1", "C2", "D", "E"}
	if !slices.Equal(got, want) {
		t.Errorf("order %v, want %v", got, want)
	}
}
