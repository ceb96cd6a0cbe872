package main

import (
	"io"

	"github.com/spf13/cobra"
)

func newRoot(stdout, stderr io.Writer) *cobra.Command {
	root := &cobra.Command{
		Use:   "lossline",
		Short: "Corrosion thickness survey in, inspection report out",
		Long: "lossline reads a survey folder (survey.md, photos/, lossline.yaml) of ultrasonic thickness\n" +
			"readings and writes a PDF report with corrosion rates, remaining life, retirement and\n" +
			"next-inspection dates, plus results.json and results.csv.",
		Version:       version,
		SilenceErrors: true,
		SilenceUsage:  true,
	}
	root.SetOut(stdout)
	root.SetErr(stderr)
	root.SetFlagErrorFunc(func(_ *cobra.Command, err error) error { return usageError{err} })
	root.AddCommand(newReportCmd(), newCheckCmd(), newNewCmd(), newCompareCmd(), newPlanCmd(), newPhotosCmd())
	for _, c := range root.Commands() {
		c.SetFlagErrorFunc(func(_ *cobra.Command, err error) error { return usageError{err} })
	}
	return root
}

// exactArgs is cobra.ExactArgs with a usage error.
func exactArgs(n int) cobra.PositionalArgs {
	return func(cmd *cobra.Command, args []string) error {
		if err := cobra.ExactArgs(n)(cmd, args); err != nil {
			return usageError{err}
		}
		return nil
	}
}
