package plan

import (
	"time"

	"github.com/lossline/lossline/survey"
)

// Settings ask for a repair plan: the first year's budget, then the budget of
// each later year, in the currency of Costs.
type Settings struct {
	Budget    survey.Money
	PerYear   survey.Money // years 2..Years; Budget when 0
	Years     int          // 1 for a single-year plan
	CarryOver bool         // money unspent in a year moves on to the next
	// Objective is "risk" (the default), "money", or "both" for the two
	// plans side by side.
	Objective string
	Money     MoneyModel
	// ToleranceMM is the gauge tolerance of the rate policy, for the
	// probabilities of breach the money objective weighs.
	ToleranceMM float64
	Costs       Costs
}

// ObjectiveNames are the values Settings.Objective takes.
var ObjectiveNames = []string{"risk", "money", "both"}

// Objectives lists the plans asked for, risk first.
func (s Settings) Objectives() []Objective {
	switch s.Objective {
	case "money":
		return []Objective{ObjectiveMoney}
	case "both":
		return []Objective{ObjectiveRisk, ObjectiveMoney}
	}
	return []Objective{ObjectiveRisk}
}

// Budgets lists the budget of each plan year.
func (s Settings) Budgets() []survey.Money {
	years := max(s.Years, 1)
	out := make([]survey.Money, years)
	for i := range out {
		out[i] = s.Budget
		if i > 0 && s.PerYear > 0 {
			out[i] = s.PerYear
		}
	}
	return out
}

// Make builds a plan for each objective asked for, its first year starting at start.
func (s Settings) Make(cands []*Candidate, start time.Time) []Plan {
	var out []Plan
	for _, o := range s.Objectives() {
		out = append(out, Schedule(cands, start, s.Budgets(), Options{Objective: o, CarryOver: s.CarryOver, Money: s.Money, ToleranceMM: s.ToleranceMM, Currency: s.Costs.Currency}))
	}
	return out
}
