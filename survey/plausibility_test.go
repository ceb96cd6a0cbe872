package survey

import (
	"path/filepath"
	"strings"
	"testing"
)

// plausibilityFolder is a one-tank survey dated 2026-05-01 with the given
// units, design list and table; its table header is on line 15.
func plausibilityFolder(t *testing.T, units, design, table string) string {
	t.Helper()
	return writeChecklist(t, t.TempDir(), "s", "---\ntitle: s\nsite: Test yard\ndate: 2026-05-01\ninspector: i\nunits: "+units+
		"\n---\n# Tank A\n\n## Course 1\n\n- required: 2 mm\n"+design+"\n\n"+table)
}

// Each plausibility check warns at the reading's (or row's) line with the
// likely intended value; ordinary wall loss raises nothing. Thresholds and
// their rationale: plausibility.go.
func TestPlausibilityWarnings(t *testing.T) {
	for _, c := range []struct {
		name, units, design, table string
		want                       string // "" for no warning; else line: message prefix
	}{
		{"inches in a mm survey", "mm", "- nominal: 9.5",
			"| CML | 2026-05-01 |\n|---|---|\n| C-1 | 0.340 |\n",
			`17: warning: CML C-1, visit 2026-05-01: reading 0.34 looks like inches (8.64 mm), against the CML's nominal (9.50 mm)` + "\n"},
		{"millimetres in an inch survey", "in", "- nominal: 0.375",
			"| CML | 2021-05-01 | 2026-05-01 |\n|---|---|---|\n| C-1 | 0.360 | 8.64 |\n",
			`17: warning: CML C-1, visit 2026-05-01: reading 8.64 looks like millimetres (0.340 in), against the CML's other readings (0.360 in)` + "\n"},
		{"decimal slip against the previous visit", "mm", "",
			"| CML | 2021-05-01 | 2026-05-01 |\n|---|---|---|\n| C-1 | 18.9 | 1.878 |\n",
			`17: warning: CML C-1, visit 2026-05-01: reading 1.878 is about a tenth of the CML's other readings (18.90 mm): did you mean 18.78?` + "\n"},
		{"decimal slip, ten times", "mm", "- nominal: 10",
			"| CML | 2021-05-01 | 2026-05-01 |\n|---|---|---|\n| C-1 | 9.6 | 93 |\n",
			`17: warning: CML C-1, visit 2026-05-01: reading 93 is about ten times the CML's other readings (9.60 mm): did you mean 9.3?` + "\n"},
		{"one reading of several", "mm", "- nominal: 10",
			"| CML | 2026-05-01 |\n|---|---|\n| C-1 | 9.4 0.93 9.5 |\n",
			`17: warning: CML C-1, visit 2026-05-01: reading 0.93 is about a tenth of the CML's other readings (about 9.45 mm): did you mean 9.3?` + "\n"},
		{"an earlier slip is warned at its own line", "mm", "",
			"| CML | 2016-05-01 | 2021-05-01 | 2026-05-01 |\n|---|---|---|---|\n| C-1 | 1.89 | 18.5 | 18.4 |\n",
			`17: warning: CML C-1, visit 2016-05-01: reading 1.89 is about a tenth of the CML's other readings (about 18.45 mm): did you mean 18.9?` + "\n"},
		{"a slip on a thinned wall, against the other readings", "mm", "- nominal: 10",
			"| CML | 2016-05-01 | 2021-05-01 | 2026-05-01 |\n|---|---|---|---|\n| C-1 | 5.1 | 4.5 | 0.45 |\n",
			`17: warning: CML C-1, visit 2026-05-01: reading 0.45 is about a tenth of the CML's other readings (about 4.80 mm): did you mean 4.5?` + "\n"},
		{"heavy real loss is no slip", "mm", "- nominal: 9.5",
			"| CML | 2021-05-01 | 2026-05-01 |\n|---|---|---|\n| C-1 | 7.9 | 3.4 |\n", ""},
		{"with two values only, the earlier is trusted", "mm", "",
			"| CML | 2021-05-01 | 2026-05-01 |\n|---|---|---|\n| C-1 | 1.89 | 18.9 |\n",
			`17: warning: CML C-1, visit 2026-05-01: reading 18.9 is about ten times the CML's other readings (1.89 mm): did you mean 1.89?` + "\n"},
		{"no reference", "mm", "",
			"| CML | 2026-05-01 |\n|---|---|\n| C-1 | 0.91 |\n", ""},
		{"step out of line with the component", "mm", "- nominal: 10",
			"| CML | 2016-05-01 | 2021-05-01 | 2026-05-01 |\n|---|---|---|---|\n" +
				"| C-1 | 9.9 | 9.8 | 9.7 |\n| C-2 | 9.8 | 9.75 | 9.6 |\n| C-3 | 9.9 | 9.85 | 7.9 |\n",
			`19: warning: CML C-3, visit 2026-05-01: 1.95 mm lost since 2021-05-01 (0.39 mm/y), over 5 times the median interval rate of the other CMLs of "Course 1" (0.02 mm/y): re-measure, or confirm the reading`},
		{"a spot losing fast all along is no step", "mm", "- nominal: 10",
			"| CML | 2016-05-01 | 2021-05-01 | 2026-05-01 |\n|---|---|---|---|\n" +
				"| C-1 | 9.9 | 9.8 | 9.7 |\n| C-2 | 9.8 | 9.75 | 9.6 |\n| C-3 | 9.9 | 8.0 | 6.1 |\n", ""},
		{"a step within gauge tolerance and margin", "mm", "- nominal: 10",
			"| CML | 2016-05-01 | 2021-05-01 | 2026-05-01 |\n|---|---|---|---|\n" +
				"| C-1 | 9.9 | 9.9 | 9.9 |\n| C-2 | 9.8 | 9.8 | 9.8 |\n| C-3 | 9.9 | 9.85 | 9.2 |\n", ""},
		// A wall does not grow between visits (common practice: a later reading
		// thicker by more than the gauge tolerance, 0.28 mm, plus 0.5 mm is a
		// slip, a different spot, or an unrecorded repair).
		{"a transposed digit makes the wall grow", "mm", "- nominal: 12.7",
			"| CML | 2016-05-01 | 2021-05-01 | 2026-05-01 |\n|---|---|---|---|\n| C-1 | 12.52 | 12.31 | 21.05 |\n",
			`17: warning: CML C-1, visit 2026-05-01: 21.05 mm is 8.74 mm thicker than on 2021-05-01 (12.31 mm): a wall does not grow`},
		{"growth within the gauge tolerance and margin", "mm", "- nominal: 10",
			"| CML | 2021-05-01 | 2026-05-01 |\n|---|---|---|\n| C-1 | 9.0 | 9.6 |\n", ""},
		{"a recorded repair between the visits", "mm", "- nominal: 10\n- repaired: 2022-01-10; new 10; plate replaced",
			"| CML | 2021-05-01 | 2026-05-01 |\n|---|---|---|\n| C-1 | 6.0 | 9.9 |\n", ""},
		// A nominal ten times the readings (common practice: walls read within
		// a fifth over nominal, mill tolerance plus gauge error).
		{"a nominal with its decimal point slipped", "mm", "- nominal: 95",
			"| CML | 2016-05-01 | 2021-05-01 | 2026-05-01 |\n|---|---|---|---|\n| C-1 | 9.6 | 9.5 | 9.4 |\n| C-2 | 9.5 | 9.4 | 9.3 |\n",
			`13: warning: the median of the latest readings of "Course 1" (9.35 mm) is far below its nominal 95 mm`},
		{"longitude without its minus sign", "mm", "- nominal: 10",
			"| CML | gps | 2026-05-01 |\n|---|---|---|\n| C-1 | 45.60238, -61.35078 | 9.5 |\n| C-2 | 45.60241, -61.35012 | 9.5 |\n" +
				"| C-3 | 45.60262, 61.35031 | 9.5 |\n| C-4 | 45.60290, -61.35050 | 9.5 |\n",
			`19: warning: CML C-3: gps 45.60262, 61.35031 is 8424 km from the other CMLs of "Tank A"; with the longitude's sign changed (45.60262, -61.35031) it would be 28 m from them` + "\n"},
		{"latitude and longitude swapped", "mm", "- nominal: 10",
			"| CML | gps | 2026-05-01 |\n|---|---|---|\n| C-1 | 45.60238, -61.35078 | 9.5 |\n| C-2 | -61.35012, 45.60241 | 9.5 |\n" +
				"| C-3 | 45.60262, -61.35031 | 9.5 |\n",
			`18: warning: CML C-2: gps -61.35012, 45.60241 is 15173 km from the other CMLs of "Tank A"; with latitude and longitude swapped (45.60241, -61.35012) it would be 35 m from them` + "\n"},
		{"a position far off with no slip that explains it", "mm", "- nominal: 10",
			"| CML | gps | 2026-05-01 |\n|---|---|---|\n| C-1 | 45.60238, -61.35078 | 9.5 |\n| C-2 | 45.60241, -61.35012 | 9.5 |\n" +
				"| C-3 | 45.90262, -61.35031 | 9.5 |\n",
			`19: warning: CML C-3: gps 45.90262, -61.35031 is 33 km from the other CMLs of "Tank A"` + "\n"},
	} {
		t.Run(c.name, func(t *testing.T) {
			dir := plausibilityFolder(t, c.units, c.design, c.table)
			_, problems := LoadSeries(dir, nil, DefaultOptions)
			text := problemText(problems)
			if c.want == "" {
				if len(problems) != 0 {
					t.Errorf("problems:\n%s", text)
				}
				return
			}
			want := filepath.Join(dir, "survey.md") + ":" + c.want
			if len(problems) != 1 || problems[0].Severity != Warning || !strings.HasPrefix(text, want) {
				t.Errorf("problems:\n%swant one warning starting %q", text, want)
			}
		})
	}
}

// The demo raises no plausibility warning.
func TestPlausibilityQuietOnDemo(t *testing.T) {
	s, problems := LoadSeries(filepath.Join("..", "testdata", "demo"), nil, DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	if p := plausibility(s); len(p) != 0 {
		t.Errorf("plausibility warnings on the demo:\n%s", problemText(p))
	}
}

// A photo name not found suggests the nearest existing names.
func TestMisspeltPhotoSuggestsNearestName(t *testing.T) {
	_, problems := Load(filepath.Join("..", "testdata", "bad", "misspelt-photo"))
	var errs []string
	for _, p := range problems {
		if p.Severity == Error {
			errs = append(errs, p.String())
		}
	}
	want := `survey.md:19: photo "t7/s02-nort.jpg" of CML C1 is not in ` + filepath.Join("..", "testdata", "bad", "misspelt-photo", "photos") + ` (did you mean t7/s02-north.jpg?)`
	if len(errs) != 1 || !strings.HasSuffix(errs[0], want) {
		t.Errorf("errors %q\nwant one ending %q", errs, want)
	}
}

func TestCloseNames(t *testing.T) {
	have := []string{"t7/s02-north.jpg", "t7/s02-south.jpg", "bridge/deck.jpg", "T7/S03-NORTH.JPG"}
	for _, c := range []struct{ want, got string }{
		{"t7/s02-nort.jpg", "t7/s02-north.jpg"},
		{"t7/S02-North.JPG", "t7/s02-north.jpg"},
		{"deck.jpg", "bridge/deck.jpg"},
		{"t7/s03-north.jpg", "T7/S03-NORTH.JPG"},
		{"overview.jpg", ""},
	} {
		if got := strings.Join(closeNames(c.want, have, 3), " "); got != c.got {
			t.Errorf("closeNames(%q) = %q, want %q", c.want, got, c.got)
		}
	}
}
