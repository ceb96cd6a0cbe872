package report

import (
	"bytes"
	"encoding/csv"
	"time"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
)

// FieldSheet is the sheet taken to the field for the next visit: per
// component, each CML of the checklist with its last two readings, its
// thickness projected to Date at its governing rate and the required
// thickness, with room for the new readings and remarks.
type FieldSheet struct {
	Title, Site string
	Date        time.Time   // the projection date, the day the sheet is made
	Units       survey.Unit // of every thickness shown and of the readings to write
	Components  []SheetComponent
}

// SheetComponent is one component's rows.
type SheetComponent struct {
	Asset, Name string
	Rows        []SheetRow
}

// SheetRow is one CML.
type SheetRow struct {
	CML, Location  string
	Previous, Last *SheetVisit // nil when there are fewer visits
	ProjectedMM    *float64
	RequiredMM     *float64
}

// SheetVisit is a visit's date and governing reading.
type SheetVisit struct {
	Date survey.VisitDate
	MM   float64
}

// BuildFieldSheet lays out the field sheet of a survey's findings, projected
// to date at; thicknesses in the display units.
func BuildFieldSheet(f *findings.Findings, at time.Time, disp Display) FieldSheet {
	s := f.Survey
	fs := FieldSheet{Title: s.Title, Site: s.Site, Date: at, Units: disp.resolve(s.Units).Thickness}
	for _, a := range s.Assets {
		for _, c := range a.Components {
			sc := SheetComponent{Asset: a.Name, Name: c.Name}
			for _, m := range c.CMLs {
				if m.File != s.File {
					continue // carried in from an earlier survey: not a row of this checklist
				}
				row := SheetRow{CML: m.ID, Location: m.Location, RequiredMM: c.Design.RequiredMM}
				if n := len(m.Visits); n > 0 {
					row.Last = &SheetVisit{m.Visits[n-1].Date, m.Visits[n-1].Governing()}
					if n > 1 {
						row.Previous = &SheetVisit{m.Visits[n-2].Date, m.Visits[n-2].Governing()}
					}
				}
				if it := f.Item(m); it != nil {
					row.ProjectedMM = it.Result.Projected(at)
				}
				sc.Rows = append(sc.Rows, row)
			}
			if len(sc.Rows) > 0 {
				fs.Components = append(fs.Components, sc)
			}
		}
	}
	return fs
}

// sheetHeader is the header row of the sheet as a table (CSV and .xlsx):
// words lossline import knows for the CML, location, date, reading (with
// its unit) and remarks columns; the others it ignores.
func (fs FieldSheet) sheetHeader() []string {
	u := " (" + string(fs.Units) + ")"
	return []string{"asset", "component", "CML", "location", "previous date", "previous" + u, "last date", "last" + u,
		"projected " + fs.Date.Format(dateLayout) + u, "required" + u, "date", "reading" + u, "remarks"}
}

// Columns of the sheet as a table: those computed, and those filled in the field.
const (
	sheetProjectedCol = 8
	sheetRequiredCol  = 9
	sheetDateCol      = 10
	sheetReadingCol   = 11
	sheetRemarksCol   = 12
)

// sheetThicknessCols are the columns of the sheet as a table that show a
// thickness: previous, last, projected, required.
var sheetThicknessCols = []int{5, 7, sheetProjectedCol, sheetRequiredCol}

// sheetCells is a row's cells as text; numbers with a decimal point.
func (fs FieldSheet) sheetCells(c SheetComponent, r SheetRow) []string {
	thick := func(mm *float64) string {
		if mm == nil {
			return ""
		}
		return fs.Units.Format(*mm)
	}
	visit := func(v *SheetVisit) (string, string) {
		if v == nil {
			return "", ""
		}
		return v.Date.String(), fs.Units.Format(v.MM)
	}
	pd, pv := visit(r.Previous)
	ld, lv := visit(r.Last)
	return []string{c.Asset, c.Name, r.CML, r.Location, pd, pv, ld, lv, thick(r.ProjectedMM), thick(r.RequiredMM), "", "", ""}
}

// FieldSheetCSV renders the sheet as CSV (RFC 4180, UTF-8 with a
// byte-order mark so that spreadsheet programs take it as UTF-8): the
// header row, then a row per CML.
func FieldSheetCSV(fs FieldSheet) ([]byte, error) {
	var b bytes.Buffer
	b.WriteString("\uFEFF")
	w := csv.NewWriter(&b)
	_ = w.Write(fs.sheetHeader())
	for _, c := range fs.Components {
		for _, r := range c.Rows {
			_ = w.Write(fs.sheetCells(c, r))
		}
	}
	w.Flush()
	return b.Bytes(), w.Error()
}
