package survey

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// Property: for any checklist that passes, every `|` row of every reading
// table in the source is in the model with all its cells, nothing dropped and
// nothing shifted. The source is read here without goldmark, line by line, and
// compared with what the reader built. Sources: the demo folders and seeded
// random tables (column order, alignment, padding, empty and several-reading
// cells, units, escaped pipes).
func TestEveryRowReachesTheModel(t *testing.T) {
	sources := map[string]string{}
	demos, _ := filepath.Glob(filepath.Join("..", "testdata", "demo*", "survey.md"))
	for _, p := range demos {
		b, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		sources[p] = string(b)
	}
	if len(sources) != 3 {
		t.Fatalf("%d demo checklists", len(sources))
	}
	rng := rand.New(rand.NewPCG(10, 11))
	for i := range 300 {
		sources[fmt.Sprintf("generated %d", i)] = generatedChecklist(rng)
	}
	for name, src := range sources {
		s, problems := readChecklist("survey.md", []byte(src))
		if problems.HasErrors() {
			t.Errorf("%s does not pass: %v\n%s", name, problems, src)
			continue
		}
		compareRows(t, name, src, s)
	}
}

// A cell taken out of, or added to, any row of a generated table is an error
// at that row's line.
func TestChangedRowShapeIsAnError(t *testing.T) {
	rng := rand.New(rand.NewPCG(12, 13))
	for range 200 {
		src := generatedChecklist(rng)
		lines := strings.Split(src, "\n")
		var rows []int
		for _, tb := range sourceTables(src) {
			rows = append(rows, tb.rows...)
		}
		i := rows[rng.IntN(len(rows))]
		cells := testCells(lines[i])
		if rng.IntN(2) == 0 {
			k := rng.IntN(len(cells))
			cells = slices.Delete(cells, k, k+1)
		} else {
			cells = append(cells, "9.9")
		}
		lines[i] = "| " + strings.Join(cells, " | ") + " |"
		_, problems := readChecklist("survey.md", []byte(strings.Join(lines, "\n")))
		wantError(t, "changed row", problems, fmt.Sprintf("survey.md:%d: row has %d ", i+1, len(cells)))
	}
}

// sourceTable is a reading table found in the source text: the 0-based index
// of its header line, the header cells and the 0-based indexes of its rows.
type sourceTable struct {
	header []string
	rows   []int
}

var separatorRow = regexp.MustCompile(`^\|?\s*:?-+:?\s*(\|\s*:?-+:?\s*)*\|?$`)

// sourceTables finds every reading table: a `| CML …` line, a separator row
// under it, then the `|` lines that follow.
func sourceTables(src string) []sourceTable {
	lines := strings.Split(strings.ReplaceAll(src, "\r\n", "\n"), "\n")
	var out []sourceTable
	for i := 0; i+1 < len(lines); i++ {
		h := testCells(lines[i])
		if !strings.HasPrefix(strings.TrimSpace(lines[i]), "|") || len(h) == 0 || !strings.EqualFold(h[0], "cml") ||
			!separatorRow.MatchString(strings.TrimSpace(lines[i+1])) {
			continue
		}
		tb := sourceTable{header: h}
		for j := i + 2; j < len(lines) && strings.HasPrefix(strings.TrimSpace(lines[j]), "|"); j++ {
			tb.rows = append(tb.rows, j)
		}
		out = append(out, tb)
		i += 1 + len(tb.rows)
	}
	return out
}

// testCells splits a row at pipes not escaped by a backslash, dropping the
// outer pipes.
func testCells(line string) []string {
	s := strings.TrimSpace(line)
	s = strings.TrimPrefix(s, "|")
	if strings.HasSuffix(s, "|") && !strings.HasSuffix(s, `\|`) {
		s = s[:len(s)-1]
	}
	var cells []string
	var cur strings.Builder
	for i := 0; i < len(s); i++ {
		if s[i] == '|' && (i == 0 || s[i-1] != '\\') {
			cells = append(cells, strings.TrimSpace(cur.String()))
			cur.Reset()
			continue
		}
		cur.WriteByte(s[i])
	}
	return append(cells, strings.TrimSpace(cur.String()))
}

func compareRows(t *testing.T, name, src string, s *Survey) {
	t.Helper()
	lines := strings.Split(src, "\n")
	byLine := map[int]*CML{}
	for _, l := range s.AllCMLs() {
		byLine[l.CML.Line] = l.CML
	}
	n := 0
	for _, tb := range sourceTables(src) {
		for _, i := range tb.rows {
			n++
			cells := testCells(lines[i])
			m := byLine[i+1]
			if m == nil {
				t.Errorf("%s: row at line %d is not in the model: %s", name, i+1, lines[i])
				continue
			}
			if len(cells) != len(tb.header) {
				t.Errorf("%s:%d: %d cells passed under a header of %d", name, i+1, len(cells), len(tb.header))
				continue
			}
			for k, h := range tb.header {
				if err := cellInModel(strings.ToLower(h), cells[k], m, s.Units); err != nil {
					t.Errorf("%s:%d: column %q, cell %q: %v", name, i+1, h, cells[k], err)
				}
			}
		}
	}
	if n != len(byLine) {
		t.Errorf("%s: %d rows in the source, %d CMLs in the model", name, n, len(byLine))
	}
}

// cellInModel compares one source cell with the model's value for its column.
func cellInModel(header, cell string, m *CML, units Unit) error {
	fields := strings.FieldsFunc(cell, func(r rune) bool { return r == ',' || r == ' ' || r == ';' })
	switch header {
	case "cml":
		return want(m.ID, cell)
	case "location":
		return want(m.Location, cell)
	case "remarks", "remark", "notes", "note":
		return want(m.Remarks, cell)
	case "photos", "photo":
		return want(strings.Join(m.PhotoRefs, " "), strings.Join(fields, " "))
	case "was":
		return want(strings.Join(m.Was, " "), strings.Join(fields, " "))
	case "gps":
		if cell == "" || cell == "-" {
			return want(m.GPS == nil, true)
		}
		lat, _ := strconv.ParseFloat(fields[0], 64)
		lon, _ := strconv.ParseFloat(fields[1], 64)
		if m.GPS == nil {
			return fmt.Errorf("no position in the model")
		}
		return want(*m.GPS, LatLon{lat, lon})
	}
	d, ok := ParseVisitDate(header)
	if !ok {
		return nil // an ignored column
	}
	i := slices.IndexFunc(m.Visits, func(v Visit) bool { return v.Date.Time.Equal(d.Time) })
	if cell == "" || cell == "-" {
		if i >= 0 {
			return fmt.Errorf("an empty cell became visit %v", m.Visits[i])
		}
		return nil
	}
	if i < 0 {
		return fmt.Errorf("no visit %s in the model", header)
	}
	got := m.Visits[i].ReadingsMM
	var mm []float64
	for j := 0; j < len(fields); j++ {
		f, scale := fields[j], units.ToMM(1)
		if strings.HasSuffix(f, "mm") {
			f, scale = strings.TrimSuffix(f, "mm"), 1
		} else if strings.HasSuffix(f, "in") {
			f, scale = strings.TrimSuffix(f, "in"), 25.4
		} else if j+1 < len(fields) && (fields[j+1] == "mm" || fields[j+1] == "in") {
			scale = map[string]float64{"mm": 1, "in": 25.4}[fields[j+1]]
			j++
		}
		v, err := strconv.ParseFloat(f, 64)
		if err != nil {
			return fmt.Errorf("the test cannot read %q", f)
		}
		mm = append(mm, v*scale)
	}
	if len(mm) != len(got) {
		return fmt.Errorf("readings %v, model %v", mm, got)
	}
	for j := range mm {
		if math.Abs(mm[j]-got[j]) > 1e-9 {
			return fmt.Errorf("readings %v, model %v", mm, got)
		}
	}
	return nil
}

func want[T comparable](got, want T) error {
	if got != want {
		return fmt.Errorf("model has %v, source %v", got, want)
	}
	return nil
}

// generatedChecklist writes a checklist of one to three components, each with
// a reading table of random shape and content that check accepts.
func generatedChecklist(rng *rand.Rand) string {
	var b strings.Builder
	units := []string{"mm", "in"}[rng.IntN(2)]
	b.WriteString("---\ntitle: Generated\nsite: Yard\ndate: 2025-07-01\ninspector: Test\nunits: " + units + "\n---\n\n# Asset\n")
	id := 0
	for c := range 1 + rng.IntN(3) {
		fmt.Fprintf(&b, "\n## Component %d\n\n- nominal: 25 mm\n- required: 3 mm\n\n", c)
		optional := []string{"location", "gps", "photos", "remarks", "was", "probe"}
		rng.Shuffle(len(optional), func(i, j int) { optional[i], optional[j] = optional[j], optional[i] })
		dates := []string{"2019-05-14", "2021-06", "2023-09-30", "2025-07-01", "2016-02-29"}
		rng.Shuffle(len(dates), func(i, j int) { dates[i], dates[j] = dates[j], dates[i] })
		header := append([]string{[]string{"CML", "cml"}[rng.IntN(2)]}, optional[:rng.IntN(len(optional)+1)]...)
		header = append(header, dates[:1+rng.IntN(len(dates))]...)
		rng.Shuffle(len(header)-1, func(i, j int) { header[i+1], header[j+1] = header[j+1], header[i+1] })
		seps := make([]string, len(header))
		for i := range seps {
			seps[i] = []string{"---", ":---", "---:", ":-:", "-"}[rng.IntN(5)]
		}
		writeRow(&b, rng, header)
		writeRow(&b, rng, seps)
		for range 1 + rng.IntN(6) {
			id++
			row := make([]string, len(header))
			for k, h := range header {
				row[k] = generatedCell(rng, h, id, units)
			}
			writeRow(&b, rng, row)
		}
		if rng.IntN(2) == 0 {
			b.WriteString("\nNotes on the component.\n")
		}
	}
	return b.String()
}

// writeRow writes table cells with random padding and outer pipes.
func writeRow(b *strings.Builder, rng *rand.Rand, cells []string) {
	b.WriteString(strings.Repeat(" ", rng.IntN(3)) + "|")
	for i, c := range cells {
		b.WriteString(strings.Repeat(" ", rng.IntN(3)) + c + strings.Repeat(" ", rng.IntN(4)))
		if i < len(cells)-1 || c == "" || rng.IntN(3) > 0 { // an empty last cell needs its closing pipe
			b.WriteString("|")
		}
	}
	b.WriteString("\n")
}

func generatedCell(rng *rand.Rand, header string, id int, units string) string {
	pick := func(xs ...string) string { return xs[rng.IntN(len(xs))] }
	switch strings.ToLower(header) {
	case "cml":
		return fmt.Sprintf("%s-%02d", pick("A", "T1", "P220", "Ω"), id)
	case "location":
		return pick("", "0°, 300 mm up", `north \| top`, "beside nozzle N3", "-", "x")
	case "gps":
		return pick("", "-", fmt.Sprintf("%.5f, %.5f", rng.Float64()*180-90, rng.Float64()*360-180),
			fmt.Sprintf("%.4f %.4f", rng.Float64()*10+40, -rng.Float64()*10-60))
	case "photos":
		return pick("", "a.jpg", "t/b.jpg, c.jpeg", "d.jpg e.jpg")
	case "remarks":
		return pick("", "probe changed", "paint *not* removed", "between pits; re-measure")
	case "was":
		return pick("", fmt.Sprintf("OLD-%d", id), fmt.Sprintf("O%d, P%d", id, id))
	case "probe":
		return pick("", "D790", "dual")
	}
	v := func() string {
		if units == "in" {
			return strconv.FormatFloat(0.2+rng.Float64()*0.6, 'f', 3, 64)
		}
		return strconv.FormatFloat(3.5+rng.Float64()*20, 'f', 2, 64)
	}
	switch rng.IntN(8) {
	case 0:
		return ""
	case 1:
		return "-"
	case 2:
		return v() + " " + v() + " " + v()
	case 3:
		return strconv.FormatFloat(5+rng.Float64()*10, 'f', 2, 64) + pick("mm", " mm")
	case 4:
		return strconv.FormatFloat(0.2+rng.Float64()*0.5, 'f', 3, 64) + pick("in", " in")
	}
	return v()
}

// An empty visit cell between two readings of a CML is warned of at the row
// (a value forgotten reads as a visit skipped and changes the short-term
// rate); `-` says not measured and is quiet, as is an empty cell after the
// last reading (a CML not re-measured, which the report states). Common
// practice: a reading not taken is marked as such on the record.
func TestEmptyCellBetweenReadings(t *testing.T) {
	src := "---\ntitle: t\nsite: y\ninspector: z\ndate: 2026-05-01\nunits: mm\n---\n## Shell\n\n- nominal: 10\n- required: 5\n\n" +
		"| CML | 2016-05-01 | 2021-05-01 | 2026-05-01 |\n|---|---|---|---|\n" +
		"| C1 | 9.8 |  | 9.4 |\n| C2 | 9.8 | - | 9.4 |\n| C3 | 9.8 | 9.6 |  |\n"
	_, problems := ParseChecklist("survey.md", []byte(src))
	if len(problems) != 1 || problems[0].Line != 15 || problems[0].Severity != Warning ||
		!strings.Contains(problems[0].Message, "CML C1 has an empty cell for 2021-05-01 between readings") {
		t.Errorf("problems: %v", problems)
	}
}
