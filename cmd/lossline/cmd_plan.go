package main

import (
	"fmt"
	"os"
	"path/filepath"

	"github.com/spf13/cobra"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
)

func newPlanCmd() *cobra.Command {
	c := &cobra.Command{
		Use:   "plan SURVEY... --budget AMOUNT [--plan-years N --budget-per-year AMOUNT] [--curve]",
		Short: "Plan repairs for a budget across one or several survey folders",
		Long: "Chooses the repairs that remove the most risk for the money: mandatory repairs first (components at\n" +
			"or below required thickness, then those retiring inside the plan), then the best set within the money\n" +
			"left (0/1 knapsack). Every row shows the numbers it was decided on and a status code: funded,\n" +
			"mandatory-funded, mandatory-unfunded (with the money missing) or deferred. A folder that is not a\n" +
			"survey folder is searched for survey folders, each series read once by its latest folder.\n" +
			"--curve prints the budget curve instead: the risk removed for each first-year budget.\n" +
			"Settings (costs, currency) come from the first survey folder.",
		Example: "  lossline plan site-2026 site-2026-tanks --budget \"60 000\" --plan-years 3 --budget-per-year 45000\n" +
			"  lossline plan sites/ --budget 100000 --curve",
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) == 0 {
				return usageError{fmt.Errorf("plan needs at least one survey folder")}
			}
			return nil
		},
		RunE: runPlan,
	}
	c.Flags().Bool("csv", false, "print CSV instead of an aligned table")
	c.Flags().Bool("curve", false, "print the budget curve as CSV: the risk removed for each first-year budget")
	addSettingFlags(c)
	return c
}

// planFolders are the survey folders of plan's arguments: a survey folder
// (or its survey.md) as given, any other folder searched for survey folders.
func planFolders(args []string) ([]string, survey.ProblemList) {
	var dirs []string
	var problems survey.ProblemList
	for _, a := range args {
		dir := survey.FolderOf(a)
		_, err := os.Lstat(filepath.Join(dir, survey.ChecklistFile))
		if st, derr := os.Stat(dir); err == nil || derr != nil || !st.IsDir() {
			dirs = append(dirs, dir) // a survey folder; or the reader says what is missing
			continue
		}
		found, ps := survey.FindSurveys([]string{dir})
		dirs, problems = append(dirs, found...), append(problems, ps...)
	}
	return dirs, problems
}

func runPlan(c *cobra.Command, args []string) error {
	dirs, problems := planFolders(args)
	if problems.HasErrors() {
		return survey.InputError{Problems: problems}
	}
	set, err := loadSettings(c, dirs[0])
	if err != nil {
		return err
	}
	if set.Plan.Budget <= 0 && !c.Flags().Changed("budget") {
		return usageError{fmt.Errorf("give --budget AMOUNT (or budget: in the settings)")}
	}
	var surveys []*survey.Survey
	for _, dir := range dirs {
		s, problems := survey.LoadSeries(dir, nil, set.Read)
		if problems.HasErrors() {
			return survey.InputError{Problems: problems}
		}
		surveys = append(surveys, s)
	}
	if err := checkFailureCosts(surveys, set); err != nil {
		return err
	}
	r := findings.PlanAcross(surveys, set.findings())
	var out []byte
	if curve, _ := c.Flags().GetBool("curve"); curve {
		// How the curve was computed, and what it is exact at, goes to
		// stderr beside the CSV.
		fmt.Fprintln(c.ErrOrStderr(), report.CurveMethod(r.Curve, set.Plan.Costs.Currency))
		out, err = report.CurveCSV(r.Curve, set.Plan.Costs.Currency)
	} else {
		asCSV, _ := c.Flags().GetBool("csv")
		out, err = report.PlanText(r, set.Plan.Costs.Currency, asCSV)
	}
	if err != nil {
		return err
	}
	_, err = c.OutOrStdout().Write(out)
	return err
}
