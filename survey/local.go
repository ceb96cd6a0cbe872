package survey

import (
	"fmt"
	"math"
	"slices"
	"strings"
	"time"

	"github.com/yuin/goldmark/ast"

	"github.com/lossline/lossline/survey/localdamage"
	"github.com/lossline/lossline/survey/required"
	"github.com/lossline/lossline/survey/wallloss"
)

// LocalDamage is what a component's checklist says about local corrosion
// (grids, pit depths, a corroded area, a member's plates) and, once
// ComputeLocal has run, what each assessment gives.
type LocalDamage struct {
	Date        time.Time      // of the survey the assessments date from
	Written     []LocalWritten // each local-damage key with the inputs under it
	Grids       []*GridReadings
	Assessments []*LocalAssessment // in the order written
}

// LocalWritten is one local-damage key of the design list (`pits: Gumbel`)
// and the `name: value` items under it, as written.
type LocalWritten struct {
	Key, Method string
	Line        int
	Inputs      []MethodInput
}

// GridReadings is a grid of readings taken at one CML on one visit: a table
// whose first header cell is `grid CML DATE`.
type GridReadings struct {
	CML        string
	Date       VisitDate
	Line       int
	Rows, Cols []string    // row and column labels as written
	CellsMM    [][]float64 // NaN where not read
	RequiredMM float64     // the component's required thickness, 0 when none
	Stats      localdamage.GridStats
}

// Local-damage keys of the design list.
const (
	KeyPits         = "pits"
	KeyBottom       = "bottom pitting"
	KeyCorrodedArea = "corroded area"
	KeyMember       = "member"
)

// localMethods are the method words each key takes, lower case.
var localMethods = map[string][]string{
	KeyPits:         {"gumbel"},
	KeyBottom:       {"api 653"},
	KeyCorrodedArea: {"asme b31g"},
	KeyMember:       {"i", "channel", "angle", "plate"},
}

// The local-damage keys join the design keys: each records its method; the
// inputs under it are read by localInputs.
func init() {
	for key, methods := range localMethods {
		designKeys[key] = func(d *Design, value string, _ Unit) error {
			m := strings.ToLower(strings.Join(strings.Fields(value), " "))
			if !slices.Contains(methods, m) {
				return fmt.Errorf("%s: %q is not one of: %s (to keep the line as a note, write it without the colon)", key, value, strings.Join(methods, ", "))
			}
			if d.Local == nil {
				d.Local = &LocalDamage{}
			}
			d.Local.Written = append(d.Local.Written, LocalWritten{Key: key, Method: m})
			return nil
		}
	}
}

// localInputs reads the nested `name: value` list under a local-damage key;
// it reports whether l was such a list.
func (r *checklistReader) localInputs(l *ast.List) bool {
	if r.comp == nil || r.comp.Design.Local == nil || l.PreviousSibling() == nil {
		return false
	}
	d := &r.comp.Design
	line := r.lineOf(l.PreviousSibling())
	var w *LocalWritten
	for i := range d.Local.Written {
		if key := d.Local.Written[i].Key; d.Lines[key] == line {
			w = &d.Local.Written[i]
			w.Line = line
		}
	}
	if w == nil {
		return false
	}
	for item := l.FirstChild(); item != nil; item = item.NextSibling() {
		block := item.FirstChild()
		if block == nil {
			continue
		}
		at := r.lineOf(block)
		m := designItem.FindStringSubmatch(r.inlineSource(block))
		if m == nil {
			r.problems.Errorf(r.file, at, "input of %s: write it as `name: value`", w.Key)
			continue
		}
		key := strings.ToLower(strings.Join(strings.Fields(m[1]), " "))
		if slices.ContainsFunc(w.Inputs, func(in MethodInput) bool { return in.Name == key }) {
			r.problems.Errorf(r.file, at, "input %q given twice", key)
			continue
		}
		w.Inputs = append(w.Inputs, MethodInput{Name: key, Value: m[2], Line: at})
	}
	return true
}

// gridTable reads a table whose first header cell is `grid CML DATE`: the
// other header cells label the columns, each row's first cell labels the row,
// and each other cell is one thickness or - for a point not read. It reports
// whether t was a grid.
func (r *checklistReader) gridTable(t *tableBlock) bool {
	header := t.rows[0]
	line := r.lines.line(header.Start)
	names := gfmCells(nil, r.lineText(header.Start))
	if len(names) == 0 || !strings.EqualFold(strings.Fields(names[0] + " x")[0], "grid") {
		return false
	}
	if r.comp == nil {
		r.problems.Errorf(r.file, line, "a grid must come under a ## component heading")
		return true
	}
	f := strings.Fields(names[0])
	if len(f) != 3 {
		r.problems.Errorf(r.file, line, "grid header: write `grid CML DATE` in the first cell, e.g. `grid BP-03 2026-11-18`")
		return true
	}
	date, ok := ParseVisitDate(f[2])
	if !ok {
		r.problems.Errorf(r.file, line, "grid %s: %q is not a date such as 2026-11-18", f[1], f[2])
		return true
	}
	g := &GridReadings{CML: f[1], Date: date, Line: line, Cols: names[1:]}
	if len(g.Cols) == 0 {
		r.problems.Errorf(r.file, line, "grid %s: label the columns in the header row", g.CML)
		return true
	}
	ok = true
	for _, row := range t.rows[1:] {
		line = r.lines.advance(line, row.Start)
		cells := splitRow(nil, r.lineText(row.Start))
		if len(cells) != len(g.Cols)+1 {
			r.problems.Errorf(r.file, line, "grid %s: row has %d cells, the header %d", g.CML, len(cells), len(g.Cols)+1)
			ok = false
			continue
		}
		vals := make([]float64, len(g.Cols))
		for j, c := range cells[1:] {
			c = strings.TrimSpace(c)
			if c == "-" || c == "" {
				vals[j] = math.NaN()
				continue
			}
			v, err := ParseThickness(c, r.survey.Units)
			if err != nil {
				r.problems.Errorf(r.file, line, "grid %s, row %s, column %s: %v", g.CML, strings.TrimSpace(cells[0]), g.Cols[j], err)
				ok = false
				continue
			}
			vals[j] = v
		}
		g.Rows = append(g.Rows, strings.TrimSpace(cells[0]))
		g.CellsMM = append(g.CellsMM, vals)
	}
	if len(g.Rows) == 0 {
		r.problems.Errorf(r.file, g.Line, "grid %s has no rows", g.CML)
		return true
	}
	if ok {
		if r.comp.Design.Local == nil {
			r.comp.Design.Local = &LocalDamage{}
		}
		r.comp.Design.Local.Grids = append(r.comp.Design.Local.Grids, g)
	}
	return true
}

// LocalAssessment is one local-damage assessment of a component, with every
// input and step, as a required-thickness derivation is.
type LocalAssessment struct {
	Key    string // the design key it was written under
	Method string // name as the report prints it
	Source string // standard, edition and clause
	Line   int
	Inputs []required.Input
	Steps  []string
	Result string // one line: the outcome
	// LifeY is the years from the survey date until the method's limit is
	// reached: 0 when it already is, nil when no life follows (no rate).
	LifeY *float64
	Limit string // what ends the life

	Pits   *PitDetail
	Bottom *localdamage.BottomResult
	Pipe   *localdamage.Strength
	Member *MemberDetail
}

// PitDetail is the data and result of a Gumbel pit-depth assessment.
type PitDetail struct {
	DepthsMM     []float64
	Estimate     localdamage.PitEstimate
	Life         localdamage.PitLife
	WallMM       float64
	RequiredMM   float64 // the component's required thickness; 0 when none
	GrowthMMPerY float64 // 0 when none is known
	GrowthBasis  string
}

// MemberDetail is a member's section nominal and as measured, and the loss
// limit the responsible engineer set.
type MemberDetail struct {
	Shape         localdamage.Shape
	Plates        []localdamage.Plate // as measured
	Loss          localdamage.SectionLoss
	LimitQuantity string // one of localdamage.Quantities
	LimitPct      float64
	SetBy         string
	Exceeded      bool
}

// LocalLifeY is the shortest life of the component's local-damage
// assessments (years from the survey date; 0 = limit reached); ok is false
// when none gives a life.
func (c *Component) LocalLifeY() (life float64, ok bool) {
	if c.Design.Local == nil {
		return 0, false
	}
	life = math.Inf(1)
	for _, a := range c.Design.Local.Assessments {
		if a.LifeY != nil {
			life, ok = min(life, *a.LifeY), true
		}
	}
	return life, ok
}

// LocalLifeAt is LocalLifeY left at time t, never below 0.
func (c *Component) LocalLifeAt(t time.Time) (float64, bool) {
	life, ok := c.LocalLifeY()
	if !ok {
		return 0, false
	}
	return max(life-wallloss.YearsBetween(c.Design.Local.Date, t), 0), true
}

// nextByLocalDamage brings a CML's next inspection forward to what its
// component's local-damage assessments allow, counted from their date, where
// that is sooner than the wall's date: now when a limit is reached; the
// longest interval for API 653 §4.4.7 bottom pitting (the standard's own
// interval); half the life for the others (the half-life rule of API 570
// §7.1.1 and API 510 §7.1.1 applied to the local-damage life).
func nextByLocalDamage(c *Component, r *wallloss.Result) {
	if c.Design.Local == nil || r.Class == wallloss.AtOrBelowRequired {
		return
	}
	for _, a := range c.Design.Local.Assessments {
		if a.LifeY == nil || math.IsInf(*a.LifeY, 1) {
			continue
		}
		life, years := max(*a.LifeY, 0), *a.LifeY/2
		if a.Bottom != nil {
			years = *a.LifeY
		}
		next := wallloss.AddYears(c.Design.Local.Date, max(years, 0))
		if r.NextInspection == nil || next.Before(*r.NextInspection) {
			r.NextInspection, r.NextBasis = &next, wallloss.Basis{Kind: wallloss.BasisLocalDamage, Years: life}
		}
	}
}

// withLocalDamage ranks a CML by the more urgent of its wall result and its
// component's local-damage life.
func withLocalDamage(c *Component, k wallloss.Ranked) wallloss.Ranked {
	life, ok := c.LocalLifeY()
	switch {
	case !ok || k.Class == wallloss.AtOrBelowRequired:
	case life <= 0:
		k.Class, k.LifeY = wallloss.AtOrBelowRequired, 0
	case k.Class == wallloss.FiniteLife:
		k.LifeY = min(k.LifeY, life)
	default:
		k.Class, k.LifeY = wallloss.FiniteLife, life
	}
	return k
}
