package survey

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// writeSurvey writes a one-component survey folder and returns its path.
func writeSurvey(t *testing.T, root, name, date, front, design, table string) string {
	t.Helper()
	dir := filepath.Join(root, name)
	os.MkdirAll(dir, 0o755)
	src := "---\ntitle: " + name + "\nsite: s\ndate: " + date + "\ninspector: i\nunits: mm\n" + front + "---\n# Tank\n\n## Course\n\n" + design + "\n" + table
	if err := os.WriteFile(filepath.Join(dir, "survey.md"), []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	return dir
}

func TestMergeSeries(t *testing.T) {
	root := t.TempDir()
	writeSurvey(t, root, "y2016", "2016-05-01", "", "- nominal: 10\n- required: 5\n- installed: 2001-01\n",
		"| CML | 2011-05-01 | 2016-05-01 |\n|---|---|---|\n| C-1 | 9.9 | 9.6 |\n| C-2 | 9.8 | 9.7 |\n| OLD | 9.5 | 9.4 |\n")
	writeSurvey(t, root, "y2021", "2021-05-01", "", "- nominal: 10\n- required: 5.5\n",
		"| CML | 2016-05-01 | 2021-05-01 |\n|---|---|---|\n| C-1 | 9.6 | 9.3 |\n| C-2 | 9.7 | 9.5 |\n")
	newest := writeSurvey(t, root, "y2026", "2026-05-01", "previous: [../y2021]\n", "- required: 6\n",
		"| CML | was | 2026-05-01 |\n|---|---|---|\n| C-01 | C-1 | 9.0 |\n| C-02 | C-2 | 9.2 |\n| C-03 | | 9.9 |\n")

	// The 2016 folder comes in through --previous, out of date order: the merge sorts.
	s, problems := LoadSeries(newest, []string{filepath.Join(root, "y2016")}, DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	cmls := s.AllCMLs()
	c01 := cmls[0].CML
	var dates []string
	for _, v := range c01.Visits {
		dates = append(dates, v.Date.String())
	}
	// Renamed C-1 → C-01 through the was column; 2016-05-01 appears in two files with the same value.
	if got := strings.Join(dates, " "); got != "2011-05-01 2016-05-01 2021-05-01 2026-05-01" {
		t.Errorf("C-01 visits %s", got)
	}
	if len(cmls[2].CML.Visits) != 1 {
		t.Errorf("C-03 (new) has %d visits", len(cmls[2].CML.Visits))
	}
	h := s.History
	if h == nil || len(h.Dropped) != 1 || h.Dropped[0].ID != "OLD" || h.Dropped[0].Last.Governing() != 9.4 {
		t.Fatalf("dropped: %+v", h)
	}
	// Design data: nominal and installed inherited; required changed 5.5 → 6 (against the newest earlier survey).
	d := cmls[0].Component.Design
	if d.NominalMM == nil || *d.NominalMM != 10 || d.Installed == nil || d.Installed.String() != "2001-01" {
		t.Errorf("inherited design: nominal %v installed %v", d.NominalMM, d.Installed)
	}
	if len(h.DesignChanges) != 1 || h.DesignChanges[0].Field != "required" || h.DesignChanges[0].OldMM != 5.5 || h.DesignChanges[0].NewMM != 6 {
		t.Errorf("design changes: %+v", h.DesignChanges)
	}
	if len(cmls[0].Component.VisitDates) != 4 {
		t.Errorf("component visit dates %v", cmls[0].Component.VisitDates)
	}
}

// A required thickness computed by a method in an earlier survey is inherited
// with its derivation by a later survey that writes none.
func TestMergeInheritsComputedRequired(t *testing.T) {
	root := t.TempDir()
	writeSurvey(t, root, "old", "2021-05-01", "", pipeDesign, "| CML | 2021-05-01 |\n|---|---|\n| C-1 | 9.3 |\n")
	newest := writeSurvey(t, root, "new", "2026-05-01", "previous: ../old\n", "- nominal: 10\n", "| CML | 2026-05-01 |\n|---|---|\n| C-1 | 9.0 |\n")
	s, problems := LoadSeries(newest, nil, DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	d := s.Assets[0].Components[0].Design
	if d.RequiredMM == nil || math.Abs(*d.RequiredMM-pipeRequiredMM) > 1e-6 || d.RequiredCalc == nil {
		t.Errorf("inherited required %v (calc %v), want %v mm", d.RequiredMM, d.RequiredCalc, pipeRequiredMM)
	}
}

// Different readings for the same CML and date in two files: an error naming both places.
func TestMergeConflict(t *testing.T) {
	root := t.TempDir()
	writeSurvey(t, root, "old", "2021-05-01", "", "- nominal: 10\n- required: 5\n",
		"| CML | 2016-05-01 | 2021-05-01 |\n|---|---|---|\n| C-1 | 9.6 | 9.3 |\n")
	newest := writeSurvey(t, root, "new", "2026-05-01", "previous: ../old\n", "- nominal: 10\n- required: 5\n",
		"| CML | 2021-05-01 | 2026-05-01 |\n|---|---|---|\n| C-1 | 9.35 | 9.0 |\n")
	_, problems := LoadSeries(newest, nil, DefaultOptions)
	want := filepath.Join(root, "old", "survey.md") + ":17: CML C-1, visit 2021-05-01: readings 9.30 mm differ from 9.35 mm at " +
		filepath.Join(root, "new", "survey.md") + ":18"
	found := false
	for _, p := range problems {
		found = found || p.String() == want
	}
	if !found {
		t.Errorf("problems %v\nlack %q", problems, want)
	}
}

func TestMergeRejects(t *testing.T) {
	root := t.TempDir()
	writeSurvey(t, root, "later", "2027-01-01", "", "- nominal: 10\n", "| CML | 2027-01-01 |\n|---|---|\n| C-1 | 9 |\n")
	newest := writeSurvey(t, root, "new", "2026-05-01", "previous: ../later\n", "- nominal: 10\n", "| CML | 2026-05-01 |\n|---|---|\n| C-1 | 9.0 |\n")
	if _, problems := LoadSeries(newest, nil, DefaultOptions); !strings.Contains(problemText(problems), "after this survey") {
		t.Errorf("a previous survey dated later: %v", problems)
	}
	renamed := writeSurvey(t, root, "ren", "2026-05-01", "", "- nominal: 10\n",
		"| CML | was | 2026-05-01 |\n|---|---|---|\n| C-1 | | 9.0 |\n| C-2 | C-1 | 9.1 |\n")
	if _, problems := LoadSeries(renamed, []string{filepath.Join(root, "new")}, DefaultOptions); !strings.Contains(problemText(problems), "C-2 was C-1, but C-1 is still a CML") {
		t.Errorf("ambiguous rename: %v", problems)
	}
	if _, problems := LoadSeries(newest, []string{filepath.Join(root, "missing")}, DefaultOptions); !problems.HasErrors() {
		t.Error("a missing previous folder is no error")
	}
}

func problemText(l ProblemList) string {
	var b strings.Builder
	for _, p := range l {
		b.WriteString(p.String() + "\n")
	}
	return b.String()
}
