package intake

import (
	"bytes"
	"encoding/binary"
	"strings"
	"testing"
	"time"
	"unicode/utf16"

	"github.com/xuri/excelize/v2"

	"github.com/lossline/lossline/survey"
)

// summary writes readings as "CML date values @place [note]" lines.
func summary(rs []Reading) string {
	var b strings.Builder
	for _, r := range rs {
		b.WriteString(r.CML + " " + r.Date.String() + " " + joinValues(r.Values) + " @" + r.Place.String())
		if r.Note != "" {
			b.WriteString(" [" + r.Note + "]")
		}
		b.WriteByte('\n')
	}
	return b.String()
}

func mustRead(t *testing.T, name string, data []byte, opt Options) *File {
	t.Helper()
	if opt.Units == "" {
		opt.Units = survey.MM
	}
	f, problems := Read(name, data, opt)
	if len(problems) > 0 {
		t.Fatalf("%s: %v", name, problems.Err())
	}
	return f
}

func utf16With(order binary.AppendByteOrder, bom []byte, s string) []byte {
	out := bytes.Clone(bom)
	for _, u := range utf16.Encode([]rune(s)) {
		out = order.AppendUint16(out, u)
	}
	return out
}

func visitDate(s string) *survey.VisitDate {
	d, ok := survey.ParseVisitDate(s)
	if !ok {
		panic(s)
	}
	return &d
}

// The same long file in every encoding and delimiter read: RFC 4180 §2
// (records, quoted cells with line breaks and doubled quotes, CRLF), the
// byte-order marks of the Unicode Standard §23.8 (UTF-8 EF BB BF; UTF-16
// FF FE little-endian, FE FF big-endian, RFC 2781 §3.2), and decimal commas
// in files not separated by commas.
func TestEncodingsAndDelimiters(t *testing.T) {
	const want = "A-1 2026-05-20 12.05 @r.csv:2 [coating \"ok\"\nat weld]\nA-1 2026-05-20 11.98 @r.csv:4\nB-2 2026-05-20 9.5 @r.csv:5\n"
	comma := "CML,Date,Thickness,Note\nA-1,2026-05-20,12.05,\"coating \"\"ok\"\"\nat weld\"\nA-1,2026-05-20,11.98,\nB-2,2026-05-20,9.5,\n"
	semi := strings.NewReplacer(",", ";", "12.05", "12,05", "11.98", "11,98", "9.5", "9,5").Replace(comma)
	tab := strings.ReplaceAll(comma, ",", "\t")
	for _, c := range []struct {
		name, note string
		data       []byte
		want       string
	}{
		{"comma", "UTF-8, cells separated by commas (detected)", []byte(comma), want},
		{"crlf", "cells separated by commas", []byte(strings.ReplaceAll(comma, "\n", "\r\n")), want}, // a CRLF in a quoted cell reads as LF
		{"semicolon, decimal comma", "cells separated by semicolons (detected); decimal comma", []byte(semi), want},
		{"tab", "cells separated by tabs", []byte(tab), want},
		{"UTF-8 BOM", "UTF-8 with byte-order mark", append([]byte{0xEF, 0xBB, 0xBF}, semi...), want},
		{"UTF-16 LE", "UTF-16 little-endian, cells separated by tabs", utf16With(binary.LittleEndian, []byte{0xFF, 0xFE}, tab), want},
		{"UTF-16 BE", "UTF-16 big-endian, cells separated by semicolons", utf16With(binary.BigEndian, []byte{0xFE, 0xFF}, semi), want},
		{"sep line", "cells separated by semicolons (named by its sep= line)", []byte("sep=;\n" + semi),
			strings.NewReplacer("r.csv:2", "r.csv:3", "r.csv:4", "r.csv:5", "r.csv:5", "r.csv:6").Replace(want)},
	} {
		f := mustRead(t, "r.csv", c.data, Options{})
		if got := summary(f.Readings); got != c.want {
			t.Errorf("%s: readings\n%s\nwant\n%s", c.name, got, c.want)
		}
		if notes := strings.Join(f.Notes, "\n"); !strings.Contains(notes, c.note) {
			t.Errorf("%s: notes %q lack %q", c.name, notes, c.note)
		}
	}
}

func TestShapesFromText(t *testing.T) {
	for _, c := range []struct {
		name, data string
		opt        Options
		want       string
	}{
		{"long, units by row and header, --date", "id,reading (in),unit\nS-1,0.475,\nS-1,0.470,in\nS-2,11.9,mm\n",
			Options{Date: visitDate("2026-05-20")},
			"S-1 2026-05-20 0.475 in @r.csv:2\nS-1 2026-05-20 0.470 in @r.csv:3\nS-2 2026-05-20 11.9 @r.csv:4\n"},
		{"long, gauge export with lines before the header and a time of day",
			"Gauge: UT-5\nSerial: 123\n\nLocation ID;Value;Units;Date;Probe\nN-1;8,12;mm;2026-05-20 10:31:22;D790\nN-2;-;mm;2026-05-20 10:32:01;D790\n",
			Options{}, "N-1 2026-05-20 8.12 @r.csv:5\n"},
		{"wide", "CML,location,2021-05-18,2026-05\nS-1,north,12.31,12.05 11.98\nS-2,east,12.40,-\n", Options{},
			"S-1 2021-05-18 12.31 @r.csv:2\nS-1 2026-05 12.05 11.98 @r.csv:2\nS-2 2021-05-18 12.40 @r.csv:3\n"},
		{"grid", "CML,Date,A1,A2,B1,B2\nP-1,2026-05-20,9.1,9.0,,8.95mm\nP-1,2026-05-20,9.3,,,\n", Options{},
			"P-1 2026-05-20 9.1 @r.csv:2\nP-1 2026-05-20 9.0 @r.csv:2\nP-1 2026-05-20 8.95 @r.csv:2\nP-1 2026-05-20 9.3 @r.csv:3\n"},
		{"grid of clock positions", "TML\t12:00\t3:00\t6:00\t9:00\nE-2\t6.1\t6.2\t5.4\t6.0\n", Options{Date: visitDate("2026-05-20")},
			"E-2 2026-05-20 6.1 @r.csv:2\nE-2 2026-05-20 6.2 @r.csv:2\nE-2 2026-05-20 5.4 @r.csv:2\nE-2 2026-05-20 6.0 @r.csv:2\n"},
		{"mapped", "Punkt;Datum;Wand;Probe\nK1;2026-05-20;7,5;x\n",
			Options{Map: Map{ID: "Punkt", Date: "datum", Reading: "WAND"}}, "K1 2026-05-20 7.5 @r.csv:2\n"},
		{"mapped points", "CML,N,E,S,W\nK1,7.5,7.4,7.6,7.3\n", Options{Map: Map{Points: []string{"N", "E", "S", "W"}}, Date: visitDate("2026-05-20")},
			"K1 2026-05-20 7.5 @r.csv:2\nK1 2026-05-20 7.4 @r.csv:2\nK1 2026-05-20 7.6 @r.csv:2\nK1 2026-05-20 7.3 @r.csv:2\n"},
	} {
		f := mustRead(t, "r.csv", []byte(c.data), c.opt)
		if got := summary(f.Readings); got != c.want {
			t.Errorf("%s: readings\n%s\nwant\n%s\nnotes: %v", c.name, got, c.want, f.Notes)
		}
	}
}

// makeWorkbook builds an .xlsx with excelize: fill writes the cells of Sheet1.
func makeWorkbook(t *testing.T, fill func(f *excelize.File, sh string)) []byte {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	fill(f, "Sheet1")
	b, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

func setCells(t *testing.T, f *excelize.File, sh string, cells map[string]any) {
	t.Helper()
	for ref, v := range cells {
		if err := f.SetCellValue(sh, ref, v); err != nil {
			t.Fatal(err)
		}
	}
}

func TestShapesFromWorkbook(t *testing.T) {
	day := time.Date(2026, 5, 20, 0, 0, 0, 0, time.UTC)
	for _, c := range []struct {
		name string
		fill func(*excelize.File, string)
		want string
	}{
		{"long: date cells, number cells, a merged id, a formula's stored result", func(f *excelize.File, sh string) {
			setCells(t, f, sh, map[string]any{"A1": "CML", "B1": "Date", "C1": "Thickness (mm)", "D1": "Note",
				"A2": "S-01", "B2": day, "C2": 12.05, "B3": day, "C3": 11.98,
				"A4": "S-02", "B4": "2026-05-20", "C4": 12.5, "D4": "pitted"})
			if err := f.MergeCell(sh, "A2", "A3"); err != nil {
				t.Fatal(err)
			}
			if err := f.SetCellFormula(sh, "C4", "12.5*1"); err != nil { // keeps the value set: a stored result
				t.Fatal(err)
			}
			style, _ := f.NewStyle(&excelize.Style{CustomNumFmt: ptr("0.000")})
			_ = f.SetCellStyle(sh, "C3", "C3", style) // shows 11.980: the digits shown are the value
		}, "S-01 2026-05-20 12.05 @r.xlsx:Sheet1!C2\nS-01 2026-05-20 11.980 @r.xlsx:Sheet1!C3\nS-02 2026-05-20 12.5 @r.xlsx:Sheet1!C4 [pitted]\n"},
		{"wide: dated headers as dates and as text", func(f *excelize.File, sh string) {
			setCells(t, f, sh, map[string]any{"A1": "CML", "B1": day.AddDate(-5, 0, -2), "C1": "2026-05-20",
				"A2": "S-01", "B2": 12.31, "C2": "12.05 11.98", "A3": "S-02", "B3": "-", "C3": 12.4})
			style, _ := f.NewStyle(&excelize.Style{CustomNumFmt: ptr("yyyy-mm-dd")})
			_ = f.SetCellStyle(sh, "B1", "B1", style)
		}, "S-01 2021-05-18 12.31 @r.xlsx:Sheet1!B2\nS-01 2026-05-20 12.05 11.98 @r.xlsx:Sheet1!C2\nS-02 2026-05-20 12.4 @r.xlsx:Sheet1!C3\n"},
		{"numbers as a formula leaves them, text that reads as a number", func(f *excelize.File, sh string) {
			setCells(t, f, sh, map[string]any{"A1": "CML", "B1": "2026-05-20", "C1": "2021-05-18", "A2": "007", "B2": 9.6 - 0.23, "C2": 0.1 + 0.2})
		}, "007 2026-05-20 9.37 @r.xlsx:Sheet1!B2\n007 2021-05-18 0.3 @r.xlsx:Sheet1!C2\n"},
		{"grid", func(f *excelize.File, sh string) {
			setCells(t, f, sh, map[string]any{"A1": "Field sheet", "A3": "CML", "B3": "date", "C3": "A1", "D3": "A2",
				"A4": "P-1", "B4": "2026-05-20", "C4": 9.1, "D4": 8.95})
		}, "P-1 2026-05-20 9.1 @r.xlsx:Sheet1!C4\nP-1 2026-05-20 8.95 @r.xlsx:Sheet1!D4\n"},
	} {
		f := mustRead(t, "r.xlsx", makeWorkbook(t, c.fill), Options{})
		if got := summary(f.Readings); got != c.want {
			t.Errorf("%s: readings\n%s\nwant\n%s\nnotes: %v", c.name, got, c.want, f.Notes)
		}
	}
}

func ptr[T any](v T) *T { return &v }

// Every sheet of a workbook is read unless one is named; sheets without a
// CML column are skipped and said so.
func TestWorkbookSheets(t *testing.T) {
	data := makeWorkbook(t, func(f *excelize.File, sh string) {
		setCells(t, f, sh, map[string]any{"A1": "notes only"})
		_, _ = f.NewSheet("Tank")
		setCells(t, f, "Tank", map[string]any{"A1": "CML", "B1": "2026-05-20", "A2": "T-1", "B2": 10.1})
		_, _ = f.NewSheet("Line")
		setCells(t, f, "Line", map[string]any{"A1": "CML", "B1": "2026-05-20", "A2": "L-1", "B2": 5.5})
	})
	f := mustRead(t, "r.xlsx", data, Options{})
	if got := summary(f.Readings); got != "T-1 2026-05-20 10.1 @r.xlsx:Tank!B2\nL-1 2026-05-20 5.5 @r.xlsx:Line!B2\n" {
		t.Errorf("readings\n%s", got)
	}
	if notes := strings.Join(f.Notes, "\n"); !strings.Contains(notes, `sheet "Sheet1": no header row with a CML column: skipped`) {
		t.Errorf("notes: %s", notes)
	}
	f = mustRead(t, "r.xlsx", data, Options{Map: Map{Sheet: "line"}})
	if got := summary(f.Readings); got != "L-1 2026-05-20 5.5 @r.xlsx:Line!B2\n" {
		t.Errorf("sheet line: readings\n%s", got)
	}
}

// Every refusal names its place: file:line for text, file:Sheet!C14 for a
// workbook.
func TestErrorPlaces(t *testing.T) {
	wb := func(cells map[string]any, more func(f *excelize.File, sh string)) []byte {
		return makeWorkbook(t, func(f *excelize.File, sh string) {
			setCells(t, f, sh, cells)
			if more != nil {
				more(f, sh)
			}
		})
	}
	for i, c := range []struct {
		name string
		data []byte
		opt  Options
		want []string
	}{
		{"r.csv", []byte("CML,Date,Thickness\nA,2026-05-20,12.1\nB,2026-05-20,12.O5\nC,20.05.2026,9\nD,2026-05-20,9600\nE,,9\n"), Options{},
			[]string{`r.csv:3: reading "12.O5" is not a number: letter O in 12.O5: did you mean 12.05?`,
				`r.csv:4: date "20.05.2026" is not a date: write the date as YYYY-MM-DD (ISO 8601)`,
				`r.csv:5: reading "9600" is not a wall thickness: more than 1000 mm`,
				`r.csv:6: readings without a date: write it in column "Date" or give --date`}},
		{"r.csv", []byte("CML,Thickness,unit\nA,12,cm\nB,\"12,5\",\n"), Options{Date: visitDate("2026-05-20")},
			[]string{`r.csv:2: unit "cm" is not mm or in`,
				`r.csv:3: reading "12,5" is not a number: write 12.5, not 12,5 (the cells of this file are separated by commas, so decimals take a point)`}},
		{"r.csv", []byte("CML,Thickness\nA,12\n"), Options{}, []string{`r.csv:2: readings without a date: give the visit's date with --date (the file has no date column)`}},
		{"r.csv", []byte("CML,Thickness\nA,12\nB,1\"2\n"), Options{}, []string{`r.csv:3: a " inside a cell that does not start with one`}},
		{"r.csv", []byte("CML,Thickness\nA,\"12\nB,13\n"), Options{}, []string{`r.csv:3: the quoted cell opened on line 2 is not closed`}},
		{"r.csv", []byte("CML,Thickness,Note\nA,12,ok\nB,13,caf\xe9\n"), Options{}, []string{`r.csv:3: this line is not UTF-8 text`}},
		{"r.csv", []byte("name,thk\nA,12\n"), Options{}, []string{`r.csv: no header row with a CML column in the first 30 rows`}},
		{"r.csv", []byte("CML,Thickness,2026-05-20\nA,12,13\n"), Options{}, []string{`r.csv:1: the readings could be in column "Thickness" or in "2026-05-20"`}},
		{"r.csv", []byte("CML,2026-05-20,2026-5-21\nA,12,13\n"), Options{}, []string{`r.csv:1: column "2026-5-21" is not a visit date: one-digit month, write 2026-05-21`}},
		{"r.csv", []byte("CML,2026-05-20\nA,12\nA,13\n"), Options{}, []string{`r.csv:3: CML A is listed twice (first at r.csv:2)`}},
		{"r.csv", []byte("CML;Thickness\n;12\n"), Options{Date: visitDate("2026-05-20")}, []string{`r.csv:2: reading "12" has no CML id (column "CML")`}},
		{"r.csv", []byte("CML,reading\nA,1\n"), Options{Map: Map{ID: "TML", From: map[string]string{"id": "lossline.yaml:3"}}},
			[]string{`r.csv: no header row with the column "TML" (mapped by lossline.yaml:3) in the first 30 rows`}},
		{"r.csv", []byte("CML,reading\nA,1\n"), Options{Map: Map{Reading: "Thk", From: map[string]string{"reading": "--map"}}},
			[]string{`r.csv:1: no column "Thk" (mapped by --map): the header row holds "CML", "reading"`}},
		{"r.xlsx", wb(map[string]any{"A1": "CML", "B1": "Date", "C1": "Thickness", "A2": "A", "B2": 46162, "C2": 12.1, "A3": "B", "B3": "2026-05-20", "C3": "abc"}, nil), Options{},
			[]string{`r.xlsx:Sheet1!B2: date 46162 is a number, not a date: format the cell as a date, or write the date as text YYYY-MM-DD`,
				`r.xlsx:Sheet1!C3: reading "abc" is not a number`}},
		{"r.xlsx", wb(map[string]any{"A1": "CML", "B1": "A1", "C1": "A2", "A2": "P", "B2": 9.1, "A3": "Q", "C3": "#DIV/0!"}, func(f *excelize.File, sh string) {
			_ = f.MergeCell(sh, "B2", "C2")
			_ = f.SetCellFormula(sh, "B3", "C3/0")
		}), Options{Date: visitDate("2026-05-20")},
			[]string{`r.xlsx:Sheet1!B2: the readings are in a merged range B2:C2: unmerge it`,
				`r.xlsx:Sheet1!B3: formula =C3/0 shows nothing: its result was not saved`,
				`r.xlsx:Sheet1!C3: #DIV/0! is a formula's error, not a reading`}},
		{"r.xlsx", wb(map[string]any{"A1": "CML"}, nil), Options{Map: Map{Sheet: "Readings"}}, []string{`r.xlsx: no sheet "Readings" (the workbook has "Sheet1")`}},
		{"r.xlsx", append(bytes.Clone(oleMagic), make([]byte, 512)...), Options{}, []string{`r.xlsx: an Excel 97-2003 workbook (.xls) or one protected by a password`}},
		{"r.xlsx", []byte("PK\x03\x04 not really"), Options{}, []string{`r.xlsx: not an .xlsx workbook that can be read`}},
	} {
		opt := c.opt
		opt.Units = survey.MM
		_, problems := Read(c.name, c.data, opt)
		got := problems.Err()
		if got == nil {
			t.Errorf("case %d: no problem, want %q", i, c.want)
			continue
		}
		lines := strings.Split(got.Error(), "\n")
		if len(lines) != len(c.want) {
			t.Errorf("case %d: problems\n%v\nwant %d:\n%s", i, got, len(c.want), strings.Join(c.want, "\n"))
			continue
		}
		for j, w := range c.want {
			if !strings.HasPrefix(lines[j], w) {
				t.Errorf("case %d: problem %d\n%s\nwant it to start\n%s", i, j, lines[j], w)
			}
		}
	}
}

func TestPlaceString(t *testing.T) {
	for _, c := range []struct {
		p    Place
		want string
	}{
		{Place{File: "r.csv", Row: 14}, "r.csv:14"},
		{Place{File: "r.xlsx", Sheet: "Sheet1", Row: 14, Col: 3}, "r.xlsx:Sheet1!C14"},
		{Place{File: "r.xlsx", Sheet: "Field sheet", Row: 5, Col: 28}, "r.xlsx:'Field sheet'!AB5"},
		{Place{File: "r.xlsx", Sheet: "Tank", Row: 7}, "r.xlsx:Tank!7:7"},
		{Place{File: "r.xlsx", Sheet: "O'Brien"}, "r.xlsx:'O''Brien'"},
	} {
		if got := c.p.String(); got != c.want {
			t.Errorf("%#v: %s, want %s", c.p, got, c.want)
		}
	}
}

// A file past the row limit is refused at the first row beyond it, read
// no further.
func TestRowLimit(t *testing.T) {
	text := "CML\n" + strings.Repeat("A\n", MaxRows)
	if _, problems := Read("r.csv", []byte(text), Options{Units: survey.MM}); problems.Err() == nil ||
		!strings.HasPrefix(problems.Err().Error(), "r.csv:100001: more than 100000 records") {
		t.Errorf("CSV: %v", problems.Err())
	}
	data := makeWorkbook(t, func(f *excelize.File, sh string) {
		w, err := f.NewStreamWriter(sh)
		if err != nil {
			t.Fatal(err)
		}
		for r := 1; r <= MaxRows+1; r++ {
			ref, _ := excelize.CoordinatesToCellName(1, r)
			if err := w.SetRow(ref, []any{"A"}); err != nil {
				t.Fatal(err)
			}
		}
		if err := w.Flush(); err != nil {
			t.Fatal(err)
		}
	})
	if _, problems := Read("r.xlsx", data, Options{Units: survey.MM}); problems.Err() == nil ||
		!strings.HasPrefix(problems.Err().Error(), "r.xlsx:Sheet1!100001:100001: more than 100000 rows") {
		t.Errorf("workbook: %v", problems.Err())
	}
}
