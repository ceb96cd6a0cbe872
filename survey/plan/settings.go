package plan

import (
	"time"

	"github.com/lossline/lossline/survey"
)

// Settings ask for a repair plan: the first year's budget, then the budget of
// each later year, in the currency of Costs.
type Settings struct {
	Budget  survey.Money
	PerYear survey.Money // years 2..Years; Budget when 0
	Years   int          // 1 for a single-year plan
	Costs   Costs
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

// Make builds the plan for candidates, its first year starting at start.
func (s Settings) Make(cands []*Candidate, start time.Time) Plan {
	if s.Years <= 1 {
		return Single(cands, start, s.Budget)
	}
	return MultiYear(cands, start, s.Budgets())
}
