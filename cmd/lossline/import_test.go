package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// copyDemo copies the demo survey and the earlier surveys it names into a
// new folder; it returns the copy of the demo.
func copyDemo(t *testing.T) string {
	t.Helper()
	root := t.TempDir()
	for _, d := range []string{"demo", "demo-2021", "demo-2022"} {
		if err := os.CopyFS(filepath.Join(root, d), os.DirFS(filepath.Join("..", "..", "testdata", d))); err != nil {
			t.Fatal(err)
		}
	}
	return filepath.Join(root, "demo")
}

// visitCells returns, per CML, the cell of the column headed date in every
// reading table of a checklist, as written; the test splits rows at pipes
// itself (the demo has no escaped ones).
func visitCells(t *testing.T, src, date string) map[string]string {
	t.Helper()
	out := map[string]string{}
	col := -1
	for _, line := range strings.Split(src, "\n") {
		if !strings.HasPrefix(line, "|") {
			col = -1
			continue
		}
		cells := strings.Split(strings.Trim(line, "|"), "|")
		for i := range cells {
			cells[i] = strings.TrimSpace(cells[i])
		}
		if cells[0] == "CML" {
			col = -1
			for i, c := range cells {
				if c == date {
					col = i
				}
			}
			continue
		}
		if col >= 0 && !strings.HasPrefix(cells[0], "-") {
			out[cells[0]] = cells[col]
		}
	}
	return out
}

// blankVisit writes - in every cell of the column headed date.
func blankVisit(t *testing.T, file, date string) {
	t.Helper()
	src, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(string(src), "\n")
	col := -1
	for n, line := range lines {
		if !strings.HasPrefix(line, "|") {
			col = -1
			continue
		}
		cells := strings.Split(line, "|")
		if strings.TrimSpace(cells[1]) == "CML" {
			col = -1
			for i, c := range cells {
				if strings.TrimSpace(c) == date {
					col = i
				}
			}
			continue
		}
		if col > 0 && !strings.HasPrefix(strings.TrimSpace(cells[1]), "-") {
			cells[col] = " - "
			lines[n] = strings.Join(cells, "|")
		}
	}
	if err := os.WriteFile(file, []byte(strings.Join(lines, "\n")), 0o644); err != nil {
		t.Fatal(err)
	}
}

// results is what results.json says of a survey's CMLs: the items, dropped
// CMLs and design changes, computed as lossline report computes them.
func results(t *testing.T, dir string) string {
	t.Helper()
	s, problems := survey.LoadSeries(dir, nil, survey.DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(survey.InputError{Problems: problems})
	}
	r := report.BuildResults(findings.Compute(s, findings.Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25}), nil)
	b, err := json.MarshalIndent(struct {
		Items   []report.Item
		Dropped []report.Dropped
		Design  []report.DesignChange
	}{r.Items, r.Dropped, r.DesignChanges}, "", " ")
	if err != nil {
		t.Fatal(err)
	}
	return strings.ReplaceAll(string(b), filepath.Dir(dir), "ROOT")
}

func sameResults(t *testing.T, what, got, want string) {
	t.Helper()
	if got == want {
		return
	}
	g, w := strings.Split(got, "\n"), strings.Split(want, "\n")
	for i := range min(len(g), len(w)) {
		if g[i] != w[i] {
			t.Fatalf("%s: results differ from the typed survey's at line %d:\n%s\nwant\n%s", what, i+1, g[i], w[i])
		}
	}
	t.Fatalf("%s: results differ from the typed survey's (%d lines, want %d)", what, len(g), len(w))
}

// The round trip of the issue: the field sheet written, filled in the field
// (here by the test), imported, and the report's results equal those of the
// survey with the same readings typed (testdata/demo).
func TestSheetRoundTrip(t *testing.T) {
	want := results(t, filepath.Join("..", "..", "testdata", "demo"))
	want = strings.ReplaceAll(want, filepath.Join("..", "..", "testdata"), "ROOT")
	typedSrc, _ := os.ReadFile(filepath.Join("..", "..", "testdata", "demo", "survey.md"))
	typed := visitCells(t, string(typedSrc), "2026-11-18")
	for _, form := range []string{"xlsx", "csv"} {
		dir := copyDemo(t)
		blankVisit(t, filepath.Join(dir, "survey.md"), "2026-11-18")
		sheet := filepath.Join(filepath.Dir(dir), "sheet."+form)
		if code, out, errOut := runCLI(t, "sheet", dir, "-o", sheet, "--today", "2026-11-30"); code != exitOK {
			t.Fatalf("sheet: exit %d\n%s%s", code, out, errOut)
		}
		filled := 0
		fill := func(i int, id string) (date, reading string) {
			cell := typed[id]
			if cell == "" || cell == "-" {
				return "", ""
			}
			filled++
			if i%2 == 0 {
				date = "2026-11-18" // the others take --date
			}
			return date, cell
		}
		if form == "xlsx" {
			fillXLSX(t, sheet, fill)
		} else {
			fillCSV(t, sheet, fill)
		}
		if filled < 25 {
			t.Fatalf("%d CMLs filled", filled)
		}
		code, out, errOut := runCLI(t, "import", dir, sheet, "--date", "2026-11-18")
		if code != exitOK {
			t.Fatalf("import %s: exit %d\n%s%s", form, code, out, errOut)
		}
		if !strings.Contains(out, fmt.Sprintf("%d CML visits written, 0 already there", filled)) {
			t.Errorf("import %s:\n%s", form, out)
		}
		sameResults(t, form, results(t, dir), want)
	}
}

// fillXLSX writes a reading and a date into each row of the field sheet
// workbook, as an inspector would: one reading as a number, several as text.
func fillXLSX(t *testing.T, path string, fill func(i int, id string) (string, string)) {
	t.Helper()
	f, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	const sh = "Field sheet"
	rows, _ := f.GetRows(sh)
	for i := 4; i < len(rows); i++ {
		date, reading := fill(i, rows[i][2])
		if reading == "" {
			continue
		}
		if date != "" {
			_ = f.SetCellStr(sh, fmt.Sprintf("K%d", i+1), date)
		}
		if x, err := strconv.ParseFloat(reading, 64); err == nil {
			_ = f.SetCellFloat(sh, fmt.Sprintf("L%d", i+1), x, -1, 64)
		} else {
			_ = f.SetCellStr(sh, fmt.Sprintf("L%d", i+1), reading)
		}
	}
	if err := f.Save(); err != nil {
		t.Fatal(err)
	}
}

// fillCSV does the same to the CSV form, saved back as a spreadsheet program
// in a locale with decimal commas saves it: semicolons, decimal commas.
func fillCSV(t *testing.T, path string, fill func(i int, id string) (string, string)) {
	t.Helper()
	data, _ := os.ReadFile(path)
	recs, err := csv.NewReader(bytes.NewReader(bytes.TrimPrefix(data, []byte("\uFEFF")))).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	for i, rec := range recs[1:] {
		rec[10], rec[11] = fill(i, rec[2])
		for j, c := range rec {
			if _, err := strconv.ParseFloat(strings.Fields(c + " x")[0], 64); err == nil {
				rec[j] = strings.ReplaceAll(c, ".", ",")
			}
		}
	}
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	w.Comma = ';'
	_ = w.WriteAll(recs)
	if err := os.WriteFile(path, b.Bytes(), 0o644); err != nil {
		t.Fatal(err)
	}
}

// writeSeriesSurvey writes a survey of 100 CMLs in four components with two
// earlier visits each (invented data); with current, also the visit of
// 2026-05-20, two readings a CML. It returns the readings of that visit.
func writeSeriesSurvey(t *testing.T, dir string, current bool) map[string][2]float64 {
	t.Helper()
	rng := rand.New(rand.NewPCG(14, 2026))
	var b strings.Builder
	b.WriteString("---\ntitle: Import scale test\nsite: Test yard\ndate: 2026-05-20\ninspector: A. Tester\nunits: mm\n---\n\n# Line L-1\n")
	readings := map[string][2]float64{}
	for c := 1; c <= 4; c++ {
		fmt.Fprintf(&b, "\n## Circuit %d\n\n- nominal: 10.0\n- required: 5.5\n- consequence: medium\n\n", c)
		b.WriteString("| CML   | location   | 2016-05-10 | 2021-05-12 |")
		if current {
			b.WriteString(" 2026-05-20  |")
		}
		b.WriteString("\n|-------|------------|------------|------------|")
		if current {
			b.WriteString("-------------|")
		}
		b.WriteString("\n")
		for m := 1; m <= 25; m++ {
			id := fmt.Sprintf("C%d-%02d", c, m)
			t0 := 9.6 + float64(rng.IntN(30))/100
			t1 := t0 - float64(rng.IntN(25))/100
			r := [2]float64{t1 - float64(rng.IntN(40))/100, t1 - float64(rng.IntN(40))/100}
			readings[id] = r
			fmt.Fprintf(&b, "| %s | point %-4d | %.2f       | %.2f       |", id, m, t0, t1)
			if current {
				fmt.Fprintf(&b, " %.2f %.2f |", r[0], r[1])
			}
			b.WriteString("\n")
		}
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "survey.md"), []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	return readings
}

// The test as a new user would run it: 200 readings in a CSV, and
// the same in a spreadsheet, each imported in one command after a dry run
// shows the change; the results equal those of the survey typed.
func TestImport200Readings(t *testing.T) {
	root := t.TempDir()
	readings := writeSeriesSurvey(t, filepath.Join(root, "typed"), true)
	want := strings.ReplaceAll(results(t, filepath.Join(root, "typed")), "typed", "SURVEY")
	var ids []string
	for id := range readings {
		ids = append(ids, id)
	}
	slices.Sort(ids)

	var csvText strings.Builder
	csvText.WriteString("Location ID;Date;Thickness (mm)\n")
	for _, id := range ids {
		for _, r := range readings[id] {
			fmt.Fprintf(&csvText, "%s;2026-05-20;%s\n", id, strings.Replace(strconv.FormatFloat(r, 'f', 2, 64), ".", ",", 1))
		}
	}
	wb := excelize.NewFile()
	_ = wb.SetSheetRow("Sheet1", "A1", &[]any{"CML", "date", "reading"})
	row := 2
	for _, id := range ids {
		for _, r := range readings[id] {
			_ = wb.SetSheetRow("Sheet1", fmt.Sprintf("A%d", row), &[]any{id, "2026-05-20", r})
			row++
		}
	}
	for _, form := range []string{"csv", "xlsx"} {
		dir := filepath.Join(root, "imported-"+form)
		writeSeriesSurvey(t, dir, false)
		file := filepath.Join(root, "readings."+form)
		if form == "csv" {
			_ = os.WriteFile(file, []byte(csvText.String()), 0o644)
		} else if err := wb.SaveAs(file); err != nil {
			t.Fatal(err)
		}
		before, _ := os.ReadFile(filepath.Join(dir, "survey.md"))
		code, diff, errOut := runCLI(t, "import", dir, file, "--dry-run")
		after, _ := os.ReadFile(filepath.Join(dir, "survey.md"))
		rows := strings.Count(diff, "\n+| C") - strings.Count(diff, "\n+| CML")
		if code != exitOK || !bytes.Equal(before, after) || rows != 100 || !strings.Contains(errOut, "200 readings of 100 CMLs") {
			t.Fatalf("%s dry run: exit %d, %d rows changed in the diff\n%s", form, code, rows, errOut)
		}
		code, out, errOut := runCLI(t, "import", dir, file)
		if code != exitOK || !strings.Contains(out, "100 CML visits written") {
			t.Fatalf("%s import: exit %d\n%s%s", form, code, out, errOut)
		}
		sameResults(t, form, strings.ReplaceAll(results(t, dir), "imported-"+form, "SURVEY"), want)
	}
}

// --dry-run prints the change as a unified diff and writes nothing; the
// import then writes it, keeping the previous version beside (numbered when
// one is kept already), and reports the checks of the whole series,
// plausibility warnings included.
func TestImportDryRunThenWrite(t *testing.T) {
	dir := copyDemo(t)
	root := filepath.Dir(dir)
	file := filepath.Join(root, "g2.csv")
	_ = os.WriteFile(file, []byte("CML,Date,Thickness,Remarks\nG2-03,2026-11-18,1.58,bearing shelf dry\n"), 0o644)
	before := snapshot(t, root)
	code, out, errOut := runCLI(t, "import", dir, file, "--dry-run")
	sameSnapshot(t, "dry run", before, snapshot(t, root))
	if code != exitOK || !strings.Contains(out, "\n-| G2-03 | west bearing      | -          |\n") ||
		!strings.Contains(out, "\n+| G2-03 | west bearing      | 1.58       | bearing shelf dry |\n") ||
		!strings.HasPrefix(out, "--- "+filepath.Join(dir, "survey.md")+"\n+++ ") || !strings.Contains(errOut, "dry run:") {
		t.Fatalf("dry run: exit %d\n%s\n%s", code, out, errOut)
	}
	orig := filepath.Join(dir, "survey.md.orig")
	_ = os.WriteFile(orig, []byte("an earlier kept version\n"), 0o644)
	src, _ := os.ReadFile(filepath.Join(dir, "survey.md"))
	code, out, errOut = runCLI(t, "import", dir, file)
	if code != exitOK {
		t.Fatalf("import: exit %d\n%s%s", code, out, errOut)
	}
	if kept, _ := os.ReadFile(orig + ".1"); !bytes.Equal(kept, src) {
		t.Errorf("survey.md.orig.1 does not hold the previous survey.md")
	}
	if kept, _ := os.ReadFile(orig); string(kept) != "an earlier kept version\n" {
		t.Errorf("survey.md.orig was overwritten")
	}
	// 1.58 against G2-03's nominal 16.0 and the component's readings: a decimal slip warned about.
	if !strings.Contains(out, "survey.md:338: warning: CML G2-03, visit 2026-11-18: reading 1.58 is about a tenth") || !strings.Contains(out, "wrote "+filepath.Join(dir, "survey.md")) {
		t.Errorf("import output:\n%s", out)
	}
}

// Refusals name the import file's place and the checklist's line; nothing
// is written.
func TestImportRefusals(t *testing.T) {
	dir := copyDemo(t)
	root := filepath.Dir(dir)
	wb := excelize.NewFile()
	_ = wb.SetSheetRow("Sheet1", "A1", &[]any{"CML", "Date", "Thickness"})
	_ = wb.SetSheetRow("Sheet1", "A2", &[]any{"T1-01", "2026-11-18", 12.06})
	_ = wb.SetSheetRow("Sheet1", "A3", &[]any{"T1-03", "2026-11-18", "12.4.9"})
	_ = wb.SetSheetRow("Sheet1", "A4", &[]any{"T9-01", "2026-11-18", 9.1})
	xlsx := filepath.Join(root, "readings.xlsx")
	if err := wb.SaveAs(xlsx); err != nil {
		t.Fatal(err)
	}
	csvFile := filepath.Join(root, "readings.csv")
	_ = os.WriteFile(csvFile, []byte("CML;Date;Thickness\nBP-01;2026-11-18;6,95\nBP-02;2026-11-19;7,41\n"), 0o644)
	before := snapshot(t, root)
	code, _, errOut := runCLI(t, "import", dir, xlsx, csvFile)
	sameSnapshot(t, "refused import", before, snapshot(t, root))
	survey := filepath.Join(dir, "survey.md")
	for _, want := range []string{
		csvFile + ":3: CML BP-02: date 2026-11-19 is after this survey's last day 2026-11-18",
		xlsx + `:Sheet1!C3: reading "12.4.9" is not a number: two decimal points`,
		xlsx + ":Sheet1!A4: CML T9-01 is not in " + survey + " (did you mean T1-01 or T2-01?)",
		survey + ":72: CML T1-01, visit 2026-11-18: readings 12.05 differ from 12.06 at " + xlsx + ":Sheet1!C2",
	} {
		if !strings.Contains(errOut, want+"") {
			t.Errorf("refusal lacks\n%s\nin\n%s", want, errOut)
		}
	}
	if code != exitBadInput || strings.Count(errOut, "\n") != 4 {
		t.Errorf("exit %d, %d lines:\n%s", code, strings.Count(errOut, "\n"), errOut)
	}
}

// A gauge's export with its own headers is mapped once in lossline.yaml;
// --map overrides an entry; a wrong map is refused at its place.
func TestImportColumnMap(t *testing.T) {
	dir := copyDemo(t)
	file := filepath.Join(filepath.Dir(dir), "gauge.csv")
	_ = os.WriteFile(file, []byte("Instrument: UT gauge\n\nPoint,Wall,When\nG2-03,15.31,2026-11-18T09:12:40\n"), 0o644)
	settings := filepath.Join(dir, SettingsFile)
	base, _ := os.ReadFile(settings)
	_ = os.WriteFile(settings, append(base, "import:\n  id: point\n  reading: Wall\n  date: when\n"...), 0o644)
	if code, out, errOut := runCLI(t, "import", dir, file, "--dry-run"); code != exitOK || !strings.Contains(out, "| G2-03 | west bearing      | 15.31") {
		t.Errorf("mapped in lossline.yaml: exit %d\n%s%s", code, out, errOut)
	}
	code, _, errOut := runCLI(t, "import", dir, file, "--map", "reading=Thk")
	if code != exitBadInput || !strings.Contains(errOut, `gauge.csv:3: no column "Thk" (mapped by --map): the header row holds "Point", "Wall", "When"`) {
		t.Errorf("--map over the settings: exit %d\n%s", code, errOut)
	}
	_ = os.WriteFile(settings, append(base, "import:\n  id: point\n  wall: Wall\n"...), 0o644)
	code, _, errOut = runCLI(t, "import", dir, file)
	if code != exitBadInput || !strings.Contains(errOut, settings+`:11: import: unknown key "wall" (known: id, reading, date, unit, note, location, points, sheet)`) {
		t.Errorf("unknown key in the settings: exit %d\n%s", code, errOut)
	}
	_ = os.WriteFile(settings, base, 0o644)
	if code, _, errOut := runCLI(t, "import", dir, file, "--map", "depth"); code != exitUsage || !strings.Contains(errOut, "write KEY=HEADER") {
		t.Errorf("--map without =: exit %d\n%s", code, errOut)
	}
}

func TestSheetCommand(t *testing.T) {
	out := filepath.Join(t.TempDir(), "sheet.pdf")
	code, stdout, errOut := runCLI(t, "sheet", "../../testdata/demo", "-o", out, "--today", "2027-03-01")
	if code != exitOK || !strings.Contains(stdout, "35 CMLs, thicknesses projected to 2027-03-01") {
		t.Fatalf("sheet: exit %d\n%s%s", code, stdout, errOut)
	}
	if code, _, errOut := runCLI(t, "sheet", "../../testdata/demo", "-o", filepath.Join(t.TempDir(), "sheet.md")); code != exitUsage || !strings.Contains(errOut, "written as .pdf, .xlsx or .csv") {
		t.Errorf("-o sheet.md: exit %d %s", code, errOut)
	}
	poppler(t)
	text := pdfText(t, out)
	for _, want := range []string{"Field sheet: Greyling Sound depot", "Shell course 1", "T1-04", "10.37", "projected", "page 1 of"} {
		if !strings.Contains(text, want) {
			t.Errorf("the sheet's PDF text lacks %q", want)
		}
	}
}

// The import: block of README.md is a valid settings block.
func TestReadmeImportBlock(t *testing.T) {
	readme, err := os.ReadFile(filepath.Join("..", "..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	_, rest, ok := strings.Cut(string(readme), "```yaml\nimport:")
	block, _, _ := strings.Cut(rest, "```")
	if !ok {
		t.Fatal("README has no import: block")
	}
	file := filepath.Join(t.TempDir(), SettingsFile)
	_ = os.WriteFile(file, []byte("import:"+block), 0o644)
	read, problems := readSettingsFile(file)
	if len(problems) > 0 {
		t.Fatal(problems)
	}
	if cols := read.Values["import"].(map[string]any); len(cols) != 7 || cols["points"] != "N, E, S, W" {
		t.Errorf("README import block: %v", cols)
	}
}

// Readings of a visit an earlier survey folder holds (A-01 was A-1 in the
// 2022 survey) are checked against it: the same are left, others refused at
// that folder's line.
func TestImportAgainstEarlierFolder(t *testing.T) {
	dir := copyDemo(t)
	file := filepath.Join(filepath.Dir(dir), "old.csv")
	_ = os.WriteFile(file, []byte("CML,2022-05-10,2017-05-02\nA-01,6.62,7.40\nA-02,7.84,7.95\n"), 0o644)
	code, out, errOut := runCLI(t, "import", dir, file)
	if code != exitOK || !strings.Contains(out, "0 CML visits written, 4 already there") || !strings.Contains(out, "already holds every reading") {
		t.Errorf("the same readings: exit %d\n%s%s", code, out, errOut)
	}
	_ = os.WriteFile(file, []byte("CML,2022-05-10\nA-01,6.26\n"), 0o644)
	code, _, errOut = runCLI(t, "import", dir, file)
	earlier := filepath.Join(filepath.Dir(dir), "demo-2022", "survey.md")
	if code != exitBadInput || !strings.Contains(errOut, earlier+":30: CML A-01, visit 2022-05-10: readings 6.62 mm differ from 6.26 mm at "+file+":2") {
		t.Errorf("different readings: exit %d\n%s", code, errOut)
	}
}
