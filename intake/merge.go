package intake

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/lossline/lossline/survey"
)

// MergeOptions are the choices of a merge.
type MergeOptions struct {
	// NewComponent receives the CMLs the checklist does not list: "Asset /
	// Component", or a component's name when no other has it. "" refuses them.
	NewComponent string
}

// Change is what an import does to a survey's checklist.
type Change struct {
	File     string // survey.md as the survey names it
	Old, New []byte // its bytes before and after
	Diff     string // the change as a unified diff of the text
	Filled   int    // readings of a CML and date written into the checklist
	Same     int    // readings of a CML and date it already held, the same
	Columns  []string
	Added    []string // CMLs added with NewComponent
	Notes    int      // remarks cells written
}

// group is the readings of one CML and date, from every file.
type group struct {
	id     string
	date   survey.VisitDate
	values []Value
	notes  []string
	loc    string
	place  Place // of the first reading
	idAt   Place // of the first reading's CML id
	file   string
}

// Plan works out how the readings of files merge into survey s (as
// survey.LoadSeries returned it, without errors): the new checklist source
// and its diff. Nothing is written. Problems come back sorted.
func Plan(s *survey.Survey, files []*File, opt MergeOptions) (*Change, ProblemList) {
	var problems ProblemList
	groups := groupReadings(files, &problems)
	own := map[string]survey.Located{} // CMLs of this checklist by id
	var ids []string
	for _, loc := range s.AllCMLs() {
		if loc.CML.File == s.File {
			own[loc.CML.ID] = loc
			ids = append(ids, loc.CML.ID)
		}
	}
	var target *survey.Component
	if opt.NewComponent != "" {
		var why string
		target, why = findComponent(s, opt.NewComponent)
		if why != "" {
			problems.Errorf(Place{File: "--new"}, "%s", why)
		}
	}
	var mergeable []*group
	for _, g := range groups {
		_, known := own[g.id]
		switch {
		case g.date.After(s.LastDay()):
			problems.Errorf(g.place, "CML %s: date %s is after this survey's last day %s: readings of a later visit go into that visit's survey folder",
				g.id, g.date, s.LastDay().Format("2006-01-02"))
		case !known && opt.NewComponent == "":
			problems.Errorf(g.idAt, "CML %s is not in %s%s: add its row to a reading table, or import with --new COMPONENT to add it there",
				g.id, s.File, didYouMean(survey.CloseNames(g.id, ids, 3)))
		case known || target != nil:
			mergeable = append(mergeable, g)
		}
	}
	text, enc, _, why := decodeText(s.Source)
	if why != "" {
		problems.Errorf(Place{File: s.File}, "%s", why)
		return nil, problems
	}
	lines := strings.SplitAfter(text, "\n")
	if lines[len(lines)-1] == "" {
		lines = lines[:len(lines)-1] // the text ends with a line ending, not an empty line
	}
	m := &merger{s: s, lines: lines, tables: map[int]*mdTable{}, rowLines: map[int]bool{},
		change: &Change{File: s.File, Old: s.Source}}
	for _, loc := range own {
		m.rowLines[loc.CML.Line-1] = true
	}
	if target != nil {
		if ps := m.checkTarget(target); len(ps) > 0 {
			problems = append(problems, ps...)
			problems.Sort()
			return nil, problems
		}
	}
	for _, g := range mergeable {
		if loc, ok := own[g.id]; ok {
			m.merge(g, loc.CML, &problems)
		} else {
			m.add(g, target, &problems)
		}
	}
	if len(problems) > 0 {
		problems.Sort()
		return nil, problems
	}
	newText, ops := m.apply()
	m.change.New = encodeText(newText, enc)
	m.change.Diff = unifiedDiff(s.File, ops)
	if _, ps := survey.ParseChecklist(s.File, m.change.New); ps.HasErrors() {
		for _, p := range ps {
			if p.Severity == survey.Error {
				problems.Errorf(Place{File: s.File, Row: p.Line}, "after the import the checklist would not read: %s", p.Message)
			}
		}
		return nil, problems
	}
	return m.change, nil
}

// groupReadings gathers the readings per CML and date: the rows of one file
// add up; two files must give the same readings.
func groupReadings(files []*File, problems *ProblemList) []*group {
	var out []*group
	byKey := map[string]*group{}  // CML and date → the first file's readings
	inFile := map[string]*group{} // file, CML and date → that file's readings
	var perFile []*group
	for _, f := range files {
		for _, r := range f.Readings {
			key := f.Name + "\x00" + r.CML + "\x00" + r.Date.String()
			g, ok := inFile[key]
			if !ok {
				g = &group{id: r.CML, date: r.Date, place: r.Place, idAt: r.IDPlace, file: f.Name}
				inFile[key] = g
				perFile = append(perFile, g)
			}
			g.values = append(g.values, r.Values...)
			if r.Note != "" && !slices.Contains(g.notes, r.Note) {
				g.notes = append(g.notes, r.Note)
			}
			if g.loc == "" {
				g.loc = r.Location
			}
		}
	}
	for _, g := range perFile {
		key := g.id + "\x00" + g.date.String()
		first, ok := byKey[key]
		if !ok {
			byKey[key] = g
			out = append(out, g)
			continue
		}
		if !sameMM(mmOf(first.values), mmOf(g.values)) {
			problems.Errorf(g.place, "CML %s, visit %s: readings %s differ from %s at %s", g.id, g.date,
				formatMM(mmOf(g.values)), formatMM(mmOf(first.values)), first.place)
		}
		for _, n := range g.notes {
			if !slices.Contains(first.notes, n) {
				first.notes = append(first.notes, n)
			}
		}
	}
	return out
}

// merger holds the checklist's lines and the tables changed.
type merger struct {
	s        *survey.Survey
	lines    []string
	tables   map[int]*mdTable // by header line
	rowLines map[int]bool     // lines (0-based) of this checklist's CML rows
	change   *Change
}

// table returns the table holding the CML row at line (1-based).
func (m *merger) table(line int) (*mdTable, int) {
	for _, t := range m.tables {
		if r, ok := t.rowAt[line-1]; ok {
			return t, r
		}
	}
	t, ok := parseMDTable(m.lines, line-1, func(l int) bool { return m.rowLines[l] })
	if !ok {
		return nil, -1
	}
	m.tables[t.start] = t
	return t, t.rowAt[line-1]
}

// merge writes a group's readings into its CML's row, or finds them there.
func (m *merger) merge(g *group, cml *survey.CML, problems *ProblemList) {
	t, r := m.table(cml.Line)
	if t == nil {
		problems.Errorf(Place{File: m.s.File, Row: cml.Line}, "the reading table of CML %s cannot be rewritten (its rows are not one under the other under a header and a separator row)", cml.ID)
		return
	}
	here := Place{File: m.s.File, Row: cml.Line}
	c := t.dateColumn(g.date)
	if c >= 0 && !slices.Contains(notTaken, t.rows[r][c]) {
		have, err := survey.ParseThicknesses(t.rows[r][c], m.s.Units)
		if err != nil || !sameMM(have, mmOf(g.values)) {
			problems.Errorf(here, "CML %s, visit %s: readings %s differ from %s at %s", cml.ID, g.date,
				t.rows[r][c], joinValues(g.values), g.place)
			return
		}
		m.change.Same++
		m.note(t, r, g)
		return
	}
	// The visit may be held by an earlier survey's checklist (merged in).
	for _, v := range cml.Visits {
		if v.File == m.s.File || !v.Date.Time.Equal(g.date.Time) {
			continue
		}
		if !sameMM(v.ReadingsMM, mmOf(g.values)) {
			problems.Errorf(Place{File: v.File, Row: v.Line}, "CML %s, visit %s: readings %s differ from %s at %s", cml.ID, g.date,
				formatMM(v.ReadingsMM), formatMM(mmOf(g.values)), g.place)
			return
		}
		m.change.Same++
		return
	}
	if c < 0 {
		c = t.addDateColumn(g.date)
		m.addedColumn(g.date, cml)
	}
	t.set(r, c, joinValues(g.values))
	m.change.Filled++
	m.note(t, r, g)
}

// addedColumn records a visit column added to a CML's table.
func (m *merger) addedColumn(d survey.VisitDate, cml *survey.CML) {
	for _, loc := range m.s.AllCMLs() {
		if loc.CML == cml {
			m.change.Columns = append(m.change.Columns, fmt.Sprintf("%s in %q", d, loc.Component.Name))
		}
	}
}

// note writes a group's notes into the row's remarks cell, adding the
// column when the table has none. A note the cell holds already is not
// written again.
func (m *merger) note(t *mdTable, r int, g *group) {
	if len(g.notes) == 0 {
		return
	}
	c := t.column("remarks", "remark", "notes", "note")
	if c < 0 {
		c = t.addColumn("remarks")
	}
	cell := t.rows[r][c]
	for _, n := range g.notes {
		esc := strings.ReplaceAll(strings.Join(strings.Fields(n), " "), "|", `\|`)
		switch {
		case strings.Contains(cell, esc):
		case cell == "":
			cell = n
		default:
			cell += "; " + n
		}
	}
	if cell != t.rows[r][c] {
		t.set(r, c, cell)
		m.change.Notes++
	}
}

// checkTarget makes sure the component CMLs are added to has a reading
// table in this checklist.
func (m *merger) checkTarget(c *survey.Component) ProblemList {
	var problems ProblemList
	if m.lastRow(c) == nil {
		problems.Errorf(Place{File: m.s.File, Row: c.Line}, "--new: %q has no reading table in %s to add CMLs to: write its table header first", c.Name, m.s.File)
	}
	return problems
}

// lastRow is the last CML row of the component in this checklist.
func (m *merger) lastRow(c *survey.Component) *survey.CML {
	var last *survey.CML
	for _, cml := range c.CMLs {
		if cml.File == m.s.File && (last == nil || cml.Line > last.Line) {
			last = cml
		}
	}
	return last
}

// add puts a CML the checklist lacks into the component's last table.
func (m *merger) add(g *group, c *survey.Component, problems *ProblemList) {
	last := m.lastRow(c)
	t, _ := m.table(last.Line)
	if t == nil {
		problems.Errorf(Place{File: m.s.File, Row: last.Line}, "the reading table of %q cannot be rewritten", c.Name)
		return
	}
	r := -1
	for i, row := range t.rows {
		if row[0] == g.id {
			r = i
		}
	}
	if r < 0 {
		r = t.addRow()
		t.set(r, 0, g.id)
		m.change.Added = append(m.change.Added, g.id)
		if lc := t.column("location"); lc >= 0 {
			t.set(r, lc, g.loc)
		}
	}
	col := t.dateColumn(g.date)
	if col < 0 {
		col = t.addDateColumn(g.date)
		m.change.Columns = append(m.change.Columns, fmt.Sprintf("%s in %q", g.date, c.Name))
	}
	t.set(r, col, joinValues(g.values))
	m.change.Filled++
	m.note(t, r, g)
}

// apply writes the changed tables into the lines: the new text, and every
// line as kept, removed or added, for the diff.
func (m *merger) apply() (string, []lineOp) {
	starts := make([]int, 0, len(m.tables))
	for s, t := range m.tables {
		if t.changed {
			starts = append(starts, s)
		}
	}
	slices.Sort(starts)
	var b strings.Builder
	var ops []lineOp
	i := 0
	for _, s := range starts {
		t := m.tables[s]
		for ; i < t.start; i++ {
			b.WriteString(m.lines[i])
			ops = append(ops, lineOp{' ', m.lines[i]})
		}
		newLines := t.render()
		if t.end == len(m.lines) && !strings.HasSuffix(m.lines[t.end-1], "\n") {
			// The table ends the file without a line ending: so does its last row.
			newLines[len(newLines)-1] = chomp(newLines[len(newLines)-1])
		}
		for k, nl := range newLines {
			b.WriteString(nl)
			switch {
			case t.start+k >= t.end:
				ops = append(ops, lineOp{'+', nl})
			case m.lines[t.start+k] == nl:
				ops = append(ops, lineOp{' ', nl})
			default:
				ops = append(ops, lineOp{'-', m.lines[t.start+k]}, lineOp{'+', nl})
			}
		}
		i = t.end
	}
	for ; i < len(m.lines); i++ {
		b.WriteString(m.lines[i])
		ops = append(ops, lineOp{' ', m.lines[i]})
	}
	return b.String(), ops
}

// findComponent finds the component named "Asset / Component", or by its
// name alone when no other component has it (case and spacing aside).
func findComponent(s *survey.Survey, name string) (*survey.Component, string) {
	norm := func(x string) string { return strings.ToLower(strings.Join(strings.Fields(x), " ")) }
	want := norm(name)
	var found []*survey.Component
	var names []string
	full := map[string]string{} // a component's name or full name → its full name
	for _, a := range s.Assets {
		for _, c := range a.Components {
			f := a.Name + " / " + c.Name
			names = append(names, f, c.Name)
			full[f], full[c.Name] = f, f
			if norm(f) == want || norm(c.Name) == want {
				found = append(found, c)
			}
		}
	}
	switch len(found) {
	case 1:
		return found[0], ""
	case 0:
		var near []string
		for _, n := range survey.CloseNames(name, names, 3) {
			if !slices.Contains(near, full[n]) {
				near = append(near, full[n])
			}
		}
		return nil, fmt.Sprintf("no component %q in this survey%s", name, didYouMean(near))
	}
	return nil, fmt.Sprintf("%q names %d components: write it as \"Asset / Component\"", name, len(found))
}

func didYouMean(names []string) string {
	if len(names) == 0 {
		return ""
	}
	return " (did you mean " + strings.Join(names, " or ") + "?)"
}

func mmOf(vs []Value) []float64 {
	out := make([]float64, len(vs))
	for i, v := range vs {
		out[i] = v.MM
	}
	return out
}

// sameMM reports whether two visits hold the same readings, in any order:
// equal to a nanometre, so that 0.475 in and 12.065 mm are the same.
func sameMM(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	a, b = slices.Clone(a), slices.Clone(b)
	slices.Sort(a)
	slices.Sort(b)
	for i := range a {
		if math.Abs(a[i]-b[i]) > 1e-6 {
			return false
		}
	}
	return true
}

func formatMM(mm []float64) string {
	parts := make([]string, len(mm))
	for i, v := range mm {
		parts[i] = fmt.Sprintf("%.2f", v)
	}
	return strings.Join(parts, " ") + " mm"
}
