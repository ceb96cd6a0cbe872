package report

import (
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// The remarks column of a reading table is printed under the readings,
// read back from the PDF by poppler's pdftotext.
func TestRemarksInPDF(t *testing.T) {
	if _, err := exec.LookPath("pdftotext"); err != nil {
		if os.Getenv("LOSSLINE_REQUIRE_POPPLER") != "" {
			t.Fatal("pdftotext not installed (poppler-utils)")
		}
		t.Skip("pdftotext not installed (poppler-utils)")
	}
	src := "---\ntitle: Remarks\nsite: Yard\ninspector: Test\ndate: 2025-07-01\nunits: mm\n---\n## Course 1\n\n- nominal: 10\n- required: 5\n\n" +
		"| CML | 2020-06-01 | 2025-06-01 | remarks |\n|---|---|---|---|\n| C1 | 9.8 | 9.6 | readings between pits |\n| C2 | 9.7 | 9.5 | |\n"
	s, problems := survey.ParseChecklist("survey.md", []byte(src))
	if problems = append(problems, survey.ComputeRequired(s)...); len(problems) != 0 {
		t.Fatal(problems)
	}
	pdf, _, err := PDF(findings.Compute(s, findings.Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25}), testOptions())
	if err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(t.TempDir(), "report.pdf")
	os.WriteFile(file, pdf, 0o644)
	text, err := exec.Command("pdftotext", "-layout", file, "-").Output()
	if err != nil {
		t.Fatal(err)
	}
	if !regexp.MustCompile(`CML\s+Remarks\s*\n\s*C1\s+readings between pits`).Match(text) {
		t.Errorf("remarks not under the readings:\n%s", text)
	}
	if strings.Count(string(text), "readings between pits") != 1 {
		t.Error("remark printed more than once")
	}
}
