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
}

// Policy holds the settings the computation follows.
type Policy struct {
	// IntervalCapYears is the longest interval to the next inspection.
	IntervalCapYears float64
}

// DefaultPolicy is the policy used when the settings say nothing.
var DefaultPolicy = Policy{IntervalCapYears: 10}

// LifeClass orders results for ranking.
type LifeClass int

// Life classes, most urgent first.
const (
	AtOrBelowRequired LifeClass = iota // remaining life 0
	FiniteLife                         // a positive rate and a remaining life
	NoMeasurableLoss                   // zero rate: no retirement date
	LifeUnknown                        // no reading, no rate or no required thickness
)

// Flags: stable codes written to results and shown in the report.
const (
	FlagBelowRequired     = "below-required"
	FlagThicknessIncrease = "thickness-increase"
	FlagSingleVisit       = "single-visit"
	FlagNominalBased      = "nominal-based"
	FlagNoRate            = "no-rate"
	FlagNoRequired        = "no-required"
	FlagNoReadings        = "no-readings"
	FlagNotMeasuredLatest = "not-remeasured"
)

// Result is the outcome for one CML. Nil pointers are values that cannot be computed.
type Result struct {
	ThicknessMM     *float64
	CurrentDate     *time.Time
	RateLongMMPerY  *float64
	RateShortMMPerY *float64
	RateMMPerY      *float64 // the governing rate: the larger of long and short
	RemainingLifeY  *float64
	Retirement      *time.Time
	NextInspection  *time.Time
	NextBasis       string // why the next inspection falls when it does
	Class           LifeClass
	Flags           []string
}

// Next-inspection bases.
const (
	BasisHalfLife = "half-life"
	BasisCap      = "cap"
	BasisNow      = "now"
)

// Assess computes rates, remaining life and dates for one CML.
func Assess(in Input, p Policy) Result {
	var r Result
	r.Class = LifeUnknown
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
		r.flag(FlagNotMeasuredLatest)
	}

	switch {
	case n >= 2:
		first, prev := in.Readings[0], in.Readings[n-2]
		r.RateLongMMPerY = r.rate(first, cur)
		r.RateShortMMPerY = r.rate(prev, cur)
	default:
		r.flag(FlagSingleVisit)
		if in.NominalMM != nil && in.Installed != nil && in.Installed.Before(cur.Date) {
			r.RateLongMMPerY = r.rate(Reading{Date: *in.Installed, ThicknessMM: *in.NominalMM}, cur)
			r.flag(FlagNominalBased)
		}
	}
	switch {
	case r.RateLongMMPerY != nil && r.RateShortMMPerY != nil:
		r.RateMMPerY = ptr(math.Max(*r.RateLongMMPerY, *r.RateShortMMPerY))
	case r.RateLongMMPerY != nil:
		r.RateMMPerY = ptr(*r.RateLongMMPerY)
	default:
		r.flag(FlagNoRate)
	}

	if in.RequiredMM == nil {
		r.flag(FlagNoRequired)
		return r
	}
	margin := cur.ThicknessMM - *in.RequiredMM
	switch {
	case margin <= 0:
		r.flag(FlagBelowRequired)
		r.Class = AtOrBelowRequired
		r.RemainingLifeY = ptr(0.0)
		r.Retirement = ptr(cur.Date)
		r.NextInspection = ptr(cur.Date)
		r.NextBasis = BasisNow
	case r.RateMMPerY == nil:
		// no rate: nothing more can be said
	case *r.RateMMPerY == 0:
		r.Class = NoMeasurableLoss
		r.NextInspection = ptr(AddYears(cur.Date, p.IntervalCapYears))
		r.NextBasis = BasisCap
	default:
		r.Class = FiniteLife
		life := margin / *r.RateMMPerY
		r.RemainingLifeY = ptr(life)
		r.Retirement = ptr(AddYears(cur.Date, life))
		if life/2 < p.IntervalCapYears {
			r.NextInspection = ptr(AddYears(cur.Date, life/2))
			r.NextBasis = BasisHalfLife
		} else {
			r.NextInspection = ptr(AddYears(cur.Date, p.IntervalCapYears))
			r.NextBasis = BasisCap
		}
	}
	return r
}

// rate is the metal-loss rate from a to b in mm/y; an increase counts as zero
// loss and is flagged for re-measurement.
func (r *Result) rate(a, b Reading) *float64 {
	v := (a.ThicknessMM - b.ThicknessMM) / YearsBetween(a.Date, b.Date)
	if v < 0 {
		r.flag(FlagThicknessIncrease)
		v = 0
	}
	return &v
}

func (r *Result) flag(f string) {
	for _, x := range r.Flags {
		if x == f {
			return
		}
	}
	r.Flags = append(r.Flags, f)
}

// HasFlag reports whether the result carries flag f.
func (r Result) HasFlag(f string) bool {
	for _, x := range r.Flags {
		if x == f {
			return true
		}
	}
	return false
}

func ptr[T any](v T) *T { return &v }
