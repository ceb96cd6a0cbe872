package plan

import (
	"fmt"
	"math"
	"math/big"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// assessed is a CML with two visits five years apart, now nowMM at rate mm/y.
func assessed(id string, comp *survey.Component, nowMM, rate, reqMM float64) *survey.Assessed {
	rs := []wallloss.Reading{{Date: day("2021-01-01"), ThicknessMM: nowMM + 5*rate}, {Date: day("2026-01-01"), ThicknessMM: nowMM}}
	m := &survey.CML{ID: id}
	for _, r := range rs {
		m.Visits = append(m.Visits, survey.Visit{Date: survey.VisitDate{Time: r.Date}, ReadingsMM: []float64{r.ThicknessMM}})
	}
	res := wallloss.Assess(wallloss.Input{Readings: rs, RequiredMM: &reqMM}, wallloss.DefaultPolicy)
	return &survey.Assessed{Asset: &survey.Asset{Name: "A"}, Component: comp, CML: m, Result: res}
}

func component(name string, cost survey.Money, cons survey.Consequence) *survey.Component {
	return &survey.Component{Name: name, Design: survey.Design{Consequence: cons, RepairCost: &cost, NominalMM: f(10)}}
}

// A component's risk is its worst CML's: duplicating a CML, or adding CMLs
// less at risk, changes neither its risk nor the plan.
func TestComponentRiskIgnoresCMLCount(t *testing.T) {
	start := day("2026-01-01")
	build := func(copies int, extra bool) []*Candidate {
		a := component("a", units(40), survey.ConsequenceHigh)
		b := component("b", units(30), survey.ConsequenceMedium)
		var items []*survey.Assessed
		for i := range copies {
			items = append(items, assessed(fmt.Sprintf("a%d", i), a, 6, 0.3, 5)) // 3.3 y: possible × high
		}
		if extra {
			items = append(items, assessed("a-calm", a, 9.5, 0.05, 5)) // rare
		}
		items = append(items, assessed("b1", b, 5.8, 0.3, 5)) // 2.7 y: likely × medium
		cands, _ := Candidates("s", items, Costs{})
		return cands
	}
	one := build(1, false)
	for _, c := range []struct {
		copies int
		extra  bool
	}{{2, false}, {5, false}, {1, true}, {3, true}} {
		many := build(c.copies, c.extra)
		for _, when := range []string{"2026-01-01", "2027-06-01", "2029-01-01"} {
			b1, a1 := one[0].RiskAt(day(when))
			bn, an := many[0].RiskAt(day(when))
			if b1 != bn || a1 != an {
				t.Errorf("%+v at %s: risk %d→%d, with one CML %d→%d", c, when, bn, an, b1, a1)
			}
		}
		for _, budgets := range [][]survey.Money{{units(40)}, {units(30), units(40), units(10)}} {
			p1 := Schedule(one, start, budgets, Options{Objective: ObjectiveRisk})
			pn := Schedule(many, start, budgets, Options{Objective: ObjectiveRisk})
			for i := range p1.Rows {
				r1, rn := p1.Rows[i], pn.Rows[i]
				if r1.Candidate.Component.Name != rn.Candidate.Component.Name || r1.Status != rn.Status || r1.Year != rn.Year ||
					r1.RiskBefore != rn.RiskBefore || r1.Value != rn.Value || r1.Why != rn.Why {
					t.Errorf("%+v, budgets %v: row %d %+v, with one CML %+v", c, budgets, i, rn, r1)
				}
			}
		}
	}
}

// randomPool is a small selection problem with values per year.
func randomPool(rng *rand.Rand, n, years int) pool {
	p := pool{caps: make([]int64, years), blocked: make([]bool, years), carry: rng.IntN(2) == 0}
	var total int64
	for range n {
		c := 1 + rng.Int64N(50)
		p.costs = append(p.costs, c)
		total += c
		v := make([]int64, years)
		base := rng.Int64N(40) - 5
		for y := range v {
			v[y] = base - int64(y)*rng.Int64N(4) // worth less later, as risk-years are
		}
		p.values = append(p.values, v)
	}
	var cum int64
	for y := range p.caps {
		b := rng.Int64N(total/int64(years) + 2)
		if p.carry {
			cum += b
			p.caps[y] = cum
		} else {
			p.caps[y] = b
		}
		p.blocked[y] = rng.IntN(6) == 0
	}
	return p
}

// bruteAcross is the best assignment of the pool's candidates to years by
// enumerating all (years+1)^n of them: the independent reference.
func bruteAcross(p pool) int64 {
	years := len(p.caps)
	assign := make([]int, len(p.costs))
	best := int64(0)
	for {
		spend := make([]int64, years)
		var v int64
		for i, y := range assign {
			if y > 0 {
				spend[y-1] += p.costs[i]
				v += p.values[i][y-1]
			}
		}
		ok := true
		var cum int64
		for y := range years {
			cum += spend[y]
			switch {
			case p.blocked[y] && spend[y] > 0:
				ok = false
			case p.carry && cum > p.caps[y]:
				ok = false
			case !p.carry && spend[y] > p.caps[y]:
				ok = false
			}
		}
		if ok {
			best = max(best, v)
		}
		k := 0
		for k < len(assign) && assign[k] == years {
			assign[k] = 0
			k++
		}
		if k == len(assign) {
			return best
		}
		assign[k]++
	}
}

// The exact search over all years agrees with enumeration; the year-by-year
// selection never beats it; the relaxation bound is never below it.
func TestAcrossYearsAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 34))
	for trial := 0; trial < 400; trial++ {
		p := randomPool(rng, 1+rng.IntN(7), 2+rng.IntN(2))
		want := bruteAcross(p)
		res := p.solve()
		if !res.across.Exact || res.across.Value != want {
			t.Fatalf("trial %d: %+v, brute force %d (pool %+v)", trial, res.across, want, p)
		}
		var got int64
		for i, y := range res.year {
			if y > 0 {
				got += p.values[i][y-1]
			}
		}
		if got != want {
			t.Fatalf("trial %d: the assignment is worth %d, reported %d", trial, got, want)
		}
		if b := p.relaxation(); b < float64(want) {
			t.Fatalf("trial %d: bound %v below the best %d", trial, b, want)
		}
	}
}

// With carry-over, money a year leaves unspent pays for a repair no single
// year's budget covers; without, it cannot.
func TestCarryOver(t *testing.T) {
	start := day("2026-01-01")
	big := candidate("big", units(80), 6.2, 0.3, 5, survey.ConsequenceVeryHigh) // 4 y: possible × very high
	budgets := []survey.Money{units(50), units(50)}
	without := Schedule([]*Candidate{big}, start, budgets, Options{Objective: ObjectiveRisk})
	with := Schedule([]*Candidate{big}, start, budgets, Options{Objective: ObjectiveRisk, CarryOver: true})
	if len(without.Funded()) != 0 {
		t.Errorf("without carry-over: %+v", without.Rows)
	}
	if f := with.Funded(); len(f) != 1 || f[0].Year != 2 || with.Selection[1] != units(100) {
		t.Errorf("with carry-over: funded %+v, selection %v", f, with.Selection)
	}
}

// The money objective's saving, by hand: one CML, two visits, the normal
// rate of the gauge model; P(by the end of year t) from gonum's normal CDF;
// the saving of a repair in year 1 is the failure cost times the discounted
// first-breach probabilities avoided, less those of the repaired wall, less
// the repair cost, to the cent.
func TestMoneySaving(t *testing.T) {
	start := day("2026-01-01")
	comp := component("c", units(30_000), survey.ConsequenceHigh)
	it := assessed("m", comp, 5.6, 0.25, 5) // 0.6 mm left at 0.25 mm/y
	cands, _ := Candidates("s", []*survey.Assessed{it}, Costs{})
	c := cands[0]
	m := MoneyModel{DiscountPct: 5}
	m.FailureCost[ConsequenceLevel(survey.ConsequenceHigh)] = units(1_000_000)
	years := 3
	e := exposureOf(c, m, 0.28, start, years)
	if !e.Known {
		t.Fatal(e.Reason)
	}
	sigma := 0.28 / (2 * math.Sqrt2)
	dt := wallloss.YearsBetween(day("2021-01-01"), day("2026-01-01"))
	rate := 5 * 0.25 / dt
	norm := distuv.Normal{Mu: rate, Sigma: math.Sqrt2 * sigma / dt}
	ends := YearEnds(start, years)
	reach := func(margin float64, from, to string) float64 {
		y := wallloss.YearsBetween(day(from), day(to))
		return 1 - norm.CDF(margin/y)
	}
	var none, after, prevN, prevA float64
	for t := 1; t <= years; t++ {
		d := math.Pow(1.05, -float64(t))
		p := reach(0.6, "2026-01-01", ends[t-1].Format("2006-01-02"))
		q := reach(5, "2026-01-01", ends[t-1].Format("2006-01-02")) // repaired to nominal 10 over required 5
		none += (p - prevN) * 1e8 * d
		after += (q - prevA) * 1e8 * d
		prevN, prevA = p, q
	}
	want := none - after - 30_000_00
	got := e.saving(c.Cost, m, 1)
	if math.Abs(float64(got)-want) > 1 {
		t.Errorf("saving %d cents, by hand %.2f", got, want)
	}
	// Later years: the repair cost is discounted from the start of its year,
	// exactly: 3 000 000 cents / 1.05² = 3 000 000 × 400/441.
	if pv := presentCost(units(30_000), m, 3); pv.Cmp(big.NewRat(3_000_000*400, 441)) != 0 {
		t.Errorf("30 000 two years later at 5 %%: %v cents", pv)
	}
}

// The budget curve over the cost grid, over risk values and at sampled
// amounts agree with the knapsack solved by brute force at every amount.
func TestBudgetCurveAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(6, 28))
	for trial := 0; trial < 200; trial++ {
		n := 1 + rng.IntN(9)
		items := make([]Item, n)
		var total int64
		for i := range items {
			items[i] = Item{Cost: (1 + rng.Int64N(30)) * 7, Value: 1 + rng.Int64N(25)}
			total += items[i].Cost
		}
		var sum int64
		for _, it := range items {
			sum += it.Value
		}
		byCost := curveByCost(items, total/7, 7)
		byValue := curveByValue(items, sum)
		sampled := curveSampled(items, total)
		at := func(pts []CurvePoint, m int64) int64 {
			var v int64
			for _, p := range pts {
				if int64(p.Money) <= m {
					v = p.Removed
				}
			}
			return v
		}
		for m := int64(0); m <= total; m++ {
			want := bruteForce(items, m)
			if a, b := at(byCost, m), at(byValue, m); a != want || b != want {
				t.Fatalf("trial %d, money %d: cost grid %d, risk values %d, brute force %d", trial, m, a, b, want)
			}
		}
		for _, p := range sampled {
			if want := bruteForce(items, int64(p.Money)); p.Removed != want || !p.Exact {
				t.Fatalf("trial %d: sampled %+v, brute force %d", trial, p, want)
			}
		}
		if !slices.IsSortedFunc(byValue, func(a, b CurvePoint) int { return int(a.Money - b.Money) }) {
			t.Fatalf("trial %d: steps out of order %v", trial, byValue)
		}
	}
}

// The knee of a curve that rises steeply then flattens is where it turns.
func TestKnee(t *testing.T) {
	pts := []CurvePoint{{Money: 0, Removed: 0}, {Money: 10, Removed: 50}, {Money: 20, Removed: 80}, {Money: 60, Removed: 90}, {Money: 100, Removed: 100}}
	if k := knee(pts, 100); k != 2 {
		t.Errorf("knee at %d, want 2 (20, 80): 0.8 − 0.2 is the largest lead over the line", k)
	}
	if k := knee([]CurvePoint{{}, {Money: 10, Removed: 0}}, 10); k != -1 {
		t.Errorf("flat curve: knee %d", k)
	}
}

// The plan's budget curve gives at the plan's selection money what its
// year-1 selection removes, and one more step beyond when money is short.
func TestPlanCurveMatchesPlan(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 99))
	start := day("2026-01-01")
	for trial := 0; trial < 60; trial++ {
		var cands []*Candidate
		var total survey.Money
		for i := range 2 + rng.IntN(8) {
			c := component(fmt.Sprintf("c%d", i), units(10+rng.Int64N(90)), survey.Consequence(1+rng.IntN(5)))
			cs, _ := Candidates("s", []*survey.Assessed{assessed("m", c, 5.05+rng.Float64()*4, 0.05+rng.Float64()*0.4, 5)}, Costs{})
			cands = append(cands, cs[0])
			total += cs[0].Cost
		}
		p := Single(cands, start, survey.Money(rng.Int64N(int64(total))))
		c := p.BudgetCurve()
		var sel int64
		for _, r := range p.Rows {
			if r.Status == StatusFunded {
				sel += r.Value
			}
		}
		if p.Solutions[0].Method != MethodAll && c.AtMoney != sel {
			t.Fatalf("trial %d: curve at %s gives %d, the plan's selection removes %d", trial, c.Money, c.AtMoney, sel)
		}
	}
}
