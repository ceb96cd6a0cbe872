package findings

import (
	"path/filepath"
	"testing"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
	"github.com/lossline/lossline/survey/wallloss"
)

func demo(t *testing.T, set Settings) *Findings {
	t.Helper()
	s, problems := survey.LoadSeries(filepath.Join("..", "testdata", "demo"), nil, survey.DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	return Compute(s, set)
}

// Every lookup agrees with the ranked list it was built from.
func TestComputeIsConsistent(t *testing.T) {
	f := demo(t, Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25})
	if len(f.Changes) != len(f.Items) {
		t.Fatalf("%d changes for %d items", len(f.Changes), len(f.Items))
	}
	total := 0
	for _, row := range f.Matrix {
		for _, n := range row {
			total += n
		}
	}
	if total != len(f.Items) {
		t.Errorf("risk matrix counts %d CMLs, want %d", total, len(f.Items))
	}
	for i, it := range f.Items {
		if f.Item(it.CML) != it || f.Changes[i].Item != it || f.Change(it.CML).Item != it {
			t.Errorf("%s: lookups disagree with rank %d", it.CML.ID, it.Rank)
		}
		if f.Risk(it) != plan.RiskOf(it) {
			t.Errorf("%s: risk %v, want %v", it.CML.ID, f.Risk(it), plan.RiskOf(it))
		}
	}
	// A component is governed by its most urgent CML: the first of its CMLs in rank order.
	for _, a := range f.Survey.Assets {
		for _, c := range a.Components {
			var first *survey.Assessed
			for _, it := range f.Items {
				if it.Component == c {
					first = it
					break
				}
			}
			if g := f.Governing(c); g != first {
				t.Errorf("%s governed by %v, want %v", c.Name, g, first)
			}
		}
	}
	if f.Repairs != nil {
		t.Error("a plan without a budget")
	}
	if g := f.Governing(f.Item(f.Items[0].CML).Component); g == nil {
		t.Error("no governing CML for the most urgent component")
	}
}

// Shell course 1 of the demo's tank is governed by T1-04 (checked by hand from its readings).
func TestDemoGoverningCML(t *testing.T) {
	f := demo(t, Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25})
	for _, it := range f.Items {
		if it.CML.ID == "T1-01" {
			if g := f.Governing(it.Component); g.CML.ID != "T1-04" {
				t.Errorf("shell course 1 governed by %s, want T1-04", g.CML.ID)
			}
			return
		}
	}
	t.Fatal("no CML T1-01 in the demo")
}

// With a budget the plan is made once, from the same ranked items.
func TestComputeMakesThePlan(t *testing.T) {
	f := demo(t, Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25,
		Plan: plan.Settings{Budget: 1e8, Years: 1, Costs: plan.Costs{Currency: "units", Unit: map[string]survey.Money{}}}}) // 1 000 000.00
	if f.Repairs == nil {
		t.Fatal("no plan with a budget")
	}
	if len(f.Repairs.Plan.Budgets) != 1 || f.Repairs.Plan.Budgets[0] != 1e8 {
		t.Errorf("budgets %v", f.Repairs.Plan.Budgets)
	}
}
