package plan

import (
	"fmt"
	"math"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// Costs are the repair prices of the settings.
type Costs struct {
	Currency string
	Unit     map[string]survey.Money // price per unit of a named repair item ("recoat-m2": 85)
}

// Candidate is one component's repair: what it costs, by when it must be done
// and the CMLs it resets.
type Candidate struct {
	Source    string // survey title, to tell assets of several surveys apart
	Asset     string
	Component *survey.Component
	Cost      survey.Money
	CostBasis string  // "as written", or quantity × unit price
	Rounded   bool    // quantity × unit price was rounded to the cent
	ResetMM   float64 // thickness its CMLs have after the repair
	Deadline  *time.Time
	Mandatory bool // a CML is at or below required now
	CMLs      []*survey.Assessed
	// Work is "" for a wall repair, else WorkAnodes or WorkRecoat, with
	// WorkWhy saying what makes it due (upkeep.go).
	Work, WorkWhy string
}

// Name is "asset / component".
func (c *Candidate) Name() string {
	if c.Work != "" {
		return c.Asset + " / " + c.Component.Name + " (" + c.Work + ")"
	}
	return c.Asset + " / " + c.Component.Name
}

// NoCost is a component that cannot be planned: the checklist gives no repair cost.
type NoCost struct {
	Source, Asset, Component string
	Reason                   string
}

// Candidates groups assessed CMLs into one candidate repair per component
// with a cost.
func Candidates(source string, items []*survey.Assessed, costs Costs) ([]*Candidate, []NoCost) {
	var out []*Candidate
	var missing []NoCost
	byComp := map[*survey.Component]*Candidate{}
	for _, it := range items {
		c := byComp[it.Component]
		if c == nil {
			d := it.Component.Design
			cost, basis, rounded, err := costOf(it.Component, costs)
			if err != nil {
				missing = append(missing, NoCost{source, it.Asset.Name, it.Component.Name, err.Error()})
				byComp[it.Component] = &Candidate{} // mark as seen
				continue
			}
			reset := 0.0
			switch {
			case d.RepairThicknessMM != nil:
				reset = *d.RepairThicknessMM
			case d.NominalMM != nil:
				reset = *d.NominalMM
			}
			c = &Candidate{Source: source, Asset: it.Asset.Name, Component: it.Component, Cost: cost, CostBasis: basis, Rounded: rounded, ResetMM: reset}
			byComp[it.Component] = c
			out = append(out, c)
		}
		if c.Component == nil {
			continue
		}
		c.CMLs = append(c.CMLs, it)
		r := it.Result
		if l, ok := it.Component.LocalLifeY(); r.Class == wallloss.AtOrBelowRequired || ok && l <= 0 {
			c.Mandatory = true
		}
		if r.Retirement != nil && (c.Deadline == nil || r.Retirement.Before(*c.Deadline)) {
			c.Deadline = r.Retirement
		}
		if d := localDeadline(it.Component); d != nil && (c.Deadline == nil || d.Before(*c.Deadline)) {
			c.Deadline = d // local damage reaches its limit first (local.go)
		}
	}
	return out, missing
}

// costOf is a component's repair cost: as written, or its quantity × the
// unit price of the settings, rounded to the cent (rounded says so). A cost
// that cannot be worked out is an error naming the checklist line.
func costOf(comp *survey.Component, costs Costs) (cost survey.Money, basis string, rounded bool, err error) {
	d := comp.Design
	switch {
	case d.RepairCost != nil:
		return *d.RepairCost, "as written", false, nil
	case d.RepairItem != "":
		price, ok := costs.Unit[d.RepairItem]
		if !ok {
			return 0, "", false, fmt.Errorf("no unit cost %q in the settings", d.RepairItem)
		}
		basis = fmt.Sprintf("%g %s × %s", d.RepairQuantity, d.RepairItem, price)
		cost, rounded, err = price.Times(d.RepairQuantity)
		if err != nil {
			return 0, "", false, fmt.Errorf("%s:%d: repair %s: the cost is %w", comp.File, d.Lines["repair"], basis, err)
		}
		return cost, basis, rounded, nil
	}
	return 0, "", false, fmt.Errorf("no repair cost in the checklist")
}

// RiskAt is the candidate's risk at time t, the walls having kept thinning at
// their rates, and its risk right after a repair at t. A component's risk is
// that of its worst CML (likelihood × consequence): a component is not made
// riskier by having more CMLs, and duplicating a CML changes nothing.
func (c *Candidate) RiskAt(t time.Time) (before, after int) {
	cons := ConsequenceLevel(c.Component.Design.Consequence)
	for _, it := range c.CMLs {
		r := it.Result
		before = max(before, int(LikelihoodOfLife(withLocalDamage(c.Component, lifeAt(r, t), t)))*cons)
		after = max(after, int(LikelihoodOfLife(c.lifeAfterRepair(r)))*cons)
	}
	return before, after
}

// WorstAt is the CML that sets the candidate's risk at time t: the first of
// its CMLs (in rank order) with the highest score.
func (c *Candidate) WorstAt(t time.Time) *survey.Assessed {
	var worst *survey.Assessed
	best := -1
	for _, it := range c.CMLs {
		if l := int(LikelihoodOfLife(lifeAt(it.Result, t))); l > best {
			worst, best = it, l
		}
	}
	return worst
}

// lifeAt is a result's remaining life left at time t (NaN unknown, +Inf no
// measurable loss).
func lifeAt(r wallloss.Result, t time.Time) float64 {
	life := lifeOf(r)
	if r.CurrentDate != nil && !math.IsNaN(life) && !math.IsInf(life, 1) {
		life = max(life-wallloss.YearsBetween(*r.CurrentDate, t), 0)
	}
	return life
}

// lifeAfterRepair is the remaining life of a CML reset to ResetMM, at the rate
// its dates use (the upper bound for a fitted rate).
func (c *Candidate) lifeAfterRepair(r wallloss.Result) float64 {
	req := r.RequiredMM()
	rate := r.RateMMPerY
	if r.RateUpperMMPerY != nil {
		rate = r.RateUpperMMPerY
	}
	switch {
	case req == nil || rate == nil || c.ResetMM == 0:
		return math.NaN()
	case c.ResetMM <= *req:
		return 0
	case *rate == 0:
		return math.Inf(1)
	}
	return (c.ResetMM - *req) / *rate
}
