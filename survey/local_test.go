package survey

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/survey/wallloss"
)

// parseLocal reads a checklist and runs ComputeRequired and ComputeLocal.
func parseLocal(t *testing.T, body string) (*Survey, ProblemList) {
	t.Helper()
	src := "---\ntitle: x\nsite: y\ninspector: z\ndate: 2026-11-18\nunits: mm\n---\n" + body
	s, problems := ParseChecklist("survey.md", []byte(src))
	problems = append(problems, ComputeRequired(s)...)
	problems = append(problems, ComputeLocal(s)...)
	return s, problems
}

const localBody = `## Floor

- nominal: 8.0
- required: 2.54
- pits: Gumbel
  - depths: 0.82 1.05 0.91 1.23 0.77 1.12 0.98 1.41 0.88 1.02
  - sample area: 0.05 m2
  - total area: 50 m2
  - growth rate: 0.1 mm/y
- bottom pitting: API 653
  - bottom side remaining: 4.572
  - product side remaining: 5.08
  - product side rate: 0.004 in/y
  - underside rate: 0.006 in/y
  - interval: 8 y
  - release prevention barrier: no

| CML | 2014-09-10 | 2026-11-18 |
|---|---|---|
| F-1 | 7.5 | 7.1 6.4 |

| grid F-1 2026-11-18 | A | B |
|---|---|---|
| 1 | 6.9 | 7.0 |
| 2 | - | 6.4 |

## Pipe

- nominal: 10.3
- required: 4
- corroded area: ASME B31G
  - outside diameter: 323.9 mm
  - depth: 5.0
  - length: 100 mm
  - SMYS: 483 MPa
  - MAOP: 10 MPa
  - safety factor: 1.39

| CML | 2026-11-18 |
|---|---|
| P-1 | 10.1 |

## Girder

- nominal: 20
- required: 15
- member: I
  - depth: 600 mm
  - top flange: 300 x 20
  - web: 12
  - bottom flange: 300 × 20 mm
  - measured bottom flange: 16
  - allowed loss: 5 % of area
  - set by: A. Engineer, structures

| CML | 2026-11-18 |
|---|---|
| G-1 | 16 |
`

func TestLocalDamageRead(t *testing.T) {
	s, problems := parseLocal(t, localBody)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	floor, pipe, girder := s.Assets[0].Components[0], s.Assets[0].Components[1], s.Assets[0].Components[2]
	// The grid's minimum is written in F-1's row, whose readings stay as written.
	g := floor.Design.Local.Grids[0]
	if g.CML != "F-1" || g.Line != 29 || g.Stats.Count != 3 || g.Stats.MinMM != 6.4 || g.Stats.MinRow != 1 || g.Stats.MinCol != 1 {
		t.Errorf("grid %+v", g)
	}
	if v := floor.CMLs[0].Visits[1]; v.Governing() != 6.4 || len(v.ReadingsMM) != 2 {
		t.Errorf("visit with the grid: %v", v.ReadingsMM)
	}
	as := floor.Design.Local.Assessments
	if len(as) != 2 || as[0].Pits == nil || as[1].Bottom == nil {
		t.Fatalf("floor assessments %+v", as)
	}
	// Gumbel: the same ten maxima as localdamage's derived check (T = 1000,
	// LS x_T 2.26400 mm); ligament 8 − 2.264 = 5.736 mm; (5.736 − 2.54)/0.1 = 31.96 y.
	if p := as[0].Pits; math.Abs(p.Estimate.DepthMM-2.26400) > 1e-4 || math.Abs(*as[0].LifeY-31.96) > 1e-3 {
		t.Errorf("pits: depth %v, life %v", p.Estimate.DepthMM, *as[0].LifeY)
	}
	// API 653 §4.4.7 with the inch values in mm: MRT = 0.180 − 8 × 0.010 = 0.100 in.
	if b := as[1].Bottom; math.Abs(b.MRTMM-2.54) > 1e-9 || !b.Pass || math.Abs(*b.MaxIntervalY-8) > 1e-9 {
		t.Errorf("bottom %+v", b)
	}
	// ASME B31G, the X70 check of localdamage: modified P_F 27.291 MPa governs.
	pa := pipe.Design.Local.Assessments[0]
	if pa.Pipe == nil || math.Abs(pa.Pipe.Governing.FailurePress-27.291) > 1e-3 || pa.LifeY != nil {
		t.Errorf("pipe %+v", pa)
	}
	// The I of localdamage's hand check, bottom flange 20 → 16: area loss 6.41 % > 5 %.
	ma := girder.Design.Local.Assessments[0]
	if ma.Member == nil || !ma.Member.Exceeded || ma.Member.SetBy != "A. Engineer, structures" || ma.LifeY == nil || *ma.LifeY != 0 {
		t.Errorf("member %+v", ma.Member)
	}
	if life, ok := floor.LocalLifeY(); !ok || math.Abs(life-8) > 1e-9 {
		t.Errorf("floor local life %v %v, want 8 (the bottom's longest interval)", life, ok)
	}
}

// The ranking puts a CML whose component's local damage has reached its
// limit with the CMLs at or below required.
func TestLocalDamageRanks(t *testing.T) {
	s, problems := parseLocal(t, localBody)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	items := Assess(s, wallloss.DefaultPolicy)
	if items[0].CML.ID != "G-1" {
		t.Errorf("first ranked %s, want G-1 (section loss beyond the engineer's limit)", items[0].CML.ID)
	}
	for _, it := range items {
		if it.CML.ID == "F-1" && it.ranked().LifeY > 8 {
			t.Errorf("F-1 ranks with life %v, want at most the bottom's 8 y", it.ranked().LifeY)
		}
	}
}

func TestLocalDamageProblems(t *testing.T) {
	table := "\n| CML | 2026-11-18 |\n|---|---|\n| A | 7 |\n"
	for _, tc := range []struct {
		name, body, want string
		warning          bool // want is a warning
	}{
		{"grid on a date the row has no reading", "## C\n\n- nominal: 8\n" + table + "\n| grid A 2025-11-18 | 1 |\n|---|---|\n| a | 7 |\n", "survey.md:16: warning: grid A: the CML's row has no reading on 2025-11-18", true},
		{"unknown method", "## C\n\n- nominal: 8\n- pits: Weibull\n" + table, `survey.md:11: pits: "Weibull" is not one of: gumbel`, false},
		{"missing input", "## C\n\n- nominal: 8\n- pits: Gumbel\n  - depths: 1 2 3\n  - sample area: 1 m2\n" + table, "survey.md:11: pits: give total area", false},
		{"bad area unit", "## C\n\n- nominal: 8\n- pits: Gumbel\n  - depths: 1 2 3\n  - sample area: 1 acre\n  - total area: 9 m2\n" + table, `survey.md:13: pits: sample area: "1 acre": unknown area unit`, false},
		{"pit depths in inches", "## C\n\n- nominal: 8\n- pits: Gumbel\n  - depths: 0.064 0.081 0.056 0.094\n  - sample area: 1 m2\n  - total area: 9 m2\n" + table, "survey.md:12: warning: pits: depths: every pit is under 0.25 mm deep (deepest 0.094 mm): inches in a mm survey?", true},
		{"pit depths in mm", "## C\n\n- nominal: 8\n- pits: Gumbel\n  - depths: 1.62 2.05 1.41 2.38\n  - sample area: 1 m2\n  - total area: 9 m2\n" + table, "", true},
		{"too few pits", "## C\n\n- nominal: 8\n- pits: Gumbel\n  - depths: 1 2\n  - sample area: 1 m2\n  - total area: 9 m2\n" + table, "survey.md:11: pits: 2 pit-depth samples", false},
		{"unknown input", "## C\n\n- nominal: 8\n- pits: Gumbel\n  - depths: 1 2 3\n  - sample area: 1 m2\n  - total area: 9 m2\n  - colour: red\n" + table, `survey.md:15: pits: "colour" is not an input`, false},
		{"pressure without unit", "## C\n\n- nominal: 8\n- corroded area: ASME B31G\n  - outside diameter: 200\n  - depth: 2\n  - length: 50\n  - SMYS: 241\n  - MAOP: 2 MPa\n  - safety factor: 1.39\n" + table, `survey.md:15: corroded area: SMYS: "241": give the unit`, false},
		{"too deep is repair, not an error", "## C\n\n- nominal: 8\n- corroded area: ASME B31G\n  - outside diameter: 200\n  - depth: 7\n  - length: 50\n  - SMYS: 241 MPa\n  - MAOP: 2 MPa\n  - safety factor: 1.39\n" + table, "", false},
		// "65 %" once read as 0.65 mm: a depth as a share of the wall is not a length.
		{"depth as a percentage", "## C\n\n- nominal: 8\n- corroded area: ASME B31G\n  - outside diameter: 200\n  - depth: 65 %\n  - length: 50\n  - SMYS: 241 MPa\n  - MAOP: 2 MPa\n  - safety factor: 1.39\n" + table, `survey.md:13: corroded area: depth: "65 %" is a percentage, not a length`, false},
		{"depth beyond wall", "## C\n\n- nominal: 8\n- corroded area: ASME B31G\n  - outside diameter: 200\n  - depth: 9\n  - length: 50\n  - SMYS: 241 MPa\n  - MAOP: 2 MPa\n  - safety factor: 1.39\n" + table, "survey.md:11: corroded area: the depth must be at least 0 and less than the wall", false},
		{"limit without engineer", "## C\n\n- nominal: 8\n- member: plate\n  - plate: 200 x 8\n  - allowed loss: 10 % of Sx\n" + table, "survey.md:13: member: allowed loss: name the engineer", false},
		// A measured plate ten times its nominal (a slipped decimal point) would
		// count as a gain and hide the loss (mill over-tolerance is about a
		// tenth: EN 10029, from memory).
		{"measured plate over nominal", "## C\n\n- nominal: 8\n- member: plate\n  - plate: 200 x 8\n  - measured plate: 80\n" + table, "survey.md:13: member: measured plate: 80 mm is over 20 % more than its nominal 8 mm", false},
		{"measured plate at mill tolerance", "## C\n\n- nominal: 8\n- member: plate\n  - plate: 200 x 8\n  - measured plate: 8.6\n" + table, "", false},
		{"limit of an unknown quantity", "## C\n\n- nominal: 8\n- member: plate\n  - plate: 200 x 8\n  - allowed loss: 10 % of J\n  - set by: A. B.\n" + table, `survey.md:13: member: allowed loss: "J" is not one of area, Ix, Iy, Sx, Sy`, false},
		{"grid of a missing CML", "## C\n\n- nominal: 8\n" + table + "\n| grid B 2026-11-18 | 1 |\n|---|---|\n| a | 7 |\n", "survey.md:16: grid B: no CML B", false},
		{"grid minimum not in the row", "## C\n\n- nominal: 8\n" + table + "\n| grid A 2026-11-18 | 1 |\n|---|---|\n| a | 6.5 |\n", "survey.md:16: grid A: its minimum 6.5 mm (row a, column 1) is below the row's governing reading 7 mm", false},
		{"grid minimum at the row's", "## C\n\n- nominal: 8\n" + table + "\n| grid A 2026-11-18 | 1 |\n|---|---|\n| a | 7.0 |\n", "", false},
		{"grid cell not a number", "## C\n\n- nominal: 8\n" + table + "\n| grid A 2026-11-18 | 1 |\n|---|---|\n| a | 7,1 |\n", "survey.md:18: grid A, row a, column 1", false},
		{"grid row short", "## C\n\n- nominal: 8\n" + table + "\n| grid A 2026-11-18 | 1 | 2 |\n|---|---|---|\n| a | 7 |\n", "survey.md:18: grid A: row has 2 cells, the header 3", false},
		{"bottom barrier not yes or no", "## C\n\n- nominal: 8\n- bottom pitting: API 653\n  - bottom side remaining: 5\n  - product side remaining: 5\n  - product side rate: 0.1\n  - underside rate: 0.1\n  - interval: 5 y\n  - release prevention barrier: maybe\n" + table, "survey.md:17: bottom pitting: release prevention barrier: write yes or no", false},
	} {
		_, problems := parseLocal(t, tc.body)
		var got []string
		for _, p := range problems {
			if p.Severity == Error || tc.warning {
				got = append(got, p.String())
			}
		}
		all := strings.Join(got, "\n")
		if tc.want == "" {
			if all != "" {
				t.Errorf("%s: errors %s", tc.name, all)
			}
			continue
		}
		if !strings.Contains(all, tc.want) {
			t.Errorf("%s: errors\n%s\nlack %q", tc.name, all, tc.want)
		}
	}
}

// Every local-damage snippet in README.md reads and computes under a component.
func TestReadmeLocalSnippets(t *testing.T) {
	readme, err := os.ReadFile(filepath.Join("..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, part := range strings.Split(string(readme), "```markdown\n")[1:] {
		snippet, _, _ := strings.Cut(part, "```")
		key, _, _ := strings.Cut(snippet, ":")
		table := "\n| CML | 2026-11-18 |\n|---|---|\n| BS-01 | 9 |\n"
		var body string
		switch key {
		case "- pits", "- bottom pitting", "- corroded area", "- member":
			body = "## C\n\n- nominal: 8.18\n- required: 2.5\n" + snippet + table
		default:
			if !strings.HasPrefix(snippet, "| grid ") {
				continue
			}
			body = "## C\n\n- nominal: 8.18\n- required: 2.5\n" + strings.Replace(table, "| 9 |", "| 9 5.74 |", 1) + "\n" + snippet
		}
		n++
		s, problems := parseLocal(t, body)
		if problems.HasErrors() {
			t.Errorf("README snippet %q: %v", key, problems)
			continue
		}
		if ld := s.Assets[0].Components[0].Design.Local; ld == nil || len(ld.Assessments)+len(ld.Grids) != 1 {
			t.Errorf("README snippet %q computed nothing", key)
		}
	}
	if n != 5 {
		t.Errorf("%d local-damage snippets in README, want 5", n)
	}
}

// A survey in inches: bare numbers are inches and inch rates. API 653
// §4.4.7 with RT_bc 0.180 in, RT_ip 0.200 in, StP_r 0.004 in/y, UP_r 0.006
// in/y, Or 8 y: MRT = 0.100 in, at the 0.10 in limit of Table 4.4.
func TestLocalDamageInches(t *testing.T) {
	src := "---\ntitle: x\nsite: y\ninspector: z\ndate: 2026-11-18\nunits: in\n---\n## Floor\n\n- nominal: 0.25\n- required: 0.1\n" +
		"- bottom pitting: API 653\n  - bottom side remaining: 0.180\n  - product side remaining: 0.200\n  - product side rate: 0.004\n" +
		"  - underside rate: 6 mpy\n  - interval: 8 years\n  - release prevention barrier: no\n" +
		"\n| CML | 2026-11-18 |\n|---|---|\n| F-1 | 0.2 |\n"
	s, problems := ParseChecklist("survey.md", []byte(src))
	problems = append(problems, ComputeRequired(s)...)
	problems = append(problems, ComputeLocal(s)...)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	b := s.Assets[0].Components[0].Design.Local.Assessments[0].Bottom
	if math.Abs(b.MRTMM-0.100*25.4) > 1e-9 || math.Abs(b.LimitMM-2.54) > 1e-12 || !b.Pass || math.Abs(*b.MaxIntervalY-8) > 1e-9 {
		t.Errorf("bottom in inches: %+v", b)
	}
}

// A deepest-pit estimate through the wall reaches its limit even with no
// required thickness: ligament 1.0 − 2.264 mm < 0 (the ten maxima above).
func TestPitThroughTheWall(t *testing.T) {
	s, problems := parseLocal(t, "## C\n\n- nominal: 1.0\n- pits: Gumbel\n  - depths: 0.82 1.05 0.91 1.23 0.77 1.12 0.98 1.41 0.88 1.02\n"+
		"  - sample area: 0.05 m2\n  - total area: 50 m2\n\n| CML | 2026-11-18 |\n|---|---|\n| A | 1.0 |\n")
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	if life, ok := s.Assets[0].Components[0].LocalLifeY(); !ok || life != 0 {
		t.Errorf("life %v %v, want 0", life, ok)
	}
}

// A CML's next inspection comes no later than its component's local damage
// allows: the pipe's wall alone would wait, but ASME B31G-2012 with a depth
// growth rate leaves a life L, and the half-life rule (API 570 §7.1.1) puts
// the inspection at L/2; the floor's API 653 §4.4.7 bottom check allows its
// longest interval (8 y) itself; a member past its limit is due now.
func TestNextInspectionByLocalDamage(t *testing.T) {
	body := strings.Replace(localBody, "  - safety factor: 1.39\n", "  - safety factor: 1.39\n  - depth growth rate: 0.2 mm/y\n", 1)
	s, problems := parseLocal(t, body)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	date := s.Date
	for _, it := range Assess(s, wallloss.DefaultPolicy) {
		r := it.Result
		var want time.Time
		switch it.CML.ID {
		case "P-1":
			life := *it.Component.Design.Local.Assessments[0].LifeY
			want = wallloss.AddYears(date, life/2)
		case "F-1":
			want = wallloss.AddYears(date, 8)
		case "G-1":
			want = date
		}
		if r.NextInspection == nil || !r.NextInspection.Equal(want) || (it.CML.ID != "G-1" && r.NextBasis.Kind != wallloss.BasisLocalDamage) {
			t.Errorf("%s: next inspection %v (%s), want %s", it.CML.ID, r.NextInspection, r.NextBasis, want.Format(time.DateOnly))
		}
	}
}
