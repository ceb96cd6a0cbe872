package findings

import (
	"time"

	"github.com/lossline/lossline/actions"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
	"github.com/lossline/lossline/survey/wallloss"
)

// Settings are the choices the computation follows.
type Settings struct {
	Policy wallloss.Policy
	// AccelerationPct is the margin over the long-term rate at which a CML's
	// latest interval counts as accelerating.
	AccelerationPct float64
	Plan            plan.Settings // a repair plan is made when Plan.Budget > 0
}

// Findings are everything a survey's report says, computed once.
type Findings struct {
	Survey   *survey.Survey
	Settings Settings
	Items    []*survey.Assessed // rank order, most urgent first
	Changes  []survey.Change    // one per item, in rank order
	Matrix   plan.Matrix        // CMLs per likelihood and consequence
	Photos   *survey.PhotoIndex
	Repairs  *Repairs // nil when no budget is set
	// Breach is each item's probability of reaching its required thickness
	// by the end of each plan year, in rank order.
	Breach []plan.Breach
	// Actions is the register of actions, by due date (see actions.Register).
	Actions []actions.Action

	item      map[*survey.CML]int
	risk      []plan.Risk
	governing map[*survey.Component]*survey.Assessed
}

// Repairs is the repair plan for the budget of the settings.
type Repairs struct {
	Plan   plan.Plan     // the plan for the settings' objective (with "both": the risk plan)
	Plans  []plan.Plan   // every plan asked for, Plan first (two with the objective "both")
	Curve  plan.Curve    // the budget curve of the risk plan's first year
	NoCost []plan.NoCost // components left out for want of a cost
}

// repairsOf makes the plans asked for and the budget curve.
func repairsOf(cands []*plan.Candidate, noCost []plan.NoCost, set Settings, start time.Time) *Repairs {
	ps := set.planSettings()
	plans := ps.Make(cands, start)
	r := &Repairs{Plan: plans[0], Plans: plans, NoCost: noCost}
	risk := plans[0]
	if risk.Objective != plan.ObjectiveRisk {
		ps.Objective = "risk"
		risk = ps.Make(cands, start)[0]
	}
	r.Curve = risk.BudgetCurve()
	return r
}

// planSettings are the plan settings with the rate policy's gauge tolerance.
func (set Settings) planSettings() plan.Settings {
	ps := set.Plan
	ps.ToleranceMM = set.Policy.ToleranceMM
	return ps
}

// Compute assesses, compares, scores and plans a loaded survey.
func Compute(s *survey.Survey, set Settings) *Findings {
	items := survey.Assess(s, set.Policy)
	photos := survey.IndexPhotos(s)
	f := &Findings{
		Survey: s, Settings: set, Items: items,
		Changes:   survey.Changes(s, items, photos, set.Policy, set.AccelerationPct),
		Photos:    photos,
		item:      make(map[*survey.CML]int, len(items)),
		risk:      make([]plan.Risk, len(items)),
		governing: map[*survey.Component]*survey.Assessed{},
	}
	for i, it := range items {
		f.item[it.CML] = i
		f.risk[i] = plan.RiskOf(it)
		f.Matrix[f.risk[i].Likelihood-1][f.risk[i].Consequence-1]++
		if _, ok := f.governing[it.Component]; !ok {
			f.governing[it.Component] = it // items are in rank order: the first is the most urgent
		}
	}
	ends := plan.YearEnds(s.Date, set.Plan.Years)
	f.Breach = make([]plan.Breach, len(items))
	for i, it := range items {
		f.Breach[i] = plan.BreachOf(it, set.Policy.ToleranceMM, ends)
	}
	if set.Plan.Budget > 0 {
		cands, noCost := plan.Candidates(s.Title, items, set.Plan.Costs)
		cands = append(cands, plan.UpkeepCandidates(s.Title, s, s.Date, set.Plan.Years)...)
		f.Repairs = repairsOf(cands, noCost, set, s.Date)
	}
	f.Actions = actions.Register(actions.Input{Survey: s, Items: items, Changes: f.Changes, Repairs: plannedRepairs(f.Repairs, s.Date, set.Plan.Years),
		CP: s.FailingTestPoints()})
	return f
}

// Item is the assessment of a CML; nil for a CML of another survey.
func (f *Findings) Item(m *survey.CML) *survey.Assessed {
	if i, ok := f.item[m]; ok {
		return f.Items[i]
	}
	return nil
}

// Change is what a CML's latest visit changed.
func (f *Findings) Change(m *survey.CML) survey.Change {
	if i, ok := f.item[m]; ok {
		return f.Changes[i]
	}
	return survey.Change{WindowBefore: wallloss.WindowUnknown}
}

// Risk is the risk of an assessed CML.
func (f *Findings) Risk(it *survey.Assessed) plan.Risk { return f.risk[f.item[it.CML]] }

// BreachOf is an assessed CML's probability of breach per plan year.
func (f *Findings) BreachOf(it *survey.Assessed) plan.Breach { return f.Breach[f.item[it.CML]] }

// Governing is a component's most urgent CML; nil when it has none.
func (f *Findings) Governing(c *survey.Component) *survey.Assessed { return f.governing[c] }

// PlanAcross plans repairs over several surveys with one budget, its first
// year starting at the newest survey's date.
func PlanAcross(surveys []*survey.Survey, set Settings) *Repairs {
	var cands []*plan.Candidate
	var noCost []plan.NoCost
	var latest *survey.Survey
	for _, s := range surveys {
		if latest == nil || s.Date.After(latest.Date) {
			latest = s
		}
	}
	for _, s := range surveys {
		cs, nc := plan.Candidates(s.Title, survey.Assess(s, set.Policy), set.Plan.Costs)
		cs = append(cs, plan.UpkeepCandidates(s.Title, s, latest.Date, set.Plan.Years)...)
		cands, noCost = append(cands, cs...), append(noCost, nc...)
	}
	return repairsOf(cands, noCost, set, latest.Date)
}
