package main

import (
	"fmt"
	"regexp"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
)

func newDueCmd() *cobra.Command {
	c := &cobra.Command{
		Use:   "due DIR... [--within 6m] [--csv]",
		Short: "List what is overdue or due soon across all survey folders under the given folders",
		Long: "Finds every survey folder (a folder holding survey.md) in or under the folders given, reads each\n" +
			"series once by its latest folder (a folder another one names as previous: is read with it), and\n" +
			"lists what is overdue or falls due within the window: CMLs at or below required, retirement dates,\n" +
			"next inspections and scope checklist items not done. Each folder's own lossline.yaml applies.",
		Example: "  lossline due sites/ --within 6m\n  lossline due north-yard south-yard --within 1y --csv",
		Args: func(cmd *cobra.Command, args []string) error {
			if len(args) == 0 {
				return usageError{fmt.Errorf("due needs at least one folder")}
			}
			return nil
		},
		RunE: runDue,
	}
	c.Flags().Bool("csv", false, "print CSV instead of an aligned table")
	c.Flags().String("within", "6m", "the `window` ahead of today: a number and d, w, m or y (days, weeks, months, years)")
	c.Flags().String("today", "", "the `date` to count from, YYYY-MM-DD (default: today's date)")
	addSettingFlags(c)
	return c
}

var windowText = regexp.MustCompile(`^(\d{1,4})\s*([dwmy])$`)

// windowEnd is the last day of a window such as 6m from today.
func windowEnd(today time.Time, within string) (time.Time, error) {
	m := windowText.FindStringSubmatch(strings.ToLower(strings.TrimSpace(within)))
	if m == nil {
		return time.Time{}, fmt.Errorf("--within %q: write a number and d, w, m or y, such as 30d, 6m or 1y", within)
	}
	n, _ := strconv.Atoi(m[1])
	switch m[2] {
	case "d":
		return today.AddDate(0, 0, n), nil
	case "w":
		return today.AddDate(0, 0, 7*n), nil
	case "m":
		return today.AddDate(0, n, 0), nil
	}
	return today.AddDate(n, 0, 0), nil
}

// todayOf is the --today date, or the clock's date.
func todayOf(c *cobra.Command) (time.Time, error) {
	text := flagString(c, "today")
	if text == "" {
		y, m, d := time.Now().Date()
		return time.Date(y, m, d, 0, 0, 0, 0, time.UTC), nil
	}
	t, err := time.Parse("2006-01-02", text)
	if err != nil {
		return time.Time{}, fmt.Errorf("--today %q is not a date YYYY-MM-DD", text)
	}
	return t, nil
}

func runDue(c *cobra.Command, args []string) error {
	today, err := todayOf(c)
	if err != nil {
		return usageError{err}
	}
	until, err := windowEnd(today, flagString(c, "within"))
	if err != nil {
		return usageError{err}
	}
	dirs, problems := survey.FindSurveys(args)
	var due []plan.Due
	for _, dir := range dirs {
		set, err := loadSettings(c, dir)
		if err != nil {
			return err
		}
		s, ps := survey.LoadSeries(dir, nil, set.Read)
		problems = append(problems, ps...)
		if ps.HasErrors() {
			continue
		}
		due = append(due, plan.DueOf(dir, s, survey.Assess(s, set.Policy), today, until)...)
	}
	if problems.HasErrors() {
		problems.Sort()
		return survey.InputError{Problems: problems}
	}
	plan.SortDue(due)
	asCSV, _ := c.Flags().GetBool("csv")
	out, err := report.DueText(due, asCSV)
	if err != nil {
		return err
	}
	w := c.OutOrStdout()
	if _, err := w.Write(out); err != nil {
		return err
	}
	if !asCSV {
		_, err = fmt.Fprintf(w, "\n%d survey folders read (%s); today %s, due up to %s; overdue means before today.\n",
			len(dirs), strings.Join(dirs, ", "), today.Format("2006-01-02"), until.Format("2006-01-02"))
	}
	return err
}
