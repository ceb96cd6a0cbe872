package intake

import (
	"fmt"
	"regexp"
	"slices"
	"strings"

	"github.com/lossline/lossline/survey"
)

// Reading is the readings of one CML on one date from one row of a file
// (several rows of a long file for the same CML and date merge later).
type Reading struct {
	CML      string
	Date     survey.VisitDate
	Values   []Value
	Note     string // the note column, as written
	Location string // the location column, as written (used for CMLs added with --new)
	Place    Place  // the row of a text file, the cell of a worksheet
	IDPlace  Place  // the cell of the CML id
}

// readingCell is a cell that holds readings and the date they were taken.
type readingCell struct {
	c    cell
	date *survey.VisitDate // nil: the row's date
}

// readings reads the data rows under the header.
func (s *sheet) readings(lay *layout, opt Options) ([]Reading, []string, ProblemList) {
	var problems ProblemList
	comma := s.decimalComma(lay)
	if comma {
		s.notes = append(s.notes, "decimal comma")
	}
	var out []Reading
	var notRead []string
	seen := map[string]int{}        // wide: CML id → row
	mergedSaid := map[string]bool{} // merged ranges already refused
	hdr := s.rows[lay.header]
	for _, r := range s.rows[lay.header+1:] {
		if blankRow(r) {
			continue
		}
		id := s.at(r, lay.col[roleID])
		cells := s.readingCells(r, lay)
		var filled []readingCell
		for _, rc := range cells {
			if msg := cellProblem(rc.c); msg != "" {
				if rc.c.formula == "" && rc.c.merged != "" {
					if mergedSaid[rc.c.merged] {
						continue
					}
					mergedSaid[rc.c.merged] = true
				}
				problems.Errorf(rc.c.place, "%s", msg)
				continue
			}
			if !slices.Contains(notTaken, rc.c.text) {
				filled = append(filled, rc)
			}
		}
		if id.formula != "" {
			problems.Errorf(id.place, "%s", cellProblem(id))
			continue
		}
		if id.text == "" {
			if len(filled) > 0 {
				problems.Errorf(filled[0].c.place, "reading %q has no CML id (column %q)", filled[0].c.text, s.at(hdr, lay.col[roleID]).text)
			}
			continue
		}
		if lay.shape == Wide {
			if first, twice := seen[id.text]; twice {
				problems.Errorf(id.place, "CML %s is listed twice (first at %s)", id.text, s.rowPlace(first))
				continue
			}
			seen[id.text] = r.n
		}
		if len(filled) == 0 {
			notRead = append(notRead, id.text)
			continue
		}
		unit, date, ok := s.rowUnitAndDate(r, lay, opt, &problems)
		note, loc := s.textOf(r, lay.col[roleNote]), s.textOf(r, lay.col[roleLocation])
		for _, rc := range filled {
			vals, err := parseValues(rc.c.text, comma, unit, opt.Units)
			if err != nil {
				msg := err.Error()
				if !s.commaDecimals {
					msg = strings.Replace(msg, "(decimals take a point)", "(the cells of this file are separated by commas, so decimals take a point)", 1)
				}
				problems.Errorf(rc.c.place, "reading %s", msg)
				continue
			}
			d := date
			if rc.date != nil {
				d = *rc.date
			} else if !ok {
				continue
			}
			place := s.rowPlace(r.n)
			if lay.shape == Wide || s.name != "" {
				place = rc.c.place
			}
			out = append(out, Reading{CML: id.text, Date: d, Values: vals, Note: note, Location: loc, Place: place, IDPlace: id.place})
		}
	}
	return out, notRead, problems
}

// readingCells are the cells of a row that hold readings.
func (s *sheet) readingCells(r row, lay *layout) []readingCell {
	var out []readingCell
	switch lay.shape {
	case Long:
		out = append(out, readingCell{c: s.at(r, lay.col[roleReading])})
	case Wide:
		for _, v := range lay.visits {
			out = append(out, readingCell{c: s.at(r, v.i), date: &v.date})
		}
	case Grid:
		for _, p := range lay.points {
			out = append(out, readingCell{c: s.at(r, p.i)})
		}
	}
	return out
}

// cellProblem says why a cell of readings or of the id cannot be read: a
// formula without a stored result, a formula's error, a merged range.
func cellProblem(c cell) string {
	switch {
	case c.formula != "":
		return fmt.Sprintf("formula =%s shows nothing: its result was not saved, or it is empty; open and save the workbook in a spreadsheet program, or paste the cells as values (lossline does not compute formulas)", c.formula)
	case formulaError.MatchString(c.text):
		return fmt.Sprintf("%s is a formula's error, not a reading", c.text)
	case c.merged != "" && c.text != "":
		return fmt.Sprintf("the readings are in a merged range %s: unmerge it and write each reading in its own cell", c.merged)
	}
	return ""
}

// formulaError matches the error values a spreadsheet shows for a formula
// (ECMA-376 Part 1, §18.17.4.4 values of type e).
var formulaError = regexp.MustCompile(`^#(NULL!|DIV/0!|VALUE!|REF!|NAME\?|NUM!|N/A|GETTING_DATA|SPILL!|CALC!)$`)

// rowUnitAndDate is the unit of a row's bare values (its unit column, the
// reading column's header, or the survey's) and its date (its date column,
// or --date); ok is false when it has none, after recording why.
func (s *sheet) rowUnitAndDate(r row, lay *layout, opt Options, problems *ProblemList) (survey.Unit, survey.VisitDate, bool) {
	unit := lay.readingUnit
	if i := lay.col[roleUnit]; i >= 0 {
		if c := s.at(r, i); c.text != "" {
			u, ok := survey.ParseUnit(c.text)
			if !ok {
				problems.Errorf(c.place, "unit %q is not mm or in", c.text)
			}
			unit = u
		}
	}
	if lay.shape == Wide {
		return unit, survey.VisitDate{}, true
	}
	i := lay.col[roleDate]
	c := s.at(r, i)
	if i < 0 || c.text == "" {
		if opt.Date != nil {
			return unit, *opt.Date, true
		}
		if i < 0 {
			problems.Errorf(s.rowPlace(r.n), "readings without a date: give the visit's date with --date (the file has no date column)")
		} else {
			problems.Errorf(c.place, "readings without a date: write it in column %q or give --date", s.at(s.rows[lay.header], i).text)
		}
		return unit, survey.VisitDate{}, false
	}
	d, err := parseDateCell(c)
	if err != nil {
		problems.Errorf(c.place, "%v", err)
		return unit, survey.VisitDate{}, false
	}
	return unit, d, true
}

// timeOfDay matches a time after a date, as gauges log it.
var timeOfDay = regexp.MustCompile(`^(\d{4}-\d{2}-\d{2})[T ]\d{1,2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?$`)

// parseDateCell reads a date cell: YYYY-MM-DD, YYYY-MM, a date with a time
// of day (the time is left out), or a worksheet date.
func parseDateCell(c cell) (survey.VisitDate, error) {
	t := c.text
	if m := timeOfDay.FindStringSubmatch(t); m != nil {
		t = m[1]
	}
	if d, ok := survey.ParseVisitDate(t); ok {
		if y := d.Time.Year(); y < 1900 {
			return d, fmt.Errorf("date %s: year %d is before 1900", c.text, y)
		}
		return d, nil
	}
	if c.number {
		return survey.VisitDate{}, fmt.Errorf("date %s is a number, not a date: format the cell as a date, or write the date as text YYYY-MM-DD", c.text)
	}
	why := survey.VisitDateMistake(t)
	if why == "" {
		why = "write the date as YYYY-MM-DD (ISO 8601), e.g. 2026-11-18"
	}
	return survey.VisitDate{}, fmt.Errorf("date %q is not a date: %s", c.text, why)
}

// textOf is the text of a row's column i, "" for no column.
func (s *sheet) textOf(r row, i int) string {
	if i < 0 {
		return ""
	}
	return s.at(r, i).text
}

// decimalComma decides whether the sheet writes decimals with a comma: it
// may (its cells are not separated by commas), some readings have one and
// none has a decimal point.
func (s *sheet) decimalComma(lay *layout) bool {
	if !s.commaDecimals {
		return false
	}
	commas, points := 0, 0
	for _, r := range s.rows[lay.header+1:] {
		for _, rc := range s.readingCells(r, lay) {
			c, p := decimalMarks(rc.c.text)
			commas, points = commas+c, points+p
		}
	}
	return commas > 0 && points == 0
}

func blankRow(r row) bool {
	for _, c := range r.cells {
		if c.text != "" || c.formula != "" {
			return false
		}
	}
	return true
}
