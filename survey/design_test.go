package survey

import (
	"math"
	"slices"
	"testing"
)

// pipeDesign is a design list whose required thickness is an ASME B31.3
// method with six inputs.
const pipeDesign = "- nominal: 10\n- required: ASME B31.3 pipe\n  - pressure: 4.0 MPa\n  - Outside  Diameter: 168.3 mm\n" +
	"  - allowable stress: 137.9 MPa\n  - joint factor: 1\n  - coefficient Y: 0.4\n  - allowance: 1.5 mm\n"

// pipeRequiredMM is the required thickness of pipeDesign. ASME B31.3
// §304.1.2 Eq. (3a): t = P·D / (2·(S·E·W + P·Y)) = 4.0 × 168.3 / (2 × (137.9
// × 1 × 1 + 4.0 × 0.4)) = 673.2 / 279 = 2.412903 mm; §304.1.1: t_m = t + c =
// 2.412903 + 1.5 = 3.912903 mm.
const pipeRequiredMM = 3.912903

// The reader records the method and its inputs as written; the thickness
// appears only once ComputeRequired runs.
func TestRequiredComputedAfterReading(t *testing.T) {
	src := "---\ntitle: x\ndate: 2025-01-01\nunits: mm\n---\n## C\n\n" + pipeDesign + "\n| CML | 2024-01-01 |\n|---|---|\n| A | 9 |\n"
	s, problems := ParseChecklist("survey.md", []byte(src))
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	d := &s.Assets[0].Components[0].Design
	if d.RequiredMethod != "ASME B31.3 pipe" || d.Lines["required"] != 9 {
		t.Errorf("method %q at line %d, want ASME B31.3 pipe at 9", d.RequiredMethod, d.Lines["required"])
	}
	want := []MethodInput{
		{"pressure", "4.0 MPa", 10}, {"outside diameter", "168.3 mm", 11}, {"allowable stress", "137.9 MPa", 12},
		{"joint factor", "1", 13}, {"coefficient y", "0.4", 14}, {"allowance", "1.5 mm", 15},
	}
	if !slices.Equal(d.RequiredInputs, want) {
		t.Errorf("inputs %v, want %v", d.RequiredInputs, want)
	}
	if d.RequiredMM != nil || d.RequiredCalc != nil {
		t.Fatalf("the reader computed required %v (calc %v)", d.RequiredMM, d.RequiredCalc)
	}

	if p := ComputeRequired(s); len(p) != 0 {
		t.Fatalf("ComputeRequired: %v", p)
	}
	if d.RequiredCalc == nil || d.RequiredMM == nil || math.Abs(*d.RequiredMM-pipeRequiredMM) > 1e-6 {
		t.Errorf("required %v (calc %v), want %v mm", d.RequiredMM, d.RequiredCalc, pipeRequiredMM)
	}
}

// Problems of the computation point at the `required:` line; the warning of
// a missing required thickness (judged after the merge) at the component heading.
func TestComputeRequiredProblemLines(t *testing.T) {
	src := "---\ntitle: x\ndate: 2025-01-01\nunits: mm\n---\n## C\n\n- nominal: 2\n" + pipeDesign[len("- nominal: 10\n"):] +
		"\n| CML | 2024-01-01 |\n|---|---|\n| A | 1.9 |\n\n## D\n\n- required: section loss\n  - allowed section loss: 25 %\n" +
		"\n| CML | 2024-01-01 |\n|---|---|\n| B | 9 |\n"
	s, problems := ParseChecklist("survey.md", []byte(src))
	if len(problems) != 2 { // no site, no inspector
		t.Fatalf("reader problems %v", problems)
	}
	var got []string
	for _, p := range append(ComputeRequired(s), requiredWarnings(s)...) {
		got = append(got, p.String())
	}
	want := []string{
		`survey.md:9: required 3.91 mm is above nominal 2.00 mm in "C"`,
		`survey.md:23: required: section loss needs the component's nominal thickness`,
		`survey.md:21: warning: "D" has no required thickness: no remaining life can be computed`,
	}
	if !slices.Equal(got, want) {
		t.Errorf("problems\n%q\nwant\n%q", got, want)
	}
}
