package report

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
	"github.com/lossline/lossline/survey/wallloss"
)

// FuzzRenderChecklist: whatever check accepts of a checklist renders: the
// findings, the PDF, results.json, results.csv and locations.geojson, never a
// panic or a rendering error. Photos are left out: the survey has none, so
// their preparation does nothing.
func FuzzRenderChecklist(f *testing.F) {
	seeds, _ := filepath.Glob(filepath.Join("..", "testdata", "*", "survey.md"))
	more, _ := filepath.Glob(filepath.Join("..", "testdata", "bad", "*", "survey.md"))
	for _, p := range append(seeds, more...) {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(b)
		}
	}
	set := findings.Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25, Plan: plan.Settings{
		Budget: 6000000, Years: 2, Costs: plan.Costs{Currency: "EUR", Unit: map[string]survey.Money{"pipe-m": 95000}}}}
	f.Fuzz(func(t *testing.T, src []byte) {
		s, problems := survey.ParseChecklist("survey.md", src)
		problems = append(problems, survey.ComputeRequired(s)...)
		problems = append(problems, survey.ComputeElectro(s)...)
		problems = append(problems, survey.ComputeLocal(s)...)
		if problems.HasErrors() {
			return
		}
		for _, l := range s.AllCMLs() {
			l.CML.PhotoRefs = nil // the photos are not part of this target (FuzzScanPhoto reads them)
		}
		if _, _, err := Render(findings.Compute(s, set), testOptions()); err != nil {
			t.Fatalf("accepted checklist does not render: %v", err)
		}
	})
}
