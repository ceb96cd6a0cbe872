package plan

import (
	"math"
	"slices"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// Choice is a candidate placed in a plan year (or deferred past the plan).
type Choice struct {
	Candidate  *Candidate
	Year       int // 1 = the first plan year; 0 when deferred
	RiskBefore int // at the start of its year (deferred: at the end of the plan)
	RiskAfter  int
	Why        string
}

// Reduction is the risk score the repair removes.
func (c Choice) Reduction() int { return c.RiskBefore - c.RiskAfter }

// Shortfall is a component whose repair no budget up to its deadline covers.
type Shortfall struct {
	Candidate *Candidate
	Money     survey.Money // what the best year before the deadline lacks
}

// Plan is the repairs funded year by year and what is left over.
type Plan struct {
	Start     time.Time
	Budgets   []survey.Money // per plan year
	Spent     []survey.Money
	Chosen    []Choice
	Deferred  []Choice
	Uncovered []Shortfall
	// MandatoryCost is the cost of repairs at or below required; over the
	// first year's budget by MandatoryOver (0 when they fit). A cost too
	// large to add up is survey.MoneySaturated.
	MandatoryCost, MandatoryOver survey.Money
	Solutions                    []Solution // the knapsack of each year
}

// Single plans one year: repairs of components at or below required first;
// then the set of the others that removes the most risk within what is left
// (all of them when it covers them).
func Single(cands []*Candidate, start time.Time, budget survey.Money) Plan {
	return schedule(cands, start, []survey.Money{budget})
}

// MultiYear plans len(budgets) years. Components whose retirement date falls
// inside the plan are placed first, in order of that date, each in the first
// year whose remaining budget covers it; one that no year up to its deadline
// can pay for is named with the money missing. Each year's remaining budget
// then buys the most risk reduction among the rest (all of them when it
// covers them), with risk recomputed at the start of that year as walls keep
// thinning. Unspent money is not carried over.
func MultiYear(cands []*Candidate, start time.Time, budgets []survey.Money) Plan {
	return schedule(cands, start, budgets)
}

func schedule(cands []*Candidate, start time.Time, budgets []survey.Money) Plan {
	p := Plan{Start: start, Budgets: budgets, Spent: make([]survey.Money, len(budgets))}
	years := len(budgets)
	left := slices.Clone(budgets)
	done := map[*Candidate]bool{}
	yearStart := func(y int) time.Time { return wallloss.AddYears(start, float64(y-1)) }
	place := func(c *Candidate, y int, why string) {
		before, after := c.RiskAt(yearStart(y))
		p.Chosen = append(p.Chosen, Choice{Candidate: c, Year: y, RiskBefore: before, RiskAfter: after, Why: why})
		left[y-1] -= c.Cost
		p.Spent[y-1] += c.Cost
		done[c] = true
	}

	// Repairs at or below required come first, in year 1.
	for _, c := range cands {
		if c.Mandatory {
			p.MandatoryCost = p.MandatoryCost.Add(c.Cost)
		}
	}
	p.MandatoryOver = max(p.MandatoryCost-left[0], 0)

	// The first year's money goes to repairs at or below required before any
	// deadline placement.
	reserve := func(y int) survey.Money {
		if y == 1 {
			return min(p.MandatoryCost, left[0])
		}
		return 0
	}

	// Deadlines inside the plan, earliest first.
	var due []*Candidate
	for _, c := range cands {
		if !c.Mandatory && c.Deadline != nil && deadlineYear(start, *c.Deadline) <= years {
			due = append(due, c)
		}
	}
	slices.SortStableFunc(due, func(a, b *Candidate) int { return a.Deadline.Compare(*b.Deadline) })
	for _, c := range due {
		k := deadlineYear(start, *c.Deadline)
		placed := false
		for y := 1; y <= k; y++ {
			if left[y-1]-reserve(y) >= c.Cost {
				place(c, y, "before its retirement date "+c.Deadline.Format("2006-01-02"))
				placed = true
				break
			}
		}
		if !placed {
			var best survey.Money
			for y := 1; y <= k; y++ {
				best = max(best, left[y-1]-reserve(y))
			}
			p.Uncovered = append(p.Uncovered, Shortfall{Candidate: c, Money: c.Cost - best})
		}
	}

	// Each year: repairs at or below required (or past their retirement date)
	// that are still unfunded come first; while any of them stays unfunded,
	// nothing else is. Then the most risk reduction for what is left.
	for y := 1; y <= years; y++ {
		var urgent, pool []*Candidate
		for _, c := range cands {
			switch {
			case done[c]:
			case c.Mandatory || (c.Deadline != nil && !c.Deadline.After(yearStart(y))):
				urgent = append(urgent, c)
			default:
				pool = append(pool, c)
			}
		}
		var need survey.Money
		for _, c := range urgent {
			need = need.Add(c.Cost)
		}
		if need > left[y-1] {
			sol := solveYear(urgent, left[y-1], yearStart(y))
			for _, i := range sol.Chosen {
				place(urgent[i], y, "at or below required")
			}
			p.Solutions = append(p.Solutions, sol)
			continue
		}
		for _, c := range urgent {
			place(c, y, "at or below required")
		}
		sol := solveYear(pool, left[y-1], yearStart(y))
		for _, i := range sol.Chosen {
			place(pool[i], y, "most risk reduction for the money")
		}
		p.Solutions = append(p.Solutions, sol)
	}
	end := yearStart(years + 1)
	for _, c := range cands {
		if !done[c] {
			before, after := c.RiskAt(end)
			p.Deferred = append(p.Deferred, Choice{Candidate: c, RiskBefore: before, RiskAfter: after, Why: "deferred"})
		}
	}
	slices.SortStableFunc(p.Deferred, func(a, b Choice) int { return b.RiskBefore - a.RiskBefore })
	return p
}

// solveYear runs the knapsack on a year's candidates, valued by the risk each
// removes at that date, on their exact costs in cents. A budget that covers
// every candidate funds them all, those that remove no risk too.
func solveYear(pool []*Candidate, budget survey.Money, at time.Time) Solution {
	items := make([]Item, len(pool))
	var total survey.Money
	for i, c := range pool {
		before, after := c.RiskAt(at)
		items[i] = Item{Cost: int64(c.Cost), Value: int64(before - after)}
		total = total.Add(c.Cost)
	}
	if total <= budget {
		return takeAll(items)
	}
	return Solve(items, int64(budget))
}

// deadlineYear is the plan year (1-based) in which a date falls; dates before
// the start fall in year 1.
func deadlineYear(start, deadline time.Time) int {
	if !deadline.After(start) {
		return 1
	}
	return 1 + int(math.Floor(wallloss.YearsBetween(start, deadline)))
}
