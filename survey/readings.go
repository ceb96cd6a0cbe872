package survey

import (
	"bytes"
	"fmt"
	"slices"
	"sort"
	"strings"

	"github.com/yuin/goldmark/ast"
	east "github.com/yuin/goldmark/extension/ast"

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

func (r *checklistReader) table(t *east.Table) {
	header, ok := t.FirstChild().(*east.TableHeader)
	if !ok {
		return
	}
	headerLine := r.lineOf(header)
	if r.comp == nil {
		r.problems.Errorf(r.file, headerLine, "a reading table must come under a ## component heading")
		return
	}
	cols := r.columns(header, headerLine)
	if cols == nil {
		return
	}
	for row := header.NextSibling(); row != nil; row = row.NextSibling() {
		line := r.lineOf(row)
		if n := len(splitRow(r.rowSource(row))); n != len(cols) {
			r.problems.Errorf(r.file, line, "row has %d %s, the header has %d: write one cell per column (- for a reading not taken)",
				n, plural(n, "cell", "cells"), len(cols))
			continue
		}
		r.row(row, line, cols)
	}
}

// rowSource returns the source text of a table row: goldmark pads short rows
// and cuts long ones, so their shape is checked on the text as written.
func (r *checklistReader) rowSource(row ast.Node) []byte {
	start := min(max(row.Pos(), 0), len(r.src))
	end := len(r.src)
	if i := bytes.IndexByte(r.src[start:], '\n'); i >= 0 {
		end = start + i
	}
	return r.src[start:end]
}

// splitRow splits a table row into the cells written, as the GFM table
// extension of goldmark does: one leading and one trailing pipe are dropped,
// and a pipe after a backslash does not end a cell. Unlike goldmark it keeps an
// empty last cell written `||` at the end of the row (goldmark drops it, then
// pads the row with an empty cell: the same value).
func splitRow(line []byte) []string {
	s := strings.TrimSpace(string(line))
	pos, limit := 0, len(s)
	if limit > 0 && s[0] == '|' {
		pos++
	}
	if limit > pos && s[limit-1] == '|' {
		limit--
	}
	var cells []string
	for pos < limit {
		end := pos
		for ; end < limit; end++ {
			if s[end] == '|' && (end == 0 || s[end-1] != '\\') {
				break
			}
		}
		cells = append(cells, strings.TrimSpace(s[pos:end]))
		if end == limit-1 {
			cells = append(cells, "") // `||` closing the row
		}
		pos = end + 1
	}
	return cells
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

func (r *checklistReader) cellText(cell ast.Node) string {
	return strings.TrimSpace(r.inlineSource(cell))
}

// columns reads the header row; nil when the table cannot be read.
func (r *checklistReader) columns(header ast.Node, line int) []tableColumn {
	var cols []tableColumn
	seen := map[string]bool{}
	for cell := header.FirstChild(); cell != nil; cell = cell.NextSibling() {
		name := r.cellText(cell)
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
	sort.Slice(r.comp.VisitDates, func(i, j int) bool { return r.comp.VisitDates[i].Time.Before(r.comp.VisitDates[j].Time) })
}

// noAccess are words written in a reading cell for a reading not taken.
var noAccess = []string{"los", "n/a", "na", "n.a.", "none", "no access", "noaccess", "not accessible", "nr", "not read", "x"}

func (r *checklistReader) row(row ast.Node, line int, cols []tableColumn) {
	cml := &CML{File: r.file, Line: line}
	i := 0
	for cell := row.FirstChild(); cell != nil && i < len(cols); cell, i = cell.NextSibling(), i+1 {
		v := r.cellText(cell)
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
			if v == "" || v == "-" || v == "—" || v == "–" {
				break
			}
			if slices.Contains(noAccess, strings.ToLower(strings.Join(strings.Fields(v), " "))) {
				r.problems.Errorf(r.file, line, "reading %q on %s: write - for a reading not taken and say why in a note", v, cols[i].date)
				break
			}
			vals, err := ParseThicknesses(v, r.survey.Units)
			if err != nil {
				r.problems.Errorf(r.file, line, "reading %v", err)
				break
			}
			cml.Visits = append(cml.Visits, Visit{Date: cols[i].date, ReadingsMM: vals, File: r.file, Line: line})
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
	sort.SliceStable(cml.Visits, func(a, b int) bool { return cml.Visits[a].Date.Time.Before(cml.Visits[b].Date.Time) })
	r.comp.CMLs = append(r.comp.CMLs, cml)
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
			if len(c.CMLs) == 0 {
				r.problems.Warnf(r.file, c.Line, "%q has no reading table", c.Name)
			}
		}
	}
}
