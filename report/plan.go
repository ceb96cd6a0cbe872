package report

import (
	"bytes"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
)

// planRows are the funded repairs, then the deferred ones; costs grouped by
// thousands for people, plain for CSV.
func planRows(p plan.Plan, plain bool) [][]string {
	var rows [][]string
	for _, c := range append(append([]plan.Choice{}, p.Chosen...), p.Deferred...) {
		year := "deferred"
		if c.Year > 0 {
			year = strconv.Itoa(c.Year)
		}
		deadline := ""
		if c.Candidate.Deadline != nil {
			deadline = c.Candidate.Deadline.Format(dateLayout)
		}
		cost := c.Candidate.Cost.String()
		if plain {
			cost = c.Candidate.Cost.Plain()
		}
		rows = append(rows, []string{year, c.Candidate.Source, c.Candidate.Name(), cost,
			strconv.Itoa(c.RiskBefore), strconv.Itoa(c.RiskAfter), strconv.Itoa(c.Reduction()), deadline, c.Why})
	}
	return rows
}

var planHeader = []string{"year", "survey", "asset / component", "cost", "risk_before", "risk_after", "risk_reduction", "retirement_date", "why"}

func oneSource(p plan.Plan) bool {
	all := append(append([]plan.Choice{}, p.Chosen...), p.Deferred...)
	for _, c := range all {
		if c.Candidate.Source != all[0].Candidate.Source {
			return false
		}
	}
	return true
}

// planNotes are the plain sentences under a plan: budgets, optimality,
// repairs that do not fit, costs rounded, components without a cost. A
// selection is called optimal only when the solver proved it on the costs in
// the table, which are exact to the cent.
func planNotes(p plan.Plan, noCost []plan.NoCost, currency string) []string {
	var notes []string
	for y, b := range p.Budgets {
		notes = append(notes, fmt.Sprintf("Year %d (from %s): budget %s %s, spent %s.", y+1,
			p.Start.AddDate(y, 0, 0).Format(dateLayout), b, currency, p.Spent[y]))
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
	exact, searched, gap, bound := true, true, 0.0, 0.0
	for _, s := range p.Solutions {
		exact = exact && s.Exact
		searched = searched && s.Method != plan.MethodAll
		gap += s.Gap()
		bound += s.UpperBound
	}
	switch {
	case exact && len(p.Deferred) == 0 && len(p.Budgets) == 1:
		notes = append(notes, "The budget covers every repair: all are funded.")
	case exact && len(p.Deferred) == 0:
		notes = append(notes, "The budgets cover every repair: all are funded.")
	case exact && searched:
		notes = append(notes, "Each year's selection is optimal (proved by dynamic programming or branch and bound).")
	case exact:
		notes = append(notes, "Each year's selection is optimal: proved by dynamic programming or branch and bound, "+
			"or the year's budget covers every repair left to it.")
	default:
		notes = append(notes, fmt.Sprintf("The search stopped at its limit: the selection may miss up to %.1f of risk reduction (LP-relaxation bound %.1f).", gap, bound))
	}
	for _, c := range append(append([]plan.Choice{}, p.Chosen...), p.Deferred...) {
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

// PlanText renders a plan as an aligned table with its notes, or as CSV.
func PlanText(p plan.Plan, noCost []plan.NoCost, currency string, asCSV bool) ([]byte, error) {
	rows := planRows(p, asCSV)
	h := append([]string{}, planHeader...)
	if oneSource(p) { // the survey column says nothing with one survey
		h = append(h[:1], h[2:]...)
		for i, r := range rows {
			rows[i] = append(r[:1], r[2:]...)
		}
	}
	if asCSV {
		h[slices.Index(h, "cost")] = "cost_" + strings.ReplaceAll(strings.ToLower(currency), " ", "_")
		return textTable(h, rows, true)
	}
	h[slices.Index(h, "cost")] = "cost (" + currency + ")"
	out, err := textTable(h, rows, false)
	if err != nil {
		return nil, err
	}
	b := bytes.NewBuffer(out)
	b.WriteString("\n")
	for _, n := range planNotes(p, noCost, currency) {
		b.WriteString(n + "\n")
	}
	b.WriteString("Risk scores are likelihood (1-5, from remaining life) × consequence (1-5); see the report's methods appendix.\n")
	return b.Bytes(), nil
}
