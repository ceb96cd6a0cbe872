package main

import (
	"fmt"

	"github.com/spf13/cobra"

	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
)

func newCheckCmd() *cobra.Command {
	c := &cobra.Command{
		Use:   "check SURVEY",
		Short: "Check a survey folder and list every problem, writing nothing",
		Long: "Prints every problem as path:line: message. Exits 1 if any is an error, 0 otherwise\n" +
			"(warnings alone do not fail the check).",
		Example: "  lossline check site-2026",
		Args:    cobra.ExactArgs(1),
		RunE:    runCheck,
	}
	c.Flags().StringSlice("previous", nil, "earlier survey `DIR`s whose readings merge in (besides the front matter's previous:)")
	addSettingFlags(c)
	return c
}

func runCheck(c *cobra.Command, args []string) error {
	dir := survey.FolderOf(args[0])
	set, err := loadSettings(c, dir)
	if err != nil {
		return err
	}
	previous, _ := c.Flags().GetStringSlice("previous")
	s, problems := survey.LoadSeries(dir, previous, set.Read)
	if s != nil {
		problems = append(problems, report.TextWarnings(s)...)
		problems.Sort()
	}
	w := c.OutOrStdout()
	errs := 0
	for _, p := range problems {
		fmt.Fprintln(w, p)
		if p.Severity == survey.Error {
			errs++
		}
	}
	fmt.Fprintf(w, "%d %s, %d %s\n", errs, plural(errs, "error", "errors"), len(problems)-errs, plural(len(problems)-errs, "warning", "warnings"))
	if errs > 0 {
		return silentExit(exitBadInput)
	}
	return nil
}
