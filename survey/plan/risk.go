package plan

import (
	"math"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// Likelihood is how likely the wall is to reach its required thickness soon,
// on five levels (lossline's own bands of remaining life).
type Likelihood int

// Likelihood levels, least likely first.
const (
	Rare          Likelihood = 1 + iota // 10 years or more, or no measurable loss
	Unlikely                            // 5 to 10 years
	Possible                            // 3 to 5 years, or unknown
	Likely                              // 1 to 3 years
	AlmostCertain                       // under 1 year, or at or below required
)

var likelihoodNames = []string{"", "rare", "unlikely", "possible", "likely", "almost certain"}

func (l Likelihood) String() string { return likelihoodNames[l] }

// LifeBands states the likelihood bands, for the report.
const LifeBands = "at or below required or under 1 year: almost certain; 1 to under 3 years: likely; " +
	"3 to under 5 years: possible; 5 to under 10 years: unlikely; 10 years or more, or no measurable loss: rare; " +
	"remaining life unknown: taken as possible"

// LikelihoodOfLife places a remaining life (years; NaN when unknown, +Inf for
// no measurable loss) in its band.
func LikelihoodOfLife(life float64) Likelihood {
	switch {
	case math.IsNaN(life):
		return Possible
	case life < 1:
		return AlmostCertain
	case life < 3:
		return Likely
	case life < 5:
		return Possible
	case life < 10:
		return Unlikely
	}
	return Rare
}

// LikelihoodOf is the likelihood of a result by the remaining life its dates
// use, which for a fitted rate is the lower confidence bound: the rate's
// uncertainty can only raise the likelihood.
func LikelihoodOf(r wallloss.Result) Likelihood {
	return LikelihoodOfLife(lifeOf(r))
}

func lifeOf(r wallloss.Result) float64 {
	switch r.Class {
	case wallloss.AtOrBelowRequired:
		return 0
	case wallloss.NoMeasurableLoss:
		return math.Inf(1)
	case wallloss.FiniteLife:
		return *r.PlanningLifeY()
	}
	return math.NaN()
}

// ConsequenceLevel maps the checklist's consequence to 1..5; a consequence not
// given is taken as high (4), the cautious choice.
func ConsequenceLevel(c survey.Consequence) int {
	if c == survey.ConsequenceUnknown {
		return int(survey.ConsequenceHigh)
	}
	return int(c)
}

// Risk is one cell of the 5×5 matrix.
type Risk struct {
	Likelihood  Likelihood
	Consequence int
}

// Score is likelihood × consequence, 1 to 25.
func (r Risk) Score() int { return int(r.Likelihood) * r.Consequence }

// Level names the risk in words: low (1-4), medium (5-9), high (10-14),
// very high (15-25).
func (r Risk) Level() string {
	switch s := r.Score(); {
	case s <= 4:
		return "low"
	case s <= 9:
		return "medium"
	case s <= 14:
		return "high"
	}
	return "very high"
}

// RiskOf is the risk of an assessed CML.
func RiskOf(it *survey.Assessed) Risk {
	life := lifeOf(it.Result)
	if l, ok := it.Component.LocalLifeY(); ok && !(life <= l) {
		life = l // the component's local damage is more urgent than the wall
	}
	return Risk{Likelihood: LikelihoodOfLife(life), Consequence: ConsequenceLevel(it.Component.Design.Consequence)}
}

// Matrix counts CMLs per cell: [likelihood-1][consequence-1].
type Matrix [5][5]int

// MatrixOf counts the risks of items.
func MatrixOf(items []*survey.Assessed) Matrix {
	var m Matrix
	for _, it := range items {
		r := RiskOf(it)
		m[r.Likelihood-1][r.Consequence-1]++
	}
	return m
}
