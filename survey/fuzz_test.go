package survey

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/lossline/lossline/survey/wallloss"
)

// FuzzParseChecklist: any input yields a survey and problems, never a panic,
// and every problem points inside the file.
func FuzzParseChecklist(f *testing.F) {
	seeds, _ := filepath.Glob(filepath.Join("..", "testdata", "*", "survey.md"))
	more, _ := filepath.Glob(filepath.Join("..", "testdata", "bad", "*", "survey.md"))
	for _, p := range append(seeds, more...) {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(b)
		}
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		s, problems := readChecklist("survey.md", src)
		if s == nil {
			t.Fatal("nil survey")
		}
		lines := len(newLineIndex(src))
		for _, p := range problems {
			if p.Line < 0 || p.Line > lines {
				t.Fatalf("problem at line %d of a %d-line file: %v", p.Line, lines, p)
			}
		}
		// The new inputs' computations run on whatever was read.
		_ = ComputeRequired(s)
		_ = ComputeElectro(s)
		_ = ComputeLocal(s)
		_ = Assess(s, wallloss.DefaultPolicy)
	})
}
