package templates

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestOverrideFolderWins(t *testing.T) {
	dir := t.TempDir()
	os.MkdirAll(filepath.Join(dir, "report"), 0o755)
	os.WriteFile(filepath.Join(dir, "report", "cautions.md"), []byte("Owner's own cautions, cap {{.Cap}} y."), 0o644)
	s := Set{Override: dir}
	got, err := s.Execute("report/cautions.md", map[string]int{"Cap": 7})
	if err != nil || got != "Owner's own cautions, cap 7 y." {
		t.Errorf("override: %q %v", got, err)
	}
	// Files the folder lacks come from the embedded set.
	m, err := s.Read("report/methods.md")
	if err != nil || !strings.Contains(string(m), "API 570") {
		t.Errorf("fallback to embedded methods: %v", err)
	}
	for _, name := range Scaffold {
		if _, err := (Set{}).Read("scaffold/" + name); err != nil {
			t.Errorf("scaffold %s: %v", name, err)
		}
	}
}

// The built-in cautions carry the mandatory deferral to codes and engineers.
func TestCautionsDeferToCodes(t *testing.T) {
	c, err := Set{}.Execute("report/cautions.md", nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"screening", "qualified inspector or engineer", "governing code", "local regulations", "licensed engineer", "take precedence"} {
		if !strings.Contains(strings.ToLower(c), strings.ToLower(want)) {
			t.Errorf("cautions lack %q", want)
		}
	}
}
