package wallloss

import (
	"math"
	"time"
)

// Reading is the governing (minimum) thickness of one visit to a CML.
type Reading struct {
	Date        time.Time
	ThicknessMM float64
}

// Input is what the computation needs for one CML.
type Input struct {
	Readings    []Reading // oldest first
	NominalMM   *float64
	RequiredMM  *float64
	Installed   *time.Time
	LatestVisit time.Time // the newest visit of the whole survey
	OutOfScope  bool      // the survey's scope leaves the CML out of its latest visit

	RateModel         RateModel     // "" for the policy's
	Rule              *IntervalRule // nil for the policy's
	AssumedRateMMPerY *float64      // single-visit estimate written by the engineer
	Corrosivity       Corrosivity   // single-visit estimate for atmospheric exposure
	Metal             string        // of the atmospheric estimate: carbon steel (default) or zinc

	OtherRates []OtherRate // coupon and probe rates of the component
	RateSource RateSource  // which of wall, coupon and probe governs; "" for max
}

// Policy holds the settings the computation follows.
type Policy struct {
	IntervalCapYears float64      // cap of the half-life rule
	RateModel        RateModel    // long, short, max or fit
	Rule             IntervalRule // default interval rule
	ToleranceMM      float64      // gauge tolerance: smaller changes are noise
}

// DefaultToleranceMM is the default gauge tolerance: the 95 % bound of the
// difference of two readings each with a standard uncertainty of 0.1 mm,
// 2·√2·0.1 = 0.28 mm (common practice; 0.1 mm is a typical UT gauge accuracy
// on smooth parallel surfaces, from memory).
const DefaultToleranceMM = 0.28

// DefaultPolicy is the policy used when the settings say nothing.
var DefaultPolicy = Policy{IntervalCapYears: 10, RateModel: ModelMax, Rule: IntervalRule{Kind: RuleHalfLife}, ToleranceMM: DefaultToleranceMM}

// LifeClass orders results for ranking.
type LifeClass int

// Life classes, most urgent first.
const (
	AtOrBelowRequired LifeClass = iota // remaining life 0
	FiniteLife                         // a positive rate and a remaining life
	NoMeasurableLoss                   // zero rate: no retirement date
	LifeUnknown                        // no reading, no rate or no required thickness
)

// Result is the outcome for one CML. Nil pointers are values that cannot be computed.
type Result struct {
	ThicknessMM     *float64
	CurrentDate     *time.Time
	RateLongMMPerY  *float64
	RateShortMMPerY *float64
	RateMMPerY      *float64  // the governing rate under the model
	RateModel       RateModel // the model that gave RateMMPerY
	Fit             *LineFit  // the least-squares line, model fit only
	RateUpperMMPerY *float64  // fit: rate at the one-sided 95 % upper bound
	RemainingLifeY  *float64
	// RemainingLifeLowY is the remaining life at the rate's upper 95 % bound (fit only).
	RemainingLifeLowY *float64
	Retirement        *time.Time
	NextInspection    *time.Time
	NextBasis         Basis // what set the next inspection
	NextExternal      *time.Time
	Rule              IntervalRule
	Class             LifeClass
	requiredMM        *float64
	Flags             []Flag

	// With coupon or probe rates: the wall's own rate, what governs
	// ("" for the wall, else "coupon C-1") and why.
	WallRateMMPerY *float64
	RateFrom       string
	RateWhy        string
}

// PlanningLifeY is the remaining life dates and ranking use: the lower bound
// for a fitted rate, else the central value.
func (r Result) PlanningLifeY() *float64 {
	if r.RemainingLifeLowY != nil {
		return r.RemainingLifeLowY
	}
	return r.RemainingLifeY
}

// Assess computes rates, remaining life and dates for one CML.
func Assess(in Input, p Policy) Result {
	r := Result{Class: LifeUnknown, Rule: p.Rule}
	if in.Rule != nil {
		r.Rule = *in.Rule
	}
	model := p.RateModel
	if in.RateModel != "" {
		model = in.RateModel
	}
	if model == "" {
		model = ModelMax
	}
	n := len(in.Readings)
	if n == 0 {
		r.flag(FlagNoReadings)
		r.flag(FlagNoRate)
		return r
	}
	cur := in.Readings[n-1]
	r.ThicknessMM = ptr(cur.ThicknessMM)
	r.CurrentDate = ptr(cur.Date)
	if cur.Date.Before(in.LatestVisit) {
		if in.OutOfScope {
			r.flag(FlagOutOfScope)
		} else {
			r.flag(FlagNotMeasuredLatest)
		}
	}
	if in.NominalMM != nil {
		for _, rd := range in.Readings {
			if rd.ThicknessMM > *in.NominalMM+p.ToleranceMM {
				r.flag(FlagAboveNominal)
			}
		}
	}

	var measurable bool
	if n >= 2 {
		measurable = r.measuredRate(in.Readings, model, p.ToleranceMM)
	} else {
		measurable = r.estimatedRate(in, cur, p.ToleranceMM)
	}
	measurable = r.otherRates(in, measurable)
	if r.RateMMPerY != nil && !measurable {
		r.RateMMPerY = ptr(0.0)
		r.flag(FlagNoMeasurableLoss)
	}
	if r.RateMMPerY == nil {
		r.flag(FlagNoRate)
	}
	if in.RequiredMM == nil {
		r.flag(FlagNoRequired)
		return r
	}
	r.requiredMM = in.RequiredMM
	r.dates(cur, *in.RequiredMM, in, p)
	return r
}

// RequiredMM is the required thickness the result was computed against.
func (r Result) RequiredMM() *float64 { return r.requiredMM }

// measuredRate sets the long- and short-term rates and the governing rate of
// the model; it reports whether that rate is a measurable loss.
func (r *Result) measuredRate(rs []Reading, model RateModel, tol float64) bool {
	n := len(rs)
	first, prev, cur := rs[0], rs[n-2], rs[n-1]
	lt, ltOK := r.rate(first, cur, tol)
	st, stOK := r.rate(prev, cur, tol)
	r.RateLongMMPerY, r.RateShortMMPerY = &lt, &st
	if model == ModelFit {
		if f, ok := FitLine(rs); ok {
			rate := max(-f.Slope, 0)
			span := YearsBetween(first.Date, cur.Date)
			r.Fit, r.RateModel, r.RateMMPerY = &f, ModelFit, ptr(rate)
			upper := rate + StudentT95(f.N-2)*f.SESlope
			r.RateUpperMMPerY = &upper
			return rate*span > tol
		}
		r.flag(FlagFitNeedsThree)
		model = ModelMax
	}
	r.RateModel = model
	switch model {
	case ModelLong:
		r.RateMMPerY = ptr(lt)
		return ltOK
	case ModelShort:
		r.RateMMPerY = ptr(st)
		return stOK
	}
	// max: the larger of the measurable rates.
	switch {
	case ltOK && stOK:
		r.RateMMPerY = ptr(math.Max(lt, st))
	case ltOK:
		r.RateMMPerY = ptr(lt)
	case stOK:
		r.RateMMPerY = ptr(st)
	default:
		r.RateMMPerY = ptr(math.Max(lt, st))
		return false
	}
	return true
}

// estimatedRate sets a single-visit estimate: an assumed rate, else the ISO
// 9224 model for the site's corrosivity, else nominal at the installed date.
func (r *Result) estimatedRate(in Input, cur Reading, tol float64) bool {
	r.flag(FlagSingleVisit)
	switch {
	case in.AssumedRateMMPerY != nil:
		r.RateModel, r.RateMMPerY = ModelAssumed, ptr(*in.AssumedRateMMPerY)
		r.flag(FlagEstimate)
		return *in.AssumedRateMMPerY > 0
	case in.Corrosivity != "":
		// The rate stored is set once the remaining life is known (dates).
		r.RateModel = ModelISO9224
		r.RateMMPerY = ptr(in.Corrosivity.FirstYearRateUM(in.Metal) / 1000)
		r.flag(FlagEstimate)
		return true
	case in.NominalMM != nil && in.Installed != nil && in.Installed.Before(cur.Date):
		rate, ok := r.rate(Reading{Date: *in.Installed, ThicknessMM: *in.NominalMM}, cur, tol)
		r.RateModel, r.RateLongMMPerY, r.RateMMPerY = ModelNominal, ptr(rate), ptr(rate)
		r.flag(FlagNominalBased)
		r.flag(FlagEstimate)
		return ok
	}
	return false
}

// dates sets remaining life, retirement and next inspection.
func (r *Result) dates(cur Reading, requiredMM float64, in Input, p Policy) {
	margin := cur.ThicknessMM - requiredMM
	switch {
	case margin <= 0:
		r.flag(FlagBelowRequired)
		r.Class = AtOrBelowRequired
		r.RemainingLifeY = ptr(0.0)
		r.Retirement, r.NextInspection, r.NextBasis = ptr(cur.Date), ptr(cur.Date), Basis{Kind: BasisNow}
		return
	case r.RateMMPerY == nil:
		if y := r.Rule.NoRateInterval(); y > 0 {
			r.NextInspection, r.NextBasis = ptr(AddYears(cur.Date, y)), Basis{Kind: BasisRateUnknown, Years: y}
			r.NextExternal = ptr(AddYears(cur.Date, 5))
		}
		return
	case *r.RateMMPerY == 0:
		r.Class = NoMeasurableLoss
		y := r.Rule.maxYears(p.IntervalCapYears)
		r.NextInspection, r.NextBasis = ptr(AddYears(cur.Date, y)), Basis{Kind: BasisNoLoss}
		if r.Rule.Kind == RuleAPI653Shell {
			r.NextExternal = ptr(AddYears(cur.Date, 5))
		}
		return
	}
	r.Class = FiniteLife
	var life float64
	if r.RateModel == ModelISO9224 {
		age := 0.0 // unknown exposure age: the start of the curve, where loss is fastest
		if in.Installed != nil {
			age = YearsBetween(*in.Installed, cur.Date)
		}
		life = ISO9224Life(in.Corrosivity.FirstYearRateUM(in.Metal), ISO9224ExponentB(in.Metal), age, margin*1000)
		r.RateMMPerY = ptr(margin / life) // the average rate to retirement, so RL = margin / rate
	} else {
		life = margin / *r.RateMMPerY
	}
	r.RemainingLifeY = ptr(life)
	r.Retirement = ptr(AddYears(cur.Date, life))
	if r.RateUpperMMPerY != nil {
		r.RemainingLifeLowY = ptr(margin / *r.RateUpperMMPerY)
	}
	plan := *r.PlanningLifeY()
	y, basis := r.Rule.Interval(plan, p.IntervalCapYears)
	r.NextInspection, r.NextBasis = ptr(AddYears(cur.Date, y)), basis
	if r.Rule.Kind == RuleAPI653Shell {
		r.NextExternal = ptr(AddYears(cur.Date, min(plan/4, 5)))
	}
}

// rate is the metal-loss rate from a to b in mm/y and whether the loss is
// measurable (larger than the tolerance). A thickness increase counts as zero
// loss; beyond the tolerance it is flagged for re-measurement.
func (r *Result) rate(a, b Reading, tol float64) (float64, bool) {
	loss := a.ThicknessMM - b.ThicknessMM
	if loss < -tol {
		r.flag(FlagThicknessIncrease)
	}
	v := max(loss, 0) / YearsBetween(a.Date, b.Date)
	return v, loss > tol
}

func (r *Result) flag(f Flag) {
	for _, x := range r.Flags {
		if x == f {
			return
		}
	}
	r.Flags = append(r.Flags, f)
}

// FromEarlierVisit reports whether the result's current thickness dates from
// before the survey's latest visit (not re-measured, or out of its scope).
func (r Result) FromEarlierVisit() bool {
	return r.HasFlag(FlagNotMeasuredLatest) || r.HasFlag(FlagOutOfScope)
}

// HasFlag reports whether the result carries flag f.
func (r Result) HasFlag(f Flag) bool {
	for _, x := range r.Flags {
		if x == f {
			return true
		}
	}
	return false
}

func ptr[T any](v T) *T { return &v }
