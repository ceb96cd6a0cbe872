package plan

import (
	"fmt"
	"math/big"
	"slices"

	"github.com/lossline/lossline/survey"
)

// CurvePoint is a step of the budget curve: from Budget on (up to the next
// point) the first year's selection removes Removed.
type CurvePoint struct {
	Budget  survey.Money // first-year budget: the mandatory repairs' money plus Money
	Money   survey.Money // the money the selection is given
	Removed int64        // risk removed (risk-years over several years)
	Exact   bool
	Bound   float64 // an upper bound on the most removable at Money (Removed when exact)
}

// Curve is the risk the first year's selection removes as a function of its
// money: the question "what does the next amount buy".
type Curve struct {
	Points []CurvePoint
	// Steps: the value holds from each point to the next exactly, so the
	// curve is exact at every budget. Otherwise only the points are known.
	Steps  bool
	Method string       // how it was computed, in words
	Grid   survey.Money // the cost grid's step: the greatest common divisor of the costs
	// GridSteps and ValueSteps are the sizes of the two exact tables: steps
	// of the cost grid up to Total, and risk values up to their sum.
	GridSteps, ValueSteps int64
	Forced                survey.Money // the year's mandatory repairs, paid before the selection
	Money                 survey.Money // the money the plan's selection had in year 1
	AtMoney               int64        // what the curve gives there
	Total                 survey.Money // the money that funds every repair worth something
	Knee                  int          // index into Points; -1 when there is none
	RiskYear              bool         // values are risk-years (a plan over several years)
}

// Curve methods.
const (
	CurveCostGrid  = "dynamic programming over the cost grid"
	CurveRiskSteps = "dynamic programming over risk values (least cost of removing each amount of risk)"
	CurveSampled   = "branch and bound at evenly spaced amounts"
	curveGridLimit = 4_000_000 // cost grid steps held in memory
	curveGridSmall = 100_000   // a cost grid this fine is used whatever the values
	curveSamples   = 60
)

// BudgetCurve is the plan's budget curve: its selection candidates of year 1
// (the funded and deferred rows) valued as in year 1, the mandatory repairs
// of that year paid first. When the year's mandatory repairs exceed its
// budget, the curve starts once all of them are paid.
func (p Plan) BudgetCurve() Curve {
	var items []Item
	for _, r := range p.Rows {
		if r.Values != nil && r.Values[0] > 0 {
			items = append(items, Item{Cost: int64(r.Candidate.Cost), Value: r.Values[0]})
		}
	}
	forced := p.Mandatory[0]
	if p.MandatoryOver > 0 {
		forced = p.MandatoryCost
	}
	c := curveOf(items)
	c.Forced, c.Money, c.RiskYear = forced, p.Selection[0], len(p.Budgets) > 1
	for i := range c.Points {
		c.Points[i].Budget = forced.Add(c.Points[i].Money)
	}
	c.AtMoney = c.at(c.Money)
	return c
}

// at is the curve's value at money m: the last point at or below it.
func (c Curve) at(m survey.Money) int64 {
	var v int64
	for _, pt := range c.Points {
		if pt.Money > m {
			break
		}
		v = pt.Removed
	}
	return v
}

// curveOf computes the most value for every amount of money, items with a
// positive value only: over the cost grid when the table is small enough,
// else over the values, else at sampled amounts.
func curveOf(items []Item) Curve {
	var total int64
	var sum int64
	g := int64(0)
	for _, it := range items {
		total = addCapped(total, it.Cost)
		sum += it.Value
		g = gcd(g, it.Cost)
	}
	c := Curve{Total: survey.Money(total), Knee: -1, Grid: survey.Money(g), ValueSteps: sum}
	if g > 0 {
		c.GridSteps = total / g
	}
	n := int64(len(items))
	// The two exact tables: n × (total / g) cells over costs, n × sum over
	// values; the smaller is used (the cost grid when it is small anyway).
	byCost := g > 0 && total/g <= curveGridLimit && total/g <= dpCellLimit/n
	byValue := sum <= dpCellLimit/max(n, 1)
	switch {
	case n == 0:
		c.Points, c.Steps, c.Method = []CurvePoint{{Exact: true}}, true, CurveCostGrid
	case byCost && (total/g <= curveGridSmall || !byValue || total/g <= sum):
		c.Points, c.Steps, c.Method = curveByCost(items, total/g, g), true, CurveCostGrid
	case byValue:
		c.Points, c.Steps, c.Method = curveByValue(items, sum), true, CurveRiskSteps
	default:
		c.Points, c.Method = curveSampled(items, total), fmt.Sprintf("%s (%d amounts)", CurveSampled, curveSamples)
	}
	c.Knee = knee(c.Points, total)
	return c
}

// curveByCost is the dynamic programme's table best[w], the most value within
// w grid steps, kept where it rises.
func curveByCost(items []Item, w, unit int64) []CurvePoint {
	best := make([]int64, w+1)
	for _, it := range items {
		c := it.Cost / unit
		for cap := w; cap >= c; cap-- {
			best[cap] = max(best[cap], best[cap-c]+it.Value)
		}
	}
	pts := []CurvePoint{{Exact: true}}
	for cap := int64(1); cap <= w; cap++ {
		if best[cap] > best[cap-1] {
			pts = append(pts, CurvePoint{Money: survey.Money(cap * unit), Removed: best[cap], Exact: true, Bound: float64(best[cap])})
		}
	}
	return pts
}

// curveByValue finds the least cost of each total value v (the other
// dynamic programme of the knapsack); the curve steps up where a larger
// value costs no more than every one above it.
func curveByValue(items []Item, sum int64) []CurvePoint {
	const unreachable = int64(1<<63 - 1)
	least := make([]int64, sum+1)
	for v := range least {
		least[v] = unreachable
	}
	least[0] = 0
	for _, it := range items {
		for v := sum; v >= it.Value; v-- {
			if prev := least[v-it.Value]; prev != unreachable {
				least[v] = min(least[v], addCapped(prev, it.Cost))
			}
		}
	}
	// Scanning values from the top, keep v when it is cheaper than every
	// larger value: that is where the curve steps up to v.
	var pts []CurvePoint
	cheapest := unreachable
	for v := sum; v > 0; v-- {
		if least[v] < cheapest {
			cheapest = least[v]
			pts = append(pts, CurvePoint{Money: survey.Money(least[v]), Removed: v, Exact: true, Bound: float64(v)})
		}
	}
	if len(pts) == 0 || pts[len(pts)-1].Money > 0 {
		pts = append(pts, CurvePoint{Exact: true})
	}
	slices.Reverse(pts)
	return pts
}

// curveSampled solves the knapsack at evenly spaced amounts of money; each
// point is exact or carries the LP bound, and nothing is known between them.
func curveSampled(items []Item, total int64) []CurvePoint {
	pts := make([]CurvePoint, 0, curveSamples+1)
	for k := 0; k <= curveSamples; k++ {
		m := total / curveSamples * int64(k)
		if k == curveSamples {
			m = total
		}
		s := Solve(items, m)
		b := s.UpperBound
		if s.Exact {
			b = float64(s.Value)
		}
		pts = append(pts, CurvePoint{Money: survey.Money(m), Removed: s.Value, Exact: s.Exact, Bound: b})
	}
	return pts
}

// knee is the point farthest above the straight line from no money (nothing
// removed) to the money that funds everything (all removed), both axes
// scaled to 1 (Satopää, Albrecht, Irwin and Raghavan, "Finding a 'Kneedle'
// in a Haystack", ICDCS workshops 2011); -1 when the curve is flat or a line.
func knee(pts []CurvePoint, total int64) int {
	if len(pts) < 2 || total <= 0 {
		return -1
	}
	top := pts[len(pts)-1].Removed
	if top <= 0 {
		return -1
	}
	// Compare Removed/top − Money/total exactly, scaled by top × total.
	best, at := big.NewInt(0), -1
	for i, pt := range pts {
		d := new(big.Int).Mul(big.NewInt(pt.Removed), big.NewInt(total))
		d.Sub(d, new(big.Int).Mul(big.NewInt(int64(pt.Money)), big.NewInt(top)))
		if d.Cmp(best) > 0 {
			best, at = d, i
		}
	}
	return at
}
