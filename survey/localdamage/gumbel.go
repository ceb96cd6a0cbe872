package localdamage

import (
	"errors"
	"fmt"
	"math"
	"slices"
)

// GumbelFit is a largest-extreme-value (Gumbel) distribution fitted to sample
// maxima: F(x) = exp(−exp(−(x − λ)/α)) (Gumbel 1958, Statistics of Extremes),
// λ the location (mode) and α > 0 the scale, both in mm.
type GumbelFit struct {
	Method   string // "least squares, plotting position i/(n+1)" or "maximum likelihood"
	Location float64
	Scale    float64
}

// Quantile is the depth not exceeded with probability p.
func (g GumbelFit) Quantile(p float64) float64 { return g.Location - g.Scale*math.Log(-math.Log(p)) }

// CDF is the probability that a sample maximum is at most x.
func (g GumbelFit) CDF(x float64) float64 { return math.Exp(-math.Exp(-(x - g.Location) / g.Scale)) }

// ReducedVariate is y_T = −ln(−ln(1 − 1/T)), the Gumbel reduced variate of
// return period T (Gumbel 1958; T > 1).
func ReducedVariate(t float64) float64 { return -math.Log(-math.Log(1 - 1/t)) }

// PlottingPosition is the cumulative probability of the i-th smallest of n
// sample maxima on the Gumbel plot, i/(n + 1) (Gumbel 1958), i from 1.
func PlottingPosition(i, n int) float64 { return float64(i) / float64(n+1) }

// checkMaxima refuses samples the fit cannot use: fewer than 3, a depth not
// positive and finite, or all equal.
func checkMaxima(x []float64) error {
	if len(x) < 3 {
		return fmt.Errorf("%d pit-depth samples: the extreme-value fit needs at least 3 (ten or more are usual)", len(x))
	}
	for _, v := range x {
		if !(v > 0) || math.IsInf(v, 0) {
			return errors.New("a pit depth is not a positive number")
		}
	}
	if slices.Min(x) == slices.Max(x) {
		return errors.New("all pit depths are equal: no scale can be fitted")
	}
	return nil
}

// FitLeastSquares fits the Gumbel distribution by ordinary least squares of
// depth on the reduced variate of the plotting position i/(n+1): the slope is
// α and the intercept λ (the Gumbel plot of Gumbel 1958; the method
// for pit depths of Kowaka et al. 1994).
func FitLeastSquares(maxima []float64) (GumbelFit, error) {
	if err := checkMaxima(maxima); err != nil {
		return GumbelFit{}, err
	}
	x := slices.Sorted(slices.Values(maxima))
	y := make([]float64, len(x))
	for i := range x {
		y[i] = -math.Log(-math.Log(PlottingPosition(i+1, len(x))))
	}
	intercept, slope := leastSquares(y, x)
	return GumbelFit{Method: "least squares, plotting position i/(n+1)", Location: intercept, Scale: slope}, nil
}

// leastSquares is the ordinary least-squares line of y on x: y = a + b·x.
func leastSquares(x, y []float64) (a, b float64) {
	mx, my := mean(x), mean(y)
	var sxy, sxx float64
	for i := range x {
		sxy += (x[i] - mx) * (y[i] - my)
		sxx += (x[i] - mx) * (x[i] - mx)
	}
	b = sxy / sxx
	return my - b*mx, b
}

func mean(x []float64) float64 {
	s := 0.0
	for _, v := range x {
		s += v
	}
	return s / float64(len(x))
}

// FitMaximumLikelihood fits the Gumbel distribution by maximum likelihood
// (Gumbel 1958): α solves α = x̄ − Σ xᵢ e^(−xᵢ/α) / Σ e^(−xᵢ/α),
// found by bisection within bounds; then λ = −α ln((1/n) Σ e^(−xᵢ/α)). The
// exponentials are shifted by the smallest depth, which changes neither.
func FitMaximumLikelihood(maxima []float64) (GumbelFit, error) {
	if err := checkMaxima(maxima); err != nil {
		return GumbelFit{}, err
	}
	x := maxima
	m := slices.Min(x)
	avg := mean(x)
	weighted := func(a float64) (wmean, sumE float64) {
		sxe := 0.0
		for _, v := range x {
			e := math.Exp(-(v - m) / a)
			sumE += e
			sxe += v * e
		}
		return sxe / sumE, sumE
	}
	g := func(a float64) float64 { w, _ := weighted(a); return a - avg + w }
	// g < 0 as α → 0 (the weighted mean tends to the minimum), g > 0 for α
	// large (the weighted mean tends to the mean): a root lies between.
	spread := slices.Max(x) - m
	lo, hi := spread*1e-6, spread
	for g(hi) <= 0 {
		hi *= 2
		if hi > spread*1e6 {
			return GumbelFit{}, errors.New("maximum likelihood: no scale found")
		}
	}
	if g(lo) >= 0 {
		return GumbelFit{}, errors.New("maximum likelihood: the samples are too close together to fit a scale")
	}
	for range 200 {
		mid := (lo + hi) / 2
		if g(mid) < 0 {
			lo = mid
		} else {
			hi = mid
		}
		if hi-lo <= 1e-14*hi {
			break
		}
	}
	a := (lo + hi) / 2
	_, sumE := weighted(a)
	loc := m - a*math.Log(sumE/float64(len(x)))
	return GumbelFit{Method: "maximum likelihood", Location: loc, Scale: a}, nil
}

// QuantileStdErr is the asymptotic standard error of the maximum-likelihood
// estimate λ̂ + α̂·y from n samples: α·√((1.1087 + 0.5140·y + 0.6079·y²)/n),
// from the inverse Fisher information of the Gumbel distribution,
// Var(λ̂) = α²(1 + 6(1 − γ)²/π²)/n, Var(α̂) = 6α²/(π²n),
// Cov = 6(1 − γ)α²/(π²n) (Gumbel 1958).
func QuantileStdErr(scale, y float64, n int) float64 {
	c0, c1, c2 := QuantileVarianceCoefficients()
	return scale * math.Sqrt((c0+c1*y+c2*y*y)/float64(n))
}

// QuantileVarianceCoefficients are the three coefficients of the ML quantile
// variance, 1 + 6(1 − γ)²/π², 12(1 − γ)/π² and 6/π².
func QuantileVarianceCoefficients() (c0, c1, c2 float64) {
	const euler = 0.57721566490153286
	p2 := math.Pi * math.Pi
	return 1 + 6*(1-euler)*(1-euler)/p2, 12 * (1 - euler) / p2, 6 / p2
}

// z95 is the two-sided 95 % point of the standard normal distribution.
const z95 = 1.959963984540054

// PitEstimate is the deepest pit expected over a whole area from the deepest
// pits of equal sample areas.
type PitEstimate struct {
	N              int
	ReturnPeriod   float64 // T = total area / sample area
	ReducedVariate float64 // y_T
	LeastSquares   GumbelFit
	MaxLikelihood  GumbelFit
	DepthLSMM      float64 // x_T by least squares
	DepthMLMM      float64 // x_T by maximum likelihood
	StdErrMLMM     float64 // asymptotic standard error of the ML x_T
	LowerMLMM      float64 // ML x_T − 1.96·SE
	UpperMLMM      float64 // ML x_T + 1.96·SE (95 % two-sided band)
	DepthMM        float64 // the estimate used: the larger of the two fits
	Steps          []string
}

// EstimateDeepestPit fits both estimators and extrapolates to the return
// period T = totalArea/sampleArea (Kowaka et al. 1994; ASTM G46 points to
// extreme-value analysis of pit depths). The estimate used is the deeper of
// the two fits; the band is the ML quantile ± 1.96 standard errors.
func EstimateDeepestPit(maxima []float64, sampleArea, totalArea float64) (PitEstimate, error) {
	var e PitEstimate
	if !(sampleArea > 0) || !(totalArea > 0) || math.IsInf(totalArea, 0) {
		return e, errors.New("sample area and total area must be positive")
	}
	if covered := sampleArea * float64(len(maxima)); covered > totalArea {
		return e, fmt.Errorf("the samples cover %.4g, more than the total area %.4g", covered, totalArea)
	}
	ls, err := FitLeastSquares(maxima)
	if err != nil {
		return e, err
	}
	ml, err := FitMaximumLikelihood(maxima)
	if err != nil {
		return e, err
	}
	t := totalArea / sampleArea
	if t <= 1 {
		return e, errors.New("the total area must be larger than one sample area")
	}
	y := ReducedVariate(t)
	e = PitEstimate{N: len(maxima), ReturnPeriod: t, ReducedVariate: y, LeastSquares: ls, MaxLikelihood: ml}
	e.DepthLSMM = ls.Location + ls.Scale*y
	e.DepthMLMM = ml.Location + ml.Scale*y
	e.StdErrMLMM = QuantileStdErr(ml.Scale, y, len(maxima))
	e.LowerMLMM = e.DepthMLMM - z95*e.StdErrMLMM
	e.UpperMLMM = e.DepthMLMM + z95*e.StdErrMLMM
	e.DepthMM = max(e.DepthLSMM, e.DepthMLMM)
	e.Steps = []string{
		fmt.Sprintf("T = total area / sample area = %.6g / %.6g = %.4g", totalArea, sampleArea, t),
		fmt.Sprintf("y_T = −ln(−ln(1 − 1/T)) = %.4f", y),
		fmt.Sprintf("least squares (plotting position i/(n+1), n = %d): α = %.4f mm, λ = %.4f mm; x_T = λ + α·y_T = %.3f mm", len(maxima), ls.Scale, ls.Location, e.DepthLSMM),
		fmt.Sprintf("maximum likelihood: α = %.4f mm, λ = %.4f mm; x_T = %.3f mm", ml.Scale, ml.Location, e.DepthMLMM),
		fmt.Sprintf("95 %% band of the ML x_T: ± 1.96 × α·√((1.1087 + 0.5140·y_T + 0.6079·y_T²)/n) = ± 1.96 × %.3f = %.3f to %.3f mm", e.StdErrMLMM, e.LowerMLMM, e.UpperMLMM),
		fmt.Sprintf("deepest pit used: the larger of the two fits, %.3f mm", e.DepthMM),
	}
	return e, nil
}

// PitLife is the remaining ligament under the estimated deepest pit and the
// time until it reaches the required thickness and the far surface.
type PitLife struct {
	LigamentMM       float64  // wall − deepest pit
	LigamentUpperMM  float64  // wall − the upper 95 % bound
	TimeToRequiredY  *float64 // nil without a growth rate or required thickness; 0 when reached
	TimeToPerforateY *float64 // nil without a growth rate
	Steps            []string
}

// PitRemaining works out the ligament under the deepest pit estimate e and,
// at a pit growth rate (mm/y, > 0; 0 for none known), the time to the
// required thickness (≤ 0: none) and to penetration.
func PitRemaining(e PitEstimate, wallMM, requiredMM, growthMMPerY float64) (PitLife, error) {
	var p PitLife
	if !(wallMM > 0) {
		return p, errors.New("the wall thickness must be positive")
	}
	if growthMMPerY < 0 || math.IsNaN(growthMMPerY) {
		return p, errors.New("the pit growth rate must not be negative")
	}
	p.LigamentMM = wallMM - e.DepthMM
	p.LigamentUpperMM = wallMM - e.UpperMLMM
	p.Steps = append(p.Steps, fmt.Sprintf("ligament = wall − deepest pit = %.3f − %.3f = %.3f mm (at the upper 95 %% bound %.3f mm)", wallMM, e.DepthMM, p.LigamentMM, p.LigamentUpperMM))
	if growthMMPerY == 0 {
		return p, nil
	}
	perf := max(p.LigamentMM, 0) / growthMMPerY
	p.TimeToPerforateY = &perf
	p.Steps = append(p.Steps, fmt.Sprintf("time to penetration = ligament / growth rate = %.3f / %.4g = %.1f y", max(p.LigamentMM, 0), growthMMPerY, perf))
	if requiredMM > 0 {
		req := max(p.LigamentMM-requiredMM, 0) / growthMMPerY
		p.TimeToRequiredY = &req
		p.Steps = append(p.Steps, fmt.Sprintf("time to required = (ligament − required) / growth rate = (%.3f − %.3f) / %.4g = %.1f y", p.LigamentMM, requiredMM, growthMMPerY, req))
	}
	return p, nil
}

// PitGrowthRate is the rate of deepening of the deepest pit estimate between
// two visits years apart (mm/y), never negative.
func PitGrowthRate(earlier, later PitEstimate, years float64) (float64, error) {
	if !(years > 0) {
		return 0, errors.New("the earlier pit samples must be dated before this visit")
	}
	return max(later.DepthMM-earlier.DepthMM, 0) / years, nil
}
