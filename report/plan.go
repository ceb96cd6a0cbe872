package report

import (
	"bytes"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
)

// planColumn is one column of the plan table: its CSV name, its heading in
// text, and its cell of a row.
type planColumn struct {
	name, head string
	csvOnly    bool
	cell       func(p plan.Plan, c plan.Choice, plain bool) string
}

// money writes an amount grouped for people, plain for CSV.
func money(m survey.Money, plain bool) string {
	if plain {
		return m.Plain()
	}
	return m.String()
}

// cents writes a value in cents that may be negative.
func cents(v int64, plain bool) string {
	if v < 0 {
		return "-" + money(survey.Money(-v), plain)
	}
	return money(survey.Money(v), plain)
}

// planColumns are the columns of plans: the numbers each row was decided on
// (risk at the start of the year the numbers are from, the reduction, and
// what funding it is worth), then, separately, the risk an unfunded row
// carries at the end of the plan and the money a mandatory row lacks.
func planColumns(plans []plan.Plan, currency string, manySources bool) []planColumn {
	cur := strings.ReplaceAll(strings.ToLower(currency), " ", "_")
	years := len(plans[0].Budgets)
	var risk, saving, priced bool
	for _, p := range plans {
		risk = risk || p.Objective == plan.ObjectiveRisk
		saving = saving || p.Objective == plan.ObjectiveMoney
		for _, r := range p.Rows {
			priced = priced || r.Priced
		}
	}
	num := func(n int) string { return strconv.Itoa(n) }
	cols := []planColumn{}
	if len(plans) > 1 {
		cols = append(cols, planColumn{"objective", "objective", false, func(p plan.Plan, _ plan.Choice, _ bool) string { return string(p.Objective) }})
	}
	cols = append(cols,
		planColumn{"status", "status", false, func(_ plan.Plan, c plan.Choice, _ bool) string { return string(c.Status) }},
		planColumn{"year", "year", false, func(_ plan.Plan, c plan.Choice, _ bool) string {
			if c.Year == 0 {
				return ""
			}
			return num(c.Year)
		}},
		planColumn{"decided_in_year", "numbers of year", false, func(_ plan.Plan, c plan.Choice, _ bool) string { return num(c.At) }})
	if manySources {
		cols = append(cols, planColumn{"survey", "survey", false, func(_ plan.Plan, c plan.Choice, _ bool) string { return c.Candidate.Source }})
	}
	cols = append(cols,
		planColumn{"asset / component", "asset / component", false, func(_ plan.Plan, c plan.Choice, _ bool) string { return c.Candidate.Name() }},
		planColumn{"cost_" + cur, "cost (" + currency + ")", false, func(_ plan.Plan, c plan.Choice, plain bool) string {
			return money(c.Candidate.Cost, plain)
		}},
		planColumn{"risk_at_year_start", "risk", false, func(_ plan.Plan, c plan.Choice, _ bool) string { return num(c.RiskBefore) }},
		planColumn{"risk_after_repair", "after", false, func(_ plan.Plan, c plan.Choice, _ bool) string { return num(c.RiskAfter) }},
		planColumn{"risk_reduction", "reduction", false, func(_ plan.Plan, c plan.Choice, _ bool) string { return num(c.Reduction()) }})
	if risk && years > 1 {
		cols = append(cols, planColumn{"risk_years_removed", "risk-years", false, func(p plan.Plan, c plan.Choice, _ bool) string {
			if p.Objective != plan.ObjectiveRisk {
				return ""
			}
			return strconv.FormatInt(c.Value, 10)
		}})
		for y := 1; y <= years; y++ {
			cols = append(cols, planColumn{"risk_years_if_year_" + num(y), "", true, func(p plan.Plan, c plan.Choice, _ bool) string {
				if p.Objective != plan.ObjectiveRisk || c.Values == nil {
					return ""
				}
				return strconv.FormatInt(c.Values[y-1], 10)
			}})
		}
	}
	if saving {
		cols = append(cols, planColumn{"saving_" + cur, "saving (" + currency + ")", false, func(p plan.Plan, c plan.Choice, plain bool) string {
			if p.Objective != plan.ObjectiveMoney {
				return ""
			}
			return cents(c.Value, plain)
		}})
		if years > 1 {
			for y := 1; y <= years; y++ {
				cols = append(cols, planColumn{"saving_" + cur + "_if_year_" + num(y), "", true, func(p plan.Plan, c plan.Choice, plain bool) string {
					if p.Objective != plan.ObjectiveMoney || c.Values == nil {
						return ""
					}
					return cents(c.Values[y-1], plain)
				}})
			}
		}
	}
	cols = append(cols,
		planColumn{"risk_end_of_plan", "risk at end", false, func(_ plan.Plan, c plan.Choice, _ bool) string {
			if c.Year != 0 {
				return ""
			}
			return num(c.RiskEnd)
		}},
		planColumn{"money_missing_" + cur, "missing", false, func(_ plan.Plan, c plan.Choice, plain bool) string {
			if c.Status != plan.StatusMandatoryUnfunded {
				return ""
			}
			return money(c.Missing, plain)
		}})
	if priced {
		cols = append(cols, planColumn{"at_risk_" + cur, "at risk", false, func(_ plan.Plan, c plan.Choice, plain bool) string {
			if !c.Priced {
				return ""
			}
			return money(c.AtRisk, plain)
		}})
	}
	cols = append(cols,
		planColumn{"retirement_date", "retirement", false, func(_ plan.Plan, c plan.Choice, _ bool) string {
			if c.Candidate.Deadline == nil {
				return ""
			}
			return c.Candidate.Deadline.Format(dateLayout)
		}},
		planColumn{"why", "why", false, func(_ plan.Plan, c plan.Choice, _ bool) string { return c.Why }})
	return cols
}

// planTable is the header and rows of plans in CSV or text.
func planTable(plans []plan.Plan, currency string, asCSV bool) ([]string, [][]string) {
	cols := planColumns(plans, currency, !oneSource(plans[0]))
	var header []string
	for _, c := range cols {
		if c.csvOnly && !asCSV {
			continue
		}
		if asCSV {
			header = append(header, c.name)
		} else {
			header = append(header, c.head)
		}
	}
	var rows [][]string
	for _, p := range plans {
		for _, r := range p.Rows {
			var row []string
			for _, c := range cols {
				if c.csvOnly && !asCSV {
					continue
				}
				row = append(row, c.cell(p, r, asCSV))
			}
			rows = append(rows, row)
		}
	}
	return header, rows
}

func oneSource(p plan.Plan) bool {
	for _, c := range p.Rows {
		if c.Candidate.Source != p.Rows[0].Candidate.Source {
			return false
		}
	}
	return true
}

// planNotes are the plain sentences under a plan: budgets, optimality,
// repairs that do not fit, costs rounded, components without a cost. A
// selection is called optimal only when it is proved so on the costs in the
// table, which are exact to the cent.
func planNotes(p plan.Plan, noCost []plan.NoCost, currency string) []string {
	var notes []string
	for y, b := range p.Budgets {
		n := fmt.Sprintf("Year %d (from %s): budget %s %s, spent %s.", y+1, p.Start.AddDate(y, 0, 0).Format(dateLayout), b, currency, p.Spent[y])
		if p.Mandatory[y] > 0 {
			n += fmt.Sprintf(" Mandatory repairs %s; the selection had %s.", p.Mandatory[y], p.Selection[y])
		} else {
			n += fmt.Sprintf(" The selection had %s.", p.Selection[y])
		}
		notes = append(notes, n)
	}
	if p.CarryOver {
		notes = append(notes, "Money unspent in a year is carried over to the next; a year's selection may use it when no later year's mandatory repairs need it.")
	} else if len(p.Budgets) > 1 {
		notes = append(notes, "Money unspent in a year is not carried over.")
	}
	if p.MandatoryOver > 0 {
		cost, over := p.MandatoryCost.String(), p.MandatoryOver.String()
		if p.MandatoryCost == survey.MoneySaturated {
			cost, over = "more than "+cost, "more than "+over
		}
		notes = append(notes, fmt.Sprintf("The repairs of components at or below required thickness alone cost %s %s, "+
			"%s more than the first year's budget: not all of them can be funded.", cost, currency, over))
	}
	for _, s := range p.Uncovered {
		notes = append(notes, fmt.Sprintf("%s cannot be repaired before its retirement date %s within the budgets: %s %s short.",
			s.Candidate.Name(), s.Candidate.Deadline.Format(dateLayout), s.Money, currency))
	}
	notes = append(notes, optimalityNote(p, currency))
	for _, c := range p.Rows {
		if c.Candidate.Rounded {
			notes = append(notes, fmt.Sprintf("The cost of %s, %s, is rounded to the cent: %s %s.",
				c.Candidate.Name(), c.Candidate.CostBasis, c.Candidate.Cost, currency))
		}
	}
	for _, n := range noCost {
		notes = append(notes, fmt.Sprintf("%s / %s is not in the plan: %s.", n.Asset, n.Component, n.Reason))
	}
	return notes
}

// optimalityNote says how good the selection is.
func optimalityNote(p plan.Plan, currency string) string {
	unit := "risk reduction"
	if len(p.Budgets) > 1 {
		unit = "risk-years"
	}
	a := p.Across
	// amount writes a value of the selection in its units: money in cents
	// for the money objective (the bound rounded up to the cent).
	amount := func(v float64) string {
		if p.Objective == plan.ObjectiveMoney {
			return survey.Money(math.Ceil(v)).String() + " " + currency
		}
		return strconv.FormatFloat(v, 'f', 1, 64) + " " + unit
	}
	exact, searched := true, true
	for _, s := range p.Solutions {
		exact = exact && s.Exact
		searched = searched && s.Method != plan.MethodAll
	}
	blocked := true
	for _, b := range p.Blocked {
		blocked = blocked && b
	}
	unfunded := false
	for _, r := range p.Rows {
		unfunded = unfunded || r.Year == 0
	}
	var each string
	switch {
	case blocked:
		return "No selection: the mandatory repairs take all the money of every plan year."
	case exact && !unfunded && len(p.Budgets) == 1:
		return "The budget covers every repair: all are funded."
	case exact && !unfunded:
		return "The budgets cover every repair: all are funded."
	case a.FromSearch:
	case exact && searched:
		each = "Each year's selection is optimal (proved by dynamic programming or branch and bound)."
	case exact:
		each = "Each year's selection is optimal: proved by dynamic programming or branch and bound, or the year's budget covers every repair left to it."
	case len(p.Budgets) == 1:
		return fmt.Sprintf("The search stopped at its limit: the selection may miss up to %s (LP-relaxation bound %s).", amount(a.Gap()), amount(a.Bound))
	}
	switch {
	case len(p.Budgets) == 1:
		return each
	case a.FromSearch:
		return "The selection is the best over all plan years together (" + plan.AcrossSearch + "); it is worth more than choosing year by year."
	case a.Exact && a.Method == plan.AcrossSearch:
		return each + " Together they are the best choice over all plan years: proved by " + plan.AcrossSearch + "."
	case a.Exact:
		return each + " Together they are the best choice over all plan years: they reach the upper bound (all years' money in one purse)."
	}
	if each == "" {
		each = "A year's search stopped at its limit."
	}
	return fmt.Sprintf("%s The selection, chosen year by year, is worth %s and may fall short of the best choice over all plan years by up to %s "+
		"(upper bound %s: all years' money in one purse, each repair at its best year's value).", each, amount(float64(a.Value)), amount(a.Gap()), amount(a.Bound))
}

// objectiveNote states what the selection maximises.
func objectiveNote(p plan.Plan, currency string) string {
	switch {
	case p.Objective == plan.ObjectiveMoney:
		return fmt.Sprintf("Objective money: the selection saves the most expected money, the failure cost avoided less the repair cost, "+
			"both discounted at %g %% a year to %s.", p.Money.DiscountPct, p.Start.Format(dateLayout))
	case len(p.Budgets) > 1:
		return "Objective risk: the selection removes the most risk-years (a component's risk at the start of each plan year, summed from the year of the repair to the end of the plan)."
	}
	return "Objective risk: the selection removes the most risk."
}

// totalsNote says what the plan achieves in risk and, with failure costs, in money.
func totalsNote(p plan.Plan, currency string) []string {
	t := p.Totals
	unit := "risk"
	if len(p.Budgets) > 1 {
		unit = "risk-years"
	}
	notes := []string{fmt.Sprintf("The %s plan spends %s %s and removes %d %s.", p.Objective, t.Spent, currency, t.RiskRemoved, unit)}
	if t.Priced {
		notes = append(notes, fmt.Sprintf("Expected cost over the plan, discounted to %s: repairs %s + failures %s = %s %s (failures with no repair at all: %s).",
			p.Start.Format(dateLayout), t.RepairPV, t.FailureLeft, t.RepairPV.Add(t.FailureLeft), currency, t.FailureNone))
	}
	for _, u := range t.Unpriced {
		notes = append(notes, "No expected failure cost for "+u+".")
	}
	return notes
}

// curveNote says what the next step of the budget curve buys beyond the
// plan's first-year budget.
func curveNote(c plan.Curve, p plan.Plan, currency string) string {
	unit := "of risk"
	if c.RiskYear {
		unit = "risk-years"
	}
	budget := p.Budgets[0]
	var pre string
	if p.MandatoryOver > 0 {
		pre = fmt.Sprintf("Budget curve: a first-year budget of %s %s pays for every repair at or below required; ", c.Forced, currency)
		for _, pt := range c.Points {
			if pt.Removed > 0 {
				return pre + fmt.Sprintf("%s would also remove %d %s through the selection.", pt.Budget, pt.Removed, unit)
			}
		}
		return pre + "no more money would remove more risk."
	}
	for _, pt := range c.Points {
		if pt.Money > c.Money && pt.Removed > c.AtMoney {
			return fmt.Sprintf("Budget curve: a first-year budget of %s %s (%s more) would remove %d more %s.",
				pt.Budget, currency, pt.Budget-budget, pt.Removed-c.AtMoney, unit)
		}
	}
	return "Budget curve: no more money in year 1 would remove more risk."
}

// PlanText renders the plans as an aligned table with their notes, or as CSV.
// With two objectives, the text compares them side by side after both tables.
func PlanText(r *findings.Repairs, currency string, asCSV bool) ([]byte, error) {
	header, rows := planTable(r.Plans, currency, asCSV)
	if asCSV {
		return textTable(header, rows, true)
	}
	var b bytes.Buffer
	for i, p := range r.Plans {
		if len(r.Plans) > 1 {
			fmt.Fprintf(&b, "Plan for the objective %s\n\n", p.Objective)
		}
		h, rs := planTable([]plan.Plan{p}, currency, false)
		out, err := textTable(h, rs, false)
		if err != nil {
			return nil, err
		}
		b.Write(out)
		b.WriteString("\n")
		notes := append([]string{objectiveNote(p, currency)}, planNotes(p, r.NoCost, currency)...)
		notes = append(notes, totalsNote(p, currency)...)
		if i == 0 && p.Objective == plan.ObjectiveRisk {
			notes = append(notes, curveNote(r.Curve, p, currency))
		}
		for _, n := range notes {
			b.WriteString(n + "\n")
		}
		b.WriteString("\n")
	}
	if len(r.Plans) > 1 {
		h, rs := comparison(r.Plans, currency, false)
		out, err := textTable(h, rs, false)
		if err != nil {
			return nil, err
		}
		b.WriteString("The two plans side by side\n\n")
		b.Write(out)
		b.WriteString("\n")
	}
	b.WriteString("Risk scores are likelihood (1-5, from remaining life) × consequence (1-5) of the component's worst CML; see the report's methods appendix.\n")
	return b.Bytes(), nil
}

// comparison lists each component under both plans, then their totals.
func comparison(plans []plan.Plan, currency string, plain bool) ([]string, [][]string) {
	header := []string{"asset / component", "cost (" + currency + ")", "at risk (" + currency + ")"}
	for _, p := range plans {
		header = append(header, string(p.Objective)+" plan")
	}
	where := func(p plan.Plan, c *plan.Candidate) string {
		for _, r := range p.Rows {
			if r.Candidate == c {
				if r.Year > 0 {
					return fmt.Sprintf("%s, year %d", r.Status, r.Year)
				}
				return string(r.Status)
			}
		}
		return ""
	}
	var rows [][]string
	for _, r := range plans[0].Rows {
		atRisk := ""
		if r.Priced {
			atRisk = money(r.AtRisk, plain)
		}
		row := []string{r.Candidate.Name(), money(r.Candidate.Cost, plain), atRisk}
		for _, p := range plans {
			row = append(row, where(p, r.Candidate))
		}
		rows = append(rows, row)
	}
	for _, line := range []struct {
		label string
		cell  func(t plan.Totals) string
	}{
		{"spent", func(t plan.Totals) string { return money(t.Spent, plain) }},
		{"risk-years removed", func(t plan.Totals) string { return strconv.FormatInt(t.RiskRemoved, 10) }},
		{"repairs, discounted", func(t plan.Totals) string { return money(t.RepairPV, plain) }},
		{"expected failures, discounted", func(t plan.Totals) string { return money(t.FailureLeft, plain) }},
		{"expected total cost", func(t plan.Totals) string { return money(t.RepairPV.Add(t.FailureLeft), plain) }},
	} {
		row := []string{"TOTAL: " + line.label, "", ""}
		for _, p := range plans {
			row = append(row, line.cell(p.Totals))
		}
		rows = append(rows, row)
	}
	return header, rows
}

// CurveCSV writes the budget curve: one row per step (the selection's money
// from which the value holds until the next row), the stated budget and the
// knee marked.
func CurveCSV(c plan.Curve, currency string) ([]byte, error) {
	cur := strings.ReplaceAll(strings.ToLower(currency), " ", "_")
	unit := "risk_removed"
	if c.RiskYear {
		unit = "risk_years_removed"
	}
	header := []string{"budget_" + cur, "selection_money_" + cur, unit, "exact", "upper_bound", "mark"}
	var rows [][]string
	marked := false
	add := func(pt plan.CurvePoint, mark string) {
		rows = append(rows, []string{pt.Budget.Plain(), pt.Money.Plain(), strconv.FormatInt(pt.Removed, 10),
			strconv.FormatBool(pt.Exact), strconv.FormatFloat(pt.Bound, 'f', -1, 64), mark})
	}
	for i, pt := range c.Points {
		if !marked && pt.Money > c.Money {
			add(plan.CurvePoint{Budget: c.Forced.Add(c.Money), Money: c.Money, Removed: c.AtMoney, Exact: c.Steps, Bound: float64(c.AtMoney)}, "budget")
			marked = true
		}
		var marks []string
		if pt.Money == c.Money && !marked {
			marks = append(marks, "budget")
			marked = true
		}
		if i == c.Knee {
			marks = append(marks, "knee")
		}
		add(pt, strings.Join(marks, " "))
	}
	if !marked {
		add(plan.CurvePoint{Budget: c.Forced.Add(c.Money), Money: c.Money, Removed: c.AtMoney, Exact: c.Steps, Bound: float64(c.AtMoney)}, "budget")
	}
	return textTable(header, rows, true)
}

// CurveMethod says how the curve was computed and what it is exact at.
func CurveMethod(c plan.Curve, currency string) string {
	grid := fmt.Sprintf("the cost grid (steps of %s %s, the greatest common divisor of the costs; %d steps)", c.Grid, currency, c.GridSteps)
	switch {
	case c.Method == plan.CurveCostGrid && c.Grid > 0:
		return "Computed by dynamic programming over " + grid + ": exact at every budget; each step holds until the next."
	case c.Method == plan.CurveCostGrid:
		return "No repair is left to the selection."
	case c.Steps:
		return fmt.Sprintf("Computed by %s, %d values, a smaller table than %s: exact at every budget; each step holds until the next.",
			c.Method, c.ValueSteps, grid)
	}
	return fmt.Sprintf("Both exact tables are too large here: %s, and %d risk values. Computed by %s instead: each point is exact "+
		"or carries its upper bound (the search stopped at its limit), and between points nothing is computed.", grid, c.ValueSteps, c.Method)
}
