package report

import (
	"encoding/csv"
	"fmt"
	"math/rand/v2"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
	"github.com/lossline/lossline/survey/wallloss"
)

var planStart = time.Date(2026, 1, 1, 0, 0, 0, 0, time.UTC)

// planOf is a one-year plan with one deferred row and the solution given.
func planOf(sol plan.Solution, budget survey.Money, c *plan.Candidate) plan.Plan {
	across := plan.Across{Value: sol.Value, Bound: sol.UpperBound, Exact: sol.Exact, Method: plan.AcrossOneYear}
	return plan.Plan{Objective: plan.ObjectiveRisk, Start: planStart, Budgets: []survey.Money{budget},
		Spent: []survey.Money{0}, Mandatory: []survey.Money{0}, Selection: []survey.Money{budget}, Blocked: []bool{false},
		Solutions: []plan.Solution{sol}, Across: across,
		Rows: []plan.Choice{{Candidate: c, Status: plan.StatusDeferred, At: 1, Values: []int64{0}, Why: "test"}}}
}

func candidateCosting(cost survey.Money) *plan.Candidate {
	return &plan.Candidate{Source: "s", Asset: "A", Component: &survey.Component{Name: "C"}, Cost: cost, CostBasis: "as written"}
}

func repairsOf(ps ...plan.Plan) *findings.Repairs {
	return &findings.Repairs{Plan: ps[0], Plans: ps, Curve: ps[0].BudgetCurve()}
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
	p := planOf(sol, 10_000_000_00, candidateCosting(2500_00))
	for _, csv := range []bool{false, true} {
		out, err := PlanText(repairsOf(p), "EUR", csv)
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
	p := planOf(plan.Solution{Exact: true, Method: plan.MethodDP}, 60000_50, c)
	out, err := PlanText(repairsOf(p), "EUR", false)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"1 066.63", "budget 60 000.50 EUR, spent 0.", "Each year's selection is optimal",
		"The cost of A / C, 12.5 recoat-m2 × 85.33, is rounded to the cent: 1 066.63 EUR."} {
		if !strings.Contains(string(out), want) {
			t.Errorf("plan text lacks %q:\n%s", want, out)
		}
	}
	csv, _ := PlanText(repairsOf(p), "EUR", true)
	if !strings.Contains(string(csv), ",1066.63,") {
		t.Errorf("CSV cost not plain:\n%s", csv)
	}
	all := p
	all.Rows = []plan.Choice{{Candidate: candidateCosting(1066_63), Status: plan.StatusFunded, Year: 1, At: 1, Values: []int64{0}}}
	all.Solutions = []plan.Solution{{Exact: true, Method: plan.MethodAll}}
	notes := strings.Join(planNotes(all, nil, "EUR"), "\n")
	if !strings.Contains(notes, "The budget covers every repair: all are funded.") || strings.Contains(notes, "optimal") {
		t.Errorf("budget covering all:\n%s", notes)
	}
}

// randomCandidate is a one-CML component with two visits ten years apart
// (invented numbers): a random wall above or at its required thickness, a
// random rate, consequence and cost in whole hundreds or with cents.
func randomCandidate(rng *rand.Rand, i int) *plan.Candidate {
	req := 5.0
	now := req - 0.3 + rng.Float64()*4
	rate := 0.02 + rng.Float64()*0.5
	readings := []wallloss.Reading{{Date: time.Date(2016, 1, 1, 0, 0, 0, 0, time.UTC), ThicknessMM: now + 10*rate}, {Date: planStart, ThicknessMM: now}}
	res := wallloss.Assess(wallloss.Input{Readings: readings, RequiredMM: &req}, wallloss.DefaultPolicy)
	cost := survey.Money(100 * (10 + rng.Int64N(90)) * 100)
	if rng.IntN(3) == 0 {
		cost += survey.Money(rng.Int64N(100))
	}
	nominal := 10.0
	comp := &survey.Component{Name: fmt.Sprintf("C%d", i), Design: survey.Design{Consequence: survey.Consequence(1 + rng.IntN(5)), RepairCost: &cost, NominalMM: &nominal}}
	m := &survey.CML{ID: fmt.Sprintf("M%d", i)}
	for _, r := range readings {
		m.Visits = append(m.Visits, survey.Visit{Date: survey.VisitDate{Time: r.Date}, ReadingsMM: []float64{r.ThicknessMM}})
	}
	it := &survey.Assessed{Asset: &survey.Asset{Name: "A"}, Component: comp, CML: m, Result: res}
	cands, _ := plan.Candidates("s", []*survey.Assessed{it}, plan.Costs{})
	return cands[0]
}

// printed is the plan CSV read back: one map per row, column name → cell.
func printed(t *testing.T, out []byte) []map[string]string {
	t.Helper()
	recs, err := csv.NewReader(strings.NewReader(string(out))).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	var rows []map[string]string
	for _, r := range recs[1:] {
		m := map[string]string{}
		for i, h := range recs[0] {
			m[h] = r[i]
		}
		rows = append(rows, m)
	}
	return rows
}

func cellInt(t *testing.T, row map[string]string, col string) int64 {
	t.Helper()
	cell, ok := row[col]
	if !ok {
		t.Fatalf("no column %s in %v", col, row)
	}
	if strings.Contains(cell, ".") {
		neg := strings.HasPrefix(cell, "-")
		m, err := survey.ParseMoney(strings.TrimPrefix(cell, "-"))
		if err != nil {
			t.Fatalf("%s = %q: %v", col, cell, err)
		}
		if neg {
			return -int64(m)
		}
		return int64(m)
	}
	v, err := strconv.ParseInt(cell, 10, 64)
	if err != nil {
		t.Fatalf("%s = %q: %v", col, cell, err)
	}
	if strings.HasPrefix(col, "cost_") || strings.HasPrefix(col, "saving_") {
		return v * 100 // whole currency units in cents
	}
	return v
}

// The plan's printed numbers reproduce its choice: on small random instances
// (one to three years, with and without carry-over, risk and money
// objectives), a brute force over every assignment of the selection's rows
// to plan years, using only the costs and values the CSV prints and the
// budgets given, finds no better choice than the rows printed as funded; and
// the funded rows keep within the money the mandatory rows leave.
func TestPlanPrintedNumbersReproduceTheChoice(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 17))
	money := plan.MoneyModel{FailureCost: [6]survey.Money{0, 20_000_00, 60_000_00, 150_000_00, 400_000_00, 900_000_00}, DiscountPct: 4}
	mandatory := 0
	for trial := 0; trial < 300; trial++ {
		n := 2 + rng.IntN(6)
		cands := make([]*plan.Candidate, n)
		var total survey.Money
		for i := range cands {
			cands[i] = randomCandidate(rng, i)
			total += cands[i].Cost
		}
		years := 1 + rng.IntN(3)
		budgets := make([]survey.Money, years)
		for y := range budgets {
			budgets[y] = survey.Money(rng.Int64N(int64(total)/int64(years)+1)) / 100 * 100
		}
		o := plan.Options{Objective: plan.ObjectiveRisk, CarryOver: rng.IntN(2) == 0, Money: money, ToleranceMM: 0.28}
		if rng.IntN(2) == 0 {
			o.Objective = plan.ObjectiveMoney
		}
		p := plan.Schedule(cands, planStart, budgets, o)
		out, err := PlanText(repairsOf(p), "EUR", true)
		if err != nil {
			t.Fatal(err)
		}
		rows := printed(t, out)
		name := fmt.Sprintf("trial %d (%d years, carry-over %v, %s)", trial, years, o.CarryOver, o.Objective)
		// Money the mandatory rows took, per year. A year is blocked (its
		// money all goes to mandatory repairs) while a mandatory row that is
		// urgent by then (at or below required, or past its retirement date
		// at the year's start) is not yet funded.
		forced := make([]int64, years)
		blocked := make([]bool, years)
		var sel []map[string]string
		for _, r := range rows {
			switch r["status"] {
			case "mandatory-funded", "mandatory-unfunded":
				y, _ := strconv.Atoi(r["year"])
				if y > 0 {
					forced[y-1] += cellInt(t, r, "cost_eur")
				}
				retires, err := time.Parse("2006-01-02", r["retirement_date"])
				if err != nil {
					t.Fatalf("%s: mandatory row without a retirement date: %v", name, r)
				}
				for u := 1; u <= years; u++ {
					urgent := !retires.After(wallloss.AddYears(planStart, float64(u-1)))
					if urgent && (y == 0 || y > u) {
						blocked[u-1] = true
					}
				}
			case "funded", "deferred":
				sel = append(sel, r)
			default:
				t.Fatalf("%s: status %q", name, r["status"])
			}
			if r["risk_reduction"] != strconv.FormatInt(cellInt(t, r, "risk_at_year_start")-cellInt(t, r, "risk_after_repair"), 10) {
				t.Errorf("%s: reduction is not risk − after in %v", name, r)
			}
		}
		value := func(r map[string]string, y int) int64 {
			switch {
			case o.Objective == plan.ObjectiveMoney && years == 1:
				return cellInt(t, r, "saving_eur")
			case o.Objective == plan.ObjectiveMoney:
				return cellInt(t, r, fmt.Sprintf("saving_eur_if_year_%d", y))
			case years == 1:
				return cellInt(t, r, "risk_reduction")
			}
			return cellInt(t, r, fmt.Sprintf("risk_years_if_year_%d", y))
		}
		feasible := func(spend []int64) bool {
			var budget, spent int64
			for y := range years {
				budget += int64(budgets[y])
				spent += forced[y] + spend[y]
				if o.CarryOver && spent > budget || !o.CarryOver && forced[y]+spend[y] > int64(budgets[y]) || blocked[y] && spend[y] > 0 {
					return false
				}
			}
			return true
		}
		// The plan's own choice, from the printed year of each row.
		var got int64
		spend := make([]int64, years)
		for _, r := range sel {
			if r["year"] != "" {
				y, _ := strconv.Atoi(r["year"])
				got += value(r, y)
				spend[y-1] += cellInt(t, r, "cost_eur")
			}
		}
		if !feasible(spend) {
			t.Fatalf("%s: the funded rows overspend: %v with mandatory %v, budgets %v", name, spend, forced, budgets)
		}
		// Every assignment of the selection's rows to years 0 (not funded) .. years.
		best := int64(0)
		assign := make([]int, len(sel))
		for {
			v := int64(0)
			for y := range spend {
				spend[y] = 0
			}
			for i, y := range assign {
				if y > 0 {
					v += value(sel[i], y)
					spend[y-1] += cellInt(t, sel[i], "cost_eur")
				}
			}
			if feasible(spend) {
				best = max(best, v)
			}
			k := 0
			for k < len(assign) && assign[k] == years {
				assign[k] = 0
				k++
			}
			if k == len(assign) {
				break
			}
			assign[k]++
		}
		if got != best {
			t.Fatalf("%s: the funded rows are worth %d, a brute force over the printed numbers finds %d\n%s", name, got, best, out)
		}
		if strings.Contains(string(out), "mandatory-") {
			mandatory++
		}
	}
	if mandatory < 30 {
		t.Errorf("only %d of the instances have mandatory rows", mandatory)
	}
}

// The reasons differ per row: rows with different numbers never share one.
func TestPlanWhyDiffersPerRow(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 9))
	var cands []*plan.Candidate
	var total survey.Money
	for i := range 12 {
		cands = append(cands, randomCandidate(rng, i))
		total += cands[i].Cost
	}
	for _, years := range []int{1, 3} {
		p := plan.Schedule(cands, planStart, []survey.Money{total / 3, total / 4, total / 5}[:years], plan.Options{Objective: plan.ObjectiveRisk})
		seen := map[string]plan.Choice{}
		for _, r := range p.Rows {
			if o, ok := seen[r.Why]; ok && (o.Candidate.Cost != r.Candidate.Cost || o.Value != r.Value || o.RiskBefore != r.RiskBefore) {
				t.Errorf("%d years: %s and %s share the reason %q", years, o.Candidate.Name(), r.Candidate.Name(), r.Why)
			}
			seen[r.Why] = r
			if r.Why == "" || r.Why == "deferred" {
				t.Errorf("%s: reason %q", r.Candidate.Name(), r.Why)
			}
		}
	}
}

// A mandatory repair the budget cannot pay for is its own status with the
// money missing, in the CSV as in the text.
func TestPlanMandatoryUnfunded(t *testing.T) {
	rng := rand.New(rand.NewPCG(4, 4))
	var below *plan.Candidate
	for below == nil || !below.Mandatory {
		below = randomCandidate(rng, 0)
	}
	p := plan.Single([]*plan.Candidate{below}, planStart, below.Cost-150)
	out, _ := PlanText(repairsOf(p), "EUR", true)
	rows := printed(t, out)
	if rows[0]["status"] != "mandatory-unfunded" || rows[0]["money_missing_eur"] != "1.50" {
		t.Errorf("mandatory repair 1.50 short:\n%s", out)
	}
}

// The curve CSV marks the plan's budget and the knee, and gives at the
// plan's selection money what the plan's selection removes.
func TestCurveCSV(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 1))
	var cands []*plan.Candidate
	var total survey.Money
	for i := range 10 {
		cands = append(cands, randomCandidate(rng, i))
		total += cands[i].Cost
	}
	p := plan.Single(cands, planStart, total/3)
	c := p.BudgetCurve()
	out, err := CurveCSV(c, "EUR")
	if err != nil {
		t.Fatal(err)
	}
	rows := printed(t, out)
	var sel int64
	for _, r := range p.Rows {
		if r.Status == plan.StatusFunded {
			sel += int64(r.Reduction())
		}
	}
	budget, knee := 0, 0
	for _, r := range rows {
		if strings.Contains(r["mark"], "budget") {
			budget++
			if r["risk_removed"] != strconv.FormatInt(sel, 10) || r["selection_money_eur"] != p.Selection[0].Plain() {
				t.Errorf("budget row %v, the plan's selection removes %d with %s", r, sel, p.Selection[0])
			}
		}
		if strings.Contains(r["mark"], "knee") {
			knee++
		}
	}
	if budget != 1 || knee != 1 {
		t.Errorf("%d budget rows, %d knee rows:\n%s", budget, knee, out)
	}
}

// A curve known only at sampled amounts (too many repairs for either exact
// table) draws as points with their bounds, and says so; the PDF is made.
func TestSampledCurveDraws(t *testing.T) {
	s, problems := survey.LoadSeries("../testdata/demo", nil, survey.DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	f := findings.Compute(s, findings.Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25,
		Plan: plan.Settings{Budget: 60_000_00, Years: 1, Costs: plan.Costs{Currency: "EUR", Unit: map[string]survey.Money{"pipe-m": 950_00, "recoat-m2": 85_00}}}})
	f.Repairs.Curve = plan.Curve{Method: plan.CurveSampled + " (60 amounts)", Grid: 1, GridSteps: 9_000_000, ValueSteps: 60_000_000, Forced: 34_200_00, Money: 25_800_00, AtMoney: 3, Total: 90_000_00, Knee: 1,
		Points: []plan.CurvePoint{{Budget: 34_200_00, Exact: true}, {Budget: 79_200_00, Money: 45_000_00, Removed: 8, Exact: false, Bound: 9.5},
			{Budget: 124_200_00, Money: 90_000_00, Removed: 12, Exact: true, Bound: 12}}}
	if m := CurveMethod(f.Repairs.Curve, "EUR"); !strings.Contains(m, "between points nothing is computed") {
		t.Errorf("sampled curve method: %s", m)
	}
	out, _, err := PDF(f, testOptions())
	if err != nil || len(out) == 0 {
		t.Fatalf("PDF with a sampled curve: %v", err)
	}
}
