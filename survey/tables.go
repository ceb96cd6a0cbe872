package survey

import (
	"strings"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"
	"github.com/yuin/goldmark/util"
)

// tableBlock is a GFM table of the checklist: its header line, then its
// rows, kept as the lines of the source they are (rows, not Lines, which
// goldmark would read as text). It takes the place of
// goldmark's table extension, which builds a node for every cell and parses
// inline Markdown in each, though the reader takes every cell from the
// source (splitRow): a table block is raw, so goldmark parses nothing inside
// it.
type tableBlock struct {
	ast.BaseBlock
	columns int // cells of the delimiter row; the header has at most as many
	rows    []text.Segment
}

// kindTableBlock is the goldmark node kind of a tableBlock.
var kindTableBlock = ast.NewNodeKind("LosslineTable")

// Kind implements ast.Node.
func (t *tableBlock) Kind() ast.NodeKind { return kindTableBlock }

// IsRaw implements ast.Node: goldmark leaves the lines unparsed.
func (t *tableBlock) IsRaw() bool { return true }

// Dump implements ast.Node.
func (t *tableBlock) Dump(source []byte, level int) { ast.DumpHelper(t, source, level, nil, nil) }

// tableFinder turns paragraphs into tables where goldmark's GFM table
// extension (v1.8) does: at the first line that is a delimiter row (cells
// of -, optionally starting or ending with :) under a header line of no more
// cells than it. Lines before the header stay a paragraph.
type tableFinder struct{}

// Transform implements parser.ParagraphTransformer.
func (tableFinder) Transform(node *ast.Paragraph, reader text.Reader, _ parser.Context) {
	src := reader.Source()
	lines := node.Lines()
	for i := 1; i < lines.Len(); i++ {
		delimiter, header := lines.At(i), lines.At(i-1)
		cols := delimiterRowCells(delimiter.Value(src))
		if cols == 0 {
			continue
		}
		if gfmCellCount(header.Value(src)) > cols {
			return
		}
		t := &tableBlock{columns: cols, rows: make([]text.Segment, 0, lines.Len()-i)}
		t.SetPos(node.Pos())
		t.rows = append(t.rows, header)
		t.rows = append(t.rows, lines.Sliced(i+1, lines.Len())...)
		lines.SetSliced(0, i-1)
		node.Parent().InsertAfter(node.Parent(), node, t)
		if lines.Len() == 0 {
			node.Parent().RemoveChild(node.Parent(), node)
		} else {
			last := lines.At(i - 2)
			last.Stop-- // the paragraph's last newline
			lines.Set(i-2, last)
		}
		return
	}
}

// delimiterRowCells is the number of cells of a table's delimiter row, or 0
// when line is none: at most three columns of indent, only spaces, -, | and
// :, not only -, and between the pipes cells of one or more - with an
// optional : at either end (outer empty cells dropped).
func delimiterRowCells(line []byte) int {
	if w, _ := util.IndentWidth(line, 0); w > 3 {
		return 0
	}
	dashes := true
	for _, b := range line {
		if b != '-' {
			dashes = false
		}
		if !util.IsSpace(b) && b != '-' && b != '|' && b != ':' {
			return 0
		}
	}
	if dashes {
		return 0
	}
	n, start := 0, 0
	first := true
	for i := 0; i <= len(line); i++ {
		if i < len(line) && line[i] != '|' {
			continue
		}
		cell := line[start:i]
		start = i + 1
		last := i == len(line)
		if (first || last) && util.IsBlank(cell) {
			first = false
			continue
		}
		first = false
		if !delimiterCell(cell) {
			return 0
		}
		n++
	}
	return n
}

// delimiterCell reports whether a delimiter row's cell is -, :-, -: or :-:
// (any number of -) with spaces around.
func delimiterCell(cell []byte) bool {
	cell = util.TrimRightSpace(util.TrimLeftSpace(cell))
	if len(cell) > 0 && cell[0] == ':' {
		cell = cell[1:]
	}
	if len(cell) > 0 && cell[len(cell)-1] == ':' {
		cell = cell[:len(cell)-1]
	}
	if len(cell) == 0 {
		return false
	}
	for _, b := range cell {
		if b != '-' {
			return false
		}
	}
	return true
}

// gfmCells appends to dst the cells of a table line as goldmark's table
// extension splits them: spaces (ASCII) trimmed from the line, one leading
// and one trailing pipe dropped, cells ended by a pipe not after a
// backslash, each trimmed of spaces as the reader trims cell text.
func gfmCells(dst []string, line string) []string {
	start, end := 0, len(line)
	for start < end && util.IsSpace(line[start]) {
		start++
	}
	for end > start && util.IsSpace(line[end-1]) {
		end--
	}
	line = line[start:end]
	pos, limit := 0, len(line)
	if limit > 0 && line[0] == '|' {
		pos++
	}
	if limit > 0 && line[limit-1] == '|' {
		limit--
	}
	for pos < limit {
		closure := pos
		for ; closure < limit; closure++ {
			if line[closure] == '|' && (closure == 0 || line[closure-1] != '\\') {
				break
			}
		}
		dst = append(dst, strings.TrimSpace(line[pos:closure]))
		pos = closure + 1
	}
	return dst
}

// gfmCellCount is len(gfmCells(nil, line)) without building the cells.
func gfmCellCount(line []byte) int {
	var buf [16]string
	return len(gfmCells(buf[:0], string(line)))
}
