package plan

import (
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/survey"
)

// Anode replacement and recoating enter the plan (our rules): two anodes
// spent within a year of the first at 950 each cost 1 900, due when the first
// is spent; 6 m² at 140 per m² cost 840, due now at Ri 3 (ISO 12944-1:2017
// takes Ri 3 of ISO 4628-3 as the end of a coating's durability, from
// memory). With a budget of 3 000 a year both are mandatory-funded in year 1,
// the first year with the money (the planner's rule for repairs due inside
// the plan); the anodes are due in plan year 3 (2029-03-01 is 2.28 y after
// 2026-11-18).
func TestUpkeepCandidates(t *testing.T) {
	day := func(s string) *survey.VisitDate {
		d, _ := time.Parse("2006-01-02", s)
		return &survey.VisitDate{Time: d}
	}
	pct, area := 1.0, 6.0
	anodeCost, recoat := survey.Money(95000), survey.Money(14000)
	e := &survey.Electro{
		Anodes: []*survey.AnodeRow{
			{ID: "A-1", Replace: day("2029-03-01")}, {ID: "A-2", Replace: day("2029-12-01")}, {ID: "A-3", Replace: day("2031-06-01")},
		},
		AnodeReplacement: day("2029-03-01"), AnodeCost: &anodeCost, RecoatCostPerM2: &recoat,
		Coating: survey.Coating{RustedPct: &pct, BreakdownM2: &area, ISORi: 3, D610: 6},
	}
	comp := &survey.Component{Name: "Pile P-3", Design: survey.Design{Electro: e}}
	s := &survey.Survey{Title: "t", Date: day("2026-11-18").Time, Assets: []*survey.Asset{{Name: "Jetty", Components: []*survey.Component{comp}}}}
	cands := UpkeepCandidates("t", s, s.Date, 5)
	if len(cands) != 2 {
		t.Fatalf("%d candidates", len(cands))
	}
	if c := cands[0]; c.Work != WorkAnodes || c.Cost != 190000 || c.Name() != "Jetty / Pile P-3 (anode replacement)" {
		t.Errorf("anodes: %s %v %s", c.Work, c.Cost, c.Name())
	}
	if c := cands[1]; c.Work != WorkRecoat || c.Cost != 84000 || c.Deadline == nil || !c.Deadline.Equal(s.Date) {
		t.Errorf("recoat: %s %v %v", c.Work, c.Cost, c.Deadline)
	}
	if n := len(UpkeepCandidates("t", s, s.Date, 2)); n != 1 {
		t.Errorf("a 2-year plan takes %d upkeep rows, want the recoating only", n)
	}
	set := Settings{Years: 5, Budget: 300000}
	p := set.Make(cands, s.Date)[0]
	for _, r := range p.Rows {
		if r.Status != StatusMandatoryFunded || r.Year != 1 {
			t.Errorf("%s: %s in year %d (%s)", r.Candidate.Name(), r.Status, r.Year, r.Why)
		}
		if r.Candidate.Work == WorkAnodes && !strings.HasPrefix(r.Why, "first anode spent 2029-03-01: due 2029-03-01 (plan year 3)") {
			t.Errorf("anodes: %s", r.Why)
		}
	}
	// With 500 EUR a year, neither fits: the reason gives the money missing
	// in the settings' currency (1 900 − 500 = 1 400 for the anodes).
	set = Settings{Years: 5, Budget: 50000, Costs: Costs{Currency: "EUR"}}
	for _, r := range set.Make(cands, s.Date)[0].Rows {
		if r.Candidate.Work == WorkAnodes && !strings.HasSuffix(r.Why, "no plan year has the money: 1 400 EUR missing") {
			t.Errorf("anodes without the money: %s", r.Why)
		}
	}
}
