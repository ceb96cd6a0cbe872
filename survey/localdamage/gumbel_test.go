package localdamage

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"
)

// tenMaxima are ten invented sample maxima (mm) of 0.05 m² each on a 50 m²
// item (T = 1000), used with values derived independently (recomputed by
// hand and with gonum's stat.LinearRegression and distuv.GumbelRight).
var tenMaxima = []float64{0.82, 1.05, 0.91, 1.23, 0.77, 1.12, 0.98, 1.41, 0.88, 1.02}

func TestGumbelFitsDerived(t *testing.T) {
	e, err := EstimateDeepestPit(tenMaxima, 0.05, 50)
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name      string
		got, want float64
		source    string
	}{
		{"T", e.ReturnPeriod, 1000, "T = S/s, Shibata 1994 (J. Res. NIST 99(4)); Kowaka et al. 1994"},
		{"y_T", e.ReducedVariate, 6.90726, "y = −ln(−ln(1 − 1/T)), Gumbel 1958"},
		{"LS α", e.LeastSquares.Scale, 0.194166, "derived: OLS on i/(n+1), Gumbel 1958"},
		{"LS λ", e.LeastSquares.Location, 0.922847, "derived: OLS on i/(n+1)"},
		{"LS x_T", e.DepthLSMM, 2.26400, "derived; gonum GumbelRight.Quantile(0.999)"},
		{"ML α", e.MaxLikelihood.Scale, 0.146151, "derived: ML equations, Gumbel 1958"},
		{"ML λ", e.MaxLikelihood.Location, 0.933035, "derived"},
		{"ML x_T", e.DepthMLMM, 1.94254, "derived; gonum GumbelRight.Quantile(0.999)"},
		{"used", e.DepthMM, 2.26400, "the deeper of the two (our rule)"},
	}
	for _, tc := range tests {
		if !near(tc.got, tc.want, 1e-5) {
			t.Errorf("%s = %.6f, want %.6f (%s)", tc.name, tc.got, tc.want, tc.source)
		}
	}
	if !near(e.UpperMLMM-e.DepthMLMM, 1.959964*e.StdErrMLMM, 1e-6) || !(e.LowerMLMM < e.DepthMLMM) {
		t.Errorf("band %v..%v around %v", e.LowerMLMM, e.UpperMLMM, e.DepthMLMM)
	}
}

// Our quantile and CDF agree with gonum's distuv.GumbelRight (Mu = λ, Beta =
// α), and the least-squares line with gonum's stat.LinearRegression.
func TestGumbelAgainstGonum(t *testing.T) {
	x := slices.Sorted(slices.Values(tenMaxima))
	y := make([]float64, len(x))
	for i := range x {
		y[i] = -math.Log(-math.Log(PlottingPosition(i+1, len(x))))
	}
	wantLoc, wantScale := stat.LinearRegression(y, x, nil, false)
	if ls, _ := FitLeastSquares(tenMaxima); !near(ls.Location, wantLoc, 1e-12) || !near(ls.Scale, wantScale, 1e-12) {
		t.Errorf("least squares λ %v α %v, gonum %v %v", ls.Location, ls.Scale, wantLoc, wantScale)
	}
	for _, fit := range []func([]float64) (GumbelFit, error){FitLeastSquares, FitMaximumLikelihood} {
		g, err := fit(tenMaxima)
		if err != nil {
			t.Fatal(err)
		}
		ref := distuv.GumbelRight{Mu: g.Location, Beta: g.Scale}
		for _, p := range []float64{0.1, 0.5, 0.9, 0.99, 0.999, 0.9999} {
			if !near(g.Quantile(p), ref.Quantile(p), 1e-12) {
				t.Errorf("%s Quantile(%v) = %v, gonum %v", g.Method, p, g.Quantile(p), ref.Quantile(p))
			}
		}
		for _, x := range []float64{0.5, 1, 1.5, 2.5} {
			if !near(g.CDF(x), ref.CDF(x), 1e-12) {
				t.Errorf("%s CDF(%v) = %v, gonum %v", g.Method, x, g.CDF(x), ref.CDF(x))
			}
		}
		// x_T is the quantile 1 − 1/T.
		yT := ReducedVariate(1000)
		if !near(g.Location+g.Scale*yT, ref.Quantile(1-1.0/1000), 1e-12) {
			t.Errorf("%s: λ + α·y_T differs from gonum's quantile", g.Method)
		}
	}
}

// The ML estimate maximises the log-likelihood, summed with gonum's LogProb.
func TestMaximumLikelihoodIsMaximum(t *testing.T) {
	g, _ := FitMaximumLikelihood(tenMaxima)
	ll := func(mu, beta float64) float64 {
		d := distuv.GumbelRight{Mu: mu, Beta: beta}
		s := 0.0
		for _, x := range tenMaxima {
			s += d.LogProb(x)
		}
		return s
	}
	best := ll(g.Location, g.Scale)
	for _, d := range [][2]float64{{1e-3, 0}, {-1e-3, 0}, {0, 1e-3}, {0, -1e-3}, {1e-3, 1e-3}, {-1e-3, -1e-3}} {
		if ll(g.Location+d[0], g.Scale+d[1]) >= best {
			t.Errorf("log-likelihood at %+v not below the fit's", d)
		}
	}
}

// Simulation: samples drawn from a known Gumbel distribution (gonum, fixed
// seed) give back its parameters; both estimators are consistent.
func TestGumbelRecoversKnownParameters(t *testing.T) {
	src := rand.NewPCG(15, 1994)
	d := distuv.GumbelRight{Mu: 0.9, Beta: 0.15, Src: src}
	x := make([]float64, 4000)
	for i := range x {
		x[i] = d.Rand()
	}
	for _, fit := range []func([]float64) (GumbelFit, error){FitLeastSquares, FitMaximumLikelihood} {
		g, err := fit(x)
		if err != nil {
			t.Fatal(err)
		}
		if !near(g.Location, 0.9, 0.01) || !near(g.Scale, 0.15, 0.04) {
			t.Errorf("%s: λ %v α %v, want 0.9 and 0.15", g.Method, g.Location, g.Scale)
		}
	}
}

// The asymptotic 95 % band of the ML quantile covers the true quantile in
// about 95 % of repeated samples (n = 30, T = 100; fixed seed), and its
// standard error matches the spread of the estimates.
func TestQuantileBandCoverage(t *testing.T) {
	src := rand.NewPCG(7, 46)
	d := distuv.GumbelRight{Mu: 1, Beta: 0.2, Src: src}
	const reps, n, T = 1000, 30, 100.0
	truth := d.Quantile(1 - 1/T)
	covered := 0
	var est []float64
	x := make([]float64, n)
	for range reps {
		for i := range x {
			x[i] = d.Rand()
		}
		e, err := EstimateDeepestPit(x, 1, T)
		if err != nil {
			t.Fatal(err)
		}
		if e.LowerMLMM <= truth && truth <= e.UpperMLMM {
			covered++
		}
		est = append(est, e.DepthMLMM)
	}
	if c := float64(covered) / reps; c < 0.88 || c > 0.98 {
		t.Errorf("coverage %.3f, want about 0.95", c)
	}
	mean, ss := 0.0, 0.0
	for _, v := range est {
		mean += v / reps
	}
	for _, v := range est {
		ss += (v - mean) * (v - mean)
	}
	sd := math.Sqrt(ss / (reps - 1))
	if se := QuantileStdErr(0.2, ReducedVariate(T), n); !near(sd, se, 0.15) {
		t.Errorf("spread of ML x_T %.4f, asymptotic SE %.4f", sd, se)
	}
}

// The coefficients of the ML quantile variance, α²(1.1087 + 0.5140·y +
// 0.6079·y²)/n, as tabulated for the Gumbel distribution in hydrology texts
// (NERC Flood Studies Report 1975, vol. I; from memory).
func TestQuantileVarianceCoefficients(t *testing.T) {
	c0, c1, c2 := QuantileVarianceCoefficients()
	for _, c := range []struct{ got, want float64 }{{c0, 1.1087}, {c1, 0.5140}, {c2, 0.6079}} {
		if math.Abs(c.got-c.want) > 5e-5 {
			t.Errorf("coefficient %.5f, want %.4f", c.got, c.want)
		}
	}
}

func TestGumbelRefusals(t *testing.T) {
	for _, tc := range []struct {
		name        string
		x           []float64
		sample, all float64
	}{
		{"two samples", []float64{1, 2}, 1, 100},
		{"all equal", []float64{1, 1, 1, 1}, 1, 100},
		{"negative depth", []float64{1, -1, 2}, 1, 100},
		{"NaN depth", []float64{1, math.NaN(), 2}, 1, 100},
		{"samples cover more than the area", []float64{1, 2, 3}, 40, 100},
		{"no sample area", []float64{1, 2, 3}, 0, 100},
	} {
		if _, err := EstimateDeepestPit(tc.x, tc.sample, tc.all); err == nil {
			t.Errorf("%s: accepted", tc.name)
		}
	}
}

func TestPitRemaining(t *testing.T) {
	e := PitEstimate{DepthMM: 2.0, UpperMLMM: 2.5}
	// Hand calculation (common practice): ligament 8 − 2 = 6 mm; at 0.2 mm/y
	// 30 y to penetration and (6 − 2.54)/0.2 = 17.3 y to 0.10 in (API 653
	// Table 4.4 limit).
	p, err := PitRemaining(e, 8, 2.54, 0.2)
	if err != nil {
		t.Fatal(err)
	}
	if p.LigamentMM != 6 || p.LigamentUpperMM != 5.5 || !near(*p.TimeToPerforateY, 30, 1e-12) || !near(*p.TimeToRequiredY, 17.3, 1e-12) {
		t.Errorf("got %+v", p)
	}
	if p, _ := PitRemaining(e, 8, 2.54, 0); p.TimeToPerforateY != nil {
		t.Error("a time without a growth rate")
	}
	if _, err := PitRemaining(e, 8, 0, -1); err == nil {
		t.Error("negative growth accepted")
	}
	r, _ := PitGrowthRate(PitEstimate{DepthMM: 1.5}, PitEstimate{DepthMM: 2.1}, 6)
	if !near(r, 0.1, 1e-12) {
		t.Errorf("growth %v, want 0.1", r)
	}
	if r, _ := PitGrowthRate(PitEstimate{DepthMM: 2.5}, PitEstimate{DepthMM: 2.1}, 6); r != 0 {
		t.Errorf("a shallower estimate gave growth %v", r)
	}
}
