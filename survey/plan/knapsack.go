package plan

import (
	"cmp"
	"math"
	"math/bits"
	"slices"
	"sort"
)

// Item is one candidate repair for the knapsack: its cost (0 or more, in
// cents) and the risk reduction it buys.
type Item struct {
	Cost  int64
	Value int64
}

// Solution is the chosen items (indexes into the input) and how good it is.
type Solution struct {
	Chosen     []int
	Value      int64
	Cost       int64
	UpperBound float64 // the LP-relaxation bound on the best value
	Exact      bool    // proved optimal on the costs and values given
	Method     string  // MethodAll, MethodDP or MethodBB
}

// Methods of a Solution.
const (
	MethodAll = "all within the budget" // the budget covers every item: no search (takeAll)
	MethodDP  = "dynamic programming"
	MethodBB  = "branch and bound"
)

// Gap is how much value the solution may miss, from the LP bound (0 when exact).
func (s Solution) Gap() float64 {
	if s.Exact {
		return 0
	}
	return max(s.UpperBound-float64(s.Value), 0)
}

// Limits of the exact methods. Past them, branch and bound stops at the node
// limit with the best solution found and its gap to the LP bound.
const (
	dpCellLimit = 40_000_000
	bbNodeLimit = 5_000_000
)

// Solve chooses items of total cost at most budget with the largest total
// value (0/1 knapsack). It uses dynamic programming over the budget (in units
// of the costs' greatest common divisor) when that table is small enough, and
// depth-first branch and bound with the Dantzig (LP) bound otherwise. Costs
// are used as given, never scaled or rounded, so Exact is a proof on them.
func Solve(items []Item, budget int64) Solution {
	var idx []int
	var sol Solution
	for i, it := range items {
		switch {
		case it.Value <= 0 || it.Cost > budget:
		case it.Cost <= 0:
			sol.Chosen = append(sol.Chosen, i)
			sol.Value += it.Value
		default:
			idx = append(idx, i)
		}
	}
	idx = sortByRatio(items, idx)
	sol.UpperBound = float64(sol.Value) + lpBound(items, idx, 0, budget)
	g := budget
	for _, i := range idx {
		g = gcd(g, items[i].Cost)
	}
	var sub Solution
	// The table has len(idx) × (budget/g + 1) cells; compared by division,
	// which cannot overflow.
	if g > 0 && (len(idx) == 0 || budget/g < dpCellLimit/int64(len(idx))) {
		sub = solveDP(items, idx, budget, g)
	} else {
		sub = solveBB(items, idx, budget)
	}
	sol.Chosen = append(sol.Chosen, sub.Chosen...)
	sol.Value += sub.Value
	sol.Exact, sol.Method = sub.Exact, sub.Method
	for _, i := range sol.Chosen {
		sol.Cost += items[i].Cost
	}
	slices.Sort(sol.Chosen)
	if sol.Exact {
		sol.UpperBound = float64(sol.Value)
	}
	return sol
}

// takeAll is every item, whatever its value: the budget covers them all.
func takeAll(items []Item) Solution {
	sol := Solution{Exact: true, Method: MethodAll}
	for i, it := range items {
		sol.Chosen = append(sol.Chosen, i)
		sol.Value += max(it.Value, 0)
		sol.Cost += it.Cost
	}
	sol.UpperBound = float64(sol.Value)
	return sol
}

// sortByRatio orders items by value per cost, best first (ties: cheaper
// first). Values and costs are positive; the cross products are compared in
// 128 bits, so no product overflows.
func sortByRatio(items []Item, idx []int) []int {
	slices.SortStableFunc(idx, func(a, b int) int {
		lh, ll := bits.Mul64(uint64(items[a].Value), uint64(items[b].Cost))
		rh, rl := bits.Mul64(uint64(items[b].Value), uint64(items[a].Cost))
		if c := cmp.Or(cmp.Compare(rh, lh), cmp.Compare(rl, ll)); c != 0 {
			return c
		}
		return cmp.Compare(items[a].Cost, items[b].Cost)
	})
	return idx
}

// addCapped is a + b for a, b of 0 or more, at most math.MaxInt64.
func addCapped(a, b int64) int64 {
	if a > math.MaxInt64-b {
		return math.MaxInt64
	}
	return a + b
}

func gcd(a, b int64) int64 {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}

// lpBound is the LP-relaxation value of items idx[from:] in ratio order
// within capacity: whole items while they fit, then a fraction of the next.
func lpBound(items []Item, idx []int, from int, capacity int64) float64 {
	var v float64
	for _, i := range idx[from:] {
		it := items[i]
		if it.Cost <= capacity {
			capacity -= it.Cost
			v += float64(it.Value)
			continue
		}
		return v + float64(it.Value)*float64(capacity)/float64(it.Cost)
	}
	return v
}

// solveDP is the textbook dynamic programme over capacity, exact.
func solveDP(items []Item, idx []int, budget, unit int64) Solution {
	w := int(budget / unit)
	best := make([]int64, w+1)
	take := make([][]uint64, len(idx)) // take[k] bit c: item k taken at capacity c
	for k, i := range idx {
		c := int(items[i].Cost / unit)
		v := items[i].Value
		take[k] = make([]uint64, w/64+1)
		for cap := w; cap >= c; cap-- {
			if nv := best[cap-c] + v; nv > best[cap] {
				best[cap] = nv
				take[k][cap/64] |= 1 << (cap % 64)
			}
		}
	}
	sol := Solution{Value: best[w], Exact: true, Method: MethodDP}
	cap := w
	for k := len(idx) - 1; k >= 0; k-- {
		if take[k][cap/64]&(1<<(cap%64)) != 0 {
			sol.Chosen = append(sol.Chosen, idx[k])
			cap -= int(items[idx[k]].Cost / unit)
		}
	}
	return sol
}

// solveBB is depth-first branch and bound over items in ratio order, taking
// an item before leaving it out, pruned by the LP bound.
func solveBB(items []Item, idx []int, budget int64) Solution {
	n := len(idx)
	// Greedy start: whole items in ratio order while they fit.
	var bestVal int64
	bestSet := make([]bool, n)
	capacity := budget
	for k, i := range idx {
		if items[i].Cost <= capacity {
			capacity -= items[i].Cost
			bestVal += items[i].Value
			bestSet[k] = true
		}
	}
	// Prefix sums in ratio order make the Dantzig bound a binary search.
	// Cost sums are capped at math.MaxInt64: a capped difference is at most
	// the true one, so the bound can only come out higher, which keeps it a
	// bound (it prunes less, never wrongly).
	pc, pv := make([]int64, n+1), make([]int64, n+1)
	for k, i := range idx {
		pc[k+1], pv[k+1] = addCapped(pc[k], items[i].Cost), pv[k]+items[i].Value
	}
	bound := func(k int, capacity int64) float64 {
		// b: the first item from k that does not fit with all before it.
		b := k + sort.Search(n-k, func(j int) bool { return pc[k+j+1]-pc[k] > capacity })
		v := float64(pv[b] - pv[k])
		if b < n {
			rest := capacity - (pc[b] - pc[k])
			v += float64(items[idx[b]].Value) * float64(rest) / float64(items[idx[b]].Cost)
		}
		return v
	}
	cur := make([]bool, n)
	nodes := 0
	exact := true
	var dfs func(k int, capacity, value int64)
	dfs = func(k int, capacity, value int64) {
		if nodes >= bbNodeLimit {
			exact = false
			return
		}
		nodes++
		if value > bestVal {
			bestVal = value
			copy(bestSet, cur)
		}
		if k == n || float64(value)+bound(k, capacity) < float64(bestVal)+1 {
			return
		}
		i := idx[k]
		if items[i].Cost <= capacity {
			cur[k] = true
			dfs(k+1, capacity-items[i].Cost, value+items[i].Value)
			cur[k] = false
		}
		dfs(k+1, capacity, value)
	}
	dfs(0, budget, 0)
	sol := Solution{Value: bestVal, Exact: exact, Method: MethodBB}
	for k, in := range bestSet {
		if in {
			sol.Chosen = append(sol.Chosen, idx[k])
		}
	}
	return sol
}
