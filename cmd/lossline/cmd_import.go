package main

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	"github.com/lossline/lossline/intake"
	"github.com/lossline/lossline/survey"
)

func newImportCmd() *cobra.Command {
	c := &cobra.Command{
		Use:   "import SURVEY FILE...",
		Short: "Merge readings from CSV, TSV or .xlsx files into survey.md",
		Long: "Reads thickness readings from each FILE (CSV or TSV in UTF-8 or UTF-16, or an .xlsx workbook)\n" +
			"in one of three shapes — long (a reading a row), wide (a column per visit date) or grid\n" +
			"(a column per point) — and writes them into SURVEY/survey.md as visit columns of the\n" +
			"CMLs' reading tables. Only those tables change; the previous survey.md is kept as\n" +
			"survey.md.orig. Readings already there must be the same. --dry-run prints the change as\n" +
			"a unified diff and writes nothing.",
		Example: "  lossline import site-2026 gauge-export.csv --date 2026-11-18 --dry-run",
		Args:    cobra.MinimumNArgs(2),
		RunE:    runImport,
	}
	f := c.Flags()
	f.String("date", "", "visit `DATE` (YYYY-MM-DD) of rows without a date")
	f.Bool("dry-run", false, "print the change as a unified diff and write nothing")
	f.String("new", "", "add CMLs survey.md lacks to this `COMPONENT` (\"Asset / Component\", or a component's name)")
	f.StringArray("map", nil, "`KEY=HEADER`: the column headed HEADER holds KEY ("+strings.Join(intake.MapKeys, ", ")+"); points: headers separated by commas")
	f.StringSlice("previous", nil, "earlier survey `DIR`s whose readings merge in (besides the front matter's previous:)")
	addSettingFlags(c)
	return c
}

func runImport(c *cobra.Command, args []string) error {
	dir := survey.FolderOf(args[0])
	set, err := loadSettings(c, dir)
	if err != nil {
		return err
	}
	opt := intake.Options{}
	if opt.Map, err = importMap(c, set); err != nil {
		return err
	}
	if text := flagString(c, "date"); text != "" {
		d, ok := survey.ParseVisitDate(text)
		if !ok {
			return usageError{fmt.Errorf("--date %q is not a date: write YYYY-MM-DD", text)}
		}
		opt.Date = &d
	}
	previous, _ := c.Flags().GetStringSlice("previous")
	s, problems := survey.LoadSeries(dir, previous, set.Read)
	if problems.HasErrors() {
		return survey.InputError{Problems: problems}
	}
	opt.Units = s.Units
	var files []*intake.File
	var bad intake.ProblemList
	for _, name := range args[1:] {
		f, ps := intake.ReadFile(name, opt)
		bad = append(bad, ps...)
		if f != nil {
			files = append(files, f)
		}
	}
	change, ps := intake.Plan(s, files, intake.MergeOptions{NewComponent: flagString(c, "new")})
	if bad = append(bad, ps...); len(bad) > 0 {
		bad.Sort()
		return badInput{bad.Err()}
	}
	dry, _ := c.Flags().GetBool("dry-run")
	report := c.OutOrStdout()
	if dry {
		report = c.ErrOrStderr() // stdout holds the diff only
	}
	describeImport(report, files, change)
	if dry {
		fmt.Fprint(c.OutOrStdout(), change.Diff)
		fmt.Fprintf(report, "dry run: %s not written\n", s.File)
		return nil
	}
	if change.Diff == "" {
		fmt.Fprintf(report, "%s already holds every reading: not written\n", s.File)
		return nil
	}
	backup, err := intake.WriteChecklist(s.File, change.Old, change.New)
	if err != nil {
		return err
	}
	after, problems := survey.LoadSeries(dir, previous, set.Read)
	if problems.HasErrors() {
		// Plan checked the new checklist alone; an error only the whole series
		// shows puts the previous version back.
		if rerr := intake.Restore(s.File, backup); rerr != nil {
			return errors.Join(survey.InputError{Problems: problems}, rerr)
		}
		fmt.Fprintf(c.ErrOrStderr(), "%s not changed: the survey would not read with the imported readings\n", s.File)
		return survey.InputError{Problems: problems}
	}
	fmt.Fprintf(report, "wrote %s (the previous version is %s)\n", s.File, backup)
	for _, p := range problems {
		fmt.Fprintln(report, p)
	}
	fmt.Fprintf(report, "%d %s, %d %s\n", len(after.AllCMLs()), plural(len(after.AllCMLs()), "CML", "CMLs"), len(problems), plural(len(problems), "warning", "warnings"))
	return nil
}

// importMap is the column map of the settings' import: block, with --map
// entries over it.
func importMap(c *cobra.Command, set settings) (intake.Map, error) {
	var m intake.Map
	from := map[string]string{}
	for _, row := range set.Listing {
		if key, ok := strings.CutPrefix(row.Name, "import."); ok {
			from[key] = row.Source
		}
	}
	for key, header := range set.Import {
		if err := m.Set(key, header, from[key]); err != nil {
			return m, badInput{err}
		}
	}
	entries, _ := c.Flags().GetStringArray("map")
	for _, e := range entries {
		key, header, ok := strings.Cut(e, "=")
		if !ok || strings.TrimSpace(header) == "" {
			return m, usageError{fmt.Errorf("--map %q: write KEY=HEADER, e.g. --map reading=Thk", e)}
		}
		if err := m.Set(key, header, "--map"); err != nil {
			return m, usageError{fmt.Errorf("--map %q: %v", e, err)}
		}
	}
	return m, nil
}

// describeImport says what was read from each file and what changes.
func describeImport(w io.Writer, files []*intake.File, ch *intake.Change) {
	for _, f := range files {
		for _, n := range f.Notes {
			fmt.Fprintf(w, "%s: %s\n", f.Name, n)
		}
		values, cmls := 0, map[string]bool{}
		for _, r := range f.Readings {
			values += len(r.Values)
			cmls[r.CML] = true
		}
		fmt.Fprintf(w, "%s: %d %s of %d %s", f.Name, values, plural(values, "reading", "readings"), len(cmls), plural(len(cmls), "CML", "CMLs"))
		if len(f.NotRead) > 0 {
			fmt.Fprintf(w, "; rows without a reading: %s", strings.Join(f.NotRead, ", "))
		}
		fmt.Fprintln(w)
	}
	fmt.Fprintf(w, "%s: %d CML %s written, %d already there", ch.File, ch.Filled, plural(ch.Filled, "visit", "visits"), ch.Same)
	if len(ch.Columns) > 0 {
		fmt.Fprintf(w, "; visit columns added: %s", strings.Join(ch.Columns, ", "))
	}
	if len(ch.Added) > 0 {
		fmt.Fprintf(w, "; CMLs added: %s", strings.Join(ch.Added, ", "))
	}
	if ch.Notes > 0 {
		fmt.Fprintf(w, "; %d remarks written", ch.Notes)
	}
	fmt.Fprintln(w)
}

// plural is one or many by n.
func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}
