package main

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"
)

func newRoot(stdout, stderr io.Writer) *cobra.Command {
	root := &cobra.Command{
		Use:   "lossline",
		Short: "Corrosion thickness survey in, inspection report out",
		Long: "lossline reads a survey folder (survey.md, photos/, lossline.yaml) of ultrasonic thickness\n" +
			"readings and writes a PDF report with corrosion rates, remaining life, retirement and\n" +
			"next-inspection dates, plus results.json and results.csv.",
		Example:       "  lossline report site-2026",
		Version:       version,
		Args:          unknownCommand,
		RunE:          func(c *cobra.Command, _ []string) error { return c.Help() },
		SilenceErrors: true,
		SilenceUsage:  true,
		// A misspelt command within two edits is suggested.
		SuggestionsMinimumDistance: 2,
	}
	root.SetOut(stdout)
	root.SetErr(stderr)
	root.SetFlagErrorFunc(func(_ *cobra.Command, err error) error { return usageError{err} })
	root.AddCommand(newReportCmd(), newCheckCmd(), newNewCmd(), newCompareCmd(), newPlanCmd(), newPhotosCmd(), newImportCmd(), newSheetCmd(), newDueCmd())
	root.InitDefaultHelpCmd()
	root.InitDefaultCompletionCmd()
	argsAreUsage(root)
	return root
}

// unknownCommand refuses arguments to the root command: they can only be a
// misspelt command.
func unknownCommand(c *cobra.Command, args []string) error {
	if len(args) == 0 {
		return nil
	}
	msg := fmt.Sprintf("unknown command %q for %q", args[0], c.CommandPath())
	if s := c.SuggestionsFor(args[0]); len(s) > 0 {
		msg += "; did you mean " + strings.Join(s, " or ") + "?"
	}
	return usageError{errors.New(msg)}
}

// argsAreUsage makes every argument check of c and its subcommands a usage
// error (exit 2), whatever error type the check returns.
func argsAreUsage(c *cobra.Command) {
	if check := c.Args; check != nil {
		c.Args = func(cmd *cobra.Command, args []string) error {
			err := check(cmd, args)
			if err == nil || errors.As(err, new(usageError)) {
				return err
			}
			return usageError{err}
		}
	}
	for _, sub := range c.Commands() {
		argsAreUsage(sub)
	}
}
