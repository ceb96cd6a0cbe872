package plan

import (
	"fmt"
	"math"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// SpreadKind is the distribution a CML's corrosion rate is taken to follow.
type SpreadKind int

// Spread kinds.
const (
	SpreadNone      SpreadKind = iota // no readings, or a required thickness missing
	SpreadEstimate                    // one visit: the rate is an estimate, no probability
	SpreadOtherRate                   // a coupon or probe rate governs: the wall readings' spread does not describe it
	SpreadNormal                      // normal: two visits, or a fit whose scatter is below the gauge's
	SpreadStudentT                    // Student t: the least-squares fit through three or more visits
)

// RateSpread is a corrosion rate and its uncertainty: the rate R (mm/y, loss
// positive) is Rate + Scale·X with X standard normal or Student t with DOF
// degrees of freedom.
type RateSpread struct {
	Kind  SpreadKind
	Rate  float64 // centre, mm/y; negative when the readings grow
	Scale float64 // standard error of the rate, mm/y
	DOF   int     // Student t only
	N     int     // visits it rests on
	From  string  // SpreadOtherRate only: the coupon or probe whose rate governs
}

// Exceeds is P(R ≥ need): the probability that the true rate is at least need.
// A zero scale makes it 0 or 1.
func (s RateSpread) Exceeds(need float64) float64 {
	switch {
	case s.Kind < SpreadNormal:
		return math.NaN()
	case s.Scale == 0:
		if s.Rate >= need {
			return 1
		}
		return 0
	case s.Kind == SpreadStudentT:
		return studentTCDF((s.Rate-need)/s.Scale, s.DOF)
	}
	return normalCDF((s.Rate - need) / s.Scale)
}

// Reaches is the probability that a wall marginMM above its required
// thickness reaches it within years at the spread's rate.
func (s RateSpread) Reaches(marginMM, years float64) float64 {
	switch {
	case s.Kind < SpreadNormal:
		return math.NaN()
	case marginMM <= 0:
		return 1
	case years <= 0:
		return 0
	}
	return s.Exceeds(marginMM / years)
}

// Describe names the model in words for the report.
func (s RateSpread) Describe() string {
	switch s.Kind {
	case SpreadEstimate:
		return "single-visit estimate: no probability"
	case SpreadOtherRate:
		return "the " + s.From + " rate governs: no probability (the wall readings' spread does not describe that rate)"
	case SpreadNormal:
		if s.N > 2 {
			return fmt.Sprintf("least-squares fit of %d visits, normal with the gauge's error: rate %.4f ± %.4f mm/y", s.N, s.Rate, s.Scale)
		}
		return fmt.Sprintf("two visits, normal with the gauge tolerance on both readings: rate %.4f ± %.4f mm/y", s.Rate, s.Scale)
	case SpreadStudentT:
		return fmt.Sprintf("least-squares fit of %d visits, Student t with %d degrees of freedom: rate %.4f ± %.4f mm/y", s.N, s.DOF, s.Rate, s.Scale)
	}
	return "no probability (no readings or no required thickness)"
}

// GaugeSigmaMM is the standard uncertainty of one reading implied by a gauge
// tolerance: the tolerance is the 95 % bound of the difference of two
// readings, 2·√2·σ (see wallloss.DefaultToleranceMM), so σ = tol/(2√2).
func GaugeSigmaMM(tolMM float64) float64 { return tolMM / (2 * math.Sqrt2) }

// SpreadOf is the uncertainty of a CML's rate from its governing readings
// (oldest first). Two visits: the rate (t₁ − t₂)/Δt with each reading's
// standard uncertainty σ from the gauge tolerance, so σ_rate = √2·σ/Δt
// (normal). Three or more: the least-squares slope with its standard error
// and n − 2 degrees of freedom (Student t), or, where the readings scatter
// less about the line than the gauge can resolve, the slope's error from the
// gauge alone, σ/√Σ(t − t̄)² (normal). One visit: an estimate.
func SpreadOf(readings []wallloss.Reading, tolMM float64) RateSpread {
	n := len(readings)
	sigma := GaugeSigmaMM(tolMM)
	switch {
	case n == 0:
		return RateSpread{Kind: SpreadNone}
	case n == 1:
		return RateSpread{Kind: SpreadEstimate}
	case n == 2:
		a, b := readings[0], readings[1]
		dt := wallloss.YearsBetween(a.Date, b.Date)
		if dt <= 0 {
			return RateSpread{Kind: SpreadNone}
		}
		return RateSpread{Kind: SpreadNormal, Rate: (a.ThicknessMM - b.ThicknessMM) / dt, Scale: math.Sqrt2 * sigma / dt, N: 2}
	}
	f, ok := wallloss.FitLine(readings)
	if !ok {
		return RateSpread{Kind: SpreadNone}
	}
	var st float64
	for _, r := range readings {
		st += wallloss.YearsBetween(readings[0].Date, r.Date)
	}
	mt := st / float64(n)
	var stt float64
	for _, r := range readings {
		d := wallloss.YearsBetween(readings[0].Date, r.Date) - mt
		stt += d * d
	}
	gauge := sigma / math.Sqrt(stt)
	if f.SESlope < gauge {
		return RateSpread{Kind: SpreadNormal, Rate: -f.Slope, Scale: gauge, N: n}
	}
	return RateSpread{Kind: SpreadStudentT, Rate: -f.Slope, Scale: f.SESlope, DOF: f.N - 2, N: n}
}

// Breach is the probability that a CML's wall reaches its required thickness
// by the end of each plan year, from the current reading and the rate's
// uncertainty. P is nil when there is no probability (see Spread.Kind).
type Breach struct {
	Spread   RateSpread
	Reached  bool       // at or below required at the current reading
	MarginMM *float64   // current reading − required
	From     *time.Time // date of the current reading
	By       []time.Time
	P        []float64
}

// Model says in words what the probabilities rest on.
func (b Breach) Model() string {
	if b.Reached {
		return "at or below required"
	}
	if b.MarginMM == nil && b.Spread.Kind != SpreadNone {
		return "no required thickness: no probability"
	}
	return b.Spread.Describe()
}

// BreachOf is a CML's probability of reaching its required thickness by each
// of the dates by (the ends of the plan years), with its governing readings
// and the gauge tolerance.
func BreachOf(it *survey.Assessed, tolMM float64, by []time.Time) Breach {
	b := Breach{Spread: SpreadOf(survey.RateReadings(it.Component, it.CML), tolMM), By: by}
	r := it.Result
	if r.RateFrom != "" {
		// A coupon's or probe's rate governs the life: a probability from the
		// wall's slower rate would understate the chance of reaching required.
		b.Spread = RateSpread{Kind: SpreadOtherRate, From: r.RateFrom}
	}
	req := r.RequiredMM()
	if r.ThicknessMM == nil || req == nil {
		return b
	}
	m := *r.ThicknessMM - *req
	b.MarginMM, b.From = &m, r.CurrentDate
	b.Reached = r.Class == wallloss.AtOrBelowRequired
	if !b.Reached && b.Spread.Kind < SpreadNormal {
		return b
	}
	b.P = make([]float64, len(by))
	for i, t := range by {
		if b.Reached {
			b.P[i] = 1
			continue
		}
		b.P[i] = b.Spread.Reaches(m, wallloss.YearsBetween(*r.CurrentDate, t))
	}
	return b
}

// Readings are a CML's governing readings, oldest first: the inputs of its
// rates.
func Readings(m *survey.CML) []wallloss.Reading {
	out := make([]wallloss.Reading, len(m.Visits))
	for i, v := range m.Visits {
		out[i] = wallloss.Reading{Date: v.Date.Time, ThicknessMM: v.Governing()}
	}
	return out
}

// YearEnds are the ends of n plan years from start.
func YearEnds(start time.Time, n int) []time.Time {
	out := make([]time.Time, max(n, 1))
	for i := range out {
		out[i] = wallloss.AddYears(start, float64(i+1))
	}
	return out
}
