package survey

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

func writeFrontMatter(t *testing.T, dir, front string) {
	t.Helper()
	if err := os.MkdirAll(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	src := "---\ntitle: T\nsite: S\ndate: 2026-01-10\nunits: mm\n" + front + "---\n"
	if err := os.WriteFile(filepath.Join(dir, ChecklistFile), []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
}

// Survey folders are found at any depth; a folder another names as previous
// (or previous-other-site) is read with it, not listed; photos and hidden
// folders are not searched.
func TestFindSurveys(t *testing.T) {
	root := t.TempDir()
	writeFrontMatter(t, filepath.Join(root, "north", "2026"), "previous: ../2021\nprevious-other-site:\n  - ../../old/2016\n")
	writeFrontMatter(t, filepath.Join(root, "north", "2021"), "")
	writeFrontMatter(t, filepath.Join(root, "old", "2016"), "")
	writeFrontMatter(t, filepath.Join(root, "south", "line", "2025"), "")
	writeFrontMatter(t, filepath.Join(root, "north", "2026", "photos", "x"), "")
	writeFrontMatter(t, filepath.Join(root, ".trash", "2020"), "")
	got, problems := FindSurveys([]string{root})
	if len(problems) != 0 {
		t.Fatal(problems)
	}
	want := []string{filepath.Join(root, "north", "2026"), filepath.Join(root, "south", "line", "2025")}
	if !slices.Equal(got, want) {
		t.Errorf("found %v, want %v", got, want)
	}
	// Given twice, or as a survey folder and its survey.md, a folder is listed once.
	got, _ = FindSurveys([]string{filepath.Join(root, "south"), filepath.Join(root, "south", "line", "2025", ChecklistFile)})
	if len(got) != 1 {
		t.Errorf("found %v", got)
	}
	// A missing folder, and one without a survey, are errors naming them.
	empty := t.TempDir()
	_, problems = FindSurveys([]string{filepath.Join(root, "nowhere"), empty})
	if len(problems) != 2 || !problems.HasErrors() || !strings.Contains(problems[0].String(), "nowhere: no such folder") ||
		!strings.Contains(problems[1].String(), "no survey folder") {
		t.Errorf("problems %v", problems)
	}
}
