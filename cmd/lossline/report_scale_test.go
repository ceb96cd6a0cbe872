package main

import (
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// --detail assets and --photos separate on the demo: a detail PDF per asset
// and photos.pdf beside report.pdf, named in the lines the command prints;
// a second run without them leaves none of them.
func TestReportDetailAndPhotosFlags(t *testing.T) {
	poppler(t)
	out := filepath.Join(t.TempDir(), "out")
	code, stdout, stderr := runCLI(t, "report", "../../testdata/demo", "-o", out, "--detail", "assets", "--photos", "separate")
	if code != exitOK {
		t.Fatalf("exit %d\n%s\n%s", code, stdout, stderr)
	}
	for _, f := range []string{"report.pdf", "photos.pdf", "detail-tank-t-101.pdf", "results.json"} {
		if !strings.Contains(stdout, filepath.Join(out, f)) {
			t.Errorf("%s not among the files written:\n%s", f, stdout)
		}
	}
	details, _ := filepath.Glob(filepath.Join(out, "detail-*.pdf"))
	if len(details) < 2 {
		t.Errorf("detail PDFs %v", details)
	}
	text, err := exec.Command("pdftotext", filepath.Join(out, "report.pdf"), "-").Output()
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(text), "The photos are in photos.pdf") || !strings.Contains(string(text), "Ranked list of CMLs") {
		t.Error("report.pdf of the demo should be in full and refer to photos.pdf")
	}
	if code, _, stderr := runCLI(t, "report", "../../testdata/demo", "-o", out); code != exitOK {
		t.Fatal(stderr)
	}
	left, _ := filepath.Glob(filepath.Join(out, "*.pdf"))
	if len(left) != 1 {
		t.Errorf("after a run without the flags the folder holds %v", left)
	}
}

// The thresholds are settings: one below the demo's 28 CMLs makes its
// report summary-first, and a wrong --detail or --photos is refused.
func TestReportThresholdSetting(t *testing.T) {
	poppler(t)
	out := filepath.Join(t.TempDir(), "out")
	if code, _, stderr := runCLI(t, "report", "../../testdata/demo", "-o", out, "--full-detail-max-cmls", "27"); code != exitOK {
		t.Fatal(stderr)
	}
	text, err := exec.Command("pdftotext", filepath.Join(out, "report.pdf"), "-").Output()
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"What needs attention", "What this report leaves to the exports", "full-detail-max-cmls"} {
		if !strings.Contains(string(text), want) {
			t.Errorf("summary-first demo lacks %q", want)
		}
	}
	for _, args := range [][]string{{"--detail", "components"}, {"--photos", "elsewhere"}, {"--list-max-rows", "0"}} {
		code, _, stderr := runCLI(t, append([]string{"report", "../../testdata/demo", "-o", filepath.Join(t.TempDir(), "x")}, args...)...)
		if code != exitBadInput || stderr == "" {
			t.Errorf("%v: exit %d, %s", args, code, stderr)
		}
	}
}
