package plan

import (
	"math/rand/v2"
	"testing"
	"time"
)

// bruteForce is the independent reference: every subset.
func bruteForce(items []Item, budget int64) int64 {
	var best int64
	for mask := 0; mask < 1<<len(items); mask++ {
		var c, v int64
		for i, it := range items {
			if mask&(1<<i) != 0 {
				c += it.Cost
				v += it.Value
			}
		}
		if c <= budget && v > best {
			best = v
		}
	}
	return best
}

func checkFeasible(t *testing.T, items []Item, budget int64, s Solution) {
	t.Helper()
	var c, v int64
	seen := map[int]bool{}
	for _, i := range s.Chosen {
		if seen[i] {
			t.Fatalf("item %d chosen twice", i)
		}
		seen[i] = true
		c += items[i].Cost
		v += items[i].Value
	}
	if c > budget || c != s.Cost || v != s.Value {
		t.Fatalf("solution cost %d (reported %d) value %d (reported %d), budget %d", c, s.Cost, v, s.Value, budget)
	}
}

// Both exact methods against brute-force enumeration on many small random instances.
func TestSolveAgainstBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := 0; trial < 600; trial++ {
		n := 1 + rng.IntN(14)
		items := make([]Item, n)
		var total int64
		for i := range items {
			items[i] = Item{Cost: int64(rng.IntN(40)) * int64(1+rng.IntN(3)*50), Value: int64(rng.IntN(30))}
			total += items[i].Cost
		}
		budget := int64(rng.IntN(int(total/2 + 1)))
		want := bruteForce(items, budget)
		s := Solve(items, budget)
		checkFeasible(t, items, budget, s)
		if s.Value != want || !s.Exact {
			t.Fatalf("trial %d (%s): value %d exact %v, brute force %d; items %v budget %d", trial, s.Method, s.Value, s.Exact, want, items, budget)
		}
		// Force branch and bound on the same instance.
		idx := []int{}
		for i, it := range items {
			if it.Value > 0 && it.Cost <= budget && it.Cost > 0 {
				idx = append(idx, i)
			}
		}
		bb := solveBB(items, sortByRatio(items, idx), budget)
		var free int64
		for _, it := range items {
			if it.Cost == 0 && it.Value > 0 {
				free += it.Value
			}
		}
		if bb.Value+free != want || !bb.Exact {
			t.Fatalf("trial %d: branch and bound %d (+%d free), brute force %d", trial, bb.Value, free, want)
		}
	}
}

// CLRS (Cormen, Leiserson, Rivest, Stein, Introduction to Algorithms, 3rd ed.,
// §16.2, Figure 16.2; from memory): values 60, 100, 120, weights 10, 20, 30,
// capacity 50 → the 0/1 optimum is 220 (items 2 and 3), not the greedy 160.
func TestSolveCLRS(t *testing.T) {
	items := []Item{{10, 60}, {20, 100}, {30, 120}}
	s := Solve(items, 50)
	if s.Value != 220 || len(s.Chosen) != 2 || s.Chosen[0] != 1 || s.Chosen[1] != 2 {
		t.Errorf("CLRS 16.2: %+v, want 220 from items 2 and 3", s)
	}
}

// P01 of the FSU "KNAPSACK_01" data set (J. Burkardt; from memory): capacity 165,
// optimum 309 with items 1, 2, 3, 4 and 6 (weight 165).
func TestSolveP01(t *testing.T) {
	w := []int64{23, 31, 29, 44, 53, 38, 63, 85, 89, 82}
	p := []int64{92, 57, 49, 68, 60, 43, 67, 84, 87, 72}
	items := make([]Item, len(w))
	for i := range w {
		items[i] = Item{w[i], p[i]}
	}
	s := Solve(items, 165)
	want := []int{0, 1, 2, 3, 5}
	if s.Value != 309 || s.Cost != 165 || len(s.Chosen) != len(want) {
		t.Fatalf("P01: %+v, want 309", s)
	}
	for i := range want {
		if s.Chosen[i] != want[i] {
			t.Errorf("P01 chosen %v, want %v", s.Chosen, want)
		}
	}
}

func TestSolveEdges(t *testing.T) {
	if s := Solve(nil, 100); s.Value != 0 || !s.Exact {
		t.Errorf("no items: %+v", s)
	}
	if s := Solve([]Item{{50, 5}}, 0); s.Value != 0 || len(s.Chosen) != 0 {
		t.Errorf("zero budget: %+v", s)
	}
	if s := Solve([]Item{{100, 5}}, 100); s.Value != 5 {
		t.Errorf("budget that exactly fits: %+v", s)
	}
}

// bigInstance is 5,000 candidate repairs costing 2,000 to 60,000 (in steps of 1)
// with risk reductions of 1 to 120.
func bigInstance() []Item {
	rng := rand.New(rand.NewPCG(7, 11))
	items := make([]Item, 5000)
	for i := range items {
		items[i] = Item{Cost: 2000 + int64(rng.IntN(58001)), Value: 1 + int64(rng.IntN(120))}
	}
	return items
}

// solveLarge solves a 5,000-repair instance with a budget of 10 million and
// checks it finishes in under 2 s within a gap of maxGap (a fraction).
func solveLarge(t *testing.T, name string, items []Item, maxGap float64) {
	t.Helper()
	start := time.Now()
	s := Solve(items, 10_000_000)
	el := time.Since(start)
	checkFeasible(t, items, 10_000_000, s)
	if el > 2*time.Second {
		t.Errorf("%s: %v, want under 2 s", name, el)
	}
	if s.Gap() > maxGap*float64(s.Value) {
		t.Errorf("%s: gap %.1f of %d is over %g %%", name, s.Gap(), s.Value, 100*maxGap)
	}
	t.Logf("%s, %s: value %d, bound %.1f, gap %.2f (%.4f %%), exact %v, %v", name, s.Method, s.Value, s.UpperBound, s.Gap(), 100*s.Gap()/float64(s.Value), s.Exact, el)
}

func benchLarge(b *testing.B, items []Item) {
	var s Solution
	for b.Loop() {
		s = Solve(items, 10_000_000)
	}
	b.ReportMetric(s.Gap(), "gap")
	b.ReportMetric(100*s.Gap()/float64(s.Value), "gap-%")
}

func TestSolveLargeWithinTime(t *testing.T) { solveLarge(t, "random", bigInstance(), 0.001) }

// BenchmarkSolve5000: 5,000 candidate repairs, a budget of 10 million.
func BenchmarkSolve5000(b *testing.B) { benchLarge(b, bigInstance()) }

// hardInstance is strongly correlated (value = cost/1000 + 10), the classic hard
// case for branch and bound (Pisinger, "Where are the hard knapsack problems?", 2005).
func hardInstance() []Item {
	rng := rand.New(rand.NewPCG(3, 5))
	items := make([]Item, 5000)
	for i := range items {
		c := 2000 + int64(rng.IntN(58001))
		items[i] = Item{Cost: c, Value: c/1000 + 10}
	}
	return items
}

func TestSolveHardWithinTime(t *testing.T) {
	solveLarge(t, "strongly correlated", hardInstance(), 0.01)
}

// BenchmarkSolve5000Hard: the strongly correlated instance.
func BenchmarkSolve5000Hard(b *testing.B) { benchLarge(b, hardInstance()) }

// Costs near the money limit (10^15 cents) with large values: the ratio order
// compares products beyond int64 and both methods must still match brute force.
func TestSolveLargeMagnitudes(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	for trial := 0; trial < 200; trial++ {
		n := 1 + rng.IntN(12)
		items := make([]Item, n)
		var total int64
		for i := range items {
			items[i] = Item{Cost: 1 + rng.Int64N(999_999_999_999_999), Value: 1 + rng.Int64N(1_000_000)}
			total += items[i].Cost
		}
		budget := rng.Int64N(total/2 + 1)
		want := bruteForce(items, budget)
		s := Solve(items, budget)
		checkFeasible(t, items, budget, s)
		if s.Value != want || !s.Exact {
			t.Fatalf("trial %d (%s): value %d exact %v, brute force %d", trial, s.Method, s.Value, s.Exact, want)
		}
	}
}

// More items than int64 can add up the costs of: branch and bound's prefix
// sums are capped and its result is still the proved optimum. Every cost is
// equal, so the best five are the five largest values.
func TestSolveCostsBeyondInt64(t *testing.T) {
	const cost = 999_999_999_999_999
	items := make([]Item, 12_000) // 1.2 × 10^19 cents in all
	idx := make([]int, len(items))
	for i := range items {
		items[i] = Item{Cost: cost, Value: int64(1 + i%1000)}
		idx[i] = i
	}
	budget := int64(5 * cost)
	for _, s := range []Solution{Solve(items, budget), solveBB(items, sortByRatio(items, idx), budget)} {
		if s.Value != 5*1000 || !s.Exact {
			t.Errorf("%s: value %d exact %v, want 5000 exact", s.Method, s.Value, s.Exact)
		}
	}
}
