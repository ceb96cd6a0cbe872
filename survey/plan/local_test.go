package plan

import (
	"testing"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// localComponent is a component whose one local-damage assessment leaves
// life years from 2026-01-01.
func localComponent(life float64) *survey.Component {
	return &survey.Component{Name: "C", Design: survey.Design{
		Consequence: survey.ConsequenceHigh, RepairCost: ptrMoney(units(1000)),
		Local: &survey.LocalDamage{Date: day("2026-01-01"), Assessments: []*survey.LocalAssessment{{LifeY: f(life), Limit: "the limit"}}},
	}}
}

func ptrMoney(m survey.Money) *survey.Money { return &m }

// The risk, the plan's risk over time, its deadline and mandatory repairs
// take the shorter of the wall's life and the local damage's (lossline's
// own rule, stated in the methods appendix).
func TestLocalDamageInRiskAndPlan(t *testing.T) {
	wall := wallloss.Result{Class: wallloss.FiniteLife, RemainingLifeY: f(20), CurrentDate: ptrTime(day("2026-01-01"))}
	a := &survey.Asset{Name: "A"}
	for _, c := range []struct {
		life        float64
		want        Likelihood
		mandatory   bool
		deadlineDay string
	}{
		{0, AlmostCertain, true, "2026-01-01"},
		{2, Likely, false, "2028-01-01"},
		{30, Rare, false, ""}, // the wall (20 y) governs the risk; no retirement date is set by the wall here
	} {
		comp := localComponent(c.life)
		it := &survey.Assessed{Asset: a, Component: comp, CML: &survey.CML{ID: "X"}, Result: wall}
		if got := RiskOf(it).Likelihood; got != c.want {
			t.Errorf("local life %v: likelihood %v, want %v", c.life, got, c.want)
		}
		cands, _ := Candidates("s", []*survey.Assessed{it}, Costs{})
		if len(cands) != 1 || cands[0].Mandatory != c.mandatory {
			t.Fatalf("local life %v: candidates %+v", c.life, cands)
		}
		before, _ := cands[0].RiskAt(day("2026-01-01"))
		if want := int(c.want) * 4; before != want {
			t.Errorf("local life %v: risk at the start %d, want %d", c.life, before, want)
		}
		if c.deadlineDay != "" && (cands[0].Deadline == nil || cands[0].Deadline.Format("2006-01-02") != c.deadlineDay) {
			t.Errorf("local life %v: deadline %v, want %s", c.life, cands[0].Deadline, c.deadlineDay)
		}
	}
}

func ptrTime(t time.Time) *time.Time { return &t }
