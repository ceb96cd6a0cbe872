package main

import (
	"github.com/spf13/cobra"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
)

func newCompareCmd() *cobra.Command {
	c := &cobra.Command{
		Use:   "compare OLD NEW",
		Short: "Print what changed between an earlier survey folder and a newer one",
		Long: "Merges OLD's readings into NEW (by CML id, with NEW's was column for renamed CMLs) and prints\n" +
			"per CML the previous and current thickness, the latest interval's rate, the repair window\n" +
			"before and now, and what changed; then CMLs no longer listed and design data that changed.",
		Example: "  lossline compare site-2022 site-2026 --csv",
		Args:    cobra.ExactArgs(2),
		RunE:    runCompare,
	}
	c.Flags().Bool("csv", false, "print CSV instead of an aligned table")
	addSettingFlags(c)
	return c
}

func runCompare(c *cobra.Command, args []string) error {
	oldDir, newDir := survey.FolderOf(args[0]), survey.FolderOf(args[1])
	set, err := loadSettings(c, newDir)
	if err != nil {
		return err
	}
	s, problems := survey.LoadSeries(newDir, []string{oldDir}, set.Read)
	if problems.HasErrors() {
		return survey.InputError{Problems: problems}
	}
	asCSV, _ := c.Flags().GetBool("csv")
	out, err := report.Comparison(findings.Compute(s, set.findings()), set.Display, asCSV)
	if err != nil {
		return err
	}
	_, err = c.OutOrStdout().Write(out)
	return err
}
