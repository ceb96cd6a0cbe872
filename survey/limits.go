package survey

import (
	"bytes"
	"fmt"
)

// Limits of a survey.md. The Markdown reader's time and memory grow faster
// than the file on deep nesting, big tables and long runs of Markdown marks;
// a checklist beyond a limit is refused at the line that crosses it, before
// the reader sees it, so that any file read takes seconds at most.
const (
	MaxChecklistBytes = 32 << 20  // 32 MiB
	MaxNesting        = 32        // levels of lists and block quotes
	MaxTableColumns   = 200       // per table
	MaxTableRows      = 100_000   // per table, not counting its header
	MaxTableCells     = 2_000_000 // rows × columns of all tables together (the reader fills short rows)

	// maxMarkWork bounds the work of reading the text inside blocks, which
	// can grow with the number of Markdown marks times the length of the
	// paragraph (or table cell) holding them; maxMarkWorkEach bounds one
	// paragraph. Ordinary text holds a few marks per line and stays far below.
	maxMarkWork     = 3_000_000_000
	maxMarkWorkEach = 1_000_000_000
)

// markChars are the characters that start the reader's scans for links,
// code, emphasis, autolinks and escapes.
const markChars = "[`*_<\\"

// checkLimits scans the checklist's lines once and returns the first limit
// it crosses, or nil. It errs on the side of counting: a line it cannot
// place is counted where it costs more.
func checkLimits(file string, src []byte) *Problem {
	if len(src) > MaxChecklistBytes {
		return &Problem{File: file, Severity: Error,
			Message: fmt.Sprintf("the checklist is %d bytes, more than the %d MiB lossline reads", len(src), MaxChecklistBytes>>20)}
	}
	s := limitScan{file: file}
	for start, n := 0, 1; start < len(src); n++ {
		end := bytes.IndexByte(src[start:], '\n')
		if end < 0 {
			end = len(src)
		} else {
			end += start
		}
		if p := s.line(n, bytes.TrimSuffix(src[start:end], []byte("\r"))); p != nil {
			return p
		}
		start = end + 1
	}
	return s.endUnit()
}

// limitScan is the state of checkLimits between lines.
type limitScan struct {
	file  string
	items []int // content columns of the list items that may be open, innermost last

	unitLine  int   // first line of the paragraph being counted; 0: none
	unitMarks int64 // its Markdown marks
	unitBytes int64 // and length
	work      int64 // marks × bytes of every paragraph and table cell so far

	prev            []byte // the line before, when it may be a table's header
	table           bool   // inside a table's rows
	tableLine       int    // its header's line
	tableCols, rows int
	cells           int64 // of all tables so far
}

func (s *limitScan) fail(line int, format string, args ...any) *Problem {
	return &Problem{File: s.file, Line: line, Severity: Error, Message: fmt.Sprintf(format, args...)}
}

// line takes one line of the checklist.
func (s *limitScan) line(n int, l []byte) *Problem {
	if s.nesting(l) > MaxNesting {
		return s.fail(n, "nesting deeper than %d levels (lists and block quotes)", MaxNesting)
	}
	if isBlankLine(l) {
		s.table = false
		s.prev = nil
		return s.endUnit()
	}
	if s.table {
		if tableRowLine(l) {
			s.rows++
			if s.rows > MaxTableRows {
				return s.fail(n, "table (from line %d) has more than %d rows", s.tableLine, MaxTableRows)
			}
			s.cells += int64(s.tableCols)
			if s.cells > MaxTableCells {
				return s.fail(n, "tables hold more than %d cells in all (rows × columns)", MaxTableCells)
			}
			return s.countCells(n, l)
		}
		s.table = false
	}
	if cols := delimiterCells(l); cols > 0 && s.prev != nil && headerCells(s.prev) == cols {
		if cols > MaxTableColumns {
			return s.fail(n-1, "table has %d columns, more than %d", cols, MaxTableColumns)
		}
		// The header was counted as paragraph text; the rows are cells.
		if p := s.endUnit(); p != nil {
			return p
		}
		s.table, s.tableLine, s.tableCols, s.rows = true, n-1, cols, 0
		s.cells += int64(cols)
		if s.cells > MaxTableCells {
			return s.fail(n, "tables hold more than %d cells in all (rows × columns)", MaxTableCells)
		}
		s.prev = nil
		return nil
	}
	// A heading, a rule or a list item at the margin always ends the
	// paragraph before (a rule or a setext underline makes it a heading);
	// other lines may continue it.
	j, c := skipIndent(l, 0, 0)
	rule := c <= 3 && isThematicBreak(l[j:])
	if rule || startsBlock(l) || isUnderline(l) {
		if p := s.endUnit(); p != nil {
			return p
		}
	}
	if rule {
		s.prev = nil
		return nil
	}
	if s.unitLine == 0 {
		s.unitLine = n
	}
	s.unitMarks += int64(countMarks(l))
	s.unitBytes += int64(len(l)) + 1
	s.prev = nil
	if mayBeHeader(l) {
		s.prev = l
	}
	if p := s.checkUnit(n); p != nil {
		return p
	}
	if isHeadingLine(l) {
		return s.endUnit()
	}
	return nil
}

// checkUnit refuses the paragraph being counted once it alone costs too much.
func (s *limitScan) checkUnit(n int) *Problem {
	if s.unitMarks*s.unitBytes > maxMarkWorkEach {
		return s.fail(s.unitLine, "paragraph of %d bytes (to line %d) with %d Markdown marks (%s) is more than lossline reads; "+
			"split it with blank lines or write fewer marks", s.unitBytes, n, s.unitMarks, markChars)
	}
	return nil
}

// endUnit closes the paragraph being counted and adds its work to the file's.
func (s *limitScan) endUnit() *Problem {
	if s.unitLine == 0 {
		return nil
	}
	line := s.unitLine
	s.work += s.unitMarks * s.unitBytes
	s.unitLine, s.unitMarks, s.unitBytes = 0, 0, 0
	if s.work > maxMarkWork {
		return s.fail(line, "the checklist up to this paragraph holds too many Markdown marks (%s) for its length; "+
			"write fewer marks or shorter paragraphs", markChars)
	}
	return nil
}

// countCells adds the work of a table row's cells, each read on its own.
func (s *limitScan) countCells(n int, l []byte) *Problem {
	var marks, size int64
	for i := 0; i <= len(l); i++ {
		if i == len(l) || l[i] == '|' && (i == 0 || l[i-1] != '\\') {
			s.work += marks * size
			if marks*size > maxMarkWorkEach {
				return s.fail(n, "table cell of %d bytes with %d Markdown marks (%s) is more than lossline reads", size, marks, markChars)
			}
			marks, size = 0, 0
			continue
		}
		size++
		if isMark(l[i]) {
			marks++
		}
	}
	if s.work > maxMarkWork {
		return s.fail(n, "the checklist up to this table row holds too many Markdown marks (%s) for its length", markChars)
	}
	return nil
}

// nesting is the number of block quotes and list items that may hold the
// line. It follows list items by their content columns and closes them only
// at a list marker left of them, so it can count a level that has closed,
// never miss one that is open.
func (s *limitScan) nesting(l []byte) int {
	i, col, quotes, base := 0, 0, 0, 0 // base: the column after the last >
	popped := false
	for quotes+len(s.items) <= MaxNesting {
		j, c := skipIndent(l, i, col)
		if j >= len(l) {
			break
		}
		enclosing := base
		if len(s.items) > 0 {
			enclosing = max(enclosing, s.items[len(s.items)-1])
		}
		if l[j] == '>' && c-enclosing <= 3 {
			quotes++
			i, col = j+1, c+1
			if i < len(l) && l[i] == ' ' {
				i, col = i+1, col+1
			}
			base = col
			continue
		}
		w := listMarker(l[j:])
		if w == 0 || isThematicBreak(l[j:]) {
			break
		}
		if !popped { // the line's first marker closes the items right of it
			for len(s.items) > 0 && s.items[len(s.items)-1] > c {
				s.items = s.items[:len(s.items)-1]
			}
			popped = true
			enclosing = base
			if len(s.items) > 0 {
				enclosing = max(enclosing, s.items[len(s.items)-1])
			}
		}
		if c-enclosing >= 4 { // indented code or paragraph text, not an item
			break
		}
		// Content starts after the marker and one to four spaces.
		k, cc := skipIndent(l, j+w, c+w)
		if cc-(c+w) > 4 || k >= len(l) {
			k, cc = j+w, c+w+1
			if k < len(l) {
				k++
			}
		}
		s.items = append(s.items, cc)
		i, col = k, cc
	}
	return quotes + len(s.items)
}

// skipIndent skips spaces and tabs from l[i], at column col (tabs stop every
// 4 columns), and returns the index and column it stops at.
func skipIndent(l []byte, i, col int) (int, int) {
	for ; i < len(l); i++ {
		switch l[i] {
		case ' ':
			col++
		case '\t':
			col += 4 - col%4
		default:
			return i, col
		}
	}
	return i, col
}

// listMarker is the length of a list marker at the start of l (-, +, * or
// up to nine digits and . or ) followed by a space, a tab or the end), or 0.
func listMarker(l []byte) int {
	w := 0
	switch {
	case len(l) > 0 && (l[0] == '-' || l[0] == '+' || l[0] == '*'):
		w = 1
	default:
		for w < len(l) && w < 9 && l[w] >= '0' && l[w] <= '9' {
			w++
		}
		if w == 0 || w >= len(l) || l[w] != '.' && l[w] != ')' {
			return 0
		}
		w++
	}
	if w < len(l) && l[w] != ' ' && l[w] != '\t' {
		return 0
	}
	return w
}

// isThematicBreak reports whether l is three or more of one of - * _ with
// only spaces or tabs between.
func isThematicBreak(l []byte) bool {
	var ch byte
	count := 0
	for _, b := range l {
		switch {
		case b == ' ' || b == '\t':
		case (b == '-' || b == '*' || b == '_') && (ch == 0 || b == ch):
			ch = b
			count++
		default:
			return false
		}
	}
	return count >= 3
}

// isUnderline reports whether l is a setext heading's underline of = (a
// rule of - is a thematic break): it ends the paragraph before it.
func isUnderline(l []byte) bool {
	j, c := skipIndent(l, 0, 0)
	t := bytes.TrimRight(l[j:], " \t")
	return c <= 3 && len(t) > 0 && len(bytes.Trim(t, "=")) == 0
}

func isBlankLine(l []byte) bool { return len(bytes.TrimLeft(l, " \t")) == 0 }

// isHeadingLine reports whether l is an ATX heading: up to three spaces, one
// to six #, then a space, a tab or the end.
func isHeadingLine(l []byte) bool {
	j, c := skipIndent(l, 0, 0)
	if c > 3 {
		return false
	}
	k := j
	for k < len(l) && l[k] == '#' {
		k++
	}
	return k > j && k-j <= 6 && (k == len(l) || l[k] == ' ' || l[k] == '\t')
}

// startsBlock reports whether l starts a heading or a list item whatever
// comes before it: within three spaces of the margin, a heading, a bullet
// with text after it, or an ordered item numbered 1.
func startsBlock(l []byte) bool {
	if isHeadingLine(l) {
		return true
	}
	j, c := skipIndent(l, 0, 0)
	if c > 3 || isThematicBreak(l[j:]) {
		return false
	}
	w := listMarker(l[j:])
	if w == 0 || isBlankLine(l[j+w:]) {
		return false
	}
	return l[j] == '-' || l[j] == '+' || l[j] == '*' || w == 2 && l[j] == '1'
}

// mayBeHeader reports whether l may be a table's header, the line of a
// paragraph before its delimiter row. Headings, code fences, HTML, rules
// and indented lines are not (so the rows after them count as a paragraph).
func mayBeHeader(l []byte) bool {
	j, c := skipIndent(l, 0, 0)
	if c > 3 || isHeadingLine(l) || isThematicBreak(l[j:]) {
		return false
	}
	return !bytes.HasPrefix(l[j:], []byte("```")) && !bytes.HasPrefix(l[j:], []byte("~~~")) && l[j] != '<'
}

// tableRowLine reports whether l continues a table: it holds a | and starts
// no other block (otherwise it is counted as a paragraph, which costs more).
func tableRowLine(l []byte) bool {
	if bytes.IndexByte(l, '|') < 0 {
		return false
	}
	j, c := skipIndent(l, 0, 0)
	if c > 3 {
		return true
	}
	switch l[j] {
	case '#', '>', '-', '*', '+', '<', '`', '~', '=', '_':
		return false
	}
	return listMarker(l[j:]) == 0
}

// delimiterCells is the number of columns of a table's delimiter row
// (|---|:--:|), as the table extension reads it; 0 when l is none.
func delimiterCells(l []byte) int {
	if j, c := skipIndent(l, 0, 0); c > 3 || j == len(l) {
		return 0
	}
	dashOnly := true
	for _, b := range l {
		switch b {
		case '-':
		case ' ', '\t', '|', ':':
			dashOnly = false
		default:
			return 0
		}
	}
	if dashOnly {
		return 0
	}
	cols := bytes.Split(l, []byte{'|'})
	if isBlankLine(cols[0]) {
		cols = cols[1:]
	}
	if len(cols) > 0 && isBlankLine(cols[len(cols)-1]) {
		cols = cols[:len(cols)-1]
	}
	for _, col := range cols {
		t := bytes.Trim(col, " \t")
		t = bytes.TrimPrefix(t, []byte(":"))
		t = bytes.TrimSuffix(t, []byte(":"))
		if len(t) == 0 || len(bytes.Trim(t, "-")) != 0 {
			return 0
		}
	}
	return len(cols)
}

// headerCells is the number of cells of a table's header row, split at the
// | not escaped by a backslash, as the table extension reads it.
func headerCells(l []byte) int {
	l = bytes.Trim(l, " \t")
	if len(l) == 0 {
		return 0
	}
	pos, limit := 0, len(l)
	if l[0] == '|' {
		pos++
	}
	if limit > pos && l[limit-1] == '|' {
		limit--
	}
	n := 0
	for pos < limit {
		n++
		for pos < limit && !(l[pos] == '|' && (pos == 0 || l[pos-1] != '\\')) {
			pos++
		}
		pos++
	}
	return n
}

// countMarks counts the Markdown marks in l.
func countMarks(l []byte) int {
	n := 0
	for _, b := range l {
		if isMark(b) {
			n++
		}
	}
	return n
}

// isMark reports whether b is one of markChars.
func isMark(b byte) bool {
	switch b {
	case '[', '`', '*', '_', '<', '\\':
		return true
	}
	return false
}
