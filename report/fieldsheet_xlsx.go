package report

import (
	"fmt"
	"maps"
	"slices"
	"strconv"

	"github.com/xuri/excelize/v2"
)

// fieldSheetName is the worksheet of the field sheet workbook.
const fieldSheetName = "Field sheet"

// sheetHeaderRow is the row of the column headers; title lines are above it.
const sheetHeaderRow = 4

// FieldSheetXLSX renders the sheet as an .xlsx workbook: two title lines,
// the header row (frozen), then a row per CML, thicknesses as numbers shown
// with the unit's decimals. The cells to fill are shaded; the date column
// is text, so that a date typed there stays as written.
func FieldSheetXLSX(fs FieldSheet) ([]byte, error) {
	f := excelize.NewFile()
	defer f.Close()
	if err := f.SetSheetName("Sheet1", fieldSheetName); err != nil {
		return nil, err
	}
	decimals := "0.00"
	if fs.Units.Decimals() == 3 {
		decimals = "0.000"
	}
	border := []excelize.Border{{Type: "left", Color: "999999", Style: 1}, {Type: "right", Color: "999999", Style: 1},
		{Type: "top", Color: "999999", Style: 1}, {Type: "bottom", Color: "999999", Style: 1}}
	fill := excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"FFF6D5"}}
	styles := map[string]*excelize.Style{
		"title":   {Font: &excelize.Font{Bold: true, Size: 13}},
		"header":  {Font: &excelize.Font{Bold: true}, Border: border, Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"E4E4E4"}}, Alignment: &excelize.Alignment{WrapText: true, Vertical: "top"}},
		"text":    {Border: border},
		"number":  {Border: border, CustomNumFmt: &decimals},
		"date":    {Border: border, Fill: fill, NumFmt: 49}, // 49: text (@)
		"reading": {Border: border, Fill: fill, CustomNumFmt: &decimals},
		"remarks": {Border: border, Fill: fill, Alignment: &excelize.Alignment{WrapText: true}},
	}
	id := map[string]int{}
	for _, name := range slices.Sorted(maps.Keys(styles)) { // in one order, so the file is the same each time
		n, err := f.NewStyle(styles[name])
		if err != nil {
			return nil, err
		}
		id[name] = n
	}
	sh := fieldSheetName
	set := func(col, row int, v any, style string) error {
		ref, err := excelize.CoordinatesToCellName(col, row)
		if err != nil {
			return err
		}
		if v != nil {
			if err := f.SetCellValue(sh, ref, v); err != nil {
				return err
			}
		}
		return f.SetCellStyle(sh, ref, ref, id[style])
	}
	if err := set(1, 1, "Field sheet: "+fs.Title, "title"); err != nil {
		return nil, err
	}
	note := fmt.Sprintf("%s. Projected thickness at %s by each CML's governing rate. Readings in %s, several in one cell separated by spaces; date as YYYY-MM-DD. lossline import reads this sheet back.",
		fs.Site, fs.Date.Format(dateLayout), fs.Units)
	if err := set(1, 2, note, "text"); err != nil {
		return nil, err
	}
	header := fs.sheetHeader()
	for i, h := range header {
		if err := set(i+1, sheetHeaderRow, h, "header"); err != nil {
			return nil, err
		}
	}
	row := sheetHeaderRow
	for _, c := range fs.Components {
		for _, r := range c.Rows {
			row++
			for i, text := range fs.sheetCells(c, r) {
				style := "text"
				var v any = text
				switch {
				case i == sheetDateCol:
					style, v = "date", nil
				case i == sheetReadingCol:
					style, v = "reading", nil
				case i == sheetRemarksCol:
					style, v = "remarks", nil
				case text == "":
					v = nil
				case slices.Contains(sheetThicknessCols, i):
					if x, err := strconv.ParseFloat(text, 64); err == nil {
						style, v = "number", x
					}
				}
				if err := set(i+1, row, v, style); err != nil {
					return nil, err
				}
			}
		}
	}
	widths := []float64{16, 22, 10, 28, 12, 11, 12, 11, 14, 11, 12, 18, 30}
	for i, w := range widths {
		col, _ := excelize.ColumnNumberToName(i + 1)
		if err := f.SetColWidth(sh, col, col, w); err != nil {
			return nil, err
		}
	}
	if err := f.SetPanes(sh, &excelize.Panes{Freeze: true, YSplit: sheetHeaderRow, TopLeftCell: fmt.Sprintf("A%d", sheetHeaderRow+1), ActivePane: "bottomLeft"}); err != nil {
		return nil, err
	}
	landscape := "landscape"
	if err := f.SetPageLayout(sh, &excelize.PageLayoutOptions{Orientation: &landscape}); err != nil {
		return nil, err
	}
	b, err := f.WriteToBuffer()
	if err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}
