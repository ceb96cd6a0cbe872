package intake

import (
	"regexp"
	"strings"
	"unicode/utf8"

	"github.com/lossline/lossline/survey"
)

// mdTable is a reading table of the checklist's source, cell by cell as
// written, so that it can be written back with columns and rows added and
// its cells re-padded.
type mdTable struct {
	start, end  int    // the header line and the line after the last row (0-based)
	indent      string // before the header's first character
	lead, trail bool   // the header opens and closes with a pipe
	spacedSep   bool   // separator cells written `| --- |`, not `|-----|`
	eol         string // the header's line ending
	header      []string
	seps        []string // separator cells, trimmed
	rows        [][]string
	width       []int // each column's width as written, at least
	rowAt       map[int]int
	changed     bool
}

// separatorLine matches a table's separator row.
var separatorLine = regexp.MustCompile(`^\s*\|?\s*:?-+:?\s*(\|\s*:?-+:?\s*)*\|?\s*$`)

// parseMDTable reads the table holding row line at (0-based): rows are the
// lines that isRow accepts, under a separator and a header line.
func parseMDTable(lines []string, at int, isRow func(int) bool) (*mdTable, bool) {
	sep := at
	for sep >= 0 && isRow(sep) {
		sep--
	}
	if sep < 1 || !separatorLine.MatchString(chomp(lines[sep])) {
		return nil, false
	}
	t := &mdTable{start: sep - 1, rowAt: map[int]int{}}
	end := sep + 1
	for end < len(lines) && isRow(end) {
		end++
	}
	t.end = end
	head := chomp(lines[t.start])
	t.eol = lines[t.start][len(head):]
	t.indent = head[:len(head)-len(strings.TrimLeft(head, " \t"))]
	trimmed := strings.TrimSpace(head)
	t.lead = strings.HasPrefix(trimmed, "|")
	t.trail = strings.HasSuffix(trimmed, "|") && !strings.HasSuffix(trimmed, `\|`)
	t.header = splitCells(head)
	sepText := chomp(lines[sep])
	t.seps = splitCells(sepText)
	t.spacedSep = strings.Contains(sepText, " -") || strings.Contains(sepText, "- ")
	if len(t.seps) != len(t.header) {
		return nil, false
	}
	t.width = make([]int, len(t.header))
	for i, raw := range rawCells(head) {
		if i < len(t.width) {
			t.width[i] = max(0, utf8.RuneCountInString(raw)-2)
		}
	}
	for l := sep + 1; l < end; l++ {
		cells := splitCells(chomp(lines[l]))
		if len(cells) != len(t.header) {
			return nil, false
		}
		t.rowAt[l] = len(t.rows)
		t.rows = append(t.rows, cells)
	}
	return t, true
}

// chomp drops a line's ending.
func chomp(line string) string {
	return strings.TrimRight(line, "\r\n")
}

// rawCells splits a row into its cells as written, padding included, by
// the rule of splitCells.
func rawCells(line string) []string {
	s := strings.TrimSpace(line)
	pos, limit := 0, len(s)
	if limit > 0 && s[0] == '|' {
		pos++
	}
	if limit > pos && s[limit-1] == '|' && (limit < 2 || s[limit-2] != '\\') {
		limit--
	}
	var cells []string
	for pos < limit {
		end := pos
		for ; end < limit; end++ {
			if s[end] == '|' && (end == 0 || s[end-1] != '\\') {
				break
			}
		}
		cells = append(cells, s[pos:end])
		if end == limit-1 {
			cells = append(cells, "")
		}
		pos = end + 1
	}
	return cells
}

// splitCells splits a table row into its cells as the checklist reader
// does (the GFM table extension's rule): one leading and one trailing pipe
// are dropped and a pipe after a backslash does not end a cell.
func splitCells(line string) []string {
	cells := rawCells(line)
	for i, c := range cells {
		cells[i] = strings.TrimSpace(c)
	}
	return cells
}

// column returns the index of the first column whose header names role
// (lower case, as the checklist reader knows them), or -1.
func (t *mdTable) column(names ...string) int {
	for i, h := range t.header {
		for _, n := range names {
			if strings.EqualFold(h, n) {
				return i
			}
		}
	}
	return -1
}

// dateColumn returns the visit column of date d, or -1.
func (t *mdTable) dateColumn(d survey.VisitDate) int {
	for i, h := range t.header {
		if hd, ok := survey.ParseVisitDate(h); ok && hd.Time.Equal(d.Time) && hd.MonthOnly == d.MonthOnly {
			return i
		}
	}
	return -1
}

// addDateColumn inserts the visit column of date d after the table's
// earlier visit columns (before its later ones), or, in a table without
// one, after the CML, was, location and gps columns; it returns its index.
func (t *mdTable) addDateColumn(d survey.VisitDate) int {
	at, later, dated := -1, -1, false
	for i, h := range t.header {
		if hd, ok := survey.ParseVisitDate(h); ok {
			dated = true
			if hd.Time.Before(d.Time) {
				at = i + 1
			} else if later < 0 {
				later = i
			}
		}
	}
	if at < 0 {
		at = later
	}
	if !dated {
		at = 1
		for i, h := range t.header {
			if slicesContainsFold([]string{"cml", "was", "location", "gps"}, h) {
				at = i + 1
			}
		}
	}
	t.insertColumn(at, d.String())
	return at
}

// addColumn appends a column headed h; it returns its index.
func (t *mdTable) addColumn(h string) int {
	t.insertColumn(len(t.header), h)
	return len(t.header) - 1
}

func (t *mdTable) insertColumn(at int, h string) {
	t.header = insertAt(t.header, at, h)
	t.seps = insertAt(t.seps, at, "---")
	t.width = insertAt(t.width, at, 0)
	for i := range t.rows {
		t.rows[i] = insertAt(t.rows[i], at, "")
	}
	t.changed = true
}

// addRow appends a row of empty cells; it returns its index.
func (t *mdTable) addRow() int {
	t.rows = append(t.rows, make([]string, len(t.header)))
	t.changed = true
	return len(t.rows) - 1
}

// set writes text into row r, column c, escaped for a table cell.
func (t *mdTable) set(r, c int, text string) {
	text = strings.Join(strings.Fields(text), " ")
	text = strings.ReplaceAll(text, "|", `\|`)
	if t.rows[r][c] != text {
		t.rows[r][c] = text
		t.changed = true
	}
}

// render writes the table's lines, each column padded to its widest cell
// (or its width as written, when wider).
func (t *mdTable) render() []string {
	w := make([]int, len(t.header))
	for i := range w {
		w[i] = max(t.width[i], utf8.RuneCountInString(t.header[i]), 1)
		for _, r := range t.rows {
			w[i] = max(w[i], utf8.RuneCountInString(r[i]))
		}
	}
	if !t.trail {
		// An empty last cell needs the closing pipe: without it the row would
		// read as a cell short.
		for _, r := range t.rows {
			t.trail = t.trail || r[len(r)-1] == ""
		}
	}
	out := []string{t.line(t.header, w)}
	seps := make([]string, len(t.seps))
	for i, s := range t.seps {
		n := w[i]
		if !t.spacedSep {
			n += 2 // the dashes fill the cell's padding too: |-----|
		}
		left, right := strings.HasPrefix(s, ":"), strings.HasSuffix(s, ":")
		dashes := n
		if left {
			dashes--
		}
		if right {
			dashes--
		}
		seps[i] = strings.Repeat("-", max(dashes, 1))
		if left {
			seps[i] = ":" + seps[i]
		}
		if right {
			seps[i] += ":"
		}
	}
	if t.spacedSep {
		out = append(out, t.line(seps, w))
	} else {
		var b strings.Builder
		b.WriteString(t.indent)
		if t.lead {
			b.WriteString("|")
		}
		b.WriteString(strings.Join(seps, "|"))
		if t.trail {
			b.WriteString("|")
		}
		out = append(out, b.String()+t.eol)
	}
	for _, r := range t.rows {
		out = append(out, t.line(r, w))
	}
	return out
}

// line writes one row, each cell padded to its column's width w.
func (t *mdTable) line(cells []string, w []int) string {
	parts := make([]string, len(cells))
	for i, c := range cells {
		parts[i] = c + strings.Repeat(" ", max(0, w[i]-utf8.RuneCountInString(c)))
	}
	var b strings.Builder
	b.WriteString(t.indent)
	if t.lead {
		b.WriteString("| ")
	}
	b.WriteString(strings.Join(parts, " | "))
	if t.trail {
		b.WriteString(" |")
	}
	return strings.TrimRight(b.String(), " ") + t.eol
}

func insertAt[T any](s []T, at int, v T) []T {
	s = append(s, v)
	copy(s[at+1:], s[at:])
	s[at] = v
	return s
}

func slicesContainsFold(list []string, s string) bool {
	for _, x := range list {
		if strings.EqualFold(x, strings.TrimSpace(s)) {
			return true
		}
	}
	return false
}
