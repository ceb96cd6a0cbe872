package report

import (
	"math/rand/v2"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
)

func planOf(t *testing.T, sol plan.Solution, budget survey.Money, cands ...*plan.Candidate) plan.Plan {
	t.Helper()
	p := plan.Plan{Start: time.Date(2026, 1, 1, 0, 0, 0, 0, time.UTC), Budgets: []survey.Money{budget},
		Spent: []survey.Money{0}, Solutions: []plan.Solution{sol}}
	for _, c := range cands {
		p.Deferred = append(p.Deferred, plan.Choice{Candidate: c, Why: "deferred"})
	}
	return p
}

func candidateCosting(cost survey.Money) *plan.Candidate {
	return &plan.Candidate{Source: "s", Asset: "A", Component: &survey.Component{Name: "C"}, Cost: cost, CostBasis: "as written"}
}

// A search stopped at its node limit never calls the selection optimal: the
// solution comes from the solver on the strongly correlated instance that
// is hard for branch and bound (Pisinger, "Where are the hard knapsack
// problems?", 2005), with values per cent of cost as in a plan.
func TestPlanNotesNodeLimitNeverOptimal(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	items := make([]plan.Item, 5000)
	for i := range items {
		c := 2000_00 + rng.Int64N(58001)*100
		items[i] = plan.Item{Cost: c, Value: c/1000_00 + 10}
	}
	sol := plan.Solve(items, 10_000_000_00)
	if sol.Exact {
		t.Fatalf("the instance no longer reaches the node limit: %+v", sol.Method)
	}
	p := planOf(t, sol, 10_000_000_00, candidateCosting(2500_00))
	for _, csv := range []bool{false, true} {
		out, err := PlanText(p, nil, "EUR", csv)
		if err != nil {
			t.Fatal(err)
		}
		if strings.Contains(strings.ToLower(string(out)), "optimal") {
			t.Errorf("plan stopped at the node limit says optimal:\n%s", out)
		}
	}
	notes := strings.Join(planNotes(p, nil, "EUR"), "\n")
	if !strings.Contains(notes, "The search stopped at its limit: the selection may miss up to") {
		t.Errorf("notes do not say the search stopped:\n%s", notes)
	}
}

// Costs show to the cent when they have cents; a cost rounded from quantity ×
// unit price says so; a budget that covers all says so instead of "optimal".
func TestPlanNotesMoney(t *testing.T) {
	c := candidateCosting(1066_63)
	c.CostBasis, c.Rounded = "12.5 recoat-m2 × 85.33", true
	p := planOf(t, plan.Solution{Exact: true, Method: plan.MethodDP}, 60000_50, c)
	out, err := PlanText(p, nil, "EUR", false)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"1 066.63", "budget 60 000.50 EUR, spent 0.", "Each year's selection is optimal",
		"The cost of A / C, 12.5 recoat-m2 × 85.33, is rounded to the cent: 1 066.63 EUR."} {
		if !strings.Contains(string(out), want) {
			t.Errorf("plan text lacks %q:\n%s", want, out)
		}
	}
	csv, _ := PlanText(p, nil, "EUR", true)
	if !strings.Contains(string(csv), ",1066.63,") {
		t.Errorf("CSV cost not plain:\n%s", csv)
	}
	all := plan.Plan{Start: p.Start, Budgets: []survey.Money{5000_00}, Spent: []survey.Money{1066_63},
		Chosen:    []plan.Choice{{Candidate: candidateCosting(1066_63), Year: 1}},
		Solutions: []plan.Solution{{Exact: true, Method: plan.MethodAll}}}
	notes := strings.Join(planNotes(all, nil, "EUR"), "\n")
	if !strings.Contains(notes, "The budget covers every repair: all are funded.") || strings.Contains(notes, "optimal") {
		t.Errorf("budget covering all:\n%s", notes)
	}
}
