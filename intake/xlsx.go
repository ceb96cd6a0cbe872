package intake

import (
	"bytes"
	"errors"
	"fmt"
	"strconv"
	"strings"
	"time"

	"github.com/xuri/excelize/v2"
)

// oleMagic opens a compound file: an Excel 97-2003 workbook (.xls), or an
// .xlsx encrypted with a password.
var oleMagic = []byte{0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1}

// maxUnzipBytes bounds what a workbook may unpack to, so that a small file
// cannot fill memory.
const maxUnzipBytes = 256 << 20

// readWorkbook reads the worksheets of an .xlsx workbook (Office Open XML,
// ECMA-376): every sheet, or only the one named (case aside). Cells show
// formulas' stored results; a merged range's value is in its first cell, and
// the other cells are marked covered with that value.
func readWorkbook(name string, data []byte, only string) ([]*sheet, ProblemList) {
	var problems ProblemList
	whole := Place{File: name}
	if bytes.HasPrefix(data, oleMagic) {
		problems.Errorf(whole, "an Excel 97-2003 workbook (.xls) or one protected by a password: save it as .xlsx (Excel Workbook) without a password")
		return nil, problems
	}
	f, err := excelize.OpenReader(bytes.NewReader(data), excelize.Options{UnzipSizeLimit: maxUnzipBytes})
	if err != nil {
		problems.Errorf(whole, "not an .xlsx workbook that can be read (%s)", workbookFailure(err))
		return nil, problems
	}
	defer f.Close()
	props, _ := f.GetWorkbookProps()
	book := &workbook{f: f, date1904: props.Date1904 != nil && *props.Date1904, dateStyle: map[int]bool{}}
	names := f.GetSheetList()
	if only != "" {
		found := ""
		for _, n := range names {
			if strings.EqualFold(strings.TrimSpace(n), strings.TrimSpace(only)) {
				found = n
			}
		}
		if found == "" {
			problems.Errorf(whole, "no sheet %q (the workbook has %s)", only, quotedList(names))
			return nil, problems
		}
		names = []string{found}
	}
	var sheets []*sheet
	cells := 0
	for _, sh := range names {
		s, ps := book.sheet(name, sh, &cells)
		problems = append(problems, ps...)
		if s != nil {
			sheets = append(sheets, s)
		}
	}
	return sheets, problems
}

// workbook is an open .xlsx and what is known of its styles.
type workbook struct {
	f         *excelize.File
	date1904  bool         // dates count from 1904 (ECMA-376 Part 1, §18.17.4.1)
	dateStyle map[int]bool // style index → its number format shows a date
}

// sheet reads one worksheet. cells counts the cells read so far in the
// workbook, against MaxCells.
func (b *workbook) sheet(file, name string, cells *int) (*sheet, ProblemList) {
	var problems ProblemList
	s := &sheet{file: file, name: name, commaDecimals: true}
	start := *cells
	shown, ps := b.rows(s, excelize.Options{}, cells)
	if len(ps) > 0 {
		return nil, ps
	}
	*cells = start // the raw values are the same cells again
	raw, ps := b.rows(s, excelize.Options{RawCellValue: true}, cells)
	if len(ps) > 0 {
		return nil, ps
	}
	grid := make([][]cell, len(shown))
	for r, vals := range shown {
		grid[r] = make([]cell, len(vals))
		for c, v := range vals {
			rv := v
			if r < len(raw) && c < len(raw[r]) {
				rv = raw[r][c]
			}
			grid[r][c] = b.cell(name, r+1, c+1, v, rv)
			grid[r][c].place = s.place(r+1, c)
		}
	}
	grid, problems = b.merge(s, grid)
	if len(problems) > 0 {
		return nil, problems
	}
	for r, cs := range grid {
		s.rows = append(s.rows, row{n: r + 1, cells: cs})
	}
	return s, nil
}

// rows reads a worksheet's rows as GetRows does (empty rows in between kept,
// none after the last), streaming, so that it stops at the first row past
// MaxRows, maxColumns or MaxCells in all instead of holding them.
func (b *workbook) rows(s *sheet, opt excelize.Options, cells *int) ([][]string, ProblemList) {
	var problems ProblemList
	it, err := b.f.Rows(s.name)
	if err != nil {
		problems.Errorf(s.rowPlace(0), "cannot be read (%s)", workbookFailure(err))
		return nil, problems
	}
	defer it.Close()
	var out [][]string
	n := 0
	for it.Next() {
		n++
		if n > MaxRows {
			problems.Errorf(s.rowPlace(n), "more than %d rows: lossline imports at most %d", MaxRows, MaxRows)
			return nil, problems
		}
		vals, err := it.Columns(opt)
		if err != nil {
			problems.Errorf(s.rowPlace(n), "cannot be read (%s)", workbookFailure(err))
			return nil, problems
		}
		if len(vals) > maxColumns {
			problems.Errorf(s.rowPlace(n), "%d cells in a row, more than the %d lossline reads", len(vals), maxColumns)
			return nil, problems
		}
		if *cells += len(vals); *cells > MaxCells {
			problems.Errorf(s.rowPlace(n), "more than %d cells in all: lossline imports at most %d", MaxCells, MaxCells)
			return nil, problems
		}
		if len(vals) > 0 {
			for len(out) < n-1 {
				out = append(out, nil)
			}
			out = append(out, vals)
		}
	}
	if err := it.Error(); err != nil {
		problems.Errorf(s.rowPlace(0), "cannot be read (%s)", workbookFailure(err))
		return nil, problems
	}
	return out, nil
}

// cell makes the cell at row r, column c (1-based) from its shown and raw
// values. A number keeps the digits shown when they are its value (12.50);
// otherwise it is written from the value to 12 significant digits (12.456
// for a cell showing 12.5; 9.28 for 9.279999999999994 left by a formula's
// binary arithmetic: no gauge resolves a wall to a billionth). A number
// formatted as a date becomes the date.
func (b *workbook) cell(sheet string, r, c int, shown, raw string) cell {
	out := cell{text: strings.TrimSpace(shown)}
	ref, _ := excelize.CoordinatesToCellName(c, r)
	v, err := strconv.ParseFloat(strings.TrimSpace(raw), 64)
	switch {
	case raw == "" && shown == "":
		// A formula showing nothing: its result was never stored (a
		// program wrote the file without computing it), or it is empty
		// text; the two cannot be told apart, so either is refused
		// rather than read as a reading not taken.
		out.formula, _ = b.f.GetCellFormula(sheet, ref)
		return out
	case err != nil:
		return out
	case raw != shown && b.isDateStyle(sheet, ref):
		if t, err := excelize.ExcelDateToTime(v, b.date1904); err == nil {
			out.text, out.date = t.Format(time.DateOnly), true
			return out
		}
	case raw == shown:
		// Text that reads as a number stays text ("007"); a number cell has
		// no type or the number type.
		if t, _ := b.f.GetCellType(sheet, ref); t != excelize.CellTypeUnset && t != excelize.CellTypeNumber {
			return out
		}
	}
	out.number = true
	if s, err := strconv.ParseFloat(out.text, 64); err != nil || s != v || significantDigits(out.text) > numberDigits {
		out.text = strconv.FormatFloat(v, 'g', numberDigits, 64)
		if strings.ContainsAny(out.text, "eE") {
			out.text = strconv.FormatFloat(v, 'f', -1, 64)
		}
	}
	return out
}

// numberDigits is how many significant digits a worksheet number is read to.
const numberDigits = 12

// significantDigits counts the digits of a decimal number from its first
// non-zero one.
func significantDigits(s string) int {
	n, started := 0, false
	for _, r := range s {
		switch {
		case r == 'e' || r == 'E':
			return n
		case r >= '1' && r <= '9', r == '0' && started:
			started = true
			n++
		}
	}
	return n
}

// isDateStyle reports whether the cell's number format shows a date.
func (b *workbook) isDateStyle(sheet, ref string) bool {
	idx, err := b.f.GetCellStyle(sheet, ref)
	if err != nil {
		return false
	}
	if d, ok := b.dateStyle[idx]; ok {
		return d
	}
	st, err := b.f.GetStyle(idx)
	d := err == nil && (dateFormatIDs[st.NumFmt] || st.CustomNumFmt != nil && isDateFormat(*st.CustomNumFmt))
	b.dateStyle[idx] = d
	return d
}

// dateFormatIDs are the built-in number formats that show a date
// (ECMA-376 Part 1, §18.8.30; 27-58 are those of East Asian locales).
var dateFormatIDs = map[int]bool{14: true, 15: true, 16: true, 17: true, 22: true,
	27: true, 28: true, 29: true, 30: true, 31: true, 36: true, 50: true, 51: true, 54: true, 57: true, 58: true}

// isDateFormat reports whether a custom number format shows a date: it has
// a day or year part outside quoted text, escapes and brackets.
func isDateFormat(code string) bool {
	quoted, bracket := false, false
	for i := 0; i < len(code); i++ {
		switch ch := code[i]; {
		case ch == '"':
			quoted = !quoted
		case quoted:
		case ch == '\\' || ch == '_' || ch == '*':
			i++
		case ch == '[':
			bracket = true
		case ch == ']':
			bracket = false
		case bracket:
		case ch == 'd' || ch == 'D' || ch == 'y' || ch == 'Y':
			return true
		}
	}
	return false
}

// merge gives every cell of a merged range its first cell's value, marked
// covered, growing the grid where a range reaches past the cells read.
func (b *workbook) merge(s *sheet, grid [][]cell) ([][]cell, ProblemList) {
	var problems ProblemList
	ranges, err := b.f.GetMergeCells(s.name, true)
	if err != nil {
		problems.Errorf(s.rowPlace(0), "cannot be read (%s)", workbookFailure(err))
		return grid, problems
	}
	for _, m := range ranges {
		c1, r1, err1 := excelize.CellNameToCoordinates(m.GetStartAxis())
		c2, r2, err2 := excelize.CellNameToCoordinates(m.GetEndAxis())
		if err1 != nil || err2 != nil || r2 > MaxRows || c2 > maxColumns || (r2-r1+1)*(c2-c1+1) > MaxCells {
			problems.Errorf(s.rowPlace(0), "merged range %s cannot be read", m[0])
			return grid, problems
		}
		first := cell{}
		if r1 <= len(grid) && c1 <= len(grid[r1-1]) {
			first = grid[r1-1][c1-1]
		}
		for r := r1; r <= r2; r++ {
			for len(grid) < r {
				grid = append(grid, nil)
			}
			for c := c1; c <= c2; c++ {
				for len(grid[r-1]) < c {
					grid[r-1] = append(grid[r-1], cell{place: s.place(r, len(grid[r-1]))})
				}
				g := &grid[r-1][c-1]
				g.merged = m[0]
				if r != r1 || c != c1 {
					g.text, g.number, g.date, g.formula, g.covered = first.text, first.number, first.date, first.formula, true
				}
			}
		}
	}
	return grid, nil
}

// workbookFailure says why a workbook or sheet cannot be read, without the
// library's own wording where it has a better one.
func workbookFailure(err error) string {
	switch {
	case errors.Is(err, excelize.ErrWorkbookFileFormat), errors.Is(err, excelize.ErrWorkbookPassword):
		return "an unknown format or a password"
	case strings.Contains(err.Error(), "zip"):
		return "not a zip archive of worksheets"
	case strings.Contains(err.Error(), "size"):
		return fmt.Sprintf("it unpacks to more than %d MiB", maxUnzipBytes>>20)
	}
	return err.Error()
}

func quotedList(names []string) string {
	q := make([]string, len(names))
	for i, n := range names {
		q[i] = strconv.Quote(n)
	}
	return strings.Join(q, ", ")
}
