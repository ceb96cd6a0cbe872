package survey

import (
	"sort"
	"strconv"
	"strings"

	"github.com/yuin/goldmark/ast"
	east "github.com/yuin/goldmark/extension/ast"
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
)

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
		r.row(row, cols)
	}
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
		switch {
		case len(cols) == 0:
			if lower != "cml" {
				r.problems.Errorf(r.file, line, "the first column of a reading table must be CML, not %q", name)
				return nil
			}
			col.role = colCML
		case lower == "location":
			col.role = colLocation
		case lower == "gps":
			col.role = colGPS
		case lower == "photos" || lower == "photo":
			col.role = colPhotos
		case lower == "was":
			col.role = colWas
		default:
			d, ok := ParseVisitDate(name)
			if !ok {
				r.problems.Warnf(r.file, line, "column %q is not a date, location, gps, photos or was: ignored", name)
				break
			}
			if seen[d.String()] {
				r.problems.Errorf(r.file, line, "visit %s has two columns", d)
				break
			}
			seen[d.String()] = true
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

func (r *checklistReader) row(row ast.Node, cols []tableColumn) {
	line := r.lineOf(row)
	cml := &CML{File: r.file, Line: line}
	i := 0
	for cell := row.FirstChild(); cell != nil && i < len(cols); cell, i = cell.NextSibling(), i+1 {
		v := r.cellText(cell)
		switch cols[i].role {
		case colCML:
			cml.ID = v
		case colLocation:
			cml.Location = v
		case colGPS:
			if v == "" || v == "-" {
				break
			}
			p, ok := parseLatLon(v)
			if !ok {
				r.problems.Errorf(r.file, line, "gps %q is not `latitude, longitude` in decimal degrees", v)
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
			vals, err := ParseThicknesses(v, r.survey.Units)
			if err != nil {
				r.problems.Errorf(r.file, line, "%s", err)
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

func parseLatLon(s string) (LatLon, bool) {
	parts := strings.FieldsFunc(s, func(c rune) bool { return c == ',' || c == ' ' || c == ';' })
	if len(parts) != 2 {
		return LatLon{}, false
	}
	lat, err1 := strconv.ParseFloat(parts[0], 64)
	lon, err2 := strconv.ParseFloat(parts[1], 64)
	if err1 != nil || err2 != nil || lat < -90 || lat > 90 || lon < -180 || lon > 180 {
		return LatLon{}, false
	}
	return LatLon{Lat: lat, Lon: lon}, true
}

// finish checks what can only be checked once the whole checklist is read.
func (r *checklistReader) finish() {
	if len(r.survey.Assets) == 0 || len(r.survey.AllCMLs()) == 0 {
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
