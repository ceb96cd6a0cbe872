package report

import (
	"strings"

	"github.com/yuin/goldmark"
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/text"
	"github.com/yuin/goldmark/util"
)

// prose parses the report's Markdown texts (templates and checklist notes).
var prose = goldmark.New()

// markdown writes Markdown blocks: headings, paragraphs and bullet lists with
// bold, italic and code inline.
func (d *doc) markdown(src string) {
	source := []byte(src)
	root := prose.Parser().Parse(text.NewReader(source))
	for n := root.FirstChild(); n != nil; n = n.NextSibling() {
		d.mdBlock(n, source, 0)
	}
	d.font("", bodySize)
}

func (d *doc) mdBlock(n ast.Node, src []byte, indent float64) {
	p := d.pdf
	switch n := n.(type) {
	case *ast.Heading:
		size := map[int]float64{1: 13, 2: 11.5}[n.Level]
		if size == 0 {
			size = 10
		}
		d.need(18)
		p.Ln(1.5)
		d.font("B", size)
		p.SetX(d.left() + indent)
		d.inline(n, src, "B", size, lineH+1)
		p.Ln(lineH + 1.5)
	case *ast.Paragraph, *ast.TextBlock:
		p.SetX(d.left() + indent)
		d.inline(n, src, "", bodySize, lineH)
		p.Ln(lineH + 1.2)
	case *ast.List:
		for item := n.FirstChild(); item != nil; item = item.NextSibling() {
			d.bullet(item, src, indent)
		}
		p.Ln(0.8)
	default:
		p.SetX(d.left() + indent)
		d.text(strings.TrimSpace(string(n.Lines().Value(src))))
	}
}

// bullet writes one list item with a hanging indent.
func (d *doc) bullet(item ast.Node, src []byte, indent float64) {
	p := d.pdf
	d.need(lineH * 2)
	d.font("", bodySize)
	p.SetX(d.left() + indent)
	p.CellFormat(4, lineH, "•", "", 0, "L", false, 0, "")
	left := d.left()
	p.SetLeftMargin(left + 4)
	for c := item.FirstChild(); c != nil; c = c.NextSibling() {
		if _, nested := c.(*ast.List); nested {
			p.Ln(lineH)
			d.mdBlock(c, src, 0)
			continue
		}
		d.inline(c, src, "", bodySize, lineH)
	}
	p.SetLeftMargin(left)
	p.Ln(lineH + 0.6)
}

// inline writes the inline content of a block as flowing text.
func (d *doc) inline(block ast.Node, src []byte, base string, size, h float64) {
	var walk func(n ast.Node, style string)
	walk = func(n ast.Node, style string) {
		for c := n.FirstChild(); c != nil; c = c.NextSibling() {
			switch c := c.(type) {
			case *ast.Text:
				d.font(style, size)
				// The segment is the raw source: drop the backslash of an
				// escape ("t\_min" prints "t_min").
				d.pdf.Write(h, string(util.UnescapePunctuations(c.Segment.Value(src))))
				if c.SoftLineBreak() || c.HardLineBreak() {
					d.pdf.Write(h, " ")
				}
			case *ast.String:
				d.font(style, size)
				d.pdf.Write(h, string(c.Value))
			case *ast.Emphasis:
				walk(c, addStyle(style, map[int]string{1: "I", 2: "B"}[c.Level]))
			case *ast.CodeSpan:
				d.pdf.SetFont(monoFamily, "", size*0.95)
				var b strings.Builder
				for t := c.FirstChild(); t != nil; t = t.NextSibling() {
					if tx, ok := t.(*ast.Text); ok {
						b.Write(tx.Segment.Value(src))
					}
				}
				d.pdf.Write(h, b.String())
			default:
				walk(c, style)
			}
		}
	}
	walk(block, base)
}

// addStyle combines font styles: "B" + "I" = "BI".
func addStyle(style, add string) string {
	if strings.Contains(style, add) {
		return style
	}
	if style+add == "IB" {
		return "BI"
	}
	return style + add
}
