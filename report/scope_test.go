package report

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// A visit whose scope covers one of two tanks: the other tank's CML is in
// results.json flagged out of scope, not dropped and not "not-remeasured",
// and lossline compare does not call it no longer listed.
func TestOutOfScopeIsNeitherDroppedNorNotRemeasured(t *testing.T) {
	root := t.TempDir()
	write := func(name, src string) string {
		dir := filepath.Join(root, name)
		if err := os.MkdirAll(dir, 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(dir, "survey.md"), []byte(src), 0o644); err != nil {
			t.Fatal(err)
		}
		return dir
	}
	const front = "---\ntitle: t\nsite: Test yard\ninspector: i\nunits: mm\n"
	write("y2021", front+"date: 2021-05-01\n---\n# Tank A\n\n## Course 1\n\n- nominal: 10\n- required: 5\n\n"+
		"| CML | 2016-05-01 | 2021-05-01 |\n|---|---|---|\n| A-1 | 9.8 | 9.5 |\n\n"+
		"# Tank B\n\n## Shell\n\n- nominal: 8\n- required: 4\n\n| CML | 2016-05-01 | 2021-05-01 |\n|---|---|---|\n| B-1 | 7.9 | 7.6 |\n")
	dir := write("y2026", front+"date: 2026-05-01\nprevious: ../y2021\nscope: [Tank A]\n---\n# Tank A\n\n## Course 1\n\n"+
		"| CML | 2026-05-01 |\n|---|---|\n| A-1 | 9.2 |\n")
	s, problems := survey.LoadSeries(dir, nil, survey.DefaultOptions)
	if len(problems) != 0 {
		t.Fatal(problems)
	}
	f := findings.Compute(s, findings.Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25})
	res := BuildResults(f, nil)
	if len(res.Dropped) != 0 {
		t.Errorf("dropped %+v", res.Dropped)
	}
	var b *Item
	for i := range res.Items {
		if res.Items[i].CML == "B-1" {
			b = &res.Items[i]
		}
	}
	if b == nil {
		t.Fatal("B-1 is not among the items")
	}
	if !slices.Contains(b.Flags, "out-of-scope") || slices.Contains(b.Flags, "not-remeasured") ||
		!slices.Equal(b.Change, []string{"out-of-scope"}) || b.Asset != "Tank B" || b.ThicknessDate == nil || *b.ThicknessDate != "2021-05-01" {
		t.Errorf("B-1: flags %v, change %v, asset %q, thickness date %v", b.Flags, b.Change, b.Asset, b.ThicknessDate)
	}
	text, err := Comparison(f, Display{}, false)
	if err != nil {
		t.Fatal(err)
	}
	if strings.Contains(string(text), "no longer listed") || !strings.Contains(string(text), "out-of-scope") {
		t.Errorf("comparison:\n%s", text)
	}
	if _, _, err := Render(f, testOptions()); err != nil {
		t.Errorf("render: %v", err)
	}
}
