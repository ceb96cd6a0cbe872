package plan

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// The finite series of Abramowitz and Stegun 26.7.3/26.7.4 against gonum's
// Student t (distuv.StudentsT, an independent implementation through the
// regularized incomplete beta function), and Φ against distuv.Normal.
func TestStudentTAgainstGonum(t *testing.T) {
	for _, nu := range []int{1, 2, 3, 4, 5, 6, 7, 10, 11, 29, 30, 31, 60, 121} {
		ref := distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(nu)}
		for _, x := range []float64{-40, -6.3, -3, -2.015, -1, -0.3, 0, 0.1, 0.7, 1.5, 2.353, 4, 9, 55} {
			got, want := studentTCDF(x, nu), ref.CDF(x)
			if math.Abs(got-want) > 1e-12 {
				t.Errorf("t CDF(%v; %d) = %.15g, gonum %.15g", x, nu, got, want)
			}
		}
	}
	// The one-sided 95 % quantiles of the t table (NIST/SEMATECH e-Handbook
	// §1.3.6.7.2) fall at 0.95 to the table's three decimals.
	for nu, q := range map[int]float64{1: 6.314, 2: 2.920, 5: 2.015, 10: 1.812, 30: 1.697} {
		if p := studentTCDF(q, nu); math.Abs(p-0.95) > 2e-4 {
			t.Errorf("t CDF(%v; %d) = %v, want 0.95", q, nu, p)
		}
	}
	n := distuv.Normal{Mu: 0, Sigma: 1}
	for _, x := range []float64{-38, -8, -1.96, -0.5, 0, 0.5, 1.6448536269514722, 3, 8} {
		if got, want := normalCDF(x), n.CDF(x); math.Abs(got-want) > 1e-15*math.Max(1, 1/want) {
			t.Errorf("Φ(%v) = %.17g, gonum %.17g", x, got, want)
		}
	}
}

func readingsOf(days []string, mm ...float64) []wallloss.Reading {
	out := make([]wallloss.Reading, len(days))
	for i, d := range days {
		out[i] = wallloss.Reading{Date: day(d), ThicknessMM: mm[i]}
	}
	return out
}

// Two visits: the rate's standard uncertainty is √2·σ/Δt with σ = tol/(2√2),
// normal (the gauge error of each reading, HSE RR016 (2002) on the scatter of
// ultrasonic thickness readings); checked against gonum's normal CDF and a
// Monte Carlo draw of the two readings' errors within its standard error.
func TestBreachTwoVisits(t *testing.T) {
	rs := readingsOf([]string{"2016-05-20", "2026-05-20"}, 10.0, 9.0)
	s := SpreadOf(rs, 0.28)
	dt := wallloss.YearsBetween(rs[0].Date, rs[1].Date)
	sigma := 0.28 / (2 * math.Sqrt2)
	if s.Kind != SpreadNormal || math.Abs(s.Rate-1/dt) > 1e-12 || math.Abs(s.Scale-math.Sqrt2*sigma/dt) > 1e-15 {
		t.Fatalf("spread %+v", s)
	}
	margin := 1.0 // 9.0 over required 8.0
	for _, years := range []float64{1, 5, 9, 10, 12, 20} {
		need := margin / years
		want := 1 - distuv.Normal{Mu: 1 / dt, Sigma: math.Sqrt2 * sigma / dt}.CDF(need)
		if got := s.Reaches(margin, years); math.Abs(got-want) > 1e-12 {
			t.Errorf("%g years: %v, gonum %v", years, got, want)
		}
		// Monte Carlo: each reading off by N(0, σ); the rate they give reaches need.
		rng := rand.New(rand.NewPCG(11, uint64(years)))
		const n = 200_000
		hits := 0
		for range n {
			rate := (rs[0].ThicknessMM + sigma*rng.NormFloat64() - rs[1].ThicknessMM - sigma*rng.NormFloat64()) / dt
			if rate >= need {
				hits++
			}
		}
		p := float64(hits) / n
		se := math.Sqrt(max(want*(1-want), 1e-6) / n)
		if math.Abs(p-want) > 4*se {
			t.Errorf("%g years: Monte Carlo %v ± %v, computed %v", years, p, se, want)
		}
	}
}

// Three or more visits: the least-squares slope with Student t on n − 2
// degrees of freedom; checked against gonum's Student t and a Monte Carlo
// draw of t = Z/√(χ²/ν) built from normal variates.
func TestBreachFit(t *testing.T) {
	rs := readingsOf([]string{"2011-05-20", "2014-06-01", "2018-05-10", "2021-05-18", "2026-05-20"}, 12.1, 11.7, 11.5, 11.0, 10.9)
	s := SpreadOf(rs, 0.28)
	f, _ := wallloss.FitLine(rs)
	if s.Kind != SpreadStudentT || s.DOF != 3 || s.Rate != -f.Slope || s.Scale != f.SESlope {
		t.Fatalf("spread %+v, fit %+v", s, f)
	}
	margin := 10.9 - 9.6
	rng := rand.New(rand.NewPCG(5, 7))
	for _, years := range []float64{1, 3, 10, 15, 25} {
		need := margin / years
		ref := distuv.StudentsT{Mu: s.Rate, Sigma: s.Scale, Nu: 3}
		want := 1 - ref.CDF(need)
		got := s.Reaches(margin, years)
		if math.Abs(got-want) > 1e-12 {
			t.Errorf("%g years: %v, gonum %v", years, got, want)
		}
		const n = 200_000
		hits := 0
		for range n {
			var chi2 float64
			for range 3 {
				z := rng.NormFloat64()
				chi2 += z * z
			}
			if s.Rate+s.Scale*rng.NormFloat64()/math.Sqrt(chi2/3) >= need {
				hits++
			}
		}
		p := float64(hits) / n
		se := math.Sqrt(max(want*(1-want), 1e-6) / n)
		if math.Abs(p-want) > 4*se {
			t.Errorf("%g years: Monte Carlo %v ± %v, computed %v", years, p, se, want)
		}
	}
	// Readings on a straight line scatter less than the gauge resolves: the
	// slope's error is then the gauge's, σ/√Σ(t − t̄)², normal.
	line := readingsOf([]string{"2016-01-01", "2021-01-01", "2026-01-01"}, 10, 9.5, 9)
	s = SpreadOf(line, 0.28)
	var stt float64
	mean := (0 + wallloss.YearsBetween(line[0].Date, line[1].Date) + wallloss.YearsBetween(line[0].Date, line[2].Date)) / 3
	for _, r := range line {
		d := wallloss.YearsBetween(line[0].Date, r.Date) - mean
		stt += d * d
	}
	if s.Kind != SpreadNormal || math.Abs(s.Scale-0.28/(2*math.Sqrt2)/math.Sqrt(stt)) > 1e-15 {
		t.Errorf("collinear readings: %+v", s)
	}
}

// Per plan year: a single visit has no probability; at or below required it is 1;
// probabilities never fall from one year to the next.
func TestBreachOf(t *testing.T) {
	mk := func(req float64, rs []wallloss.Reading) *survey.Assessed {
		m := &survey.CML{ID: "X"}
		for _, r := range rs {
			m.Visits = append(m.Visits, survey.Visit{Date: survey.VisitDate{Time: r.Date}, ReadingsMM: []float64{r.ThicknessMM}})
		}
		res := wallloss.Assess(wallloss.Input{Readings: rs, RequiredMM: &req, NominalMM: f(12)}, wallloss.DefaultPolicy)
		return &survey.Assessed{CML: m, Result: res}
	}
	start := day("2026-05-20")
	by := YearEnds(start, 3)
	if by[0] != day("2027-05-20") || by[2] != day("2029-05-20") {
		t.Fatalf("year ends %v", by)
	}
	one := BreachOf(mk(8, readingsOf([]string{"2026-05-20"}, 9)), 0.28, by)
	if one.P != nil || one.Model() != "single-visit estimate: no probability" {
		t.Errorf("single visit: %+v", one)
	}
	below := BreachOf(mk(9.5, readingsOf([]string{"2016-05-20", "2026-05-20"}, 10, 9.4)), 0.28, by)
	if !below.Reached || below.P[0] != 1 || below.Model() != "at or below required" {
		t.Errorf("below required: %+v", below)
	}
	b := BreachOf(mk(8.8, readingsOf([]string{"2016-05-20", "2026-05-20"}, 10, 9)), 0.28, by)
	// 0.2 mm above required at 0.1 mm/y (σ_rate = 0.014 mm/y): the mean wall
	// reaches it in two years, so about half by the end of year 2.
	if b.P == nil || !(b.P[0] < 1e-6 && math.Abs(b.P[1]-0.5) < 0.01 && b.P[2] > 0.99) {
		t.Errorf("two visits, 0.2 mm above required at 0.1 mm/y: %v", b.P)
	}
	// The same CML whose life a coupon's faster rate governs: the wall
	// readings' spread does not describe that rate, so no probability (it
	// would understate the chance of reaching required).
	c := mk(8.8, readingsOf([]string{"2016-05-20", "2026-05-20"}, 10, 9))
	c.Result.RateFrom = "coupon C-1"
	if cb := BreachOf(c, 0.28, by); cb.P != nil || cb.Model() != "the coupon C-1 rate governs: no probability (the wall readings' spread does not describe that rate)" {
		t.Errorf("coupon rate governs: %+v, %q", cb.P, cb.Model())
	}
}
