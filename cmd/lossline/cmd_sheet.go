package main

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
)

func newSheetCmd() *cobra.Command {
	c := &cobra.Command{
		Use:   "sheet SURVEY",
		Short: "Write the field sheet for the next visit: PDF to print, or .xlsx or CSV to fill in",
		Long: "Lists per component each CML with its location, its last two readings, the thickness\n" +
			"projected to today at its governing rate and the required thickness, with cells for the\n" +
			"new readings and remarks. The form follows FILE's extension: .pdf, .xlsx or .csv; lossline\n" +
			"import reads a filled .xlsx or .csv back without a column map.",
		Example: "  lossline sheet site-2026 -o site-2026-sheet.xlsx",
		Args:    cobra.ExactArgs(1),
		RunE:    runSheet,
	}
	c.Flags().StringP("out", "o", "", "output `FILE`: .pdf, .xlsx or .csv (default SURVEY/field-sheet.pdf)")
	c.Flags().String("today", "", "`DATE` (YYYY-MM-DD) the thicknesses are projected to (default: today)")
	c.Flags().StringSlice("previous", nil, "earlier survey `DIR`s whose readings merge in (besides the front matter's previous:)")
	addSettingFlags(c)
	return c
}

// sheetForms renders the field sheet by the output file's extension.
var sheetForms = map[string]func(report.FieldSheet) ([]byte, error){
	".pdf":  func(fs report.FieldSheet) ([]byte, error) { return report.FieldSheetPDF(fs, version) },
	".xlsx": report.FieldSheetXLSX,
	".csv":  report.FieldSheetCSV,
}

func runSheet(c *cobra.Command, args []string) error {
	dir := survey.FolderOf(args[0])
	out := flagString(c, "out")
	if out == "" {
		out = filepath.Join(dir, "field-sheet.pdf")
	}
	render, ok := sheetForms[strings.ToLower(filepath.Ext(out))]
	if !ok {
		return usageError{fmt.Errorf("-o %s: the field sheet is written as .pdf, .xlsx or .csv", out)}
	}
	if st, err := os.Stat(out); err == nil && !st.Mode().IsRegular() {
		return badInput{fmt.Errorf("%s: not a file", out)}
	}
	today := time.Now()
	if text := flagString(c, "today"); text != "" {
		d, ok := survey.ParseVisitDate(text)
		if !ok || d.MonthOnly {
			return usageError{fmt.Errorf("--today %q is not a date: write YYYY-MM-DD", text)}
		}
		today = d.Time
	}
	today = time.Date(today.Year(), today.Month(), today.Day(), 0, 0, 0, 0, time.UTC)
	set, err := loadSettings(c, dir)
	if err != nil {
		return err
	}
	previous, _ := c.Flags().GetStringSlice("previous")
	s, problems := survey.LoadSeries(dir, previous, set.Read)
	if problems.HasErrors() {
		return survey.InputError{Problems: problems}
	}
	for _, p := range problems {
		fmt.Fprintln(c.ErrOrStderr(), p)
	}
	fs := report.BuildFieldSheet(findings.Compute(s, set.findings()), today, set.Display)
	data, err := render(fs)
	if err != nil {
		return err
	}
	if err := report.WriteFile(out, data); err != nil {
		return err
	}
	n := 0
	for _, sc := range fs.Components {
		n += len(sc.Rows)
	}
	fmt.Fprintf(c.OutOrStdout(), "wrote %s: %d CMLs, thicknesses projected to %s\n", out, n, today.Format("2006-01-02"))
	return nil
}
