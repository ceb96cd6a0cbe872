package main

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// Every folder of testdata/bad is one category of input mistake. Its
// expect.txt holds `exit N` and then every error check must print, one per
// line, as a substring of `path:line: message`; check must print no other
// error.
func TestCheckBadFolders(t *testing.T) {
	dirs, _ := filepath.Glob(filepath.Join("..", "..", "testdata", "bad", "*"))
	if len(dirs) < 20 {
		t.Fatalf("%d folders in testdata/bad", len(dirs))
	}
	for _, dir := range dirs {
		t.Run(filepath.Base(dir), func(t *testing.T) {
			b, err := os.ReadFile(filepath.Join(dir, "expect.txt"))
			if err != nil {
				t.Fatalf("every testdata/bad folder needs an expect.txt: %v", err)
			}
			lines := strings.Split(strings.TrimRight(string(b), "\n"), "\n")
			exit, err := strconv.Atoi(strings.TrimPrefix(lines[0], "exit "))
			if err != nil || !strings.HasPrefix(lines[0], "exit ") {
				t.Fatalf("expect.txt must open with `exit N`, not %q", lines[0])
			}
			want := lines[1:]
			code, out, errOut := runCLI(t, "check", dir)
			if code != exit {
				t.Errorf("exit %d, want %d\n%s%s", code, exit, out, errOut)
			}
			var errs []string
			for _, l := range strings.Split(out, "\n") {
				if strings.HasPrefix(l, dir) && !strings.Contains(l, ": warning: ") {
					errs = append(errs, l)
				}
			}
			for _, w := range want {
				found := false
				for _, e := range errs {
					found = found || strings.Contains(e, w)
				}
				if !found {
					t.Errorf("no error %q in\n%s", w, out)
				}
			}
			if len(errs) != len(want) {
				t.Errorf("%d errors, want %d:\n%s", len(errs), len(want), out)
			}
		})
	}
}
