package main

import (
	"fmt"

	"github.com/spf13/cobra"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
)

func newPlanCmd() *cobra.Command {
	c := &cobra.Command{
		Use:   "plan SURVEY... --budget AMOUNT [--plan-years N --budget-per-year AMOUNT]",
		Short: "Plan repairs for a budget across one or several survey folders",
		Long: "Chooses the repairs that remove the most risk for the money: repairs of components at or below\n" +
			"required thickness first, then the best set within the budget (0/1 knapsack). Over several years,\n" +
			"components are repaired before their retirement dates where the budgets allow; those that cannot\n" +
			"be are named with the money missing. Settings (costs, currency) come from the first survey folder.",
		Example: "  lossline plan site-2026 site-2026-tanks --budget \"60 000\" --plan-years 3 --budget-per-year 45000",
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) == 0 {
				return usageError{fmt.Errorf("plan needs at least one survey folder")}
			}
			return nil
		},
		RunE: runPlan,
	}
	c.Flags().Bool("csv", false, "print CSV instead of an aligned table")
	addSettingFlags(c)
	return c
}

func runPlan(c *cobra.Command, args []string) error {
	set, err := loadSettings(c, survey.FolderOf(args[0]))
	if err != nil {
		return err
	}
	if set.Plan.Budget <= 0 && !c.Flags().Changed("budget") {
		return usageError{fmt.Errorf("give --budget AMOUNT (or budget: in the settings)")}
	}
	var surveys []*survey.Survey
	for _, dir := range args {
		s, problems := survey.LoadSeries(survey.FolderOf(dir), nil, set.Read)
		if problems.HasErrors() {
			return survey.InputError{Problems: problems}
		}
		surveys = append(surveys, s)
	}
	r := findings.PlanAcross(surveys, set.findings())
	asCSV, _ := c.Flags().GetBool("csv")
	out, err := report.PlanText(r.Plan, r.NoCost, set.Plan.Costs.Currency, asCSV)
	if err != nil {
		return err
	}
	_, err = c.OutOrStdout().Write(out)
	return err
}
