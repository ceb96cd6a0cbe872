package templates

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// write creates a file under dir, with its folders.
func write(t *testing.T, dir, name, text string) string {
	t.Helper()
	path := filepath.Join(dir, filepath.FromSlash(name))
	if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

func TestFolderReplacesMethodsAndAddsToCautions(t *testing.T) {
	dir := t.TempDir()
	write(t, dir, "report/methods.md", "Owner's own methods, cap {{.Cap}} y.")
	write(t, dir, "report/cautions.md", "Owner's cautions, cap {{.Cap}} y.")
	s := Set{Override: dir}
	got, err := s.Execute("report/methods.md", map[string]int{"Cap": 7})
	if err != nil || got != "Owner's own methods, cap 7 y." {
		t.Errorf("methods from the folder: %q %v", got, err)
	}
	// The cautions always come from the binary; the folder's copy is an addition.
	c, err := s.Execute("report/cautions.md", map[string]int{"Cap": 7})
	if err != nil || !strings.Contains(c, "licensed engineer") || strings.Contains(c, "Owner's") {
		t.Errorf("cautions with a folder: %q %v", c, err)
	}
	add, err := s.Addition("report/cautions.md", map[string]int{"Cap": 7})
	if err != nil || add != "Owner's cautions, cap 7 y." {
		t.Errorf("addition: %q %v", add, err)
	}
	if add, err := (Set{}).Addition("report/cautions.md", nil); add != "" || err != nil {
		t.Errorf("addition without a folder: %q %v", add, err)
	}
	// Files the folder lacks come from the embedded set.
	os.Remove(filepath.Join(dir, "report", "methods.md"))
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

// A folder is used only inside the survey folder or a folder named on the
// command line, with its links resolved.
func TestOpenKeepsTheFolderInsideItsRoots(t *testing.T) {
	root, outside := t.TempDir(), t.TempDir()
	inside := filepath.Join(root, "texts")
	os.Mkdir(inside, 0o755)
	if s, err := Open(inside, root); err != nil || s.Override != inside {
		t.Errorf("folder inside the survey folder: %v %v", s, err)
	}
	if s, err := Open(""); err != nil || s.Override != "" {
		t.Errorf("no folder: %v %v", s, err)
	}
	var te *Error
	if _, err := Open(outside, root); !errors.As(err, &te) || !strings.Contains(err.Error(), "outside") {
		t.Errorf("folder outside: %v", err)
	}
	if _, err := Open(filepath.Join(root, "none"), root); err == nil {
		t.Error("missing folder: no error")
	}
	link := filepath.Join(root, "link")
	if err := os.Symlink(outside, link); err != nil {
		t.Skip("no symbolic links:", err)
	}
	if _, err := Open(link, root); err == nil {
		t.Error("a link inside the survey folder to a folder outside it: accepted")
	}
	if _, err := Open(link, root, outside); err != nil {
		t.Errorf("the same folder named on the command line: %v", err)
	}
}

// No file of the folder leads outside it, blocks the read or is too large.
func TestFolderFilesAreChecked(t *testing.T) {
	dir, outside := t.TempDir(), t.TempDir()
	secret := write(t, outside, "secret.txt", "root:x:0:0")
	os.MkdirAll(filepath.Join(dir, "report"), 0o755)
	if err := os.Symlink(secret, filepath.Join(dir, "report", "cautions.md")); err != nil {
		t.Skip("no symbolic links:", err)
	}
	s := Set{Override: dir}
	if add, err := s.Addition("report/cautions.md", nil); err == nil || !strings.Contains(err.Error(), "outside the templates folder") || add != "" {
		t.Errorf("cautions.md linked outside: %q, %v", add, err)
	}
	// A link that stays inside is fine.
	write(t, dir, "texts/m.md", "inside")
	os.Symlink(filepath.Join(dir, "texts", "m.md"), filepath.Join(dir, "report", "methods.md"))
	if m, err := s.Execute("report/methods.md", nil); err != nil || m != "inside" {
		t.Errorf("link inside the folder: %q %v", m, err)
	}
	// A folder of the set linked outside.
	d2 := t.TempDir()
	write(t, outside, "report/methods.md", "outside")
	os.Symlink(filepath.Join(outside, "report"), filepath.Join(d2, "report"))
	if _, err := (Set{Override: d2}).Execute("report/methods.md", nil); err == nil {
		t.Error("report/ linked outside: accepted")
	}
	d4 := t.TempDir()
	write(t, d4, "report/methods.md", strings.Repeat("x", MaxFileBytes+1))
	if _, err := (Set{Override: d4}).Execute("report/methods.md", nil); err == nil || !strings.Contains(err.Error(), "more than the 256 KiB") {
		t.Errorf("a file over the limit: %v", err)
	}
}

// Templates that loop or explode end in an error naming the file, within
// the time limit and without exhausting memory.
func TestRunawayTemplatesAreStopped(t *testing.T) {
	for _, c := range []struct{ name, src, want string }{
		{"endless output", `{{range 100000000000}}xxxxxxxxxxxxxxxx{{end}}`, "writes more than 1024 KiB"},
		{"doubling string", `{{define "a"}}{{template "a" (printf "%s%s" . .)}}{{end}}{{template "a" "x"}}`, "writes more than 1024 KiB"},
		{"escaping grows", `{{define "a"}}{{template "a" (html (print . "<"))}}{{end}}{{template "a" "<"}}`, "writes more than 1024 KiB"},
		{"silent loop", `{{range 100000000000}}{{end}}`, "still running after 2s"},
		{"silent recursion", `{{define "a"}}{{if .}}{{template "a" (slice . 1)}}{{template "a" (slice . 1)}}{{end}}{{end}}{{template "a" "xxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxx"}}`, "still running after 2s"},
		{"deep recursion", `{{define "a"}}{{template "a" .}}{{end}}{{template "a" 1}}`, "exceeded maximum template depth"},
		{"bad syntax", `{{if}}`, "missing value for if"},
	} {
		t.Run(c.name, func(t *testing.T) {
			t.Parallel()
			dir := t.TempDir()
			path := write(t, dir, "report/methods.md", c.src)
			start := time.Now()
			_, err := Set{Override: dir}.Execute("report/methods.md", nil)
			if err == nil || !strings.HasPrefix(err.Error(), path+": ") || !strings.Contains(err.Error(), c.want) {
				t.Errorf("got %v, want %s: ...%s", err, path, c.want)
			}
			if took := time.Since(start); took > MaxRunTime+3*time.Second {
				t.Errorf("took %v", took)
			}
		})
	}
}
