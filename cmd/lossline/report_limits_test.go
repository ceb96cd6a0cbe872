package main

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io/fs"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/lossline/lossline/report"
)

// writeSurvey writes a small survey folder (invented data): a title, a
// general note at line 9 and two CMLs with two visits each.
func writeSurvey(t *testing.T, dir, title, note string, ids ...string) {
	t.Helper()
	if len(ids) == 0 {
		ids = []string{"C1", "C2"}
	}
	src := fmt.Sprintf(`---
title: %s
site: Test yard
date: 2025-06-10
inspector: Test
units: mm
---

%s

# Tank A

## Course 1

- nominal: 10.0
- required: 6.0
- consequence: high

| CML | 2020-06-01 | 2025-06-10 | photos |
|-----|------------|------------|--------|
| %s  | 9.80       | 9.60       |        |
| %s  | 9.70       | 9.50       |        |
`, title, note, ids[0], ids[1])
	mkfile(t, filepath.Join(dir, "survey.md"), src)
}

// writeEarlierSurvey writes the 2020 visit of writeSurvey's CMLs as a survey
// of its own.
func writeEarlierSurvey(t *testing.T, dir string) {
	t.Helper()
	mkfile(t, filepath.Join(dir, "survey.md"), `---
title: Earlier
site: Test yard
date: 2020-06-01
inspector: Test
units: mm
---

# Tank A

## Course 1

- nominal: 10.0
- required: 6.0
- consequence: high

| CML | 2020-06-01 | photos |
|-----|------------|--------|
| C1  | 9.80       |        |
| C2  | 9.70       |        |
`)
}

func mkfile(t *testing.T, path, text string) {
	t.Helper()
	if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
}

func symlink(t *testing.T, target, link string) {
	t.Helper()
	if err := os.MkdirAll(filepath.Dir(link), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink(target, link); err != nil {
		t.Skip("no symbolic links here:", err)
	}
}

// snapshot records every file, folder and link under dir, with contents.
func snapshot(t *testing.T, dir string) map[string]string {
	t.Helper()
	got := map[string]string{}
	filepath.WalkDir(dir, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return nil
		}
		switch {
		case d.Type()&fs.ModeSymlink != 0:
			target, _ := os.Readlink(path)
			got[path] = "link to " + target
		case d.IsDir():
			got[path] = "folder"
		default:
			b, _ := os.ReadFile(path)
			got[path] = string(b)
		}
		return nil
	})
	return got
}

func sameSnapshot(t *testing.T, what string, before, after map[string]string) {
	t.Helper()
	for p, v := range after {
		if w, ok := before[p]; !ok {
			t.Errorf("%s: %s appeared", what, p)
		} else if w != v {
			t.Errorf("%s: %s changed", what, p)
		}
	}
	for p := range before {
		if _, ok := after[p]; !ok {
			t.Errorf("%s: %s disappeared", what, p)
		}
	}
}

// pdfText is the text poppler reads from a PDF.
func pdfText(t *testing.T, path string) string {
	t.Helper()
	poppler(t)
	b, err := exec.Command("pdftotext", path, "-").Output()
	if err != nil {
		t.Fatalf("pdftotext %s: %v", path, err)
	}
	return string(b)
}

// leftovers lists what lossline left beside the output folder out.
func leftovers(out string) []string {
	var left []string
	entries, _ := os.ReadDir(filepath.Dir(out))
	for _, e := range entries {
		n := e.Name()
		if strings.HasPrefix(n, "."+filepath.Base(out)+".tmp-") || strings.HasPrefix(n, "."+filepath.Base(out)+".old-") || n == "."+filepath.Base(out)+".lock" {
			left = append(left, n)
		}
	}
	return left
}

// Hostile and broken texts, templates and output folders end within seconds
// under the memory and time limits, in a clear message or a correct report;
// no input file is changed.
func TestReportLimits(t *testing.T) {
	for _, c := range []struct {
		name    string
		fixture func(t *testing.T, root string) []string // writes root/site and more; returns the command line
		ulimits string                                   // further limits of the run
		code    int
		want    []string // in the output
		then    func(t *testing.T, root string, r limitedRun)
	}{
		{
			name: "emoji in a note: check warns at the line",
			fixture: func(t *testing.T, root string) []string {
				writeSurvey(t, filepath.Join(root, "site"), "Emoji", "Gauge calibrated 🙂 before the survey.")
				return []string{"check", filepath.Join(root, "site")}
			},
			want: []string{"site/survey.md:9: warning: character 🙂 (U+1F642) cannot be drawn in the PDF; it will show as □", "0 errors, 1 warning"},
		},
		{
			name: "emoji in a note: the report shows the replacement",
			fixture: func(t *testing.T, root string) []string {
				writeSurvey(t, filepath.Join(root, "site"), "Emoji 🚀 title", "Gauge calibrated 🙂 before the survey.")
				return []string{"report", filepath.Join(root, "site"), "-o", filepath.Join(root, "out")}
			},
			want: []string{"survey.md:9: warning: character 🙂 (U+1F642)", "survey.md:2: warning: character 🚀 (U+1F680)"},
			then: func(t *testing.T, root string, r limitedRun) {
				text := pdfText(t, filepath.Join(root, "out", report.PDFFile))
				for _, want := range []string{"Gauge calibrated □ before the survey.", "Emoji □ title"} {
					if !strings.Contains(text, want) {
						t.Errorf("PDF lacks %q", want)
					}
				}
				if strings.ContainsRune(text, '🙂') {
					t.Error("the PDF holds the emoji")
				}
				js, _ := os.ReadFile(filepath.Join(root, "out", report.JSONFile))
				if !strings.Contains(string(js), "cannot be drawn in the PDF") {
					t.Error("results.json lacks the warning")
				}
			},
		},
		{
			name: "cautions.md linked to /etc/passwd",
			fixture: func(t *testing.T, root string) []string {
				site := filepath.Join(root, "site")
				writeSurvey(t, site, "Linked cautions", "Plain note.")
				mkfile(t, filepath.Join(site, "lossline.yaml"), "templates: texts\n")
				symlink(t, "/etc/passwd", filepath.Join(site, "texts", "report", "cautions.md"))
				return []string{"report", site, "-o", filepath.Join(root, "out")}
			},
			code: exitBadInput,
			want: []string{"texts/report/cautions.md: leads to /etc/passwd, outside the templates folder"},
			then: noOutput,
		},
		{
			name: "templates folder outside the survey, from its settings file",
			fixture: func(t *testing.T, root string) []string {
				site := filepath.Join(root, "site")
				writeSurvey(t, site, "Outside", "Plain note.")
				mkfile(t, filepath.Join(root, "elsewhere", "report", "cautions.md"), "Replaced.")
				mkfile(t, filepath.Join(site, "lossline.yaml"), "templates: ../elsewhere\n")
				return []string{"report", site, "-o", filepath.Join(root, "out")}
			},
			code: exitBadInput,
			want: []string{"templates folder is outside", "a folder named on the command line"},
			then: noOutput,
		},
		{
			name: "templates folder named on the command line adds to the cautions",
			fixture: func(t *testing.T, root string) []string {
				site := filepath.Join(root, "site")
				writeSurvey(t, site, "Own cautions", "Plain note.")
				mkfile(t, filepath.Join(root, "texts", "report", "cautions.md"), "Keep the hatch shut.")
				return []string{"report", site, "-o", filepath.Join(root, "out"), "--templates", filepath.Join(root, "texts")}
			},
			then: func(t *testing.T, root string, r limitedRun) {
				text := pdfText(t, filepath.Join(root, "out", report.PDFFile))
				builtIn := strings.Index(text, "Screening calculations, not an engineering assessment")
				added := strings.Index(text, "Keep the hatch shut.")
				if builtIn < 0 || added < builtIn || !strings.Contains(text, "Further cautions") {
					t.Errorf("built-in cautions at %d, the addition at %d", builtIn, added)
				}
			},
		},
		{
			name: "template that loops",
			fixture: func(t *testing.T, root string) []string {
				site := filepath.Join(root, "site")
				writeSurvey(t, site, "Loop", "Plain note.")
				mkfile(t, filepath.Join(site, "texts", "report", "methods.md"), "{{range 100000000000}}{{end}}")
				return []string{"report", site, "-o", filepath.Join(root, "out"), "--templates", filepath.Join(site, "texts")}
			},
			code: exitBadInput,
			want: []string{"texts/report/methods.md: still running after 2s"},
			then: func(t *testing.T, root string, r limitedRun) {
				noOutput(t, root, r)
				if r.Took > 20*time.Second {
					t.Errorf("took %v", r.Took)
				}
			},
		},
		{
			name: "template that explodes",
			fixture: func(t *testing.T, root string) []string {
				site := filepath.Join(root, "site")
				writeSurvey(t, site, "Boom", "Plain note.")
				mkfile(t, filepath.Join(site, "texts", "report", "cautions.md"),
					`{{define "a"}}{{template "a" (printf "%s%s" . .)}}{{end}}{{template "a" "boom"}}`)
				mkfile(t, filepath.Join(site, "lossline.yaml"), "templates: texts\n")
				return []string{"report", site, "-o", filepath.Join(root, "out")}
			},
			code: exitBadInput,
			want: []string{"texts/report/cautions.md: writes more than 1024 KiB"},
			then: noOutput,
		},
		{
			name: "-o inside photos/",
			fixture: func(t *testing.T, root string) []string {
				site := filepath.Join(root, "site")
				writeSurvey(t, site, "Photos", "Plain note.")
				os.MkdirAll(filepath.Join(site, "photos"), 0o755)
				return []string{"report", site, "-o", filepath.Join(site, "photos", "report")}
			},
			code: exitBadInput,
			want: []string{"site/photos/report is inside the photos folder", "site/photos of the survey folder"},
		},
		{
			name: "-o the survey folder",
			fixture: func(t *testing.T, root string) []string {
				site := filepath.Join(root, "site")
				writeSurvey(t, site, "Itself", "Plain note.")
				return []string{"report", site, "-o", site}
			},
			code: exitBadInput,
			want: []string{"site is the survey folder", "site itself"},
		},
		{
			name: "-o inside an earlier survey folder",
			fixture: func(t *testing.T, root string) []string {
				site, old := filepath.Join(root, "site"), filepath.Join(root, "old")
				writeSurvey(t, site, "Series", "Plain note.")
				writeEarlierSurvey(t, old)
				return []string{"report", site, "--previous", old, "-o", filepath.Join(old, "report")}
			},
			code: exitBadInput,
			want: []string{"old/report is inside the earlier survey folder", "/old, whose files are inputs"},
		},
		{
			name: "-o a folder of the user's",
			fixture: func(t *testing.T, root string) []string {
				writeSurvey(t, filepath.Join(root, "site"), "Mine", "Plain note.")
				mkfile(t, filepath.Join(root, "mine", "notes.txt"), "my notes")
				return []string{"report", filepath.Join(root, "site"), "-o", filepath.Join(root, "mine")}
			},
			code: exitBadInput,
			want: []string{"mine holds notes.txt, which lossline did not write"},
			then: func(t *testing.T, root string, r limitedRun) {
				if got := snapshot(t, filepath.Join(root, "mine")); len(got) != 2 || got[filepath.Join(root, "mine", "notes.txt")] != "my notes" {
					t.Errorf("the user's folder changed: %v", got)
				}
			},
		},
		{
			name: "a write that fails midway leaves the previous report",
			fixture: func(t *testing.T, root string) []string {
				site := filepath.Join(root, "site")
				writeSurvey(t, site, "Previous", "Plain note.")
				out := filepath.Join(root, "out")
				if r := runLimited(t, "report", site, "-o", out); r.Code != 0 {
					t.Fatalf("first report: exit %d\n%s", r.Code, r.Stderr)
				}
				writeSurvey(t, site, "Current", "Plain note.") // a real change, so a mixed set would show
				return []string{"report", site, "-o", out}
			},
			ulimits: "-f 40", // 20 KiB: the marker and the small files fit, the PDF does not
			code:    exitOther,
			want:    []string{"writing report.pdf", "file too large"},
			then: func(t *testing.T, root string, r limitedRun) {
				out := filepath.Join(root, "out")
				assertOneRun(t, out, "Previous", "C1")
			},
		},
		{
			name: "a killed run's temporary folder is cleared by the next run",
			fixture: func(t *testing.T, root string) []string {
				writeSurvey(t, filepath.Join(root, "site"), "After a kill", "Plain note.")
				mkfile(t, filepath.Join(root, ".out.tmp-1234567", report.PDFFile), "%PDF-1.3 half")
				mkfile(t, filepath.Join(root, ".out.tmp-7654321", report.MarkerFile), "")
				return []string{"report", filepath.Join(root, "site"), "-o", filepath.Join(root, "out")}
			},
			then: func(t *testing.T, root string, r limitedRun) {
				assertOneRun(t, filepath.Join(root, "out"), "After a kill", "C1")
			},
		},
	} {
		t.Run(c.name, func(t *testing.T) {
			root := t.TempDir()
			args := c.fixture(t, root)
			inputs := map[string]map[string]string{}
			for _, d := range []string{"site", "old", "texts", "elsewhere"} {
				inputs[d] = snapshot(t, filepath.Join(root, d))
			}
			r := runUnder(t, c.ulimits, args...)
			output := r.Stdout + r.Stderr
			if r.Code != c.code {
				t.Errorf("exit %d, want %d\n%s", r.Code, c.code, output)
			}
			for _, w := range c.want {
				if !strings.Contains(output, w) {
					t.Errorf("output lacks %q:\n%s", w, output)
				}
			}
			if strings.Contains(output, "goroutine ") || strings.Count(r.Stderr, "\n") > 10 {
				t.Errorf("a stack trace or a flood of messages:\n%s", r.Stderr)
			}
			for d, before := range inputs {
				sameSnapshot(t, d, before, snapshot(t, filepath.Join(root, d)))
			}
			if c.then != nil {
				c.then(t, root, r)
			}
		})
	}
}

// noOutput checks that a refused run wrote nothing.
func noOutput(t *testing.T, root string, _ limitedRun) {
	t.Helper()
	if _, err := os.Stat(filepath.Join(root, "out")); err == nil {
		t.Error("an output folder was written")
	}
	if left := leftovers(filepath.Join(root, "out")); len(left) > 0 {
		t.Errorf("left beside the output: %v", left)
	}
}

// assertOneRun checks that out holds one run's outputs whole: results.json,
// results.csv and report.pdf all of the survey titled title with first CML
// id, and nothing left beside out.
func assertOneRun(t *testing.T, out, title, id string) {
	t.Helper()
	js, err := os.ReadFile(filepath.Join(out, report.JSONFile))
	if err != nil {
		t.Fatal(err)
	}
	var res struct{ Survey struct{ Title string } }
	if err := json.Unmarshal(js, &res); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(js), `"cml": "`+id+`"`) || res.Survey.Title != title {
		t.Errorf("results.json of %q, want %q with CML %s", res.Survey.Title, title, id)
	}
	csv, _ := os.ReadFile(filepath.Join(out, report.CSVFile))
	if !strings.Contains(string(csv), ","+id+",") {
		t.Errorf("results.csv is not of %q:\n%s", title, csv)
	}
	if text := pdfText(t, filepath.Join(out, report.PDFFile)); !strings.Contains(text, title) {
		t.Errorf("report.pdf is not of %q", title)
	}
	if left := leftovers(out); len(left) > 0 {
		t.Errorf("left beside the output: %v", left)
	}
}

// Two runs of different surveys into one folder at once never leave a mixed
// set: each time the folder holds one run's outputs whole.
func TestConcurrentReportsIntoOneFolder(t *testing.T) {
	poppler(t)
	root := t.TempDir()
	writeSurvey(t, filepath.Join(root, "alpha"), "Alpha yard", "Plain note.", "A1", "A2")
	writeSurvey(t, filepath.Join(root, "bravo"), "Bravo yard", "Plain note.", "B1", "B2")
	out := filepath.Join(root, "out")
	waited := false
	for round := 0; round < 4; round++ {
		ctx, cancel := context.WithTimeout(context.Background(), limitWall)
		var wg sync.WaitGroup
		runs := make([]struct {
			err  error
			errb bytes.Buffer
		}, 2)
		for i, site := range []string{"alpha", "bravo"} {
			cmd := limitedCommand(ctx, t, "", "report", filepath.Join(root, site), "-o", out)
			cmd.Stderr = &runs[i].errb
			wg.Add(1)
			go func() {
				defer wg.Done()
				runs[i].err = cmd.Run()
			}()
		}
		wg.Wait()
		cancel()
		for i, r := range runs {
			if r.err != nil {
				t.Fatalf("round %d, run %d: %v\n%s", round, i, r.err, r.errb.String())
			}
			waited = waited || strings.Contains(r.errb.String(), "waiting for another lossline run writing "+out)
		}
		js, _ := os.ReadFile(filepath.Join(out, report.JSONFile))
		if strings.Contains(string(js), "Alpha yard") {
			assertOneRun(t, out, "Alpha yard", "A1")
		} else {
			assertOneRun(t, out, "Bravo yard", "B1")
		}
	}
	t.Logf("a run waited for the other: %v", waited)
}

// A panic while rendering ends with exit 3 and one line, never a stack trace.
func TestRenderPanicIsOneLine(t *testing.T) {
	var b bytes.Buffer
	err := fmt.Errorf("rendering: %w", report.RenderPanic{Stage: report.PDFFile, Value: "index out of range [128578] with length 65536\ngoroutine 1 [running]:"})
	if code := exitCode(err, &b); code != exitOther {
		t.Errorf("exit %d, want %d", code, exitOther)
	}
	if msg := b.String(); strings.Count(msg, "\n") != 1 || !strings.Contains(msg, "internal error while rendering report.pdf: index out of range") {
		t.Errorf("message %q", msg)
	}
}
