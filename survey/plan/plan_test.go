package plan

import (
	"math"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

func day(s string) time.Time {
	t, _ := time.Parse("2006-01-02", s)
	return t
}

func f(v float64) *float64 { return &v }

// units is an amount of whole currency units.
func units(n int64) survey.Money { return survey.Money(n * 100) }

// Risk bands at their boundaries (lossline's own table, stated in the report).
func TestLikelihoodBands(t *testing.T) {
	for _, c := range []struct {
		life float64
		want Likelihood
	}{
		{0, AlmostCertain}, {0.999, AlmostCertain}, {1, Likely}, {2.999, Likely}, {3, Possible}, {4.999, Possible},
		{5, Unlikely}, {9.999, Unlikely}, {10, Rare}, {math.Inf(1), Rare}, {math.NaN(), Possible},
	} {
		if got := LikelihoodOfLife(c.life); got != c.want {
			t.Errorf("life %v: %v, want %v", c.life, got, c.want)
		}
	}
	for _, c := range []struct {
		l    Likelihood
		cons int
		want string
	}{
		{Rare, 4, "low"}, {Rare, 5, "medium"}, {Possible, 3, "medium"}, {Unlikely, 5, "high"}, {Likely, 3, "high"},
		{Possible, 5, "very high"}, {AlmostCertain, 3, "very high"}, {AlmostCertain, 5, "very high"},
	} {
		if got := (Risk{c.l, c.cons}).Level(); got != c.want {
			t.Errorf("%v × %d = %d: %s, want %s", c.l, c.cons, c.l*Likelihood(c.cons), got, c.want)
		}
	}
	if ConsequenceLevel(survey.ConsequenceUnknown) != 4 {
		t.Error("a consequence not given is taken as high")
	}
}

// A fitted rate's lower confidence bound raises the likelihood.
func TestLikelihoodUsesLowerBound(t *testing.T) {
	r := wallloss.Result{Class: wallloss.FiniteLife, RemainingLifeY: f(6), RemainingLifeLowY: f(4)}
	if LikelihoodOf(r) != Possible {
		t.Errorf("central 6 y, lower bound 4 y: %v, want possible", LikelihoodOf(r))
	}
}

// candidate builds a one-CML component: thickness now, rate, required, cost.
func candidate(name string, cost survey.Money, nowMM, rate, reqMM float64, cons survey.Consequence) *Candidate {
	readings := []wallloss.Reading{{Date: day("2021-01-01"), ThicknessMM: nowMM + 5*rate}, {Date: day("2026-01-01"), ThicknessMM: nowMM}}
	res := wallloss.Assess(wallloss.Input{Readings: readings, RequiredMM: &reqMM}, wallloss.Policy{IntervalCapYears: 10})
	comp := &survey.Component{Name: name, Design: survey.Design{Consequence: cons, RepairCost: &cost, NominalMM: f(10)}}
	it := &survey.Assessed{Asset: &survey.Asset{Name: "A"}, Component: comp, CML: &survey.CML{ID: name}, Result: res}
	cands, _ := Candidates("s", []*survey.Assessed{it}, Costs{})
	return cands[0]
}

func names(cs []Choice) []string {
	var out []string
	for _, c := range cs {
		out = append(out, c.Candidate.Component.Name)
	}
	return out
}

func TestSingleYear(t *testing.T) {
	start := day("2026-01-01")
	below := candidate("below", units(80), 4.9, 0.2, 5, survey.ConsequenceLow)      // at or below required
	risky := candidate("risky", units(50), 5.3, 0.2, 5, survey.ConsequenceVeryHigh) // 1.5 y left: likely × 5
	calm := candidate("calm", units(40), 9, 0.1, 5, survey.ConsequenceLow)          // 40 y: rare
	// Anything at or below required comes first even if another buys more.
	p := Single([]*Candidate{below, risky, calm}, start, units(100))
	if got := names(p.Funded()); len(got) != 1 || got[0] != "below" {
		t.Errorf("chosen %v, want [below]", got)
	}
	// A budget that exactly fits both.
	p = Single([]*Candidate{below, risky}, start, units(130))
	if len(p.Funded()) != 2 || p.Spent[0] != units(130) || len(p.Unfunded()) != 0 {
		t.Errorf("exact fit: %+v", p)
	}
	// Zero budget: nothing funded, and the plan says the repairs at or below required do not fit.
	p = Single([]*Candidate{below, risky, calm}, start, 0)
	if len(p.Funded()) != 0 || len(p.Unfunded()) != 3 || p.MandatoryOver != units(80) {
		t.Errorf("zero budget: chosen %v, deferred %d, over %v", names(p.Funded()), len(p.Unfunded()), p.MandatoryOver)
	}
	// The risk a deferred repair still carries, at the end of the plan, most first:
	// risky has 0.5 y left by then (almost certain × very high = 25), below 5 × 2 = 10.
	if d := p.Unfunded(); d[0].Candidate.Component.Name != "risky" || d[0].RiskEnd != 25 || d[1].RiskEnd != 10 {
		t.Errorf("deferred %v with risks %d, %d", names(d), d[0].RiskEnd, d[1].RiskEnd)
	}
}

func TestMultiYear(t *testing.T) {
	start := day("2026-01-01")
	// Retires in about 1.5 years (deadline in plan year 2), costs more than any one year's budget.
	big := candidate("big", units(100), 5.3, 0.2, 5, survey.ConsequenceHigh)
	p := MultiYear([]*Candidate{big}, start, []survey.Money{units(50), units(50), units(50)})
	if len(p.Uncovered) != 1 || p.Uncovered[0].Money != units(50) {
		t.Fatalf("uncovered %+v, want big short by 50", p.Uncovered)
	}
	if len(p.Funded()) != 0 || len(p.Unfunded()) != 1 {
		t.Errorf("chosen %v deferred %d", names(p.Funded()), len(p.Unfunded()))
	}
	// With 100 in year 2, it is placed there, before its deadline.
	p = MultiYear([]*Candidate{big}, start, []survey.Money{units(50), units(100), units(50)})
	if len(p.Funded()) != 1 || p.Funded()[0].Year != 2 || len(p.Uncovered) != 0 {
		t.Errorf("chosen %+v", p.Funded())
	}
	// Risk is recomputed each year: 6 years left now (unlikely), 4 at the start of year 3 (possible).
	slow := candidate("slow", units(10), 6.2, 0.2, 5, survey.ConsequenceMedium)
	b1, _ := slow.RiskAt(start)
	b3, _ := slow.RiskAt(wallloss.AddYears(start, 2))
	if b1 != int(Unlikely)*3 || b3 != int(Possible)*3 {
		t.Errorf("risk of slow: %d now, %d in year 3; want %d and %d", b1, b3, int(Unlikely)*3, int(Possible)*3)
	}
}

// A budget at or above the total cost of every candidate funds every repair,
// those that remove no risk too, without a search.
func TestBudgetCoveringAllFundsAll(t *testing.T) {
	start := day("2026-01-01")
	below := candidate("below", units(80), 4.9, 0.2, 5, survey.ConsequenceLow)
	risky := candidate("risky", units(50), 5.3, 0.2, 5, survey.ConsequenceVeryHigh)
	calm := candidate("calm", units(40)+1, 9, 0.1, 5, survey.ConsequenceLow) // removes no risk
	cands := []*Candidate{below, risky, calm}
	total := units(170) + 1
	for _, budget := range []survey.Money{total, total + 1, survey.MoneyLimit - 1} {
		p := Single(cands, start, budget)
		if len(p.Funded()) != 3 || len(p.Unfunded()) != 0 || p.Spent[0] != total {
			t.Errorf("budget %s: chosen %v, spent %s", budget, names(p.Funded()), p.Spent[0])
		}
		if s := p.Solutions[0]; !s.Exact || s.Method != MethodAll {
			t.Errorf("budget %s: %+v", budget, s)
		}
	}
	// One cent less: the repair that removes no risk waits; the rest is proved best.
	p := Single(cands, start, total-1)
	if got := names(p.Unfunded()); len(got) != 1 || got[0] != "calm" || !p.Solutions[0].Exact || p.Solutions[0].Method == MethodAll {
		t.Errorf("budget a cent short: deferred %v, %+v", got, p.Solutions[0])
	}
	// Over several years, the first year's budget covering all funds all in year 1.
	p = MultiYear(cands, start, []survey.Money{total, 0, 0})
	for _, c := range p.Funded() {
		if c.Year != 1 {
			t.Errorf("%s in year %d", c.Candidate.Component.Name, c.Year)
		}
	}
	if len(p.Funded()) != 3 {
		t.Errorf("multi-year: chosen %v", names(p.Funded()))
	}
}

// A cost from quantity × unit price is exact to the cent, says when it was
// rounded, and one too large for Money leaves the plan with its checklist line.
func TestCandidateCostFromUnitPrice(t *testing.T) {
	item := func(q float64) *survey.Assessed {
		reqMM := 5.0
		res := wallloss.Assess(wallloss.Input{Readings: []wallloss.Reading{{Date: day("2026-01-01"), ThicknessMM: 8}}, RequiredMM: &reqMM},
			wallloss.Policy{IntervalCapYears: 10})
		comp := &survey.Component{Name: "C", File: "survey.md", Design: survey.Design{RepairQuantity: q, RepairItem: "recoat-m2",
			Lines: map[string]int{"repair": 12}}}
		return &survey.Assessed{Asset: &survey.Asset{Name: "A"}, Component: comp, CML: &survey.CML{ID: "1"}, Result: res}
	}
	costs := Costs{Unit: map[string]survey.Money{"recoat-m2": 85_33}}
	cands, missing := Candidates("s", []*survey.Assessed{item(12.5)}, costs)
	if len(missing) != 0 || cands[0].Cost != 1066_63 || !cands[0].Rounded || cands[0].CostBasis != "12.5 recoat-m2 × 85.33" {
		t.Errorf("12.5 × 85.33: %+v %v", cands[0], missing)
	}
	cands, _ = Candidates("s", []*survey.Assessed{item(40)}, costs)
	if cands[0].Cost != 3413_20 || cands[0].Rounded {
		t.Errorf("40 × 85.33: %+v", cands[0])
	}
	cands, missing = Candidates("s", []*survey.Assessed{item(1e12)}, costs)
	if len(cands) != 0 || len(missing) != 1 || !strings.HasPrefix(missing[0].Reason, "survey.md:12: repair 1e+12 recoat-m2 × 85.33: the cost is too large") {
		t.Errorf("1e12 × 85.33: %v %+v", cands, missing)
	}
}
