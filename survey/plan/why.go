package plan

import (
	"fmt"
	"math/big"

	"github.com/lossline/lossline/survey"
)

// whyOf says in words, with the row's own numbers, why the row has its status.
func whyOf(p Plan, r Choice, s *scheduler) string {
	c := r.Candidate
	switch r.Status {
	case StatusMandatoryFunded:
		w := mandatoryReason(c, s.val)
		switch {
		case !c.Mandatory && c.Deadline.Before(s.val.yearStart(r.Year)):
			w += fmt.Sprintf("; funded in year %d, after that date: no year before it had the money", r.Year)
		case !c.Mandatory:
			w += fmt.Sprintf("; funded in year %d, the first year with the money", r.Year)
		case r.Year > 1:
			w += fmt.Sprintf("; funded in year %d: no earlier year had the money", r.Year)
		}
		if s.knapsacked[c] {
			w += fmt.Sprintf("; year %d cannot pay for all such repairs and takes the set removing the most risk", r.Year)
		}
		return w
	case StatusMandatoryUnfunded:
		return fmt.Sprintf("%s; no plan year has the money: %s missing", mandatoryReason(c, s.val), p.money(r.Missing))
	}
	worth := worthOf(p, r, r.At)
	if r.Status == StatusFunded {
		switch {
		case p.Across.FromSearch:
			return fmt.Sprintf("%s; the best choice over all plan years funds it in year %d", worth, r.Year)
		case len(p.Solutions) >= r.Year && p.Solutions[r.Year-1].Method == MethodAll:
			return fmt.Sprintf("year %d's %s for the selection covers every repair left", r.Year, p.money(p.Selection[r.Year-1]))
		}
		return fmt.Sprintf("%s; in the set worth most within the %s that year %d left to the selection", worth, p.money(p.Selection[r.Year-1]), r.Year)
	}
	positive, fits := false, false
	var most survey.Money
	for y, v := range r.Values {
		positive = positive || v > 0
		fits = fits || c.Cost <= p.Selection[y]
		most = max(most, p.Selection[y])
	}
	switch {
	case !positive && p.Objective == ObjectiveMoney && !r.Priced:
		return "no expected failure cost to weigh: " + exposureReason(p, c)
	case !positive && p.Objective == ObjectiveMoney:
		return fmt.Sprintf("saves no money in any plan year: its cost %s is more than the discounted failure cost it would avoid (%s with no repair)", p.money(c.Cost), p.money(r.AtRisk))
	case !positive:
		return fmt.Sprintf("a repair for %s lowers its risk (%d at the start of year %d) in no plan year", p.money(c.Cost), r.RiskBefore, r.At)
	case !fits:
		return fmt.Sprintf("costs %s, more than any year left to the selection (at most %s)", p.money(c.Cost), p.money(most))
	}
	left := p.Selection[r.At-1]
	for _, f := range p.Rows {
		if f.Status == StatusFunded && f.Year == r.At {
			left -= f.Candidate.Cost
		}
	}
	switch {
	case p.Across.Exact && len(p.Budgets) == 1:
		return fmt.Sprintf("%s; costs more than the %s left beside the funded set, and making room for it gives up more", worth, p.money(left))
	case p.Across.Exact:
		return fmt.Sprintf("%s in year %d, where %s is left beside the funded set; no choice over the plan years that funds it is worth more", worth, r.At, p.money(left))
	case len(p.Budgets) == 1:
		return fmt.Sprintf("%s; not in the best set found (%s left; the search stopped at its limit)", worth, p.money(left))
	}
	return fmt.Sprintf("%s in year %d, where %s is left beside the funded set; not in any year's best set", worth, r.At, p.money(left))
}

// mandatoryReason names the CML that makes a repair mandatory.
func mandatoryReason(c *Candidate, v valuation) string {
	if c.Work != "" {
		return upkeepReason(c, v)
	}
	if c.Mandatory {
		for _, it := range c.CMLs {
			r := it.Result
			if r.ThicknessMM != nil && r.RequiredMM() != nil && *r.ThicknessMM <= *r.RequiredMM() {
				return fmt.Sprintf("CML %s at or below required (%.2f mm, required %.2f mm)", it.CML.ID, *r.ThicknessMM, *r.RequiredMM())
			}
		}
		if why := localReason(c, v); why != "" {
			return why
		}
		return "at or below required"
	}
	var id string
	for _, it := range c.CMLs {
		if r := it.Result; r.Retirement != nil && r.Retirement.Equal(*c.Deadline) {
			id = "CML " + it.CML.ID + " "
			break
		}
	}
	if why := localReason(c, v); id == "" && why != "" {
		return why
	}
	return fmt.Sprintf("%sretires %s (plan year %d)", id, c.Deadline.Format("2006-01-02"), deadlineYear(v.start, *c.Deadline))
}

// worthOf states what funding the row in year y is worth, and per 1 000 of
// its cost.
func worthOf(p Plan, r Choice, y int) string {
	c := r.Candidate
	v := r.Values[y-1]
	per := perThousand(v, c.Cost, p.Objective == ObjectiveMoney)
	switch {
	case p.Objective == ObjectiveMoney:
		return fmt.Sprintf("saves %s for %s (%s per 1 000%s)", p.withCurrency(signedMoney(v)), p.money(c.Cost), per, p.unit())
	case len(p.Budgets) == 1:
		return fmt.Sprintf("removes %d of risk for %s (%s per 1 000%s)", v, p.money(c.Cost), per, p.unit())
	}
	return fmt.Sprintf("removes %d risk-years for %s (%s per 1 000%s)", v, p.money(c.Cost), per, p.unit())
}

// perThousand is value per 1 000 currency units of cost, to two decimals,
// exactly: value × 100 000 / cost in cents (value in cents too when money).
func perThousand(value int64, cost survey.Money, money bool) string {
	if cost <= 0 {
		return "free"
	}
	scale := int64(100_000)
	if money {
		scale = 1000
	}
	r := new(big.Rat).SetFrac(new(big.Int).Mul(big.NewInt(value), big.NewInt(scale)), big.NewInt(int64(cost)))
	return r.FloatString(2)
}

// signedMoney writes cents that may be negative.
func signedMoney(cents int64) string {
	if cents < 0 {
		return "−" + survey.Money(-cents).String()
	}
	return survey.Money(cents).String()
}

// exposureReason is why a candidate has no expected failure cost.
func exposureReason(p Plan, c *Candidate) string {
	for _, u := range p.Totals.Unpriced {
		if len(u) > len(c.Name())+2 && u[:len(c.Name())] == c.Name() {
			return u[len(c.Name())+2:]
		}
	}
	return "no failure costs in the settings"
}

// money is an amount with the plan's currency, as the reasons print it.
func (p Plan) money(m survey.Money) string { return p.withCurrency(m.String()) }

// withCurrency adds the plan's currency to an amount written out.
func (p Plan) withCurrency(amount string) string { return amount + p.unit() }

// unit is the currency after a space, or "" when none is set.
func (p Plan) unit() string {
	if p.Currency == "" {
		return ""
	}
	return " " + p.Currency
}
