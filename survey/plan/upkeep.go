package plan

import (
	"fmt"
	"slices"
	"time"

	"github.com/lossline/lossline/survey"
)

// Works of a candidate that is not a wall repair.
const (
	WorkAnodes = "anode replacement"
	WorkRecoat = "recoating"
)

// RecoatRi is the ISO 4628-3 rust degree at which a coating is due for
// maintenance painting now: Ri 3, the degree ISO 12944-1:2017 takes as the
// end of a coating's durability (from memory).
const RecoatRi = 3

// UpkeepCandidates are the anode replacements and recoatings of a survey's
// components that give their costs and fall due within the plan's years from
// start: anodes due when the first one is spent, at anode cost × the number
// of anodes spent within a year of it; recoating at recoat cost per m² ×
// breakdown area, due now at Ri 3 or worse, or when the galvanizing's
// shortest life ends. Work due later is left to a later plan.
func UpkeepCandidates(source string, s *survey.Survey, start time.Time, years int) []*Candidate {
	return slices.DeleteFunc(upkeepAll(source, s), func(c *Candidate) bool { return c.Deadline == nil || deadlineYear(start, *c.Deadline) > years })
}

// upkeepAll is every anode replacement and recoating with a cost, due or not.
func upkeepAll(source string, s *survey.Survey) []*Candidate {
	var out []*Candidate
	for _, a := range s.Assets {
		for _, c := range a.Components {
			e := c.Design.Electro
			if e == nil {
				continue
			}
			if e.AnodeCost != nil && e.AnodeReplacement != nil {
				first := e.AnodeReplacement.Time
				n := 0
				for _, an := range e.Anodes {
					if an.Replace != nil && !an.Replace.Time.After(first.AddDate(1, 0, 0)) {
						n++
					}
				}
				cost, rounded, err := e.AnodeCost.Times(float64(n))
				if err == nil {
					out = append(out, &Candidate{Source: source, Asset: a.Name, Component: c, Work: WorkAnodes, Cost: cost, Rounded: rounded,
						CostBasis: fmt.Sprintf("%d anode(s) × %s", n, *e.AnodeCost), Deadline: &first,
						WorkWhy: fmt.Sprintf("first anode spent %s", first.Format("2006-01-02"))})
				}
			}
			co := e.Coating
			if e.RecoatCostPerM2 != nil && co.BreakdownM2 != nil {
				cost, rounded, err := e.RecoatCostPerM2.Times(*co.BreakdownM2)
				if err != nil {
					continue
				}
				cand := &Candidate{Source: source, Asset: a.Name, Component: c, Work: WorkRecoat, Cost: cost, Rounded: rounded,
					CostBasis: fmt.Sprintf("%g m² × %s per m²", *co.BreakdownM2, *e.RecoatCostPerM2)}
				switch {
				case co.RustedPct != nil && co.ISORi >= RecoatRi:
					now := s.Date
					cand.Deadline, cand.WorkWhy = &now, fmt.Sprintf("rust degree Ri %d (ASTM D610 grade %d) is at or past Ri %d", co.ISORi, co.D610, RecoatRi)
				case co.GalvanizingEnd != nil:
					end := co.GalvanizingEnd.Time
					cand.Deadline, cand.WorkWhy = &end, fmt.Sprintf("galvanizing's shortest life ends %s", end.Format("2006-01-02"))
				case co.RustedPct != nil:
					cand.WorkWhy = fmt.Sprintf("rust degree Ri %d, short of Ri %d: not yet due", co.ISORi, RecoatRi)
				default:
					cand.WorkWhy = "no rusted area or zinc thickness: not yet due"
				}
				out = append(out, cand)
			}
		}
	}
	return out
}

// upkeepReason is why an anode replacement or recoating is due.
func upkeepReason(c *Candidate, v valuation) string {
	if c.Deadline == nil {
		return c.WorkWhy
	}
	return fmt.Sprintf("%s: due %s (plan year %d)", c.WorkWhy, c.Deadline.Format("2006-01-02"), deadlineYear(v.start, *c.Deadline))
}
