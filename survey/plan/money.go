package plan

import (
	"math/big"
	"strconv"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// MoneyModel values repairs in money: what a failure costs at each
// consequence level and the discount rate of money over the years.
type MoneyModel struct {
	FailureCost [6]survey.Money // by consequence level 1..5; 0: not given
	DiscountPct float64         // a year, percent
}

// Given reports whether a failure cost is set for the consequence level.
func (m MoneyModel) Given(level int) bool { return m.FailureCost[level] > 0 }

// discount is (1 + r)^−t exactly, with r read from the percentage's shortest
// decimal form (3.5 % is 7/200, not the nearest binary fraction).
func (m MoneyModel) discount(t int) *big.Rat {
	r, ok := new(big.Rat).SetString(strconv.FormatFloat(m.DiscountPct, 'f', -1, 64))
	if !ok {
		r = new(big.Rat)
	}
	base := new(big.Rat).Add(big.NewRat(1, 1), r.Quo(r, big.NewRat(100, 1)))
	d := big.NewRat(1, 1)
	for range t {
		d.Quo(d, base)
	}
	return d
}

// exposure is a component's expected failure cost over the plan, discounted
// to the plan's start: the failure cost times the probability that its worst
// CML first reaches the required thickness in each plan year, charged at the
// end of that year.
type exposure struct {
	Known  bool   // every CML of the component has a probability of breach
	Reason string // why not, when not known
	None   *big.Rat
	// with[y-1] is the expected failure cost with the repair at the start of
	// plan year y: breaches before it, then those of the repaired walls.
	with []*big.Rat
}

// exposureOf works out a candidate's exposure over years plan years.
func exposureOf(c *Candidate, m MoneyModel, tol float64, start time.Time, years int) exposure {
	level := ConsequenceLevel(c.Component.Design.Consequence)
	e := exposure{}
	if !m.Given(level) {
		e.Reason = "no failure cost for consequence " + survey.Consequence(level).String()
		return e
	}
	if c.ResetMM == 0 {
		e.Reason = "no nominal or repair thickness: the repaired walls cannot be projected"
		return e
	}
	ends := YearEnds(start, years)
	worst := make([]float64, years) // P(by the end of year t), worst CML
	var spreads []RateSpread
	var margins []float64 // after the repair: repair thickness − required
	for _, it := range c.CMLs {
		b := BreachOf(it, tol, ends)
		if b.P == nil {
			e.Reason = "CML " + it.CML.ID + ": " + b.Model()
			return e
		}
		for t, p := range b.P {
			worst[t] = max(worst[t], p)
		}
		spreads = append(spreads, b.Spread)
		margins = append(margins, c.ResetMM-*it.Result.RequiredMM())
	}
	fc := new(big.Rat).SetInt64(int64(m.FailureCost[level]))
	d := make([]*big.Rat, years+1)
	for t := range d {
		d[t] = m.discount(t)
	}
	// charge adds fc × (p(t) − p(t−1)) × d(t) for t in from..to (1-based),
	// p(from−1) taken as 0.
	charge := func(sum *big.Rat, p func(t int) float64, from, to int) {
		prev := 0.0
		for t := from; t <= to; t++ {
			cur := p(t)
			if dp := cur - prev; dp > 0 {
				x := new(big.Rat).SetFloat64(dp)
				sum.Add(sum, x.Mul(x, new(big.Rat).Mul(fc, d[t])))
			}
			prev = max(prev, cur)
		}
	}
	e.Known = true
	e.None = new(big.Rat)
	charge(e.None, func(t int) float64 { return worst[t-1] }, 1, years)
	e.with = make([]*big.Rat, years)
	for y := 1; y <= years; y++ {
		sum := new(big.Rat)
		charge(sum, func(t int) float64 { return worst[t-1] }, 1, y-1)
		// After the repair at the start of year y, each wall starts again at
		// the repair thickness with the same rate and its uncertainty.
		at := wallloss.AddYears(start, float64(y-1))
		after := func(t int) float64 {
			var p float64
			for i, s := range spreads {
				p = max(p, s.Reaches(margins[i], wallloss.YearsBetween(at, ends[t-1])))
			}
			return p
		}
		charge(sum, after, y, years)
		e.with[y-1] = sum
	}
	return e
}

// saving is what repairing in plan year y saves in expected money, to the
// cent: the failure cost avoided less the repair cost, both discounted to
// the plan's start (the repair paid at the start of its year).
func (e exposure) saving(cost survey.Money, m MoneyModel, y int) int64 {
	s := new(big.Rat).Sub(e.None, e.with[y-1])
	pv := new(big.Rat).Mul(new(big.Rat).SetInt64(int64(cost)), m.discount(y-1))
	return roundCents(s.Sub(s, pv))
}

// presentCost is a repair cost paid at the start of plan year y, discounted
// to the plan's start.
func presentCost(cost survey.Money, m MoneyModel, y int) *big.Rat {
	return new(big.Rat).Mul(new(big.Rat).SetInt64(int64(cost)), m.discount(y-1))
}

// roundCents rounds an amount in cents to a whole cent, half away from zero.
func roundCents(r *big.Rat) int64 {
	num, den := new(big.Int).Set(r.Num()), r.Denom()
	neg := num.Sign() < 0
	num.Abs(num)
	q, rem := new(big.Int).QuoRem(num, den, new(big.Int))
	if rem.Lsh(rem, 1).Cmp(den) >= 0 {
		q.Add(q, big.NewInt(1))
	}
	if neg {
		q.Neg(q)
	}
	if !q.IsInt64() {
		if neg {
			return -int64(survey.MoneySaturated)
		}
		return int64(survey.MoneySaturated)
	}
	return q.Int64()
}
