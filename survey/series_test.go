package survey

import (
	"path/filepath"
	"strings"
	"testing"
)

// An earlier folder of another site, or one that shares no asset, is an
// error naming both folders; previous-other-site: accepts it.
func TestPreviousOfAnotherSite(t *testing.T) {
	root := t.TempDir()
	const table = "| CML | 2021-05-01 |\n|---|---|\n| C-1 | 9.6 |\n"
	other := writeChecklist(t, root, "south", "---\ntitle: s\nsite: Example terminal, south yard\ndate: 2021-05-01\ninspector: i\nunits: mm\n---\n# Tank\n\n## Course\n\n"+table)
	writeChecklist(t, root, "tanks", "---\ntitle: s\nsite: Example terminal,  NORTH yard\ndate: 2021-05-01\ninspector: i\nunits: mm\n---\n# Tank T-9\n\n## Course\n\n"+table)
	newFolder := func(name, front string) string {
		return writeChecklist(t, root, name, "---\ntitle: n\nsite: Example terminal, north yard\ndate: 2026-05-01\ninspector: i\nunits: mm\n"+front+
			"---\n# Tank\n\n## Course\n\n- nominal: 10\n- required: 5\n\n| CML | 2026-05-01 |\n|---|---|\n| C-1 | 9.0 |\n")
	}
	for _, c := range []struct {
		name, front string
		extra       []string
		want        string // "" for no error
	}{
		{"site", "previous: ../south\n", nil,
			`site/survey.md:3: site "Example terminal, north yard" differs from site "Example terminal, south yard" of the previous survey ` +
				filepath.Join(root, "south") + " at " + filepath.Join(other, "survey.md") + ":3; if it is the same site, name that folder under previous-other-site: in this survey's front matter"},
		{"flag", "", []string{other},
			`flag/survey.md:3: site "Example terminal, north yard" differs from site "Example terminal, south yard"`},
		{"assets", "previous:\n  - ../tanks\n", nil,
			"assets/survey.md:7: the previous survey " + filepath.Join(root, "tanks") + " shares no asset with this survey (here: Tank; there: Tank T-9)"},
		{"override", "previous-other-site: [../south, ../tanks]\n", nil, ""},
	} {
		t.Run(c.name, func(t *testing.T) {
			dir := newFolder(c.name, c.front)
			s, problems := LoadSeries(dir, c.extra, DefaultOptions)
			if c.want == "" {
				if problems.HasErrors() || s.History == nil || len(s.History.Earlier) != 2 {
					t.Errorf("override: problems\n%s", problemText(problems))
				}
				return
			}
			var errs []string
			for _, p := range problems {
				if p.Severity == Error {
					errs = append(errs, p.String())
				}
			}
			if len(errs) != 1 || !strings.Contains(errs[0], c.want) {
				t.Errorf("errors %q\nwant one containing %q", errs, c.want)
			}
		})
	}
}
