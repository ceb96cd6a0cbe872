package survey

import (
	"fmt"
	"slices"
	"strings"

	"github.com/lossline/lossline/survey/number"
)

// column roles in a reading table.
const (
	colIgnored = iota
	colCML
	colVisit
	colLocation
	colGPS
	colPhotos
	colWas
	colRemarks
)

// columnNames maps the header of each optional column to its role.
var columnNames = map[string]int{
	"location": colLocation, "gps": colGPS, "photos": colPhotos, "photo": colPhotos, "was": colWas,
	"remarks": colRemarks, "remark": colRemarks, "notes": colRemarks, "note": colRemarks,
}

type tableColumn struct {
	role int
	date VisitDate
}

func (r *checklistReader) table(t *tableBlock) {
	if r.gridTable(t) {
		return
	}
	header := t.rows[0]
	headerLine := r.lines.line(header.Start)
	if r.comp == nil {
		r.problems.Errorf(r.file, headerLine, "a reading table must come under a ## component heading")
		return
	}
	names := gfmCells(nil, r.lineText(header.Start))
	for len(names) < t.columns {
		names = append(names, "") // goldmark fills a short header
	}
	if r.electroTable(t, names, headerLine) {
		return
	}
	cols := r.columns(names, headerLine)
	if cols == nil {
		return
	}
	r.visitColumns = 0
	for _, c := range cols {
		if c.role == colVisit {
			r.visitColumns++
		}
	}
	var shape, cells []string
	line := headerLine
	for _, row := range t.rows[1:] {
		start := row.Start
		line = r.lines.advance(line, start)
		text := r.lineText(start)
		var ok bool
		if shape, cells, ok = r.rowCells(shape, cells, text, line, len(cols), "reading"); ok {
			r.row(cells[:len(cols)], line, cols)
		}
	}
}

// rowCells splits a table row written as text into its n cells (cells is
// reused, shape is room for the check), or refuses at line a row whose
// number of cells is not the header's; what names a value not taken.
// goldmark fills short rows and cuts long ones, so their shape is checked on
// the text as written.
func (r *checklistReader) rowCells(shape, cells []string, text string, line, n int, what string) ([]string, []string, bool) {
	if shape = splitRow(shape[:0], text); len(shape) != n {
		got := len(shape)
		r.problems.Errorf(r.file, line, "row has %d %s, the header has %d: write one cell per column (- for a %s not taken)",
			got, plural(got, "cell", "cells"), n, what)
		return shape, cells, false
	}
	cells = gfmCells(cells[:0], text)
	for len(cells) < n {
		cells = append(cells, "")
	}
	return shape, cells, true
}

// lineText returns the text of the checklist from offset start to the end
// of its line.
func (r *checklistReader) lineText(start int) string {
	rest := r.text[start:]
	if i := strings.IndexByte(rest, '\n'); i >= 0 {
		return rest[:i]
	}
	return rest
}

// splitRow appends to dst the cells written in a table row, split as the
// GFM table extension of goldmark does: one leading and one trailing pipe are
// dropped, and a pipe after a backslash does not end a cell. Unlike goldmark
// it keeps an empty last cell written `||` at the end of the row (goldmark
// drops it, then pads the row with an empty cell: the same value).
func splitRow(dst []string, line string) []string {
	s := strings.TrimSpace(line)
	pos, limit := 0, len(s)
	if limit > 0 && s[0] == '|' {
		pos++
	}
	if limit > pos && s[limit-1] == '|' {
		limit--
	}
	for pos < limit {
		end := pos
		for ; end < limit; end++ {
			if s[end] == '|' && (end == 0 || s[end-1] != '\\') {
				break
			}
		}
		dst = append(dst, strings.TrimSpace(s[pos:end]))
		if end == limit-1 {
			dst = append(dst, "") // `||` closing the row
		}
		pos = end + 1
	}
	return dst
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// columns reads the header row's cells; nil when the table cannot be read.
func (r *checklistReader) columns(names []string, line int) []tableColumn {
	var cols []tableColumn
	seen := map[string]bool{}
	for _, name := range names {
		lower := strings.ToLower(name)
		col := tableColumn{}
		role, named := columnNames[lower]
		switch {
		case len(cols) == 0:
			if lower != "cml" {
				r.problems.Errorf(r.file, line, "the first column of a reading table must be CML, not %q", name)
				return nil
			}
			col.role = colCML
		case named:
			if slices.ContainsFunc(cols, func(c tableColumn) bool { return c.role == role }) {
				r.problems.Errorf(r.file, line, "column %q appears twice", name)
				break
			}
			col.role = role
		default:
			d, ok := ParseVisitDate(name)
			if !ok {
				if why := visitDateMistake(name); why != "" {
					r.problems.Errorf(r.file, line, "column %q is not a visit date: %s", name, why)
				} else {
					r.problems.Warnf(r.file, line, "column %q is not a date, location, gps, photos, was or remarks: ignored", name)
				}
				break
			}
			if seen[d.String()] {
				r.problems.Errorf(r.file, line, "visit %s has two columns", d)
				break
			}
			seen[d.String()] = true
			if y := d.Time.Year(); y < minVisitYear {
				r.problems.Errorf(r.file, line, "visit column %s: year %d is before %d", d, y, minVisitYear)
				break
			}
			if !r.survey.Date.IsZero() && d.After(r.survey.LastDay()) {
				r.problems.Errorf(r.file, line, "visit column %s is later than %s", d, r.survey.dayLimit())
				break
			}
			col.role, col.date = colVisit, d
			r.addVisitDate(d)
		}
		cols = append(cols, col)
	}
	return cols
}

func (r *checklistReader) addVisitDate(d VisitDate) {
	for _, v := range r.comp.VisitDates {
		if v.Time.Equal(d.Time) {
			return
		}
	}
	r.comp.VisitDates = append(r.comp.VisitDates, d)
	slices.SortFunc(r.comp.VisitDates, func(a, b VisitDate) int { return a.Time.Compare(b.Time) })
}

// noAccess are words written in a reading cell for a reading not taken.
var noAccess = []string{"los", "n/a", "na", "n.a.", "none", "no access", "noaccess", "not accessible", "nr", "not read", "x"}

func (r *checklistReader) row(cells []string, line int, cols []tableColumn) {
	cml := CML{File: r.file, Line: line}
	var blank []VisitDate // visit columns left empty
	for i, v := range cells {
		switch cols[i].role {
		case colCML:
			cml.ID = v
		case colLocation:
			cml.Location = v
		case colRemarks:
			cml.Remarks = v
		case colGPS:
			if v == "" || v == "-" {
				break
			}
			p, err := parseLatLon(v)
			if err != nil {
				r.problems.Errorf(r.file, line, "gps %q %v", v, err)
				break
			}
			cml.GPS = &p
		case colPhotos:
			cml.PhotoRefs = append(cml.PhotoRefs, strings.FieldsFunc(v, func(c rune) bool { return c == ',' || c == ' ' || c == ';' })...)
		case colWas:
			cml.Was = append(cml.Was, strings.FieldsFunc(v, func(c rune) bool { return c == ',' || c == ' ' || c == ';' })...)
		case colVisit:
			if v == "" {
				blank = append(blank, cols[i].date)
			}
			if v == "" || v == "-" || v == "—" || v == "–" {
				break
			}
			// Every word for a reading not taken starts with a letter.
			if (v[0] < '0' || v[0] > '9') && slices.Contains(noAccess, strings.ToLower(strings.Join(strings.Fields(v), " "))) {
				r.problems.Errorf(r.file, line, "reading %q on %s: write - for a reading not taken and say why in a note", v, cols[i].date)
				break
			}
			var err error
			r.readings, err = appendThicknesses(r.readings[:0], v, r.survey.Units)
			if err != nil {
				r.problems.Errorf(r.file, line, "reading %v", err)
				break
			}
			if cml.Visits == nil {
				cml.Visits = r.blocks.visits(r.visitColumns)
			}
			cml.Visits = append(cml.Visits, Visit{Date: cols[i].date, ReadingsMM: r.blocks.readings(r.readings), File: r.file, Line: line})
		}
	}
	if cml.ID == "" {
		r.problems.Errorf(r.file, line, "row has no CML id")
		return
	}
	if first, dup := r.cmlLines[cml.ID]; dup {
		r.problems.Errorf(r.file, line, "CML %s is listed twice (first at line %d)", cml.ID, first)
		return
	}
	r.cmlLines[cml.ID] = line
	if !slices.IsSortedFunc(cml.Visits, compareVisitDates) {
		slices.SortStableFunc(cml.Visits, compareVisitDates)
	}
	if n := len(cml.Visits); n >= 2 {
		for _, d := range blank {
			// A cell left empty between two readings is more often a value
			// forgotten than a visit skipped, which - says.
			if d.Time.After(cml.Visits[0].Date.Time) && d.Time.Before(cml.Visits[n-1].Date.Time) {
				r.problems.Warnf(r.file, line, "CML %s has an empty cell for %s between readings: it is taken as not measured; write - if so, or the reading", cml.ID, d)
			}
		}
	}
	r.comp.CMLs = append(r.comp.CMLs, r.blocks.cml(cml))
}

func compareVisitDates(a, b Visit) int { return a.Date.Time.Compare(b.Date.Time) }

// rowBlocks hands out the CMLs, visits and readings of table rows from
// blocks shared by many rows: a few allocations per hundreds of rows instead
// of several per row. Each slice handed out has its length as capacity, so
// appending to it (a merge adds visits) moves it out of the block.
type rowBlocks struct {
	cmlBlock   []CML
	visitBlock []Visit
	mmBlock    []float64
}

// rowBlock is the number of rows' worth of room a block is made with.
const rowBlock = 256

// cml stores m in a block and returns its place.
func (b *rowBlocks) cml(m CML) *CML {
	if len(b.cmlBlock) == cap(b.cmlBlock) {
		b.cmlBlock = make([]CML, 0, rowBlock)
	}
	b.cmlBlock = append(b.cmlBlock, m)
	return &b.cmlBlock[len(b.cmlBlock)-1]
}

// visits returns an empty slice with room for n visits.
func (b *rowBlocks) visits(n int) []Visit {
	if cap(b.visitBlock)-len(b.visitBlock) < n {
		b.visitBlock = make([]Visit, 0, max(n, 4)*rowBlock)
	}
	start := len(b.visitBlock)
	b.visitBlock = b.visitBlock[:start+n]
	return b.visitBlock[start : start : start+n]
}

// readings returns a copy of mm stored in a block.
func (b *rowBlocks) readings(mm []float64) []float64 {
	if cap(b.mmBlock)-len(b.mmBlock) < len(mm) {
		b.mmBlock = make([]float64, 0, max(len(mm), 4)*rowBlock)
	}
	start := len(b.mmBlock)
	b.mmBlock = append(b.mmBlock, mm...)
	return b.mmBlock[start:len(b.mmBlock):len(b.mmBlock)]
}

// parseLatLon reads `latitude, longitude` in decimal degrees; its error
// completes the sentence `gps "…" …`.
func parseLatLon(s string) (LatLon, error) {
	parts := strings.FieldsFunc(s, func(c rune) bool { return c == ',' || c == ' ' || c == ';' })
	if len(parts) != 2 {
		why := "is not `latitude, longitude` in decimal degrees"
		if len(parts) == 4 && strings.Count(s, ",") >= 2 {
			why += " (decimals take a point: 45.60238, -61.35078)"
		}
		return LatLon{}, fmt.Errorf("%s", why)
	}
	lat, err := number.Parse(parts[0])
	if err != nil {
		return LatLon{}, fmt.Errorf("is not a position: latitude %v", err)
	}
	lon, err := number.Parse(parts[1])
	if err != nil {
		return LatLon{}, fmt.Errorf("is not a position: longitude %v", err)
	}
	if lat < -90 || lat > 90 {
		return LatLon{}, fmt.Errorf("is not a position: latitude %s is beyond ±90°", parts[0])
	}
	if lon < -180 || lon > 180 {
		return LatLon{}, fmt.Errorf("is not a position: longitude %s is beyond ±180°", parts[1])
	}
	return LatLon{Lat: lat, Lon: lon}, nil
}

// finish checks what can only be checked once the whole checklist is read.
func (r *checklistReader) finish() {
	if len(r.survey.Assets) == 0 || r.survey.CMLCount() == 0 {
		r.problems.Errorf(r.file, 0, "the checklist has no CMLs: add a ## component heading and a reading table under it")
	}
	for _, a := range r.survey.Assets {
		for _, c := range a.Components {
			if len(c.CMLs) == 0 && c.Design.Electro.Empty() {
				r.problems.Warnf(r.file, c.Line, "%q has no reading table", c.Name)
			}
		}
	}
}
