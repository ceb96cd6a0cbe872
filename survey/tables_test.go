package survey

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/yuin/goldmark"
	meta "github.com/yuin/goldmark-meta"
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/extension"
	east "github.com/yuin/goldmark/extension/ast"
	"github.com/yuin/goldmark/text"
)

// gfmReference is goldmark with its own GFM table extension (v1.8), the
// reference tableFinder must agree with, and the front matter the reader takes.
var gfmReference = goldmark.New(goldmark.WithExtensions(meta.Meta, extension.Table))

// foundTable is a table as a list of rows, the header first: each row's
// offset in the source and its cells' text.
type foundTable []foundRow

type foundRow struct {
	start int
	cells []string
}

// blocksAndTables lists the block nodes of a parsed document (kind, first
// line's offsets, number of lines) outside tables, and the tables.
func blocksAndTables(doc ast.Node, src []byte) ([]string, []foundTable) {
	var blocks []string
	var tables []foundTable
	_ = ast.Walk(doc, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if !entering || n.Type() != ast.TypeBlock {
			return ast.WalkContinue, nil
		}
		switch n := n.(type) {
		case *east.Table:
			var t foundTable
			for row := n.FirstChild(); row != nil; row = row.NextSibling() {
				r := foundRow{start: row.Pos()}
				for cell := row.FirstChild(); cell != nil; cell = cell.NextSibling() {
					v := ""
					if cell.Lines().Len() > 0 {
						seg := cell.Lines().At(0)
						v = strings.TrimSpace(string(seg.Value(src)))
					}
					r.cells = append(r.cells, v)
				}
				t = append(t, r)
			}
			tables = append(tables, t)
			blocks = append(blocks, "table")
			return ast.WalkSkipChildren, nil
		case *tableBlock:
			var t foundTable
			text := string(src)
			for _, row := range n.rows {
				start := row.Start
				line := text[start:]
				if j := strings.IndexByte(line, '\n'); j >= 0 {
					line = line[:j]
				}
				cells := gfmCells(nil, line)
				for len(cells) < n.columns {
					cells = append(cells, "")
				}
				t = append(t, foundRow{start: start, cells: cells[:n.columns]})
			}
			tables = append(tables, t)
			blocks = append(blocks, "table")
			return ast.WalkSkipChildren, nil
		}
		desc := n.Kind().String()
		if l := n.Lines(); l.Len() > 0 {
			desc += fmt.Sprintf(" %d-%d ×%d", l.At(0).Start, l.At(l.Len()-1).Stop, l.Len())
		}
		blocks = append(blocks, desc)
		return ast.WalkContinue, nil
	})
	return blocks, tables
}

// tableSourceFragments are lines random checklists are made of: headers and
// delimiter rows that do and do not match, rows of every shape, escaped
// pipes, `||`, spaces goldmark does not trim (vertical tab, form feed,
// no-break space), tabs, list items and block quotes around tables.
var tableSourceFragments = []string{
	"| CML | location | 2016-05-10 | 2021-05-12 |",
	"CML | location | 2021-05-12",
	"| CML | 2021 |",
	"| CML |",
	"|---|---|---|---|",
	"|:--|:-:|--:|---|",
	" --- | :---: | ---",
	"|---|---|",
	"| - |",
	"|-|-|-|-|-|",
	"| :: | --- |",
	"|--- --|---|",
	"| C1 | top | 9.9 | 9.8 |",
	"| C2 | a \\| b | 9.9 | - |",
	"C3 | side | 9.9 9.7 | 9.6",
	"| C4 | `x \\| y` | 9.9 ||",
	"| C5 | far | 9.9 | 9.8 | 9.7 | 9.6 |",
	"| C6 |",
	"|",
	"||",
	"| C7 | \u00a0 | 9.9 | 9.8 |\u00a0",
	"\u00a0| C8 | x | 9.9 | 9.8 |",
	"| C9 | x | 9.9 | 9.8 |\v",
	"\f| C10 | x | 9.9 | 9.8 |",
	"\t| C11 | x | 9.9 | 9.8 |",
	"   | C12 | x | 9.9 | 9.8 |  ",
	"    | C13 | indented | 9.9 | 9.8 |",
	"| C14 | x | 9.9 | 9.8 |\r",
	"a paragraph line",
	"text with a | pipe",
	"",
	"",
	"- | CML | 2021 |",
	"  |---|---|",
	"  | C15 | 9.9 |",
	"> | CML | 2021 |",
	"> |---|---|",
	"> | C16 | 9.9 |",
	">| C17 | 9.9 |",
	"- [ ] task | with pipe",
	"1. | CML | x |",
	"# Heading | with | pipes",
	"## C | x |",
	"---",
	"===",
	"```",
	"\\| escaped | start |",
	"| a \\\\| b | c |",
}

func randomTableSource(rng *rand.Rand) string {
	n := 2 + rng.IntN(14)
	lines := make([]string, n)
	for i := range lines {
		lines[i] = tableSourceFragments[rng.IntN(len(tableSourceFragments))]
	}
	return strings.Join(lines, "\n")
}

// tableFinder finds the tables goldmark's GFM table extension finds, in the
// same places, with the same cells, and leaves every other block as that
// extension leaves it. Reference: goldmark v1.8 extension.Table, run on the
// same sources: 5,000 seeded random ones and the demo checklists.
func TestTableFinderAgreesWithGoldmark(t *testing.T) {
	rng := rand.New(rand.NewPCG(17, 1))
	var sources []string
	for range 5000 {
		sources = append(sources, randomTableSource(rng))
	}
	for _, name := range []string{"demo", "demo-2021", "demo-2022"} {
		b, err := readChecklistFile("../testdata/" + name + "/survey.md")
		if err != nil {
			t.Fatal(err)
		}
		sources = append(sources, string(b))
	}
	tablesSeen := 0
	for _, src := range sources {
		b := []byte(src)
		wantBlocks, want := blocksAndTables(gfmReference.Parser().Parse(text.NewReader(b)), b)
		gotBlocks, got := blocksAndTables(markdown.Parser().Parse(text.NewReader(b)), b)
		tablesSeen += len(want)
		if !slices.Equal(gotBlocks, wantBlocks) {
			t.Fatalf("blocks differ for %q:\ngot  %q\nwant %q", src, gotBlocks, wantBlocks)
		}
		if !slices.EqualFunc(got, want, func(a, b foundTable) bool {
			return slices.EqualFunc(a, b, func(x, y foundRow) bool { return x.start == y.start && slices.Equal(x.cells, y.cells) })
		}) {
			t.Fatalf("tables differ for %q:\ngot  %v\nwant %v", src, got, want)
		}
	}
	if tablesSeen < 1000 {
		t.Fatalf("only %d tables in the sources", tablesSeen)
	}
}
