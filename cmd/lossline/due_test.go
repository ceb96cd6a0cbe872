package main

import (
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// siteTree copies the demo and its two earlier surveys under one folder, as
// an owner's folder of sites would hold them.
func siteTree(t *testing.T) string {
	t.Helper()
	root := t.TempDir()
	for _, d := range []string{"demo", "demo-2021", "demo-2022"} {
		if err := os.CopyFS(filepath.Join(root, "greyling", d), os.DirFS(filepath.Join("..", "..", "testdata", d))); err != nil {
			t.Fatal(err)
		}
	}
	return root
}

// lossline due reads the series once, by its latest folder, and lists what
// is overdue or due in the window, soonest first, from the --today given.
func TestDueCommand(t *testing.T) {
	root := siteTree(t)
	code, out, errOut := runCLI(t, "due", root, "--today", "2026-12-01", "--within", "6m")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	latest := filepath.Join(root, "greyling", "demo")
	if !strings.Contains(out, "1 survey folders read ("+latest+"); today 2026-12-01, due up to 2027-06-01") {
		t.Errorf("due output:\n%s", out)
	}
	if !regexp.MustCompile(`overdue\s+2026-11-18\s+below-required\s+\S+\s+Transfer line P-220 / Circuit P-220-A .*A-03`).MatchString(out) {
		t.Errorf("A-03 not listed as overdue:\n%s", out)
	}
	_, out, _ = runCLI(t, "due", root, "--today", "2026-12-01", "--within", "5y", "--csv")
	if !strings.HasPrefix(out, "status,date,what,folder,asset / component,cml,detail,place\n") ||
		!strings.Contains(out, "due,2031-02-19,next-inspection,"+latest+",Tank T-101 / Shell course 1,T1-04,") {
		t.Errorf("due --csv within 5y:\n%s", out)
	}
	if code, _, errOut := runCLI(t, "due", root, "--within", "soon"); code != exitUsage || !strings.Contains(errOut, `--within "soon"`) {
		t.Errorf("--within soon: exit %d %s", code, errOut)
	}
	if code, _, errOut := runCLI(t, "due", filepath.Join(root, "none")); code != exitBadInput || !strings.Contains(errOut, "no such folder") {
		t.Errorf("missing folder: exit %d %s", code, errOut)
	}
	// plan takes the same tree: the series once, as for the folder itself.
	code, tree, _ := runCLI(t, "plan", root, "--csv")
	_, one, _ := runCLI(t, "plan", latest, "--csv")
	if code != exitOK || tree != one {
		t.Errorf("plan of the tree (exit %d):\n%s\nplan of the folder:\n%s", code, tree, one)
	}
}
