package report

import "strings"

// column is one column of a table: its heading, width (mm) and alignment
// ("L", "C", "R").
type column struct {
	title string
	width float64
	align string
}

// rowStyle marks a row: bold text and a grey fill (urgent rows). The words in
// the row carry the meaning; the shading only helps the eye.
type rowStyle struct{ bold, shade bool }

const cellPad = 1.2

// table draws rows under a header that is repeated at the top of every page
// the table runs onto. Cells wrap; a row never splits across pages.
func (d *doc) table(cols []column, rows [][]string, style func(i int) rowStyle, size float64) {
	hs := d.headerSize(cols, size)
	d.font("B", hs)
	lh := size * 0.45
	headerH := d.rowHeight(cols, titles(cols), hs*0.45)
	d.need(headerH + lh + 2*cellPad)
	d.tableRow(cols, titles(cols), hs*0.45, headerH, rowStyle{bold: true, shade: true}, hs)
	for i, row := range rows {
		st := rowStyle{}
		if style != nil {
			st = style(i)
		}
		d.font(boldStyle(st.bold), size)
		h := d.rowHeight(cols, row, lh)
		if !d.room(h) {
			d.newPage(d.landscape)
			d.font("B", hs)
			d.tableRow(cols, titles(cols), hs*0.45, headerH, rowStyle{bold: true, shade: true}, hs)
			d.font(boldStyle(st.bold), size)
		}
		d.tableRow(cols, row, lh, h, st, size)
	}
	d.font("", bodySize)
	d.pdf.Ln(2)
}

// headerSize is the largest font size up to size at which no word of any
// column title is wider than its column, so titles wrap only between words.
func (d *doc) headerSize(cols []column, size float64) float64 {
	for ; size > 5.5; size -= 0.25 {
		d.font("B", size)
		fits := true
		for _, c := range cols {
			for _, w := range strings.Fields(c.title) {
				if d.pdf.GetStringWidth(w) > c.width-2*cellPad {
					fits = false
				}
			}
		}
		if fits {
			break
		}
	}
	return size
}

func titles(cols []column) []string {
	t := make([]string, len(cols))
	for i, c := range cols {
		t[i] = c.title
	}
	return t
}

func boldStyle(b bool) string {
	if b {
		return "B"
	}
	return ""
}

// rowHeight is the height of the tallest wrapped cell in the row.
func (d *doc) rowHeight(cols []column, row []string, lh float64) float64 {
	lines := 1
	for i, c := range cols {
		if i < len(row) {
			lines = max(lines, len(d.pdf.SplitText(row[i], c.width-2*cellPad)))
		}
	}
	return float64(lines)*lh + 2*cellPad
}

func (d *doc) tableRow(cols []column, row []string, lh, h float64, st rowStyle, size float64) {
	p := d.pdf
	x0, y := p.GetX(), p.GetY()
	x := x0
	if st.shade {
		p.SetFillColor(228, 228, 228)
	}
	for i, c := range cols {
		p.Rect(x, y, c.width, h, map[bool]string{true: "FD", false: "D"}[st.shade])
		text := ""
		if i < len(row) {
			text = row[i]
		}
		for j, line := range p.SplitText(text, c.width-2*cellPad) {
			p.SetXY(x+cellPad, y+cellPad+float64(j)*lh)
			p.CellFormat(c.width-2*cellPad, lh, line, "", 0, c.align, false, 0, "")
		}
		x += c.width
	}
	p.SetXY(x0, y+h)
}

// keyValues draws a two-column table of labels and values.
func (d *doc) keyValues(pairs [][2]string, labelW float64) {
	cols := []column{{"", labelW, "L"}, {"", d.width() - labelW, "L"}}
	lh := bodySize * 0.45
	for _, kv := range pairs {
		d.font("", bodySize)
		h := d.rowHeight(cols, kv[:], lh)
		d.need(h)
		x0, y := d.pdf.GetX(), d.pdf.GetY()
		d.font("B", bodySize)
		d.tableRow(cols[:1], kv[:1], lh, h, rowStyle{shade: true}, bodySize)
		d.pdf.SetXY(x0+labelW, y)
		d.font("", bodySize)
		d.tableRow(cols[1:], kv[1:], lh, h, rowStyle{}, bodySize)
		d.pdf.SetX(x0)
	}
	d.pdf.Ln(2)
}
