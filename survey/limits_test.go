package survey

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

const limitsHead = "---\ntitle: x\ndate: 2025-01-01\nunits: mm\n---\n" // 5 lines

// readWithin reads a checklist and fails the test when that takes longer than d.
func readWithin(t *testing.T, name string, src string, d time.Duration) ProblemList {
	t.Helper()
	start := time.Now()
	_, problems := ParseChecklist("survey.md", []byte(src))
	if el := time.Since(start); el > d {
		t.Errorf("%s (%d bytes): read in %v, want under %v", name, len(src), el, d)
	}
	return problems
}

// indentedList is a list n levels deep, each item two spaces right of the
// one before (a sub-list, CommonMark 0.31.2 §5.2, list items).
func indentedList(n int) string {
	var b strings.Builder
	for i := range n {
		b.WriteString(strings.Repeat("  ", i) + "- level\n")
	}
	return b.String()
}

// Lists 2,000 and 3,000 levels deep (4 and 9 MB, which the Markdown reader
// takes 20 s and more than a minute to read) are refused within a second at
// the line of the 33rd level.
func TestDeepNestingRefusedFast(t *testing.T) {
	for _, n := range []int{2000, 3000} {
		src := limitsHead + indentedList(n)
		problems := readWithin(t, fmt.Sprintf("%d-level list", n), src, time.Second)
		wantProblem(t, fmt.Sprintf("%d levels", n), problems, "survey.md:38: nesting deeper than 32 levels")
	}
	// Block quotes in block quotes (CommonMark 0.31.2 §5.1), on one line and
	// on lines of their own, and lists inside them.
	for name, body := range map[string]string{
		"quotes on one line":  strings.Repeat(">", 100_000) + " deep\n",
		"quotes with spaces":  strings.Repeat("> ", 3000) + "deep\n",
		"markers on one line": strings.Repeat("- ", 3000) + "deep\n",
		"ordered markers":     strings.Repeat("1. ", 3000) + "deep\n",
		"quotes and lists":    strings.Repeat("> - ", 3000) + "deep\n",
	} {
		problems := readWithin(t, name, limitsHead+body, time.Second)
		wantProblem(t, name, problems, "survey.md:6: nesting deeper than 32 levels")
	}
}

// 32 levels are read; the 33rd is refused. A rule of spaced dashes is no
// list (CommonMark 0.31.2 §4.1, thematic breaks), and text between items does
// not hide their depth.
func TestNestingAtTheLimit(t *testing.T) {
	if p := checkLimits("survey.md", []byte(limitsHead+indentedList(32))); p != nil {
		t.Errorf("32 levels: %v", p)
	}
	if p := checkLimits("survey.md", []byte(limitsHead+indentedList(33))); p == nil || p.Line != 38 {
		t.Errorf("33 levels: %v, want a refusal at line 38", p)
	}
	if p := checkLimits("survey.md", []byte(limitsHead+strings.Repeat("- ", 40)+"\n")); p != nil {
		t.Errorf("a rule of 40 dashes: %v", p)
	}
	var b strings.Builder
	for i := range 40 {
		fmt.Fprintf(&b, "%s- level\n%scontinued lazily\n", strings.Repeat("  ", i), strings.Repeat(" ", i%3))
	}
	if p := checkLimits("survey.md", []byte(limitsHead+b.String())); p == nil || !strings.HasPrefix(p.Message, "nesting deeper") {
		t.Errorf("40 levels with lazy lines between: %v", p)
	}
}

// tableOf is a table of cols columns and rows rows of short cells (GFM spec
// 0.29, §4.10 tables: the delimiter row sets the columns).
func tableOf(cols, rows int) string {
	var b strings.Builder
	b.WriteString("|" + strings.Repeat(" h |", cols) + "\n|" + strings.Repeat("---|", cols) + "\n")
	for range rows {
		b.WriteString("|" + strings.Repeat(" 1 |", cols) + "\n")
	}
	return b.String()
}

func TestTableLimits(t *testing.T) {
	if p := checkLimits("survey.md", []byte(limitsHead+"\n"+tableOf(MaxTableColumns, 3))); p != nil {
		t.Errorf("%d columns: %v", MaxTableColumns, p)
	}
	for _, c := range []struct {
		name, body, want string
	}{
		{"201 columns", "\n" + tableOf(201, 3), "survey.md:7: table has 201 columns, more than 200"},
		{"100 001 rows", "\n" + tableOf(2, MaxTableRows+1), fmt.Sprintf("survey.md:%d: table (from line 7) has more than 100000 rows", 7+2+MaxTableRows)},
		// Short rows are filled to the header's width: 200 columns × 10 000 rows of "|".
		{"cells", "\n|" + strings.Repeat(" h |", 200) + "\n|" + strings.Repeat("---|", 200) + "\n" + strings.Repeat("|\n", 10_000),
			"survey.md:10008: tables hold more than 2000000 cells in all"},
	} {
		problems := readWithin(t, c.name, limitsHead+c.body, time.Second)
		wantProblem(t, c.name, problems, c.want)
	}
}

// Runs of Markdown marks that make the reader's time grow with the square of
// the paragraph (each found with inputs of this kind, about 1 MB, taking
// from seconds to many minutes) are refused within seconds at their first line.
func TestMarkRunsRefusedFast(t *testing.T) {
	for name, body := range map[string]string{
		"link openers on one line":     strings.Repeat("[a](", 300_000) + "\n",
		"link openers on lines":        strings.Repeat("[a](\n", 300_000),
		"escaped backticks":            strings.Repeat("\\``", 500_000) + "\n",
		"mixed emphasis":               strings.Repeat("*a_b*c_d**e_f*g**h*i_j**", 40_000) + "\n",
		"link definitions":             strings.Repeat("[a]: b\n", 500_000) + strings.Repeat("[a] ", 100_000),
		"many paragraphs of openers":   strings.Repeat(strings.Repeat("[a](", 7000)+"\n\n", 300),
		"openers after a table header": "| a | b |\n| c | d |\n|---|---|\n" + strings.Repeat("[a](", 300_000) + "\n",
	} {
		problems := readWithin(t, name, limitsHead+body, 2*time.Second)
		if !problems.HasErrors() || !strings.Contains(problems.Err().Error(), "Markdown marks") {
			t.Errorf("%s: %v", name, problems)
		}
	}
}

// Checklists of ordinary shape stay far inside the limits: 5,000 CMLs, and
// a long task list with photo names and emphasis on every line.
func TestOrdinaryChecklistsWithinLimits(t *testing.T) {
	if p := checkLimits("survey.md", bigChecklist(100)); p != nil {
		t.Errorf("5,000 CMLs: %v", p)
	}
	tasks := limitsHead + strings.Repeat("- [x] photo IMG_0001.jpg of the *north* side, see `notes`\n", 50_000)
	if p := checkLimits("survey.md", []byte(tasks)); p != nil {
		t.Errorf("50,000 task items: %v", p)
	}
	if p := checkLimits("survey.md", []byte(limitsHead+"\n"+tableOf(10, 50_000))); p != nil {
		t.Errorf("50,000 rows × 10 columns: %v", p)
	}
}

// A survey.md over 32 MiB is refused from its size, without being read.
func TestChecklistOverSizeRefused(t *testing.T) {
	dir := t.TempDir()
	f, err := os.Create(filepath.Join(dir, ChecklistFile))
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Truncate(MaxChecklistBytes + 1); err != nil { // sparse: no data written
		t.Fatal(err)
	}
	f.Close()
	start := time.Now()
	_, problems := Load(dir)
	wantProblem(t, "33 MiB", problems, filepath.Join(dir, ChecklistFile)+": the checklist is 33554433 bytes, more than the 32 MiB lossline reads")
	if el := time.Since(start); el > time.Second {
		t.Errorf("refused in %v", el)
	}
	if p := checkLimits("survey.md", make([]byte, MaxChecklistBytes+1)); p == nil || p.Line != 0 {
		t.Errorf("33 MiB in memory: %v", p)
	}
}
