package findings

import (
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

	item      map[*survey.CML]int
	risk      []plan.Risk
	governing map[*survey.Component]*survey.Assessed
}

// Repairs is the repair plan for the budget of the settings.
type Repairs struct {
	Plan   plan.Plan
	NoCost []plan.NoCost // components left out for want of a cost
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
	if set.Plan.Budget > 0 {
		cands, noCost := plan.Candidates(s.Title, items, set.Plan.Costs)
		f.Repairs = &Repairs{Plan: set.Plan.Make(cands, s.Date), NoCost: noCost}
	}
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

// Governing is a component's most urgent CML; nil when it has none.
func (f *Findings) Governing(c *survey.Component) *survey.Assessed { return f.governing[c] }

// PlanAcross plans repairs over several surveys with one budget, its first
// year starting at the newest survey's date.
func PlanAcross(surveys []*survey.Survey, set Settings) Repairs {
	var cands []*plan.Candidate
	var noCost []plan.NoCost
	var latest *survey.Survey
	for _, s := range surveys {
		cs, nc := plan.Candidates(s.Title, survey.Assess(s, set.Policy), set.Plan.Costs)
		cands, noCost = append(cands, cs...), append(noCost, nc...)
		if latest == nil || s.Date.After(latest.Date) {
			latest = s
		}
	}
	return Repairs{Plan: set.Plan.Make(cands, latest.Date), NoCost: noCost}
}
