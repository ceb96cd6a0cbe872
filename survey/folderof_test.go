package survey

import (
	"os"
	"path/filepath"
	"testing"
)

func TestFolderOf(t *testing.T) {
	root := t.TempDir()
	odd := filepath.Join(root, "odd", "survey.md") // a folder that happens to be called survey.md
	if err := os.MkdirAll(odd, 0o755); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ arg, want string }{
		{filepath.Join("..", "testdata", "demo"), filepath.Join("..", "testdata", "demo")},
		{filepath.Join("..", "testdata", "demo", "survey.md"), filepath.Join("..", "testdata", "demo")},
		{filepath.Join(root, "missing", "survey.md"), filepath.Join(root, "missing")},
		{"survey.md", "."},
		{odd, odd},
		{filepath.Join("..", "testdata", "demo", "lossline.yaml"), filepath.Join("..", "testdata", "demo", "lossline.yaml")},
	} {
		if got := FolderOf(c.arg); got != c.want {
			t.Errorf("FolderOf(%q) = %q, want %q", c.arg, got, c.want)
		}
	}
}
