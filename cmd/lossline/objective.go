package main

import (
	"strings"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
)

// checkFailureCosts refuses the money objective when a component with a
// repair cost has a consequence level without a failure cost in the
// settings, at the component's consequence line (or its heading).
func checkFailureCosts(surveys []*survey.Survey, set settings) error {
	if set.Plan.Budget <= 0 || set.Plan.Objective == "" || set.Plan.Objective == "risk" {
		return nil
	}
	var problems survey.ProblemList
	for _, s := range surveys {
		for _, a := range s.Assets {
			for _, c := range a.Components {
				d := c.Design
				if d.RepairCost == nil && d.RepairItem == "" {
					continue
				}
				level := plan.ConsequenceLevel(d.Consequence)
				if set.Plan.Money.Given(level) {
					continue
				}
				line := d.Lines["consequence"]
				if line == 0 {
					line = c.Line
				}
				name := survey.Consequence(level).String()
				problems.Errorf(c.File, line, "objective %s needs the failure cost of consequence %s for %s / %s: set failure-cost-%s",
					set.Plan.Objective, name, a.Name, c.Name, strings.ReplaceAll(name, " ", "-"))
			}
		}
	}
	if problems.HasErrors() {
		problems.Sort()
		return survey.InputError{Problems: problems}
	}
	return nil
}
