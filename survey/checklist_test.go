package survey

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Each bad-input fixture holds one problem; the error must name its line.
func TestBadInputPointsAtLine(t *testing.T) {
	for _, c := range []struct {
		dir, want string
	}{
		{"no-front-matter", "survey.md:1: no front matter"},
		{"unknown-units", `survey.md:6: unknown units "cm"`},
		{"non-numeric-reading", `survey.md:19: reading "12,5" is not a number`},
		{"duplicate-cml", "survey.md:20: CML C1 is listed twice (first at line 19)"},
		{"future-date-column", "survey.md:17: visit column 2025-07-01 is later than this visit's date 2025-06-10"},
		{"required-above-nominal", "survey.md:14: required 11.00 mm is above nominal 10.00 mm"},
		{"missing-photo", `survey.md:19: photo "gone.jpg" of CML C1 is not in`},
		{"photo-outside-folder", `survey.md:19: photo "../secret.jpg" of CML C1 is outside the survey's photos folder`},
	} {
		t.Run(c.dir, func(t *testing.T) {
			_, problems := Load(filepath.Join("..", "testdata", "bad", c.dir))
			if !problems.HasErrors() {
				t.Fatalf("no error; problems: %v", problems)
			}
			var errs []string
			for _, p := range problems {
				if p.Severity == Error {
					errs = append(errs, p.String())
				}
			}
			if len(errs) != 1 || !strings.Contains(errs[0], c.want) {
				t.Errorf("errors %q, want exactly one containing %q", errs, c.want)
			}
		})
	}
}

// A checklist with many problems reports all of them, sorted by line.
func TestBrokenListsEveryProblem(t *testing.T) {
	_, problems := Load(filepath.Join("..", "testdata", "broken"))
	var got []string
	for _, p := range problems {
		_, after, _ := strings.Cut(p.String(), "survey.md:")
		got = append(got, after)
	}
	want := []string{
		`14: required 11.00 mm is above nominal 10.00 mm in "Course 1"`,
		`19: reading "9,6" is not a number`,
		`19: photo "gone.jpg" of CML C1 is not in`,
		`20: CML C1 is listed twice (first at line 19)`,
		`22: warning: "Course 2" has no required thickness`,
		`25: consequence: "severe" is not very low, low, medium, high or very high`,
		`29: reading "abc" is not a number`,
	}
	if len(got) != len(want) {
		t.Fatalf("got %d problems, want %d:\n%s", len(got), len(want), strings.Join(got, "\n"))
	}
	for i := range want {
		if !strings.HasPrefix(got[i], want[i]) {
			t.Errorf("problem %d = %q, want prefix %q", i, got[i], want[i])
		}
	}
}

func TestFrontMatterProblems(t *testing.T) {
	for _, c := range []struct{ name, src, want string }{
		{"yaml error line counts from the file's first line",
			"---\ntitle: x\ndate: 2025-01-01\nunits: [mm\n---\n", "survey.md:4: front matter"},
		{"missing date", "---\ntitle: x\nunits: mm\n---\n", "survey.md:1: front matter has no date"},
		{"bad date", "---\ntitle: x\ndate: 18/11/2026\nunits: mm\n---\n", `survey.md:3: date "18/11/2026" is not an ISO 8601 date`},
		{"missing units", "---\ntitle: x\ndate: 2025-01-01\n---\n", "survey.md:1: front matter has no units"},
		{"table outside a component", "---\ntitle: x\ndate: 2025-01-01\nunits: mm\n---\n\n| CML | 2024-01-01 |\n|---|---|\n| A | 1 |\n",
			"survey.md:7: a reading table must come under a ## component heading"},
		{"first column not CML", "---\ntitle: x\ndate: 2025-01-01\nunits: mm\n---\n## C\n\n| id | 2024-01-01 |\n|---|---|\n| A | 1 |\n",
			`survey.md:8: the first column of a reading table must be CML, not "id"`},
		{"bad gps", "---\ntitle: x\ndate: 2025-01-01\nunits: mm\n---\n## C\n\n| CML | gps | 2024-01-01 |\n|---|---|---|\n| A | 95.1, 3 | 1 |\n",
			`survey.md:10: gps "95.1, 3" is not`},
	} {
		_, problems := ParseChecklist("survey.md", []byte(c.src))
		wantProblem(t, c.name, problems, c.want)
	}
}

func TestParseDemo(t *testing.T) {
	s, problems := LoadSeries(filepath.Join("..", "testdata", "demo"), nil, DefaultOptions)
	if problems.HasErrors() {
		t.Fatalf("demo has errors: %v", problems)
	}
	if s.Title == "" || s.Units != MM || s.Date.Format("2006-01-02") != "2026-11-18" {
		t.Errorf("front matter: %q %q %v", s.Title, s.Units, s.Date)
	}
	if len(s.Assets) != 8 || len(s.AllCMLs()) != 35 { // 4 assets and 28 CMLs, the electro demo's 3 and 2, local damage's 1 and 5
		t.Fatalf("%d assets, %d CMLs; want 8 and 35", len(s.Assets), len(s.AllCMLs()))
	}
	byID := map[string]Located{}
	for _, l := range s.AllCMLs() {
		byID[l.CML.ID] = l
	}
	t102 := byID["T1-02"].CML
	last := t102.Visits[len(t102.Visits)-1]
	if len(last.ReadingsMM) != 3 || last.Governing() != 10.96 {
		t.Errorf("T1-02 latest visit %v, want three readings governed by 10.96", last.ReadingsMM)
	}
	a01 := byID["A-01"]
	if d := a01.CML.Visits[0].Date; !d.MonthOnly || d.Time.Format("2006-01-02") != "2012-04-15" {
		t.Errorf("A-01 first visit %v, want month 2012-04 as its 15th", d)
	}
	// 0.322 in × 25.4 mm/in (exact, international inch) = 8.1788 mm.
	if n := *a01.Component.Design.NominalMM; math.Abs(n-8.1788) > 1e-9 {
		t.Errorf("nominal 0.322 in = %v mm, want 8.1788", n)
	}
	if a04 := byID["A-04"].CML; len(a04.Visits) != 3 {
		t.Errorf("A-04 has %d visits; the '-' cell is not a visit", len(a04.Visits))
	}
	var open int
	for _, a := range s.Assets {
		for _, c := range a.Components {
			for _, it := range c.Scope {
				if !it.Done {
					open++
				}
			}
		}
	}
	if open != 5 {
		t.Errorf("%d scope items not done, want 5", open)
	}
	// Shell course 1: API 653 §4.3.3.1 SI form from the nested inputs, S for an
	// unknown material in course 1 = 23 595 psi = 162.68 MPa:
	// 4.9 × (12.8 − 0.3) × 24 × 0.86 / (162.68 × 0.85) = 9.1424 mm.
	c1 := byID["T1-01"].Component.Design
	if c1.RequiredCalc == nil || math.Abs(*c1.RequiredMM-9.1424) > 1e-4 {
		t.Errorf("shell course 1 required %v (calc %v)", c1.RequiredMM, c1.RequiredCalc)
	}
	if r := byID["G1-01"].Component.Design.Rule; r == nil || r.Code() != "fixed-6y" {
		t.Errorf("G1 interval rule %v", r)
	}
	if d := byID["BP-01"].Component.Design; d.Rule == nil || !strings.Contains(d.Rule.Describe(10), "at most 20 years") {
		t.Errorf("bottom rule without a release prevention barrier: %v", d.Rule)
	}
	if got := byID["T1-02"].CML.PhotoRefs; len(got) != 1 || got[0] != "tank-t101/t101-c1-north.jpg" {
		t.Errorf("T1-02 photos %v", got)
	}
}

func TestParseThicknesses(t *testing.T) {
	for _, c := range []struct {
		in   string
		def  Unit
		want []float64
	}{
		{"9.5", MM, []float64{9.5}},
		{"0.375 in", MM, []float64{9.525}}, // 0.375 × 25.4, exact inch
		{"0.375", Inch, []float64{9.525}},
		{"9.1mm 9.0mm", Inch, []float64{9.1, 9.0}},
		{"11.02 10.96 11.10", MM, []float64{11.02, 10.96, 11.10}},
		{"0.250 in 6.1 mm", MM, []float64{6.35, 6.1}},
	} {
		got, err := ParseThicknesses(c.in, c.def)
		if err != nil || len(got) != len(c.want) {
			t.Errorf("%q: %v %v", c.in, got, err)
			continue
		}
		for i := range got {
			if math.Abs(got[i]-c.want[i]) > 1e-12 {
				t.Errorf("%q: %v, want %v", c.in, got, c.want)
			}
		}
	}
	for _, bad := range []string{"12,5", "abc", "0", "-1.2", "9.5 cm"} {
		if _, err := ParseThicknesses(bad, MM); err == nil {
			t.Errorf("%q: no error", bad)
		}
	}
}

// The checklist is never written to: Load leaves every input byte as it was.
func TestLoadDoesNotModifyInput(t *testing.T) {
	path := filepath.Join("..", "testdata", "demo", "survey.md")
	before, _ := os.ReadFile(path)
	LoadSeries(filepath.Join("..", "testdata", "demo"), nil, DefaultOptions)
	after, _ := os.ReadFile(path)
	if string(before) != string(after) {
		t.Error("survey.md changed")
	}
}

// The complete example in README.md must stay a valid checklist.
func TestReadmeExampleParses(t *testing.T) {
	readme, err := os.ReadFile(filepath.Join("..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	_, rest, ok := strings.Cut(string(readme), "````markdown\n")
	example, _, ok2 := strings.Cut(rest, "````")
	if !ok || !ok2 {
		t.Fatal("README has no ````markdown example")
	}
	s, problems := readChecklist("README.md", []byte(example))
	if problems.HasErrors() || len(problems) != 0 {
		t.Fatalf("README example: %v", problems)
	}
	cmls := s.AllCMLs()
	if len(s.Assets) != 1 || len(cmls) != 3 || len(cmls[1].CML.Visits) != 2 {
		t.Errorf("README example: %d assets, %d CMLs", len(s.Assets), len(cmls))
	}
	// 0.337 in nominal of the nozzle = 8.5598 mm.
	if n := *cmls[2].Component.Design.NominalMM; math.Abs(n-8.5598) > 1e-9 {
		t.Errorf("nozzle nominal %v mm", n)
	}
}

// Design-list problems of the methods and rules point at their line.
func TestDesignProblems(t *testing.T) {
	head := "---\ntitle: x\ndate: 2025-01-01\nunits: mm\n---\n## C\n\n- nominal: 10\n"
	for _, c := range []struct{ name, list, want string }{
		{"unknown method", "- required: Barlow\n", `survey.md:9: required: unknown method "Barlow"`},
		{"missing input", "- required: ASME B31.3 pipe\n  - pressure: 2 MPa\n", `survey.md:9: required: missing input "outside diameter"`},
		{"input not name: value", "- required: API 653 bottom\n  - no barrier\n", "survey.md:10: input of API 653 bottom: write it as `name: value`"},
		{"wrong kind", "- required: API 653 bottom\n  - release prevention barrier: maybe\n", `survey.md:9: required: release prevention barrier: "maybe" is not yes or no`},
		{"rate model", "- rate model: average\n", `survey.md:9: rate model "average" is not one of long, short, max, fit`},
		{"interval rule", "- interval rule: API 570 class 7\n", `survey.md:9: interval rule "API 570 class 7" is not one of`},
		{"corrosivity", "- corrosivity: C9\n", `survey.md:9: corrosivity "C9" is not an ISO 9223 category`},
		{"assumed rate", "- assumed rate: fast\n", `survey.md:9: assumed rate: "fast" is not a rate`},
		{"repair without item", "- repair: 40\n", "survey.md:9: repair: write a quantity and a priced item"},
		{"repair cost", "- repair cost: lots\n", `survey.md:9: repair cost: "lots" is not an amount`},
		{"required above nominal by method", "- required: section loss\n  - allowed section loss: 140 %\n", "survey.md:9: required: allowed section loss must be between 0 and 100 %"},
	} {
		src := head + c.list + "\n| CML | 2024-01-01 |\n|---|---|\n| A | 9 |\n"
		_, problems := readChecklist("survey.md", []byte(src))
		wantProblem(t, c.name, problems, c.want)
	}
}

func TestParseRate(t *testing.T) {
	for _, c := range []struct {
		in   string
		def  Unit
		want float64
	}{
		{"0.12 mm/y", MM, 0.12}, {"4 mpy", MM, 0.1016}, {"0.004 in/y", MM, 0.1016}, {"0.1", MM, 0.1}, {"0.004", Inch, 0.1016}, {"25 µm/a", MM, 0.025},
	} {
		got, err := ParseRate(c.in, c.def)
		if err != nil || math.Abs(got-c.want) > 1e-12 {
			t.Errorf("ParseRate(%q) = %v %v, want %v", c.in, got, err, c.want)
		}
	}
}

// Every required-thickness snippet in README.md parses under a component.
func TestReadmeMethodSnippets(t *testing.T) {
	readme, err := os.ReadFile(filepath.Join("..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, part := range strings.Split(string(readme), "```markdown\n")[1:] {
		snippet, _, _ := strings.Cut(part, "```")
		if !strings.HasPrefix(snippet, "- required:") {
			continue
		}
		n++
		src := "---\ntitle: x\ndate: 2025-01-01\nunits: mm\n---\n## C\n\n- nominal: 16\n" + snippet +
			"\n| CML | 2024-01-01 |\n|---|---|\n| A | 9 |\n"
		s, problems := readChecklist("survey.md", []byte(src))
		if problems.HasErrors() {
			t.Errorf("README snippet %d: %v", n, problems)
			continue
		}
		if s.Assets[0].Components[0].Design.RequiredCalc == nil {
			t.Errorf("README snippet %d computed nothing", n)
		}
	}
	if n != 4 {
		t.Errorf("%d method snippets in README, want 4", n)
	}
}

func TestParseAmount(t *testing.T) {
	for in, want := range map[string]float64{"12000": 12000, "12 000": 12000, "12_000": 12000, "85.5": 85.5, "12000 EUR": 12000, "6 500 EUR": 6500} {
		if got, err := ParseAmount(in); err != nil || got != want {
			t.Errorf("ParseAmount(%q) = %v %v, want %v", in, got, err, want)
		}
	}
	for _, bad := range []string{"", "-5", "lots", "12,000.5.1"} {
		if _, err := ParseAmount(bad); err == nil {
			t.Errorf("ParseAmount(%q): no error", bad)
		}
	}
}

// readChecklist reads a checklist and computes its required thicknesses, as Load does.
func readChecklist(file string, src []byte) (*Survey, ProblemList) {
	s, problems := ParseChecklist(file, src)
	problems = append(problems, ComputeRequired(s)...)
	return s, append(problems, ComputeLocal(s)...)
}

// wantProblem fails unless a problem starts with want.
func wantProblem(t *testing.T, name string, problems ProblemList, want string) {
	t.Helper()
	for _, p := range problems {
		if strings.HasPrefix(p.String(), want) {
			return
		}
	}
	t.Errorf("%s: problems %v lack %q", name, problems, want)
}
