package report

import (
	"bytes"
	"encoding/csv"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/survey"
)

// pdfPages renders the findings' PDF and reads each page's text back with
// poppler's pdftotext (pages end in a form feed).
func pdfPages(t *testing.T, pdf []byte) []string {
	t.Helper()
	if _, err := exec.LookPath("pdftotext"); err != nil {
		if os.Getenv("LOSSLINE_REQUIRE_POPPLER") != "" {
			t.Fatal("pdftotext not installed (poppler-utils)")
		}
		t.Skip("pdftotext not installed (poppler-utils)")
	}
	file := filepath.Join(t.TempDir(), "report.pdf")
	if err := os.WriteFile(file, pdf, 0o644); err != nil {
		t.Fatal(err)
	}
	text, err := exec.Command("pdftotext", "-layout", file, "-").Output()
	if err != nil {
		t.Fatal(err)
	}
	pages := strings.Split(string(text), "\f")
	if n := len(pages); n > 0 && strings.TrimSpace(pages[n-1]) == "" {
		pages = pages[:n-1]
	}
	return pages
}

// The demo is not approved: every page carries DRAFT, the document number
// and the revision; the actions are listed by due date.
func TestDemoDraftAndDocumentNumberOnEveryPage(t *testing.T) {
	f := demo(t)
	pdf, _, err := PDF(f, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	pages := pdfPages(t, pdf)
	if len(pages) < 10 {
		t.Fatalf("%d pages", len(pages))
	}
	for i, p := range pages {
		if !strings.Contains(p, "GSD-UT-2026-014 rev. B") {
			t.Errorf("page %d lacks the document number and revision", i+1)
		}
		if !strings.Contains(p, "DRAFT") {
			t.Errorf("page %d lacks the DRAFT mark", i+1)
		}
	}
	if !strings.Contains(pages[0], "Prepared by") || !strings.Contains(pages[0], "Greyling Sound Terminals Ltd") {
		t.Error("the cover lacks the sign-off table or the client")
	}

	// The actions section: due dates in order down the table, the overdue
	// action carried from 2022 said so in words, the closed one listed apart.
	var section string
	for _, p := range pages {
		if strings.Contains(p, "open actions, by due date") {
			section += p
		} else if section != "" && strings.Contains(p, "Actions closed by this survey") {
			section += p
			break
		}
	}
	if section == "" {
		t.Fatal("no actions section")
	}
	open, closed, _ := strings.Cut(section, "Actions closed by this survey")
	dueRow := regexp.MustCompile(`(?m)^\s*(\d{4}-\d{2}-\d{2})\s+(immediate|high|medium|low)\s`)
	var dues []string
	for _, m := range dueRow.FindAllStringSubmatch(open, -1) {
		dues = append(dues, m[1])
	}
	// The due cell wraps: OVERDUE starts the line under the date.
	overdue := len(regexp.MustCompile(`(?m)^\s*OVERDUE\b`).FindAllString(open, -1))
	if len(dues) < 10 {
		t.Fatalf("found %d action rows:\n%s", len(dues), open)
	}
	for i := 1; i < len(dues); i++ {
		if dues[i] < dues[i-1] {
			t.Errorf("action due %s listed after one due %s", dues[i], dues[i-1])
		}
	}
	// Overdue: the 2022 pipe-shoe action (due 2024-05-31) and the 2022 scope
	// item this survey does not list (due at this visit, 2026-11-18).
	if overdue != 2 || dues[0] != "2024-05-31" || !strings.Contains(open, "Holiday test of the wrapping") {
		t.Errorf("overdue rows %d, first due %s; want the 2022 pipe-shoe action, due 2024-05-31, and the 2022 holiday test, both overdue", overdue, dues[0])
	}
	if !strings.Contains(closed, "P220-EXCAVATE") || strings.Contains(open, "P220-EXCAVATE") {
		t.Error("the action closed by this survey is not listed apart")
	}
}

// With an approver and a date the DRAFT mark is gone from every page.
func TestApprovedReportIsNotDraft(t *testing.T) {
	f := demo(t)
	approved := time.Date(2026, 11, 30, 0, 0, 0, 0, time.UTC)
	f.Survey.Document.SignOff = append(f.Survey.Document.SignOff, survey.Signature{Role: "approved", Name: "H. Sørensen", Date: &approved})
	pdf, _, err := PDF(f, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	for i, p := range pdfPages(t, pdf) {
		if strings.Contains(p, "DRAFT") {
			t.Errorf("page %d of an approved report carries DRAFT", i+1)
		}
		if !strings.Contains(p, "GSD-UT-2026-014 rev. B") {
			t.Errorf("page %d lacks the document number and revision", i+1)
		}
	}
}

// results.json and actions.csv list the same register, in the same order.
func TestActionsExports(t *testing.T) {
	f := demo(t)
	files, _, err := Render(f, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	var csvData []byte
	for _, x := range files {
		if x.Name == ActionsCSVFile {
			csvData = x.Data
		}
	}
	rows, err := csv.NewReader(bytes.NewReader(csvData)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	res := BuildResults(f, nil)
	if len(rows) != len(f.Actions)+1 || len(res.Actions) != len(f.Actions) {
		t.Fatalf("actions.csv has %d rows, results.json %d actions; want %d", len(rows)-1, len(res.Actions), len(f.Actions))
	}
	for i, a := range res.Actions {
		if rows[i+1][0] != a.ID || rows[i+1][3] != a.Due || rows[i+1][4] != a.Status {
			t.Errorf("row %d: %v, want %s due %s %s", i+1, rows[i+1][:5], a.ID, a.Due, a.Status)
		}
	}
	last := res.Actions[len(res.Actions)-1]
	if last.ID != "P220-EXCAVATE" || last.Status != "closed" || last.ClosedDate == nil || *last.ClosedDate != "2026-11-18" {
		t.Errorf("closed action: %+v", last)
	}
}

// The instruments are listed per visit: this survey's two gauges under its
// date, and the gauge the 2022 survey of the transfer line lists under 2022.
func TestInstrumentsByVisit(t *testing.T) {
	f := demo(t)
	pdf, _, err := PDF(f, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	var text string
	for _, p := range pdfPages(t, pdf) {
		if strings.Contains(p, "Instruments, by visit") {
			text = flat(p)
		}
	}
	for _, want := range []string{"2026-11-18 ultrasonic thickness UTG-4471", "UTG-5120", "2022-05-10 ultrasonic thickness UTG-3108"} {
		if !strings.Contains(text, want) {
			t.Errorf("instruments by visit lack %q:\n%s", want, text)
		}
	}
}
