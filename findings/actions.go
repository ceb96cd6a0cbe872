package findings

import (
	"time"

	"github.com/lossline/lossline/actions"
	"github.com/lossline/lossline/survey/plan"
)

// plannedRepairs are the repair plan's rows with a plan year, due by the end
// of that year or by the repair's deadline if sooner.
func plannedRepairs(r *Repairs, start time.Time, years int) []actions.Planned {
	if r == nil {
		return nil
	}
	ends := plan.YearEnds(start, years)
	var out []actions.Planned
	for _, ch := range r.Plan.Rows {
		year := ch.Year
		if ch.Status == plan.StatusMandatoryUnfunded {
			year = ch.At
		}
		if year < 1 {
			continue
		}
		due := ends[min(year, len(ends))-1]
		if d := ch.Candidate.Deadline; d != nil && d.Before(due) {
			due = *d
		}
		if due.Before(start) {
			due = start
		}
		out = append(out, actions.Planned{Asset: ch.Candidate.Asset, Component: ch.Candidate.Component, Year: year, Due: due,
			Mandatory: ch.Status == plan.StatusMandatoryFunded || ch.Status == plan.StatusMandatoryUnfunded, Why: ch.Why})
	}
	return out
}
