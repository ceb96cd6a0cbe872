package folder

import (
	"os"
	"path/filepath"
	"testing"
)

func TestContains(t *testing.T) {
	for _, c := range []struct {
		dir, path string
		want      bool
	}{
		{"/a/b", "/a/b", true},
		{"/a/b", "/a/b/c", true},
		{"/a/b", "/a/b/c/../d", true},
		{"/a/b", "/a/bc", false},
		{"/a/b", "/a", false},
		{"/a/b", "/a/b/../c", false},
		{"/a/b", "/x/a/b", false},
		{"/", "/anything", true},
		{"/a/b", "/a/b/..c", true}, // a name starting with two dots is inside
	} {
		if got := Contains(filepath.FromSlash(c.dir), filepath.Clean(filepath.FromSlash(c.path))); got != c.want {
			t.Errorf("Contains(%s, %s) = %v, want %v", c.dir, c.path, got, c.want)
		}
	}
}

func TestResolveFollowsLinksOfTheExistingPart(t *testing.T) {
	root, err := filepath.EvalSymlinks(t.TempDir())
	if err != nil {
		t.Fatal(err)
	}
	real := filepath.Join(root, "real")
	os.Mkdir(real, 0o755)
	if err := os.Symlink(real, filepath.Join(root, "link")); err != nil {
		t.Skip("no symbolic links here:", err)
	}
	got, err := Resolve(filepath.Join(root, "link", "not-yet", "out"))
	if err != nil {
		t.Fatal(err)
	}
	if want := filepath.Join(real, "not-yet", "out"); got != want {
		t.Errorf("Resolve = %s, want %s", got, want)
	}
	if !Contains(real, got) {
		t.Errorf("%s not inside %s", got, real)
	}
	os.Symlink(filepath.Join(root, "loop"), filepath.Join(root, "loop"))
	if _, err := Resolve(filepath.Join(root, "loop", "x")); err == nil {
		t.Error("a link to itself: no error")
	}
}

func TestWriteWholeReplacesAndLeavesNoTemporary(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "results.csv")
	for _, data := range []string{"first\n", "second, longer\n"} {
		if err := WriteWhole(path, []byte(data), 0o640); err != nil {
			t.Fatal(err)
		}
		got, err := os.ReadFile(path)
		if err != nil || string(got) != data {
			t.Fatalf("read back %q, %v; want %q", got, err, data)
		}
	}
	if st, _ := os.Stat(path); st.Mode().Perm() != 0o640 {
		t.Errorf("mode %v, want 0640", st.Mode().Perm())
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 1 {
		t.Errorf("%d files in the folder, want only results.csv", len(entries))
	}
}
