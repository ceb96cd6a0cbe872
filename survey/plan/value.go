package plan

import (
	"math"
	"time"

	"github.com/lossline/lossline/survey/wallloss"
)

// Objective is what a plan's selection maximises.
type Objective string

// Objectives.
const (
	// ObjectiveRisk: the risk removed; over several years the risk-years
	// removed (the risk of each plan year's start, summed over the years
	// from the repair to the end of the plan), so an early repair counts more.
	ObjectiveRisk Objective = "risk"
	// ObjectiveMoney: the expected money saved: failure cost avoided less
	// repair cost, discounted to the plan's start.
	ObjectiveMoney Objective = "money"
)

// valuation values candidates over the plan years.
type valuation struct {
	objective Objective
	start     time.Time
	years     int
	money     MoneyModel
}

func (v valuation) yearStart(y int) time.Time { return wallloss.AddYears(v.start, float64(y-1)) }

// riskAfter is the candidate's risk at time t after a repair at time at: the
// repaired walls thin again at their rates from the repair on.
func (c *Candidate) riskAfter(at, t time.Time) int {
	cons := ConsequenceLevel(c.Component.Design.Consequence)
	gone := wallloss.YearsBetween(at, t)
	var worst int
	for _, it := range c.CMLs {
		life := c.lifeAfterRepair(it.Result)
		if !math.IsNaN(life) && !math.IsInf(life, 1) {
			life = max(life-gone, 0)
		}
		worst = max(worst, int(LikelihoodOfLife(life))*cons)
	}
	return worst
}

// riskYears is the risk removed by a repair at the start of plan year y,
// summed over the starts of years y..years.
func (v valuation) riskYears(c *Candidate, y int) int64 {
	at := v.yearStart(y)
	var sum int64
	for t := y; t <= v.years; t++ {
		before, _ := c.RiskAt(v.yearStart(t))
		sum += int64(before - c.riskAfter(at, v.yearStart(t)))
	}
	return sum
}

// values are what funding the candidate in each plan year is worth under
// the objective: risk-years removed, or cents saved. exp is its exposure
// (money objective only).
func (v valuation) values(c *Candidate, exp exposure) []int64 {
	out := make([]int64, v.years)
	for y := 1; y <= v.years; y++ {
		switch {
		case v.objective != ObjectiveMoney:
			out[y-1] = v.riskYears(c, y)
		case exp.Known:
			out[y-1] = exp.saving(c.Cost, v.money, y)
		}
	}
	return out
}
