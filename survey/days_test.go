package survey

import (
	"path/filepath"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey/wallloss"
)

// A two-day survey admits a column dated its second day; the readings of both
// days are this visit, and a CML read on either day counts as re-measured.
func TestSurveyDaysAdmitColumnsOfEveryDay(t *testing.T) {
	root := t.TempDir()
	dir := writeSurvey(t, root, "two-days", "2026-05-20", "days: 2\n", "- nominal: 10\n- required: 5\n",
		"| CML | 2021-05-20 | 2026-05-20 | 2026-05-21 |\n|---|---|---|---|\n"+
			"| C-1 | 9.6 | 9.1 |  |\n"+
			"| C-2 | 9.7 |  | 9.3 |\n"+
			"| C-3 | 9.8 | 9.4 | 9.2 9.5 |\n")
	s, problems := LoadSeries(dir, nil, DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	cmls := s.AllCMLs()
	c3 := cmls[2].CML
	if len(c3.Visits) != 2 || c3.Visits[1].Date.String() != "2026-05-20" || c3.Visits[1].Governing() != 9.2 || len(c3.Visits[1].ReadingsMM) != 3 {
		t.Errorf("C-3 visits %+v: want the two days joined into one visit of 2026-05-20 governed by 9.2", c3.Visits)
	}
	for _, it := range Assess(s, wallloss.DefaultPolicy) {
		if it.Result.HasFlag(wallloss.FlagNotMeasuredLatest) {
			t.Errorf("CML %s flagged not re-measured although read on one of the survey's days", it.CML.ID)
		}
	}
}

// A column dated after the survey's last day is refused at the header line.
func TestSurveyDaysRefuseColumnAfterLastDay(t *testing.T) {
	root := t.TempDir()
	dir := writeSurvey(t, root, "late", "2026-05-20", "days: 2\n", "- nominal: 10\n",
		"| CML | 2026-05-20 | 2026-05-22 |\n|---|---|---|\n| C-1 | 9.1 | 9.0 |\n")
	_, problems := LoadSeries(dir, nil, DefaultOptions)
	want := filepath.Join(dir, "survey.md") + ":15: visit column 2026-05-22 is later than this visit's last day 2026-05-21 (date 2026-05-20, days: 2)"
	if !strings.Contains(problemText(problems), want+"\n") || !problems.HasErrors() {
		t.Errorf("problems:\n%s\nlack the error %q", problemText(problems), want)
	}
}
