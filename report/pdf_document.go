package report

import (
	"fmt"
	"strings"

	"github.com/lossline/lossline/survey"
)

// draftMark is printed on every page, and on the cover, until an approver
// and the approval date are given.
const draftMark = "DRAFT"

// draft reports whether the report is a draft: no dated approval.
func (d *doc) draft() bool { return !d.s.Document.Approved() }

// documentLabel is the document number and revision for the page footer,
// "" when neither is given.
func (d *doc) documentLabel() string {
	doc := d.s.Document
	var parts []string
	if doc.Number != "" {
		parts = append(parts, doc.Number)
	}
	if doc.Revision != "" {
		parts = append(parts, "rev. "+doc.Revision)
	}
	return strings.Join(parts, " ")
}

// pageMarks prints the document number and revision, and the draft mark, in
// the top margin of the current page.
func (d *doc) pageMarks() {
	p := d.pdf
	label := d.documentLabel()
	if label == "" && !d.draft() {
		return
	}
	x, y := p.GetXY()
	w := d.width()
	p.SetXY(margin, 6)
	d.font("", smallSize)
	p.SetTextColor(90, 90, 90)
	p.CellFormat(w/2, 5, label, "", 0, "L", false, 0, "")
	if d.draft() {
		d.font("B", smallSize+1)
		p.SetTextColor(0, 0, 0)
		p.CellFormat(w/2, 5, draftMark+": not approved", "", 0, "R", false, 0, "")
	}
	p.SetTextColor(0, 0, 0)
	p.SetXY(x, y)
}

// documentControl writes the cover's document block: the draft notice,
// number, revision, client and contract, and the sign-off table.
func (d *doc) documentControl() {
	doc := d.s.Document
	p := d.pdf
	if d.draft() {
		d.font("B", 12)
		p.SetLineWidth(0.5)
		p.CellFormat(0, 7, draftMark+" — not approved: no approver and approval date are given", "1", 1, "C", false, 0, "")
		p.SetLineWidth(0.2)
		p.Ln(2)
	}
	var cols []column
	var row []string
	for _, kv := range [][2]string{
		{"Document number", doc.Number}, {"Revision", doc.Revision}, {"Client", doc.Client}, {"Contract or order", doc.Contract},
	} {
		if kv[1] != "" {
			cols, row = append(cols, column{kv[0], 0, "L"}), append(row, kv[1])
		}
	}
	if len(cols) > 0 {
		// One row: the revision takes a narrow column, the others share the rest.
		rest := d.width()
		wide := len(cols)
		for i := range cols {
			if cols[i].title == "Revision" {
				cols[i].width, rest, wide = 20, rest-20, wide-1
			}
		}
		for i := range cols {
			if cols[i].width == 0 {
				cols[i].width = rest / float64(wide)
			}
		}
		d.table(cols, [][]string{row}, nil, bodySize-1)
	}
	if len(doc.SignOff) > 0 {
		rows := make([][]string, len(doc.SignOff))
		for i, s := range doc.SignOff {
			date := "not signed"
			if s.Date != nil {
				date = s.Date.Format(dateLayout)
			}
			rows[i] = []string{roleName(s.Role), s.Name, s.Qualification, date}
		}
		w := d.width()
		d.table([]column{{"Role", 26, "L"}, {"Name", 48, "L"}, {"Qualification or certificate", w - 26 - 48 - 26, "L"}, {"Date", 26, "L"}}, rows, nil, bodySize-1)
	}
}

// roleName is a sign-off role as the cover prints it.
func roleName(role string) string {
	switch role {
	case "prepared":
		return "Prepared by"
	case "reviewed":
		return "Reviewed by"
	case "approved":
		return "Approved by"
	}
	return role
}

// componentRecords are the rows a component's design table gains: the
// instrument used and the repairs recorded.
func (d *doc) componentRecords(c *survey.Component) [][2]string {
	var out [][2]string
	des := c.Design
	if des.Instrument != "" {
		text := des.Instrument
		if in := d.s.Document.InstrumentBySerial(des.Instrument); in != nil {
			text = instrumentText(*in)
		}
		out = append(out, [2]string{"Instrument", text})
	}
	for _, e := range des.Repairs {
		out = append(out, [2]string{"Repaired", d.repairText(c, e)})
	}
	return out
}

// repairText says what a repair was and which readings it leaves out of the
// rates.
func (d *doc) repairText(c *survey.Component, e survey.RepairEvent) string {
	var b strings.Builder
	b.WriteString(e.Date.String())
	if e.What != "" {
		b.WriteString(": " + e.What)
	}
	if len(e.CMLs) > 0 {
		b.WriteString(" (CML " + strings.Join(e.CMLs, ", ") + ")")
	}
	b.WriteString(". ")
	if e.NewMM != nil {
		fmt.Fprintf(&b, "The new thickness %s %s counts as a reading on %s and is the new baseline; ", d.u.thick(e.NewMM), d.u.u, e.Date)
	} else {
		b.WriteString("No new thickness was written: the first reading after it is the new baseline; ")
	}
	var left []string
	for _, m := range c.CMLs {
		if n, rep := survey.UsedReadings(c, m, d.s.Date); rep != nil && rep.Date == e.Date && n > 0 {
			left = append(left, fmt.Sprintf("%s (%s)", m.ID, plural(n, "reading", "readings")))
		}
	}
	if len(left) > 0 {
		b.WriteString("readings taken before it are shown but not used for rates: " + strings.Join(left, ", ") + ".")
	} else {
		b.WriteString("no earlier reading is left out.")
	}
	return b.String()
}

// instrumentText is an instrument in one line.
func instrumentText(in survey.Instrument) string {
	parts := []string{in.Type, "serial " + in.Serial}
	if in.Probe != "" {
		parts = append(parts, "probe "+in.Probe)
	}
	if !in.Calibrated.IsZero() {
		parts = append(parts, "calibrated "+in.Calibrated.Format(dateLayout))
	}
	return strings.TrimPrefix(strings.Join(parts, ", "), ", ")
}

// recordsAppendix writes the instruments table and the repairs recorded
// between visits, when there are any.
func (d *doc) recordsAppendix() {
	doc := d.s.Document
	type repair struct {
		c *survey.Component
		e survey.RepairEvent
	}
	var repairs []repair
	for _, a := range d.s.Assets {
		for _, c := range a.Components {
			for _, e := range c.Design.Repairs {
				repairs = append(repairs, repair{c, e})
			}
		}
	}
	if len(instrumentVisits(d.s)) == 0 && len(repairs) == 0 && len(doc.Revisions) == 0 {
		return
	}
	d.need(60)
	d.heading(1, "Document history, instruments and repairs")
	if len(doc.Revisions) > 0 {
		d.heading(2, "Revision history")
		rows := make([][]string, len(doc.Revisions))
		for i, r := range doc.Revisions {
			rows[i] = []string{r.Revision, r.Date.Format(dateLayout), r.Description}
		}
		d.table([]column{{"Revision", 20, "L"}, {"Date", 26, "L"}, {"Description", d.width() - 46, "L"}}, rows, nil, bodySize-1)
	}
	if visits := instrumentVisits(d.s); len(visits) > 0 {
		d.heading(2, "Instruments, by visit")
		var rows [][]string
		for _, v := range visits {
			for _, in := range v.s.Document.Instruments {
				cal := none
				if !in.Calibrated.IsZero() {
					cal = in.Calibrated.Format(dateLayout)
					if in.Calibrated.Before(v.s.Date.AddDate(-1, 0, 0)) {
						cal += " (over 12 months before the visit)"
					}
				}
				rows = append(rows, []string{v.s.Date.Format(dateLayout) + v.which, in.Type, in.Serial, in.Probe, in.Block, cal, in.Velocity})
			}
		}
		w := d.width()
		d.table([]column{{"Visit", 24, "L"}, {"Type", 28, "L"}, {"Serial", 22, "L"}, {"Probe", 28, "L"}, {"Calibration block", 30, "L"},
			{"Calibrated", 22, "L"}, {"Velocity or mode", w - 154, "L"}}, rows, nil, smallSize)
		d.text("Each visit's instruments as its survey lists them. A calibration older than 12 months at the visit is marked: renewing it every 12 months is common practice; the owner's procedure governs.")
	}
	if len(repairs) > 0 {
		d.heading(2, "Repairs between visits")
		d.text("A repair or replacement written in the checklist (repaired:) starts a new series: readings taken before its date are printed with the readings but not used for any rate, remaining life or next inspection after it; the thickness after the repair counts as a reading on its date and, with the nominal thickness, as the new baseline.")
		d.pdf.Ln(1)
		rows := make([][]string, len(repairs))
		for i, r := range repairs {
			rows[i] = []string{r.c.Asset + " / " + r.c.Name, d.repairText(r.c, r.e)}
		}
		d.table([]column{{"Component", 50, "L"}, {"Repair", d.width() - 50, "L"}}, rows, nil, smallSize)
	}
}

// instrumentVisit is a survey of the series that lists instruments.
type instrumentVisit struct {
	s     *survey.Survey
	which string // " (this)" for this survey's own visit, "" for an earlier one
}

// instrumentVisits are this survey and its earlier ones that list
// instruments, newest first.
func instrumentVisits(s *survey.Survey) []instrumentVisit {
	var out []instrumentVisit
	if len(s.Document.Instruments) > 0 {
		out = append(out, instrumentVisit{s, " (this)"})
	}
	if h := s.History; h != nil {
		for _, e := range h.Earlier {
			if len(e.Document.Instruments) > 0 {
				out = append(out, instrumentVisit{e, ""})
			}
		}
	}
	return out
}

// footerText is the left part of every page's footer: the draft mark, the
// document number and revision (else the title) and the caution.
func (d *doc) footerText() string {
	var parts []string
	if d.draft() {
		parts = append(parts, draftMark)
	}
	if l := d.documentLabel(); l != "" {
		parts = append(parts, l)
	}
	if len(parts) == 0 || d.s.Document.Number == "" {
		parts = append(parts, d.s.Title) // the document number stands for the title when given
	}
	parts = append(parts, "screening calculations, see cautions")
	return strings.Join(parts, " — ")
}
