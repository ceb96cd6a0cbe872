package intake

import (
	"bytes"
	"encoding/binary"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey"
)

const checklist = `---
title: Merge test
date: 2026-05-20
units: mm
---

Readings by pulse-echo gauge.

# Tank

## Shell

- nominal: 12.7
- required: 9.6

| CML  | location | 2021-05-18 | photos |
|------|----------|------------|--------|
| S-01 | north    | 12.31      |        |
| S-02 | east     | 12.40      |        |

Pitting at S-02.

## Roof

- nominal: 6.0

CML | 2026-05-20 | remark
:-- | ---: | ---
R-1 | - | ladder
R-2 | 5.1 | rust
`

// parsed reads a checklist as the import sees a loaded survey.
func parsed(t *testing.T, src string) *survey.Survey {
	t.Helper()
	s, problems := survey.ParseChecklist("survey.md", []byte(src))
	if problems.HasErrors() {
		t.Fatalf("checklist: %v", survey.InputError{Problems: problems})
	}
	s.Source = []byte(src)
	return s
}

// csvFile reads an import file for a merge.
func csvFile(t *testing.T, name, text string) *File {
	t.Helper()
	return mustRead(t, name, []byte(text), Options{Units: survey.MM})
}

func TestMergeAddsAndFillsColumns(t *testing.T) {
	s := parsed(t, checklist)
	f := csvFile(t, "r.csv", "CML,date,reading,note\nS-01,2026-05-20,12.05,\nS-01,2026-05-20,11.98,\nS-02,2026-05-20,11.2,pits | deep\nR-1,2026-05-20,5.35,\nR-2,2026-05-20,5.10,\n")
	ch, problems := Plan(s, []*File{f}, MergeOptions{})
	if len(problems) > 0 {
		t.Fatal(problems.Err())
	}
	want := strings.Replace(strings.Replace(checklist, `| CML  | location | 2021-05-18 | photos |
|------|----------|------------|--------|
| S-01 | north    | 12.31      |        |
| S-02 | east     | 12.40      |        |
`, `| CML  | location | 2021-05-18 | 2026-05-20  | photos | remarks      |
|------|----------|------------|-------------|--------|--------------|
| S-01 | north    | 12.31      | 12.05 11.98 |        |              |
| S-02 | east     | 12.40      | 11.2        |        | pits \| deep |
`, 1), `CML | 2026-05-20 | remark
:-- | ---: | ---
R-1 | - | ladder
R-2 | 5.1 | rust
`, `CML | 2026-05-20 | remark
:-- | ---------: | ------
R-1 | 5.35       | ladder
R-2 | 5.1        | rust
`, 1)
	if string(ch.New) != want {
		t.Errorf("new checklist:\n%s\nwant:\n%s", ch.New, want)
	}
	if ch.Filled != 3 || ch.Same != 1 || ch.Notes != 1 || strings.Join(ch.Columns, ";") != `2026-05-20 in "Shell"` {
		t.Errorf("change: filled %d, same %d, notes %d, columns %v", ch.Filled, ch.Same, ch.Notes, ch.Columns)
	}
	// The new checklist reads back with the readings imported.
	back := parsed(t, string(ch.New))
	for _, loc := range back.AllCMLs() {
		if loc.CML.ID == "S-02" && (len(loc.CML.Visits) != 2 || loc.CML.Visits[1].ReadingsMM[0] != 11.2 || loc.CML.Remarks != `pits \| deep`) {
			t.Errorf("S-02 read back: %+v", loc.CML)
		}
	}
}

// The same readings are not written twice, and a checklist that holds them
// all is left as it is.
func TestMergeSameReadingsChangeNothing(t *testing.T) {
	s := parsed(t, checklist)
	f := csvFile(t, "r.csv", "CML;date;reading (in)\nR-2;2026-05-20;0,2007874015748\n") // 5.1 mm in inches (1 in = 25.4 mm)
	ch, problems := Plan(s, []*File{f}, MergeOptions{})
	if len(problems) > 0 {
		t.Fatal(problems.Err())
	}
	if ch.Diff != "" || !bytes.Equal(ch.New, ch.Old) || ch.Same != 1 {
		t.Errorf("diff %q, same %d", ch.Diff, ch.Same)
	}
}

func TestMergeRefusals(t *testing.T) {
	for _, c := range []struct {
		name  string
		files []*File
		opt   MergeOptions
		want  []string
	}{
		{"readings differ", []*File{csvFile(t, "r.csv", "CML,date,reading\nR-2,2026-05-20,5.2\n")}, MergeOptions{},
			[]string{`survey.md:30: CML R-2, visit 2026-05-20: readings 5.1 differ from 5.2 at r.csv:2`}},
		{"unknown ids", []*File{csvFile(t, "r.csv", "CML,date,reading\nS-1,2026-05-20,12\nX-9,2026-05-20,12\n")}, MergeOptions{},
			[]string{`r.csv:2: CML S-1 is not in survey.md (did you mean R-1 or S-01?): add its row to a reading table, or import with --new COMPONENT to add it there`,
				`r.csv:3: CML X-9 is not in survey.md (did you mean R-1 or R-2?): add its row`}},
		{"after the survey", []*File{csvFile(t, "r.csv", "CML,date,reading\nS-01,2026-05-21,12\n")}, MergeOptions{},
			[]string{`r.csv:2: CML S-01: date 2026-05-21 is after this survey's last day 2026-05-20`}},
		{"two files disagree", []*File{csvFile(t, "a.csv", "CML,date,reading\nS-01,2026-05-20,12\n"),
			csvFile(t, "b.csv", "CML,2026-05-20\nS-01,12.1\n")}, MergeOptions{},
			[]string{`b.csv:2: CML S-01, visit 2026-05-20: readings 12.10 mm differ from 12.00 mm at a.csv:2`}},
		{"no such component", []*File{csvFile(t, "r.csv", "CML,date,reading\nS-03,2026-05-20,12\n")}, MergeOptions{NewComponent: "Shel"},
			[]string{`--new: no component "Shel" in this survey (did you mean Tank / Shell?)`}},
	} {
		_, problems := Plan(parsed(t, checklist), c.files, c.opt)
		got := strings.Split(problems.Err().Error(), "\n")
		if problems.Err() == nil || len(got) != len(c.want) {
			t.Errorf("%s: %v", c.name, problems.Err())
			continue
		}
		for i, w := range c.want {
			if !strings.HasPrefix(got[i], w) {
				t.Errorf("%s: problem %d\n%s\nwant it to start\n%s", c.name, i, got[i], w)
			}
		}
	}
}

func TestMergeNewCMLs(t *testing.T) {
	s := parsed(t, checklist)
	f := csvFile(t, "r.csv", "CML,location,date,reading\nS-03,\"south, 1 m up\",2026-05-20,12.2\nS-03,,2026-05-20,12.1\n")
	ch, problems := Plan(s, []*File{f}, MergeOptions{NewComponent: "tank / shell"})
	if len(problems) > 0 {
		t.Fatal(problems.Err())
	}
	if !strings.Contains(string(ch.New), "| S-03 | south, 1 m up |            | 12.2 12.1  |        |") || strings.Join(ch.Added, ",") != "S-03" {
		t.Errorf("new checklist:\n%s", ch.New)
	}
	back := parsed(t, string(ch.New))
	if n := len(back.Assets[0].Components[0].CMLs); n != 3 {
		t.Errorf("%d CMLs in Shell after the import", n)
	}
}

// Every line outside the tables changed keeps its bytes: line endings,
// a byte-order mark, UTF-16, a last line without an ending.
func TestMergeKeepsTheRest(t *testing.T) {
	f := csvFile(t, "r.csv", "CML,date,reading\nR-1,2026-05-20,5.3\n")
	crlf := strings.ReplaceAll(checklist, "\n", "\r\n")
	noEnd := strings.TrimSuffix(checklist, "\n")
	for _, c := range []struct {
		name   string
		src    []byte
		encode func(string) []byte
		text   string
	}{
		{"CRLF with a byte-order mark", append([]byte("\xEF\xBB\xBF"), crlf...), func(s string) []byte { return append([]byte("\xEF\xBB\xBF"), s...) }, crlf},
		{"no line ending at the end", []byte(noEnd), func(s string) []byte { return []byte(s) }, noEnd},
		{"UTF-16", utf16With(binary.LittleEndian, []byte{0xFF, 0xFE}, checklist), func(s string) []byte {
			return utf16With(binary.LittleEndian, []byte{0xFF, 0xFE}, s)
		}, checklist},
	} {
		s := parsed(t, string(c.src))
		s.Source = c.src
		ch, problems := Plan(s, []*File{f}, MergeOptions{})
		if len(problems) > 0 {
			t.Fatalf("%s: %v", c.name, problems.Err())
		}
		eol := "\n"
		if strings.Contains(c.text, "\r\n") {
			eol = "\r\n"
		}
		table := strings.Join([]string{"CML | 2026-05-20 | remark", ":-- | ---------: | ------", "R-1 | 5.3        | ladder", "R-2 | 5.1        | rust"}, eol)
		head, _, _ := strings.Cut(c.text, "CML | 2026-05-20 | remark")
		want := head + table
		if strings.HasSuffix(c.text, "\n") {
			want += eol
		}
		got := string(ch.New)
		if c.name == "UTF-16" {
			text, _, _, _ := decodeText(ch.New)
			got = text
			if !bytes.Equal(ch.New, c.encode(text)) {
				t.Errorf("%s: not written back as UTF-16 with its mark", c.name)
			}
		} else if !bytes.HasPrefix(ch.New, c.encode("")) {
			t.Errorf("%s: the byte-order mark is gone", c.name)
		}
		if got = strings.TrimPrefix(got, "\uFEFF"); got != want {
			t.Errorf("%s: new checklist\n%q\nwant\n%q", c.name, got, want)
		}
	}
}

// The diff applies with patch (GNU patch, an independent reader of the
// unified format) to the old checklist and gives the new one.
func TestDiffAppliesWithPatch(t *testing.T) {
	patch, err := exec.LookPath("patch")
	if err != nil {
		t.Skip("patch not installed")
	}
	for _, src := range []string{checklist, strings.TrimSuffix(checklist, "\n"), strings.ReplaceAll(checklist, "\n", "\r\n")} {
		s := parsed(t, src)
		f := csvFile(t, "r.csv", "CML,date,reading,remarks\nS-01,2026-05-20,12.05,\nR-1,2026-05-20,5.35,\nR-2,2026-05-20,5.1,checked\n")
		ch, problems := Plan(s, []*File{f}, MergeOptions{})
		if len(problems) > 0 {
			t.Fatal(problems.Err())
		}
		dir := t.TempDir()
		file := filepath.Join(dir, "survey.md")
		if err := os.WriteFile(file, []byte(src), 0o644); err != nil {
			t.Fatal(err)
		}
		cmd := exec.Command(patch, "--quiet", "--binary", file)
		cmd.Stdin = strings.NewReader(ch.Diff)
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("patch: %v\n%s\ndiff:\n%s", err, out, ch.Diff)
		}
		got, _ := os.ReadFile(file)
		if !bytes.Equal(got, ch.New) {
			t.Errorf("patched:\n%q\nwant:\n%q\ndiff:\n%s", got, ch.New, ch.Diff)
		}
	}
}

// The previous version is kept, and never overwritten.
func TestWriteChecklistKeepsEveryVersion(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "survey.md")
	versions := []string{"one\n", "two\n", "three\n", "four\n"}
	if err := os.WriteFile(file, []byte(versions[0]), 0o640); err != nil {
		t.Fatal(err)
	}
	for i, next := range versions[1:] {
		backup, err := WriteChecklist(file, []byte(versions[i]), []byte(next))
		if err != nil {
			t.Fatal(err)
		}
		want := file + ".orig"
		if i > 0 {
			want += "." + string(rune('0'+i))
		}
		if got, _ := os.ReadFile(backup); backup != want || string(got) != versions[i] {
			t.Errorf("write %d: kept %s holding %q", i, backup, got)
		}
	}
	if got, _ := os.ReadFile(file); string(got) != "four\n" {
		t.Errorf("survey.md holds %q", got)
	}
	if st, _ := os.Stat(file); st.Mode().Perm() != 0o640 {
		t.Errorf("mode %v", st.Mode())
	}
	if _, err := WriteChecklist(file, []byte("stale\n"), []byte("five\n")); err == nil || !strings.Contains(err.Error(), "changed while the import ran") {
		t.Errorf("a checklist changed since it was read: %v", err)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 4 {
		t.Errorf("%d files in the folder, want survey.md and three kept versions", len(entries))
	}
}
