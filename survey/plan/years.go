package plan

import (
	"math"
	"math/bits"
)

// pool is the selection left after the mandatory repairs: each candidate's
// cost and its value if funded in each plan year, and the money the years
// leave to the selection.
type pool struct {
	costs  []int64
	values [][]int64 // [candidate][year-1]
	// Without carry-over, caps[y-1] is what year y leaves to the selection.
	// With carry-over, caps[y-1] is the most the selection may have spent by
	// the end of year y (money unspent moves on to later years).
	caps    []int64
	carry   bool
	blocked []bool // years whose money all goes to mandatory repairs left unfunded
	takeAll bool   // a year whose money covers every candidate left funds them all
}

// Across says how the years' selection compares with the best choice over
// all plan years together.
type Across struct {
	Value  int64   // the selection's value, in the objective's units
	Bound  float64 // an upper bound on the best value over all years (Value when exact)
	Exact  bool    // the selection is proved the best over all years
	Method string
	// FromSearch: the selection is the exact search's, which is worth more
	// than the year-by-year one.
	FromSearch bool
}

// Gap is how much value the selection may miss (0 when exact).
func (a Across) Gap() float64 {
	if a.Exact {
		return 0
	}
	return max(a.Bound-float64(a.Value), 0)
}

// Methods of Across.
const (
	AcrossOneYear  = "one year: the knapsack of that year"
	AcrossSearch   = "exact search over every year's choice (dynamic programming over the sets funded)"
	AcrossGreedy   = "year by year; bound: all years' money in one purse, each repair at its best year's value"
	exactCellLimit = 50_000_000 // years × 3^n steps of the exact search
	exactMaxItems  = 15
)

// poolResult is a selection: the plan year each candidate is funded in (0: not).
type poolResult struct {
	year      []int
	solutions []Solution // each year's knapsack, year by year
	avail     []int64    // the money the selection had in each year
	across    Across
}

// available is what year y (1-based) leaves to the selection when spent is
// what the selection spent before it.
func (p pool) available(y int, spent int64) int64 {
	switch {
	case p.blocked[y-1]:
		return 0
	case p.carry:
		return max(p.caps[y-1]-spent, 0)
	}
	return max(p.caps[y-1], 0)
}

// solve chooses year by year (each year's knapsack on the values of that
// year), then, where the pool is small enough, searches every assignment of
// candidates to years and keeps that when it is worth more; otherwise it
// bounds the best assignment by a relaxation.
func (p pool) solve() poolResult {
	years := len(p.caps)
	res := poolResult{year: make([]int, len(p.costs)), avail: make([]int64, years)}
	var spent, total int64
	for y := 1; y <= years; y++ {
		var idx []int
		var items []Item
		var all int64
		for i, c := range p.costs {
			if res.year[i] == 0 {
				idx = append(idx, i)
				items = append(items, Item{Cost: c, Value: p.values[i][y-1]})
				all = addCapped(all, c)
			}
		}
		avail := p.available(y, spent)
		res.avail[y-1] = avail
		var sol Solution
		if p.takeAll && all <= avail {
			sol = takeAll(items)
		} else {
			sol = Solve(items, avail)
		}
		for _, k := range sol.Chosen {
			res.year[idx[k]] = y
			total += p.values[idx[k]][y-1]
		}
		spent += sol.Cost
		res.solutions = append(res.solutions, sol)
	}
	res.across = Across{Value: total, Method: AcrossOneYear}
	if years == 1 {
		s := res.solutions[0]
		res.across.Exact = s.Exact
		res.across.Bound = s.UpperBound
		if s.Exact {
			res.across.Bound = float64(total)
		}
		return res
	}
	if exact, ok := p.search(); ok {
		if exact.across.Value > total {
			exact.across.FromSearch = true
			exact.avail = p.availableTo(exact.year)
			return exact
		}
		res.across = Across{Value: total, Bound: float64(total), Exact: true, Method: AcrossSearch}
		return res
	}
	res.across = Across{Value: total, Bound: p.relaxation(), Method: AcrossGreedy}
	if res.across.Bound <= float64(total) {
		res.across.Exact, res.across.Bound = true, float64(total)
	}
	return res
}

// availableTo is what each year left to the selection when it funds the
// candidates in the years given.
func (p pool) availableTo(year []int) []int64 {
	out := make([]int64, len(p.caps))
	var spent int64
	for y := 1; y <= len(p.caps); y++ {
		out[y-1] = p.available(y, spent)
		for i, fy := range year {
			if fy == y {
				spent += p.costs[i]
			}
		}
	}
	return out
}

// relaxation bounds the best value over all years from above: every year's
// money in one purse and each candidate valued at its best year.
func (p pool) relaxation() float64 {
	items := make([]Item, len(p.costs))
	for i, c := range p.costs {
		best := int64(0)
		for _, v := range p.values[i] {
			best = max(best, v)
		}
		items[i] = Item{Cost: c, Value: best}
	}
	var purse int64
	for y := range p.caps {
		switch {
		case p.carry:
			purse = max(purse, p.caps[y])
		case !p.blocked[y]:
			purse = addCapped(purse, max(p.caps[y], 0))
		}
	}
	s := Solve(items, purse)
	if s.Exact {
		return float64(s.Value)
	}
	return s.UpperBound
}

// search is the best assignment of candidates to years by dynamic
// programming over the sets already funded: best(y, S) = the most value
// years y… can add when S is funded, trying every subset of the others in
// year y. Only candidates worth something in some year take part. It
// declines pools too large for the limits.
func (p pool) search() (poolResult, bool) {
	years := len(p.caps)
	var idx []int
	for i := range p.costs {
		for _, v := range p.values[i] {
			if v > 0 {
				idx = append(idx, i)
				break
			}
		}
	}
	n := len(idx)
	if n > exactMaxItems || float64(years)*math.Pow(3, float64(n)) > exactCellLimit {
		return poolResult{}, false
	}
	full := 1<<n - 1
	cost := make([]int64, full+1)
	for m := 1; m <= full; m++ {
		low := bits.TrailingZeros(uint(m))
		cost[m] = addCapped(cost[m&(m-1)], p.costs[idx[low]])
	}
	next := make([]int64, full+1) // best(y+1, ·)
	choice := make([][]uint16, years)
	val := make([]int64, full+1)
	for y := years; y >= 1; y-- {
		for m := 1; m <= full; m++ {
			low := bits.TrailingZeros(uint(m))
			val[m] = val[m&(m-1)] + p.values[idx[low]][y-1]
		}
		cur := make([]int64, full+1)
		choice[y-1] = make([]uint16, full+1)
		for s := 0; s <= full; s++ {
			best, pick := next[s], 0
			if !p.blocked[y-1] {
				comp := full &^ s
				for t := comp; t > 0; t = (t - 1) & comp {
					if p.carry && cost[s|t] > p.caps[y-1] || !p.carry && cost[t] > p.caps[y-1] {
						continue
					}
					if v := val[t] + next[s|t]; v > best {
						best, pick = v, t
					}
				}
			}
			cur[s], choice[y-1][s] = best, uint16(pick)
		}
		next = cur
	}
	res := poolResult{year: make([]int, len(p.costs))}
	s := 0
	for y := 1; y <= years; y++ {
		t := int(choice[y-1][s])
		for k := range n {
			if t&(1<<k) != 0 {
				res.year[idx[k]] = y
			}
		}
		s |= t
	}
	res.across = Across{Value: next[0], Bound: float64(next[0]), Exact: true, Method: AcrossSearch}
	return res, true
}
