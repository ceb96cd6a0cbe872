package intake

import (
	"fmt"
	"regexp"
	"slices"
	"strings"

	"github.com/lossline/lossline/survey"
)

// role is what a column of an import file holds.
type role int

const (
	roleNone role = iota
	roleID
	roleReading
	roleDate
	roleUnit
	roleNote
	roleLocation
)

var roleNames = []string{"", "id", "reading", "date", "unit", "note", "location"}

// headerWords are the headers a column is known by, in any case, with
// underscores taken as spaces and a unit in brackets after them
// ("Thickness (mm)").
var headerWords = map[string]role{
	"cml": roleID, "cml id": roleID, "id": roleID, "location id": roleID, "tml": roleID,
	"reading": roleReading, "readings": roleReading, "thickness": roleReading, "value": roleReading,
	"date": roleDate, "visit date": roleDate,
	"unit": roleUnit, "units": roleUnit,
	"note": roleNote, "notes": roleNote, "remark": roleNote, "remarks": roleNote, "comment": roleNote, "comments": roleNote,
	"location": roleLocation,
}

// HeaderWords lists the header words of each column, for help texts.
func HeaderWords() map[string][]string {
	out := map[string][]string{}
	for w, r := range headerWords {
		out[roleNames[r]] = append(out[roleNames[r]], w)
	}
	for _, ws := range out {
		slices.Sort(ws)
	}
	return out
}

// Shape is how a file lays out its readings.
type Shape int

// The shapes of an import file.
const (
	Long Shape = iota // a CML, a date (or --date) and a reading a row
	Wide              // a CML a row, a column per visit date
	Grid              // a CML a row, a column per point of one visit
)

func (s Shape) String() string { return [...]string{"long", "wide", "grid"}[s] }

// Map names the columns of an import file by their header text, for files
// whose headers are not the words lossline knows. Empty entries are found by
// the words.
type Map struct {
	ID, Reading, Date, Unit, Note, Location string
	Points                                  []string // the point columns of a grid
	Sheet                                   string   // the worksheet of a workbook to read
	// From says where each entry was given (a settings file line, --map),
	// by key, for messages.
	From map[string]string
}

// MapKeys are the keys of a Map, as written in settings and --map.
var MapKeys = []string{"id", "reading", "date", "unit", "note", "location", "points", "sheet"}

// Set sets the entry key to value, where it was given; points are
// separated by commas.
func (m *Map) Set(key, value, from string) error {
	value = strings.TrimSpace(value)
	switch strings.ToLower(strings.TrimSpace(key)) {
	case "id":
		m.ID = value
	case "reading":
		m.Reading = value
	case "date":
		m.Date = value
	case "unit":
		m.Unit = value
	case "note":
		m.Note = value
	case "location":
		m.Location = value
	case "sheet":
		m.Sheet = value
	case "points":
		m.Points = nil
		for p := range strings.SplitSeq(value, ",") {
			if p = strings.TrimSpace(p); p != "" {
				m.Points = append(m.Points, p)
			}
		}
	default:
		return fmt.Errorf("unknown column %q (known: %s)", key, strings.Join(MapKeys, ", "))
	}
	if m.From == nil {
		m.From = map[string]string{}
	}
	m.From[strings.ToLower(strings.TrimSpace(key))] = from
	return nil
}

// Entries returns the entries set, by key, as Set reads them.
func (m Map) Entries() map[string]string {
	out := map[string]string{}
	for k, v := range map[string]string{"id": m.ID, "reading": m.Reading, "date": m.Date, "unit": m.Unit,
		"note": m.Note, "location": m.Location, "sheet": m.Sheet, "points": strings.Join(m.Points, ", ")} {
		if v != "" {
			out[k] = v
		}
	}
	return out
}

// column returns the header the map gives a role, or "".
func (m Map) column(r role) string {
	return [...]string{"", m.ID, m.Reading, m.Date, m.Unit, m.Note, m.Location}[r]
}

// from says where the map's entry for key was given, for messages.
func (m Map) from(key string) string {
	if f := m.From[key]; f != "" {
		return " (mapped by " + f + ")"
	}
	return ""
}

// normHeader is a header as the words are matched: lower case, underscores
// as spaces, single spaces.
func normHeader(s string) string {
	return strings.Join(strings.Fields(strings.ToLower(strings.ReplaceAll(s, "_", " "))), " ")
}

// unitInHeader matches a header ending in a unit in brackets.
var unitInHeader = regexp.MustCompile(`^(.*?)\s*[(\[]\s*([A-Za-z"]+)\s*[)\]]$`)

// headerUnit splits "Thickness (mm)" into "Thickness" and mm.
func headerUnit(h string) (string, survey.Unit) {
	if m := unitInHeader.FindStringSubmatch(strings.TrimSpace(h)); m != nil {
		if u, ok := survey.ParseUnit(m[2]); ok {
			return m[1], u
		}
	}
	return h, ""
}

// pointHeader matches the header of a grid point: a letter or two and a
// number (A1, E5, P12), a clock position (3, 12:00, 6 o'clock, 9h) or a point
// number up to 99.
var pointHeader = regexp.MustCompile(`^(?i:[a-z]{1,2}\d{1,3}|(1[0-2]|0?[1-9])(:[0-5]\d)?\s*(o'?clock|h)?|\d{1,2})$`)

// dateLike matches a header written as a date, valid or not.
var dateLike = regexp.MustCompile(`^\d+([-/.]\d+)+$`)

// headerRows is how far down a file its header row is looked for (a gauge's
// export may open with lines about the instrument).
const headerRows = 30

// visitColumn is a column of readings of one date (wide shape); pointColumn
// one of a grid.
type visitColumn struct {
	i    int
	date survey.VisitDate
}

type pointColumn struct {
	i    int
	name string
}

// layout is what the columns of a sheet hold.
type layout struct {
	header      int // index in sheet.rows
	shape       Shape
	col         [roleLocation + 1]int // column by role; -1 for none
	readingUnit survey.Unit           // from the reading column's header
	visits      []visitColumn
	points      []pointColumn
	ignored     []string
}

// findHeader returns the index of the header row: the first of the first
// rows that holds the id column (by the map's header or a word); -1 when
// none does.
func (s *sheet) findHeader(m Map) int {
	want := normHeader(m.ID)
	for i, r := range s.rows[:min(len(s.rows), headerRows)] {
		for _, c := range r.cells {
			h, _ := headerUnit(c.text)
			if n := normHeader(h); want != "" && n == want || want == "" && headerWords[n] == roleID {
				return i
			}
		}
	}
	return -1
}

// columns reads the header row: which column holds what, and the shape.
func (s *sheet) columns(hi int, m Map) (*layout, ProblemList) {
	var problems ProblemList
	hdr := s.rows[hi]
	at := s.rowPlace(hdr.n)
	lay := &layout{header: hi}
	for i := range lay.col {
		lay.col[i] = -1
	}
	texts := make([]string, len(hdr.cells))
	for i, c := range hdr.cells {
		texts[i] = c.text
	}
	// findMapped returns the column whose header is h, or -1.
	findMapped := func(key, h string) int {
		want := normHeader(h)
		for i, t := range texts {
			if normHeader(t) == want {
				return i
			}
			if base, _ := headerUnit(t); normHeader(base) == want {
				return i
			}
		}
		problems.Errorf(at, "no column %q%s: the header row holds %s", h, m.from(key), quotedList(nonEmpty(texts)))
		return -1
	}
	taken := map[int]bool{}
	for r := roleID; r <= roleLocation; r++ {
		if h := m.column(r); h != "" {
			if i := findMapped(roleNames[r], h); i >= 0 {
				lay.col[r], taken[i] = i, true
			}
		}
	}
	mappedPoints := len(m.Points) > 0
	for _, p := range m.Points {
		if i := findMapped("points", p); i >= 0 {
			lay.points, taken[i] = append(lay.points, pointColumn{i: i, name: texts[i]}), true
		}
	}
	var loosePoints []pointColumn
	for i, t := range texts {
		if taken[i] || t == "" {
			continue
		}
		base, _ := headerUnit(t)
		r := headerWords[normHeader(base)]
		switch {
		case r != roleNone && m.column(r) != "":
			lay.ignored = append(lay.ignored, t) // the map names another column for it
		case r != roleNone && lay.col[r] >= 0:
			problems.Errorf(at, "two %s columns, %q and %q: map the one to use (--map %s=HEADER)", roleNames[r], texts[lay.col[r]], t, roleNames[r])
		case r != roleNone:
			lay.col[r] = i
		case hdr.cells[i].date:
			d, _ := survey.ParseVisitDate(t)
			lay.visits = append(lay.visits, visitColumn{i: i, date: d})
		case dateLike.MatchString(t):
			d, ok := survey.ParseVisitDate(t)
			if !ok {
				why := survey.VisitDateMistake(t)
				if why == "" {
					why = "write the date as YYYY-MM-DD (ISO 8601)"
				}
				problems.Errorf(s.place(hdr.n, i), "column %q is not a visit date: %s", t, why)
				continue
			}
			lay.visits = append(lay.visits, visitColumn{i: i, date: d})
		case !mappedPoints && pointHeader.MatchString(t):
			loosePoints = append(loosePoints, pointColumn{i: i, name: t})
		default:
			lay.ignored = append(lay.ignored, t)
		}
	}
	if lay.col[roleReading] >= 0 {
		_, lay.readingUnit = headerUnit(texts[lay.col[roleReading]])
	}
	if len(problems) > 0 {
		return nil, problems
	}
	problems = lay.shapeOf(at, m, loosePoints, texts)
	return lay, problems
}

// shapeOf decides the shape from the columns found; a file that could be
// read two ways is refused until the map says which.
func (lay *layout) shapeOf(at Place, m Map, loosePoints []pointColumn, texts []string) ProblemList {
	var problems ProblemList
	names := func(cols []int) string {
		var n []string
		for _, i := range cols {
			n = append(n, texts[i])
		}
		return quotedList(n)
	}
	var visitCols, pointCols []int
	for _, v := range lay.visits {
		visitCols = append(visitCols, v.i)
	}
	for _, p := range loosePoints {
		pointCols = append(pointCols, p.i)
	}
	reading := lay.col[roleReading]
	switch {
	case len(m.Points) > 0:
		lay.shape = Grid
		if reading >= 0 && m.Reading == "" {
			lay.ignored = append(lay.ignored, texts[reading])
			lay.col[roleReading] = -1
		}
	case m.Reading != "" || reading >= 0 && len(visitCols) == 0 && len(pointCols) < 2:
		lay.shape = Long
		for _, i := range append(visitCols, pointCols...) {
			lay.ignored = append(lay.ignored, texts[i])
		}
		lay.visits = nil
	case reading >= 0:
		problems.Errorf(at, "the readings could be in column %q or in %s: map them (--map reading=%s, or --map points=…)",
			texts[reading], names(append(visitCols, pointCols...)), texts[reading])
	case len(visitCols) > 0 && len(pointCols) >= 2:
		problems.Errorf(at, "the readings could be in the date columns %s or the point columns %s: map the points (--map points=…) or rename them", names(visitCols), names(pointCols))
	case len(visitCols) > 0:
		lay.shape = Wide
		if d := lay.col[roleDate]; d >= 0 {
			problems.Errorf(at, "a date column %q beside columns headed by dates %s: a file holds one or the other", texts[d], names(visitCols))
		}
		for _, i := range pointCols {
			lay.ignored = append(lay.ignored, texts[i])
		}
	case len(pointCols) >= 2:
		lay.shape, lay.points = Grid, loosePoints
	default:
		problems.Errorf(at, "no readings: head them reading, thickness or value (one a row), or with dates (a column per visit), or with point names such as A1 or 12:00 (a column per point); or map them (--map reading=HEADER)")
	}
	if lay.shape == Grid && len(lay.points) == 0 {
		lay.points = loosePoints
	}
	return problems
}

// describe says in words what each column was taken for.
func (lay *layout) describe(s *sheet) string {
	hdr := s.rows[lay.header]
	text := func(i int) string { return fmt.Sprintf("%q", s.at(hdr, i).text) }
	var parts []string
	for r := roleID; r <= roleLocation; r++ {
		if i := lay.col[r]; i >= 0 {
			parts = append(parts, roleNames[r]+" "+text(i))
		}
	}
	switch lay.shape {
	case Wide:
		var ds []string
		for _, v := range lay.visits {
			ds = append(ds, v.date.String())
		}
		parts = append(parts, "visits "+strings.Join(ds, ", "))
	case Grid:
		var ps []string
		for _, p := range lay.points {
			ps = append(ps, p.name)
		}
		parts = append(parts, "points "+strings.Join(ps, ", "))
	}
	out := lay.shape.String() + " shape: " + strings.Join(parts, ", ")
	if len(lay.ignored) > 0 {
		out += "; ignored " + quotedList(lay.ignored)
	}
	return out
}

func nonEmpty(ss []string) []string {
	var out []string
	for _, s := range ss {
		if s != "" {
			out = append(out, s)
		}
	}
	return out
}
