package plan

import (
	"math"
	"math/big"
	"slices"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// Status is the stable code of a plan row.
type Status string

// Statuses of a plan row.
const (
	// StatusMandatoryFunded: at or below required now, or reaching its
	// retirement date inside the plan, and funded.
	StatusMandatoryFunded Status = "mandatory-funded"
	// StatusMandatoryUnfunded: such a repair the budgets cannot pay for;
	// the row gives the money missing.
	StatusMandatoryUnfunded Status = "mandatory-unfunded"
	// StatusFunded: chosen by the selection for the objective.
	StatusFunded Status = "funded"
	// StatusDeferred: not chosen; the row gives the risk it carries at the end of the plan.
	StatusDeferred Status = "deferred"
)

// Choice is one candidate's row of the plan with the numbers it was decided on.
type Choice struct {
	Candidate *Candidate
	Status    Status
	Year      int // the plan year it is funded in; 0 when not funded
	// At is the plan year the row's numbers are from: Year when funded; for
	// a deferred row the last year it was passed over; for a mandatory row
	// not funded the year its money was missing.
	At         int
	RiskBefore int   // risk at the start of year At
	RiskAfter  int   // risk right after a repair then
	Value      int64 // what funding it in year At is worth: risk-years removed, or cents saved
	// Values are what funding it in each plan year is worth (the
	// selection's candidates only; nil for mandatory rows).
	Values  []int64
	RiskEnd int          // not funded: its risk at the end of the plan
	Missing survey.Money // mandatory-unfunded: the money missing
	// AtRisk is its expected failure cost over the plan without a repair,
	// discounted to the plan's start (Priced only).
	AtRisk survey.Money
	Priced bool
	Why    string
}

// Reduction is the risk the repair removes at the start of year At.
func (c Choice) Reduction() int { return c.RiskBefore - c.RiskAfter }

// Shortfall is a component whose repair no budget up to its deadline covers.
type Shortfall struct {
	Candidate *Candidate
	Money     survey.Money // what the best year before the deadline lacks
}

// Totals are what a plan achieves, under both objectives where it can be
// said.
type Totals struct {
	Spent       survey.Money
	RiskRemoved int64 // risk-years removed (one year: the risk removed)
	// With failure costs: repair cost spent and expected failure cost, all
	// discounted to the plan's start; FailureNone is the expected failure
	// cost with no repair at all. Over the components that have one.
	Priced                             bool
	RepairPV, FailureLeft, FailureNone survey.Money
	Unpriced                           []string // components without an expected failure cost, with why
}

// Plan is the repairs funded year by year and what is left over.
type Plan struct {
	Currency  string // of every amount ("" when not set)
	Objective Objective
	Start     time.Time
	Budgets   []survey.Money // per plan year
	CarryOver bool           // money unspent in a year moves on to the next
	Spent     []survey.Money
	// Mandatory is what each year spends on mandatory repairs; Selection is
	// what the year left to the selection (with carry-over: including money
	// brought forward).
	Mandatory, Selection []survey.Money
	// Blocked years could not pay for all their mandatory repairs: their
	// money all went to them and the selection had none.
	Blocked   []bool
	Rows      []Choice // funded rows by year, then the others, most risk at the end first
	Uncovered []Shortfall
	// MandatoryCost is the cost of repairs at or below required; over the
	// first year's budget by MandatoryOver (0 when they fit). A cost too
	// large to add up is survey.MoneySaturated.
	MandatoryCost, MandatoryOver survey.Money
	Solutions                    []Solution // the selection's knapsack of each year
	Across                       Across     // the selection against the best over all years
	Totals                       Totals
	Money                        MoneyModel
}

// Funded are the funded rows in year order.
func (p Plan) Funded() []Choice {
	return slices.DeleteFunc(slices.Clone(p.Rows), func(c Choice) bool { return c.Year == 0 })
}

// Unfunded are the rows not funded.
func (p Plan) Unfunded() []Choice {
	return slices.DeleteFunc(slices.Clone(p.Rows), func(c Choice) bool { return c.Year != 0 })
}

// Options are how a plan is made beyond its budgets.
type Options struct {
	Objective   Objective
	CarryOver   bool
	Money       MoneyModel
	ToleranceMM float64 // gauge tolerance, for probabilities of breach
	Currency    string  // of every amount, printed with the reasons
}

// Single plans one year: repairs of components at or below required first;
// then the set of the others that removes the most risk within what is left
// (all of them when it covers them).
func Single(cands []*Candidate, start time.Time, budget survey.Money) Plan {
	return Schedule(cands, start, []survey.Money{budget}, Options{Objective: ObjectiveRisk})
}

// MultiYear plans len(budgets) years for the most risk removed, without
// carry-over (see Schedule).
func MultiYear(cands []*Candidate, start time.Time, budgets []survey.Money) Plan {
	return Schedule(cands, start, budgets, Options{Objective: ObjectiveRisk})
}

// Schedule plans len(budgets) years. Mandatory repairs come first: those at
// or below required in year 1 (when they alone exceed its money, the set
// removing the most risk, and nothing else that year); then those whose
// retirement date falls inside the plan, in order of that date, each in the
// first year whose money covers it (one no year up to its date can pay for
// is named with the money missing, and funded in the first later year that
// can); in each later year, mandatory repairs still unfunded come first in
// the same way. The money left then buys the selection: year by year, the
// set worth most under the objective, risk recomputed at the start of each
// year as walls keep thinning; where the candidates are few, every
// assignment to years is searched and the best kept, otherwise the plan
// carries an upper bound on the best (Across). With carry-over, money unspent
// in a year is added to the next.
func Schedule(cands []*Candidate, start time.Time, budgets []survey.Money, o Options) Plan {
	if o.Objective == "" {
		o.Objective = ObjectiveRisk
	}
	years := len(budgets)
	val := valuation{objective: o.Objective, start: start, years: years, money: o.Money}
	p := Plan{Currency: o.Currency, Objective: o.Objective, Start: start, Budgets: budgets, CarryOver: o.CarryOver, Money: o.Money,
		Spent: make([]survey.Money, years), Mandatory: make([]survey.Money, years), Selection: make([]survey.Money, years)}
	s := &scheduler{val: val, budgets: budgets, carry: o.CarryOver, forced: make([]int64, years), blocked: make([]bool, years),
		year: map[*Candidate]int{}, knapsacked: map[*Candidate]bool{}}

	var mandatory, due, rest []*Candidate
	for _, c := range cands {
		switch {
		case c.Mandatory:
			mandatory = append(mandatory, c)
			p.MandatoryCost = p.MandatoryCost.Add(c.Cost)
		case c.Deadline != nil && deadlineYear(start, *c.Deadline) <= years:
			due = append(due, c)
		default:
			rest = append(rest, c)
		}
	}
	p.MandatoryOver = max(p.MandatoryCost-budgets[0], 0)

	s.urgent(1, mandatory)
	slices.SortStableFunc(due, func(a, b *Candidate) int { return a.Deadline.Compare(*b.Deadline) })
	for _, c := range due {
		k := deadlineYear(start, *c.Deadline)
		var best int64
		for y := 1; y <= k; y++ {
			if s.blocked[y-1] {
				continue
			}
			if a := s.available(y); a >= int64(c.Cost) {
				s.fund(c, y)
				break
			} else {
				best = max(best, a)
			}
		}
		if s.year[c] == 0 {
			p.Uncovered = append(p.Uncovered, Shortfall{Candidate: c, Money: c.Cost - survey.Money(best)})
		}
	}
	forced := append(slices.Clone(mandatory), due...)
	for y := 1; y <= years; y++ {
		if y == 1 && s.blocked[0] {
			continue
		}
		var list []*Candidate
		for _, c := range forced {
			if s.year[c] == 0 && (c.Mandatory || !c.Deadline.After(val.yearStart(y))) {
				list = append(list, c)
			}
		}
		if len(list) > 0 {
			s.urgent(y, list)
		}
	}

	// The selection: what the mandatory repairs leave.
	exposures := map[*Candidate]exposure{}
	if o.Money.anyGiven() {
		for _, c := range cands {
			exposures[c] = exposureOf(c, o.Money, o.ToleranceMM, start, years)
		}
	}
	pl := pool{carry: o.CarryOver, blocked: s.blocked, takeAll: o.Objective == ObjectiveRisk, caps: make([]int64, years)}
	for y := 1; y <= years; y++ {
		pl.caps[y-1] = s.available(y)
	}
	for _, c := range rest {
		pl.costs = append(pl.costs, int64(c.Cost))
		pl.values = append(pl.values, val.values(c, exposures[c]))
	}
	res := pl.solve()
	p.Solutions, p.Across = res.solutions, res.across

	// Rows.
	for i, c := range rest {
		ch := Choice{Candidate: c, Status: StatusDeferred, Values: pl.values[i], At: years}
		if y := res.year[i]; y > 0 {
			ch.Status, ch.Year, ch.At = StatusFunded, y, y
		}
		p.Rows = append(p.Rows, ch)
	}
	for _, c := range forced {
		ch := Choice{Candidate: c, Status: StatusMandatoryFunded, Year: s.year[c], At: s.year[c]}
		if ch.Year == 0 {
			ch.Status, ch.At = StatusMandatoryUnfunded, 1
			if !c.Mandatory {
				ch.At = min(deadlineYear(start, *c.Deadline), years)
			}
			var best int64
			for y := 1; y <= years; y++ {
				best = max(best, s.available(y))
			}
			ch.Missing = c.Cost - survey.Money(best)
		}
		p.Rows = append(p.Rows, ch)
	}
	end := val.yearStart(years + 1)
	for i := range p.Rows {
		r := &p.Rows[i]
		c := r.Candidate
		r.RiskBefore, _ = c.RiskAt(val.yearStart(r.At))
		r.RiskAfter = c.riskAfter(val.yearStart(r.At), val.yearStart(r.At))
		if r.Values != nil {
			r.Value = r.Values[r.At-1]
		} else {
			r.Value = val.values(c, exposures[c])[r.At-1]
		}
		if r.Year == 0 {
			r.RiskEnd, _ = c.RiskAt(end)
		} else {
			p.Spent[r.Year-1] += c.Cost
		}
		if e, ok := exposures[c]; ok && e.Known {
			r.Priced, r.AtRisk = true, survey.Money(roundCents(e.None))
		}
	}
	for y := 1; y <= years; y++ {
		p.Mandatory[y-1] = survey.Money(s.forced[y-1])
		p.Selection[y-1] = survey.Money(res.avail[y-1])
	}
	slices.SortStableFunc(p.Rows, func(a, b Choice) int {
		switch {
		case a.Year != 0 && b.Year != 0 && a.Year != b.Year:
			return a.Year - b.Year
		case a.Year != 0 && b.Year != 0: // mandatory repairs first
			return cmpStatus(a.Status) - cmpStatus(b.Status)
		case a.Year != 0:
			return -1
		case b.Year != 0:
			return 1
		}
		return b.RiskEnd - a.RiskEnd
	})
	p.Blocked = s.blocked
	p.Totals = totalsOf(p, exposures, val)
	for i := range p.Rows {
		p.Rows[i].Why = whyOf(p, p.Rows[i], s)
	}
	return p
}

// cmpStatus orders rows of a year: mandatory first.
func cmpStatus(s Status) int {
	if s == StatusMandatoryFunded {
		return 0
	}
	return 1
}

// scheduler keeps the mandatory phase's money: forced[y-1] is what year y
// spends on mandatory repairs; a blocked year's money all went to mandatory
// repairs that it could not all pay for.
type scheduler struct {
	val        valuation
	budgets    []survey.Money
	carry      bool
	forced     []int64
	blocked    []bool
	year       map[*Candidate]int
	knapsacked map[*Candidate]bool // chosen among mandatory repairs a year could not all pay for
}

// available is what year y can still spend: its budget less what mandatory
// repairs spent; with carry-over, the least that any year from y on has left
// of all the money up to it, so no later year's mandatory repair loses its
// money (for the selection, a cap on what it may have spent by year y).
func (s *scheduler) available(y int) int64 {
	if !s.carry {
		return int64(s.budgets[y-1]) - s.forced[y-1]
	}
	least := int64(math.MaxInt64)
	var budget, spent int64
	for t := 1; t <= len(s.budgets); t++ {
		budget += int64(s.budgets[t-1])
		spent += s.forced[t-1]
		if t >= y {
			least = min(least, budget-spent)
		}
	}
	return least
}

func (s *scheduler) fund(c *Candidate, y int) {
	s.year[c] = y
	s.forced[y-1] += int64(c.Cost)
}

// urgent funds mandatory repairs in year y: all when the year can pay for
// them; else the set removing the most risk (then any others that still
// fit), and the year is blocked: nothing else is funded in it.
func (s *scheduler) urgent(y int, list []*Candidate) {
	var need survey.Money
	for _, c := range list {
		need = need.Add(c.Cost)
	}
	avail := s.available(y)
	if int64(need) <= avail {
		for _, c := range list {
			s.fund(c, y)
		}
		return
	}
	items := make([]Item, len(list))
	at := s.val.yearStart(y)
	for i, c := range list {
		before, after := c.RiskAt(at)
		items[i] = Item{Cost: int64(c.Cost), Value: int64(before - after)}
	}
	for _, i := range Solve(items, max(avail, 0)).Chosen {
		s.fund(list[i], y)
		s.knapsacked[list[i]] = true
	}
	// Those that remove no risk are left out of the knapsack; the money
	// left still pays for any that fit, in order.
	for _, c := range list {
		if s.year[c] == 0 && s.available(y) >= int64(c.Cost) {
			s.fund(c, y)
			s.knapsacked[c] = true
		}
	}
	s.blocked[y-1] = true
}

// totalsOf adds up what the plan achieves.
func totalsOf(p Plan, exposures map[*Candidate]exposure, val valuation) Totals {
	t := Totals{}
	risk := val
	risk.objective = ObjectiveRisk
	pv, left, none := new(big.Rat), new(big.Rat), new(big.Rat)
	for _, r := range p.Rows {
		c := r.Candidate
		if r.Year > 0 {
			t.Spent = t.Spent.Add(c.Cost)
			t.RiskRemoved += risk.riskYears(c, r.Year)
		}
		e, ok := exposures[c]
		if !ok {
			continue
		}
		if !e.Known {
			t.Unpriced = append(t.Unpriced, c.Name()+": "+e.Reason)
			continue
		}
		t.Priced = true
		none.Add(none, e.None)
		if r.Year > 0 {
			pv.Add(pv, presentCost(c.Cost, p.Money, r.Year))
			left.Add(left, e.with[r.Year-1])
		} else {
			left.Add(left, e.None)
		}
	}
	t.RepairPV, t.FailureLeft, t.FailureNone = survey.Money(roundCents(pv)), survey.Money(roundCents(left)), survey.Money(roundCents(none))
	return t
}

// anyGiven reports whether any failure cost is set.
func (m MoneyModel) anyGiven() bool {
	for _, c := range m.FailureCost {
		if c > 0 {
			return true
		}
	}
	return false
}

// deadlineYear is the plan year (1-based) in which a date falls; dates before
// the start fall in year 1.
func deadlineYear(start, deadline time.Time) int {
	if !deadline.After(start) {
		return 1
	}
	return 1 + int(math.Floor(wallloss.YearsBetween(start, deadline)))
}
