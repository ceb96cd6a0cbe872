package report

import (
	"bytes"
	"fmt"

	"github.com/go-pdf/fpdf"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
)

// sheetRowHeight is the least height of a row of the printed sheet, mm:
// room to write readings by hand.
const sheetRowHeight = 9.0

// FieldSheetPDF renders the sheet for printing, in the report's fonts and
// tables: landscape A4, a table per component with its header repeated on
// every page, blank cells for the readings and remarks, lines at the top for
// the visit's date, inspector and gauge. version is printed as the creator.
func FieldSheetPDF(fs FieldSheet, version string) ([]byte, error) {
	d := &doc{pdf: textPDF{fpdf.New("L", "mm", "A4", "")}}
	p := d.pdf
	p.SetMargins(margin, margin, margin)
	p.SetAutoPageBreak(true, bottomGap)
	p.SetCellMargin(0)
	p.AddUTF8FontFromBytes(fontFamily, "", goregular.TTF)
	p.AddUTF8FontFromBytes(fontFamily, "B", gobold.TTF)
	p.SetTitle("Field sheet: "+fs.Title, true)
	p.SetCreator("lossline "+version, true)
	p.SetCreationDate(fs.Date)
	p.SetModificationDate(fs.Date)
	p.SetCatalogSort(true)
	p.AliasNbPages("{nb}")
	p.SetFooterFunc(func() {
		p.SetY(-12)
		d.font("", smallSize)
		w := d.width()
		p.CellFormat(w*0.75, 5, fs.Title+" — field sheet, "+fs.Date.Format(dateLayout), "", 0, "L", false, 0, "")
		p.CellFormat(w*0.25, 5, fmt.Sprintf("page %d of {nb}", p.PageNo()), "", 0, "R", false, 0, "")
	})
	d.newPage(true)
	d.heading(0, "Field sheet: "+fs.Title)
	d.text(fs.Site)
	d.pdf.Ln(2)
	d.font("", bodySize)
	p.MultiCell(0, 7, "Visit date: ____________   Inspector: ______________________   Gauge and probe: ______________________   Calibration: ______________", "", "L", false)
	d.text(fmt.Sprintf("Projected: the thickness expected at %s, the current reading less the governing rate times the years since it. "+
		"Thicknesses in %s. Write each reading of a CML in its cell, several separated by spaces; lossline import reads the .xlsx and .csv forms of this sheet back.",
		fs.Date.Format(dateLayout), fs.Units))
	u := " (" + string(fs.Units) + ")"
	cols := []column{{"CML", 20, "L"}, {"location", 52, "L"}, {"previous" + u, 30, "L"}, {"last" + u, 30, "L"},
		{"projected " + fs.Date.Format(dateLayout) + u, 24, "R"}, {"required" + u, 20, "R"}, {"readings" + u, 53, "L"}, {"remarks", 38, "L"}}
	asset := ""
	for _, c := range fs.Components {
		if c.Asset != asset {
			asset = c.Asset
			d.heading(1, asset)
		}
		d.need(35) // the heading, the table's header and a row together
		d.heading(2, c.Name)
		rows := make([][]string, len(c.Rows))
		for i, r := range c.Rows {
			cells := fs.sheetCells(c, r)
			rows[i] = []string{r.CML, r.Location, sheetVisitText(r.Previous, fs), sheetVisitText(r.Last, fs), cells[sheetProjectedCol], cells[sheetRequiredCol], "", ""}
		}
		d.sheetTable(cols, rows)
	}
	if err := p.Error(); err != nil {
		return nil, fmt.Errorf("field sheet PDF: %w", err)
	}
	var b bytes.Buffer
	if err := p.Output(&b); err != nil {
		return nil, fmt.Errorf("field sheet PDF: %w", err)
	}
	return b.Bytes(), nil
}

// sheetVisitText is a visit as the printed sheet shows it.
func sheetVisitText(v *SheetVisit, fs FieldSheet) string {
	if v == nil {
		return none
	}
	return fs.Units.Format(v.MM) + " (" + v.Date.String() + ")"
}

// sheetTable draws rows of at least sheetRowHeight under a header repeated
// on every page.
func (d *doc) sheetTable(cols []column, rows [][]string) {
	size := smallSize + 0.5
	hs := d.headerSize(cols, size)
	lh := size * 0.45
	headerH := d.rowHeight(cols, titles(cols), hs*0.45)
	header := func() {
		d.font("B", hs)
		d.tableRow(cols, titles(cols), hs*0.45, headerH, rowStyle{bold: true, shade: true}, hs)
	}
	d.need(headerH + sheetRowHeight)
	header()
	for _, row := range rows {
		d.font("", size)
		h := max(d.rowHeight(cols, row, lh), sheetRowHeight)
		if !d.room(h) {
			d.newPage(true)
			header()
			d.font("", size)
		}
		d.tableRow(cols, row, lh, h, rowStyle{}, size)
	}
	d.font("", bodySize)
	d.pdf.Ln(2)
}
