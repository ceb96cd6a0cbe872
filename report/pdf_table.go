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
	cols = d.fitWords(cols, rows, size)
	hs := d.headerSize(cols, size)
	d.font("B", hs)
	lh := size * 0.45
	head := d.joinedTitles(cols)
	headerH := d.rowHeight(cols, head, hs*0.45)
	d.need(headerH + lh + 2*cellPad)
	d.tableRow(cols, head, hs*0.45, headerH, rowStyle{bold: true, shade: true}, hs)
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
			d.tableRow(cols, head, hs*0.45, headerH, rowStyle{bold: true, shade: true}, hs)
			d.font(boldStyle(st.bold), size)
		}
		d.tableRow(cols, row, lh, h, st, size)
	}
	d.font("", bodySize)
	d.pdf.Ln(2)
}

// fitWords widens a column whose longest word (in bold, as an urgent row
// prints it) would not fit, so a cell wraps only between words ("immediate",
// "nominal-based", a date stay whole). The width comes from the columns with
// the most room to spare beyond their own longest word; the table's total
// width is unchanged. Where the table has no room to spare, words still break.
func (d *doc) fitWords(cols []column, rows [][]string, size float64) []column {
	d.font("B", size)
	want := make([]float64, len(cols)) // the longest word of each column, padded
	for i, c := range cols {           // a title word too, so the header keeps its size
		for _, w := range strings.Fields(c.title) {
			want[i] = max(want[i], d.pdf.GetStringWidth(w)+2*cellPad)
		}
	}
	for _, row := range rows {
		for i := range min(len(row), len(cols)) {
			for _, w := range strings.Fields(row[i]) {
				want[i] = max(want[i], d.pdf.GetStringWidth(w)+2*cellPad+0.2)
			}
		}
	}
	deficit := 0.0
	for i, c := range cols {
		deficit += max(0, want[i]-c.width)
	}
	if deficit == 0 {
		return cols
	}
	out := append([]column(nil), cols...)
	// spare is what column i can give: its width beyond its own longest word
	// (and never below 4 mm of text).
	spare := func(i int) float64 { return out[i].width - max(want[i], 2*cellPad+4) }
	taken := 0.0
	for taken < deficit-0.01 {
		j := -1
		for i := range out {
			if spare(i) > 0 && (j < 0 || spare(i) > spare(j)) {
				j = i
			}
		}
		if j < 0 {
			break
		}
		t := min(spare(j), deficit-taken, 2.0)
		out[j].width -= t
		taken += t
	}
	for i := range out { // hand it to the columns that need it, in order
		if add := min(want[i]-out[i].width, taken); add > 0 {
			out[i].width += add
			taken -= add
		}
	}
	return out
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

// joinedTitles are the column titles at the current font with each split
// word joined again where it fits the column: "Long- term" gives "Long-term";
// a break-only split, written with a soft hyphen ("Thick\u00ad ness"), gives
// "Thickness" when it fits and "Thick-" over "ness" when it does not.
func (d *doc) joinedTitles(cols []column) []string {
	t := titles(cols)
	for i, c := range cols {
		words := strings.Fields(t[i])
		var out []string
		for k := 0; k < len(words); k++ {
			w := words[k]
			soft := strings.HasSuffix(w, softHyphen)
			if (soft || strings.HasSuffix(w, "-")) && k+1 < len(words) {
				j := w + words[k+1]
				if soft {
					j = strings.TrimSuffix(w, softHyphen) + words[k+1]
				}
				if d.pdf.GetStringWidth(j) <= c.width-2*cellPad {
					w = j
					k++
				}
			}
			out = append(out, strings.ReplaceAll(w, softHyphen, "-"))
		}
		t[i] = strings.Join(out, " ")
	}
	return t
}

// softHyphen in a column title marks where a long word may break.
const softHyphen = "\u00ad"

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
