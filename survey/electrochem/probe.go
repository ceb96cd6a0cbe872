package electrochem

import (
	"errors"
	"fmt"
	"math"
)

// ERSource names the electrical-resistance probe method.
const ERSource = "electrical-resistance probe: loss = span × Δreading / 1000 (generic instrument formula, common practice); rate by least squares"

// ERPoint is one electrical-resistance probe reading: the time since the
// first reading in years and the instrument's reading in divisions (0–1000
// across the probe's span).
type ERPoint struct {
	Years   float64
	Reading float64
}

// ERRate is the metal loss and rate of an electrical-resistance probe.
type ERRate struct {
	LossMM   []float64 // metal loss at each point since the first, mm
	MMPerY   float64   // least-squares slope of loss on time
	TotalMM  float64   // loss from first to last reading, mm
	Consumed float64   // last reading as a fraction of the span
	Working
}

// ERRateOf turns probe readings into metal loss with the generic ER formula
// loss = span × (reading − first reading) / 1000 (the instrument's 0–1000
// divisions cover the span), then fits the rate by ordinary least squares of
// loss on time. spanMM is the probe's span (usable element life) in mm.
func ERRateOf(spanMM float64, pts []ERPoint) (ERRate, error) {
	if spanMM <= 0 {
		return ERRate{}, errors.New("probe span must be positive")
	}
	if len(pts) < 2 {
		return ERRate{}, errors.New("an ER rate needs at least two readings")
	}
	var r ERRate
	r.Source = ERSource
	xs := make([]float64, len(pts))
	for i, p := range pts {
		if p.Reading < 0 || p.Reading > 1000 {
			return ERRate{}, fmt.Errorf("reading %g is outside 0–1000 divisions", p.Reading)
		}
		if i > 0 && p.Years <= pts[i-1].Years {
			return ERRate{}, errors.New("ER readings must be in time order, one per date")
		}
		xs[i] = p.Years - pts[0].Years
		r.LossMM = append(r.LossMM, spanMM*(p.Reading-pts[0].Reading)/1000)
	}
	r.MMPerY = slope(xs, r.LossMM)
	last := pts[len(pts)-1]
	r.TotalMM = r.LossMM[len(r.LossMM)-1]
	r.Consumed = last.Reading / 1000
	r.step("loss = %.4g mm × (%.4g − %.4g) / 1000 = %.4g mm over %.3g y", spanMM, last.Reading, pts[0].Reading, r.TotalMM, xs[len(xs)-1])
	r.step("least-squares slope over %d readings = %.4g mm/y", len(pts), r.MMPerY)
	return r, nil
}

// slope is the ordinary least-squares slope of y on x (x not all equal).
func slope(x, y []float64) float64 {
	var mx, my float64
	for i := range x {
		mx, my = mx+x[i], my+y[i]
	}
	n := float64(len(x))
	mx, my = mx/n, my/n
	var sxy, sxx float64
	for i := range x {
		sxy += (x[i] - mx) * (y[i] - my)
		sxx += (x[i] - mx) * (x[i] - mx)
	}
	return sxy / sxx
}

// DefaultB is the Stern–Geary constant used when no Tafel slopes are given,
// 26 mV (both slopes 120 mV/decade; common practice for actively corroding
// steel).
const DefaultB = 26.0

// SternGearyB is B = βa·βc / (2.303·(βa + βc)) in mV from the anodic and
// cathodic Tafel slopes in mV/decade (Stern and Geary, 1957).
func SternGearyB(betaA, betaC float64) (float64, error) {
	if betaA <= 0 || betaC <= 0 {
		return 0, errors.New("the Tafel slopes must be positive")
	}
	return betaA * betaC / (2.303 * (betaA + betaC)), nil
}

// LPR is one linear-polarisation-resistance measurement.
type LPR struct {
	RpOhmCM2     float64 // polarisation resistance × electrode area, Ω·cm²
	BetaA, BetaC float64 // Tafel slopes, mV/decade; both 0 to use DefaultB
	BmV          float64 // a Stern–Geary constant given directly, mV; overrides the slopes
}

// LPRRate is the corrosion current and rate of an LPR measurement.
type LPRRate struct {
	BmV, ICorr, MMPerY, MPY float64 // ICorr in µA/cm²
	Working
}

// LPRRateOf is Stern–Geary i_corr = B / R_p, then ASTM G102 §5:
// CR = K1·i_corr·EW/ρ with K1 = 3.27×10⁻³ mm·g/(µA·cm·y).
func LPRRateOf(m LPR, a Alloy) (LPRRate, error) {
	if m.RpOhmCM2 <= 0 {
		return LPRRate{}, errors.New("polarisation resistance must be positive")
	}
	var r LPRRate
	r.Source = "Stern–Geary (J. Electrochem. Soc. 104, 1957); ASTM G102-89 (R2015) §5–6"
	if m.BmV > 0 {
		r.BmV = m.BmV
		r.step("B = %.4g mV (given)", r.BmV)
	} else if m.BetaA == 0 && m.BetaC == 0 {
		r.BmV = DefaultB
		r.step("B = %.4g mV (default, no Tafel slopes given)", r.BmV)
	} else {
		b, err := SternGearyB(m.BetaA, m.BetaC)
		if err != nil {
			return LPRRate{}, err
		}
		r.BmV = b
		r.step("B = βa·βc / (2.303(βa+βc)) = %.4g × %.4g / (2.303 × %.4g) = %.4g mV", m.BetaA, m.BetaC, m.BetaA+m.BetaC, b)
	}
	r.ICorr = r.BmV * 1000 / m.RpOhmCM2
	r.step("i_corr = B / R_p = %.4g mV / %.4g Ω·cm² = %.4g µA/cm²", r.BmV, m.RpOhmCM2, r.ICorr)
	g, err := G102Rate(r.ICorr, a)
	if err != nil {
		return LPRRate{}, err
	}
	r.MMPerY, r.MPY = g.MMPerY, g.MPY
	r.Steps = append(r.Steps, g.Steps...)
	return r, nil
}

// G102 is a penetration rate from a corrosion current density.
type G102 struct {
	EW, MMPerY, MPY float64
	Working
}

// G102Rate is ASTM G102 §5: CR = K1·i_corr·EW/ρ, i_corr in µA/cm².
func G102Rate(iCorr float64, a Alloy) (G102, error) {
	if iCorr < 0 || math.IsNaN(iCorr) {
		return G102{}, errors.New("corrosion current must not be negative")
	}
	ew := a.EquivalentWeight()
	g := G102{EW: ew, MMPerY: G102K1 * iCorr * ew / a.DensityG, MPY: G102K1MPY * iCorr * ew / a.DensityG}
	g.Source = "ASTM G102-89 (R2015) §5–6"
	g.step("EW(%s) = 1/Σ(n·f/W) = %.4g g/eq", a.Name, ew)
	g.step("CR = 3.27×10⁻³ × %.4g µA/cm² × %.4g / %.4g g/cm³ = %.4g mm/y", iCorr, ew, a.DensityG, g.MMPerY)
	return g, nil
}
