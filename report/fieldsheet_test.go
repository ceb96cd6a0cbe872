package report

import (
	"bytes"
	"encoding/csv"
	"math"
	"strings"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
)

var sheetDay = time.Date(2027, 3, 1, 0, 0, 0, 0, time.UTC)

// The demo's T1-04 (12.20 mm 2014-09-10, 11.48 mm 2019-09-12, 10.41 mm
// 2026-11-18; rate model max) by hand: long-term (12.20 − 10.41) / (4452 /
// 365.25) = 0.146855 mm/y, short-term (11.48 − 10.41) / (2624 / 365.25) =
// 0.148940 mm/y, the larger governs; projected to 2027-03-01, 103 days on:
// 10.41 − 0.148940 × 103 / 365.25 = 10.367999 mm (API 570 §7.1.1 rates).
func TestFieldSheetRows(t *testing.T) {
	fs := BuildFieldSheet(demo(t), sheetDay, Display{})
	rows := map[string]SheetRow{}
	n := 0
	for _, c := range fs.Components {
		for _, r := range c.Rows {
			rows[r.CML] = r
			n++
		}
	}
	if n != 35 {
		t.Errorf("%d rows, want the demo checklist's 35 CMLs", n)
	}
	r := rows["T1-04"]
	if r.Previous == nil || r.Previous.Date.String() != "2019-09-12" || r.Previous.MM != 11.48 ||
		r.Last == nil || r.Last.Date.String() != "2026-11-18" || r.Last.MM != 10.41 {
		t.Errorf("T1-04 visits: %+v %+v", r.Previous, r.Last)
	}
	if r.ProjectedMM == nil || math.Abs(*r.ProjectedMM-10.367999) > 1e-6 {
		t.Errorf("T1-04 projected %v, want 10.367999", r.ProjectedMM)
	}
	if r := rows["T1-02"]; r.Last == nil || r.Last.MM != 10.96 {
		t.Errorf("T1-02 last reading %+v, want the governing 10.96 of 11.02 10.96 11.10", r.Last)
	}
	if r := rows["A-01"]; r.Previous == nil || r.Previous.Date.Time.Year() != 2022 {
		t.Errorf("A-01 (A-1 in the 2022 survey) previous visit %+v", r.Previous)
	}
	if r := rows["N5-01"]; r.Previous != nil || r.Last == nil {
		t.Errorf("N5-01, read once: %+v %+v", r.Previous, r.Last)
	}
}

func TestFieldSheetCSVAndXLSX(t *testing.T) {
	fs := BuildFieldSheet(demo(t), sheetDay, Display{})
	data, err := FieldSheetCSV(fs)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasPrefix(data, []byte("\uFEFFasset,component,CML,location,previous date,previous (mm),last date,last (mm),projected 2027-03-01 (mm),required (mm),date,reading (mm),remarks\r\n")) &&
		!bytes.HasPrefix(data, []byte("\uFEFFasset,component,CML,location,previous date,previous (mm),last date,last (mm),projected 2027-03-01 (mm),required (mm),date,reading (mm),remarks\n")) {
		t.Errorf("CSV header: %q", data[:min(200, len(data))])
	}
	recs, err := csv.NewReader(bytes.NewReader(data[3:])).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	found := false
	for _, rec := range recs {
		if rec[2] == "T1-04" {
			found = true
			if got := strings.Join(rec, "|"); got != "Tank T-101|Shell course 1|T1-04|270°, beside nozzle N3|2019-09-12|11.48|2026-11-18|10.41|10.37|9.14|||" {
				t.Errorf("CSV row %s", got)
			}
		}
	}
	if !found || len(recs) != 36 {
		t.Errorf("%d CSV records", len(recs))
	}

	data, err = FieldSheetXLSX(fs)
	if err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	get := func(ref string) string {
		v, err := f.GetCellValue(fieldSheetName, ref, excelize.Options{RawCellValue: true})
		if err != nil {
			t.Fatal(err)
		}
		return v
	}
	if get("C4") != "CML" || get("L4") != "reading (mm)" || get("C8") != "T1-04" || get("I8") != "10.37" {
		t.Errorf("xlsx cells: C4 %q L4 %q C8 %q I8 %q", get("C4"), get("L4"), get("C8"), get("I8"))
	}
	if typ, _ := f.GetCellType(fieldSheetName, "I8"); typ != excelize.CellTypeUnset && typ != excelize.CellTypeNumber {
		t.Errorf("projected thickness is not a number cell: %v", typ)
	}
	style, _ := f.GetCellStyle(fieldSheetName, "K8")
	if st, _ := f.GetStyle(style); st == nil || st.NumFmt != 49 {
		t.Errorf("the date column is not text (@): %+v", st)
	}
	again, _ := FieldSheetXLSX(fs)
	if !bytes.Equal(again, data) {
		t.Errorf("the workbook differs between two runs")
	}
}

func TestFieldSheetPDF(t *testing.T) {
	data, err := FieldSheetPDF(BuildFieldSheet(demo(t), sheetDay, Display{}), "test")
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasPrefix(data, []byte("%PDF-")) {
		t.Errorf("not a PDF")
	}
}
