package report

import (
	"bytes"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/lossline/lossline/survey/plan"
)

func money(v float64) string {
	s := strconv.FormatFloat(v, 'f', 0, 64)
	neg := strings.HasPrefix(s, "-")
	s = strings.TrimPrefix(s, "-")
	var b strings.Builder
	for i, r := range s {
		if i > 0 && (len(s)-i)%3 == 0 {
			b.WriteRune(' ')
		}
		b.WriteRune(r)
	}
	if neg {
		return "-" + b.String()
	}
	return b.String()
}

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
		cost := money(c.Candidate.Cost)
		if plain {
			cost = strconv.FormatFloat(c.Candidate.Cost, 'f', -1, 64)
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
// repairs that do not fit, components without a cost.
func planNotes(p plan.Plan, noCost []plan.NoCost, currency string) []string {
	var notes []string
	for y, b := range p.Budgets {
		notes = append(notes, fmt.Sprintf("Year %d (from %s): budget %s %s, spent %s.", y+1,
			p.Start.AddDate(y, 0, 0).Format(dateLayout), money(b), currency, money(p.Spent[y])))
	}
	if p.MandatoryOver > 0 {
		notes = append(notes, fmt.Sprintf("The repairs of components at or below required thickness alone cost %s %s, "+
			"%s more than the first year's budget: not all of them can be funded.", money(p.MandatoryCost), currency, money(p.MandatoryOver)))
	}
	for _, s := range p.Uncovered {
		notes = append(notes, fmt.Sprintf("%s cannot be repaired before its retirement date %s within the budgets: %s %s short.",
			s.Candidate.Name(), s.Candidate.Deadline.Format(dateLayout), money(s.Money), currency))
	}
	exact, gap, bound := true, 0.0, 0.0
	for _, s := range p.Solutions {
		exact = exact && s.Exact
		gap += s.Gap()
		bound += s.UpperBound
	}
	if exact {
		notes = append(notes, "Each year's selection is optimal (proved by dynamic programming or branch and bound).")
	} else {
		notes = append(notes, fmt.Sprintf("The search stopped at its limit: the selection may miss up to %.1f of risk reduction (LP-relaxation bound %.1f).", gap, bound))
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
