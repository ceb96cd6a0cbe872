package report

import (
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/internal/scalesurvey"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// demoPages renders the demo and reads its pages back with poppler's
// pdftotext (an independent reader), one string per page.
func demoPages(t *testing.T) []string {
	t.Helper()
	needPoppler(t)
	pdf, _, err := PDF(demo(t), testOptions())
	if err != nil {
		t.Fatal(err)
	}
	return pdfPages(t, pdf)
}

// contentsPage is the index of the first contents page; the test stops
// without one.
func contentsPage(t *testing.T, pages []string) int {
	t.Helper()
	for i, p := range pages {
		if isContentsPage(p) {
			return i
		}
	}
	t.Fatal("no contents page")
	return -1
}

// isContentsPage reports whether a page opens with the Contents heading
// (below the running header of document number and DRAFT mark).
func isContentsPage(p string) bool {
	lines := strings.Split(strings.TrimSpace(p), "\n")
	for _, l := range lines[:min(4, len(lines))] {
		if strings.TrimSpace(l) == "Contents" {
			return true
		}
	}
	return false
}

// flat is text with every run of white space made one space.
func flat(s string) string { return strings.Join(strings.Fields(s), " ") }

var contentsRow = regexp.MustCompile(`^\s*(\S.*?)\s{2,}(\d+)\s*$`)

// The demo read as a deliverable: the contents list every chapter at the page
// it is on, page 2 opens with the summary in words, no file path or checklist
// line shows before the data checks appendix, and the photo index gives each
// figure's page.
func TestDemoReadsAsADeliverable(t *testing.T) {
	pages := demoPages(t)

	// Contents: find the page, read its entries.
	ci := contentsPage(t, pages)
	type entry struct {
		title string
		page  int
	}
	var entries []entry
	for _, line := range strings.Split(pages[ci], "\n")[1:] {
		m := contentsRow.FindStringSubmatch(line)
		if m == nil || strings.Contains(line, "page ") { // the footer
			continue
		}
		n, _ := strconv.Atoi(m[2])
		entries = append(entries, entry{m[1], n})
	}
	pageOf := map[string]int{}
	last := 0
	for _, e := range entries {
		if e.page < last || e.page < 1 || e.page > len(pages) {
			t.Errorf("contents: %q on page %d, out of order or beyond the %d pages", e.title, e.page, len(pages))
			continue
		}
		last = e.page
		if !strings.Contains(flat(pages[e.page-1]), e.title) {
			t.Errorf("contents: %q is not on page %d", e.title, e.page)
		}
		if _, seen := pageOf[e.title]; !seen {
			pageOf[e.title] = e.page
		}
	}
	for _, chapter := range []string{"Summary", "Cathodic protection, coatings and metal pairs: findings", "Changes since the last visit", "Risk", "Ranked list of CMLs",
		"Tank T-101", "Transfer line P-220", "Footbridge FB-2", "Air receiver V-3",
		"Appendix A — Photos not placed on a CML or component", "Appendix B — Photo index",
		"Appendix C — Methods", "Appendix D — Data checks"} {
		if _, ok := pageOf[chapter]; !ok {
			t.Errorf("contents lack %q", chapter)
		}
	}
	if pageOf["Summary"] != 2 {
		t.Errorf("summary on page %d, want 2", pageOf["Summary"])
	}

	// Page 2: the summary in words, naming the CML below required with its
	// numbers, before any table.
	p2 := flat(pages[1])
	urgent := strings.Index(p2, "Urgent. CML A-03 on Transfer line P-220")
	table := strings.Index(p2, "Asset / component")
	if urgent < 0 || table < 0 || urgent > table {
		t.Errorf("page 2 does not open with the summary in words naming A-03 before the table:\n%s", p2)
	}
	for _, want := range []string{"3.62 mm measured on 2026-11-18 against 3.80 mm required", "Due.", "Not done.", "Changed since the last visit."} {
		if !strings.Contains(p2, want) {
			t.Errorf("page 2 lacks %q", want)
		}
	}

	// No file path or checklist line before the data checks appendix.
	checks := pageOf["Appendix D — Data checks"]
	internal := regexp.MustCompile(`\.md:\d+|survey\.md|lossline\.yaml|testdata/|\.HEIC`)
	for i := 0; i < checks-1 && i < len(pages); i++ {
		if i == ci {
			continue
		}
		if m := internal.FindString(pages[i]); m != "" {
			t.Errorf("page %d shows %q before the data checks appendix", i+1, m)
		}
	}
	if checks > 0 && !internal.MatchString(strings.Join(pages[checks-1:], "")) {
		t.Error("the data checks appendix shows no file or line")
	}

	// Photo index: every figure, in order, on the page it gives.
	row := regexp.MustCompile(`^\s*(\d+)\s+\S.*?\s{2,}(\S+\.jpe?g)\s+(\d+)\s*$`)
	start := pageOf["Appendix B — Photo index"]
	n := 0
	for i := start - 1; i >= 0 && i < len(pages) && i < pageOf["Appendix C — Methods"]; i++ {
		for _, line := range strings.Split(pages[i], "\n") {
			m := row.FindStringSubmatch(line)
			if m == nil {
				continue
			}
			fig, _ := strconv.Atoi(m[1])
			pg, _ := strconv.Atoi(m[3])
			n++
			if fig != n {
				t.Errorf("photo index: figure %d listed as number %d", fig, n)
			}
			if pg < 1 || pg > len(pages) || !strings.Contains(pages[pg-1], "Figure "+m[1]+". ") {
				t.Errorf("photo index: figure %d (%s) is not on page %d", fig, m[2], pg)
			}
		}
	}
	captions := regexp.MustCompile(`Figure (\d+)\. `).FindAllString(strings.Join(pages, ""), -1)
	if n == 0 || n != len(captions) {
		t.Errorf("photo index lists %d figures, the pages caption %d", n, len(captions))
	}
}

// A survey of 60 assets needs two contents pages: both are reserved before
// the chapters, and every entry names the page its heading is on.
func TestContentsOverSeveralPages(t *testing.T) {
	needPoppler(t)
	dir := filepath.Join(t.TempDir(), "survey")
	if err := scalesurvey.Write(dir, scalesurvey.Size{CMLs: 120, Units: 60, Circuits: 1}); err != nil {
		t.Fatal(err)
	}
	s, problems := survey.LoadSeries(dir, nil, survey.DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	opts := testOptions()
	opts.Limits = DefaultLimits
	opts.Limits.FullDetailMaxComponents = 100 // every asset in full, each a chapter of the contents
	pdf, _, err := PDF(findings.Compute(s, findings.Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25}), opts)
	if err != nil {
		t.Fatal(err)
	}
	pages := pdfPages(t, pdf)
	first := contentsPage(t, pages)
	listed := 0
	for i := first; i < first+2; i++ {
		for _, line := range strings.Split(pages[i], "\n") {
			m := contentsRow.FindStringSubmatch(line)
			if m == nil || strings.Contains(line, "page ") || m[1] == "Contents" {
				continue
			}
			n, _ := strconv.Atoi(m[2])
			if n < 1 || n > len(pages) || !strings.Contains(flat(pages[n-1]), m[1]) {
				t.Errorf("contents page %d: %q is not on page %d", i+1, m[1], n)
			}
			listed++
		}
	}
	if listed < 60 {
		t.Errorf("%d entries on the two contents pages, want every one of the 60 assets at least", listed)
	}
}

// A warning at a CML's row is said in words under its component's results,
// without the checklist's name or line, which only the data checks appendix
// prints.
func TestCMLWarningInWordsUnderResults(t *testing.T) {
	needPoppler(t)
	// 9.6 mm, then 0.95 mm: a missing digit or decimal slip, warned at the row (the
	// check itself is survey's; any warning at the row will do here).
	src := "---\ntitle: Slip\nsite: Yard\ninspector: Test\ndate: 2025-07-01\nunits: mm\n---\n# Tank\n\n## Course 1\n\n- nominal: 10\n- required: 5\n\n" +
		"| CML | 2020-06-01 | 2025-07-01 |\n|---|---|---|\n| C1 | 9.8 | 9.6 |\n| C2 | 9.7 | 0.95 |\n| C3 | 9.9 | 9.7 |\n"
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "survey.md"), []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	s, problems := survey.LoadSeries(dir, nil, survey.DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	var msg string
	for _, p := range s.Problems {
		if p.Line == 18 { // the row of C2
			msg = p.Message
		}
	}
	if msg == "" {
		t.Fatalf("no warning at the row of C2: %v", s.Problems)
	}
	opts := testOptions()
	opts.Limits = DefaultLimits
	opts.Limits.FullDetailMaxComponents = 100 // every asset in full, each a chapter of the contents
	pdf, _, err := PDF(findings.Compute(s, findings.Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25}), opts)
	if err != nil {
		t.Fatal(err)
	}
	pages := pdfPages(t, pdf)
	all := flat(strings.Join(pages, " "))
	checks := strings.Index(all, "Appendix D — Data checks For the inspector")
	at := strings.Index(all, "Check before relying on these results")
	if at < 0 || checks < 0 || at > checks || !strings.Contains(all[at:checks], flat(msg)) {
		t.Errorf("the warning %q is not said under the component's results before the data checks", msg)
	}
	if strings.Contains(all[:checks], "survey.md:18") {
		t.Error("the warning's place shows before the data checks appendix")
	}
	if !strings.Contains(all[checks:], "survey.md:18") {
		t.Error("the data checks appendix lacks the warning's place")
	}
}
