package report

import (
	"strconv"
)

// The printed table of contents. Its pages are reserved where it stands and
// filled once every section is written, by going back to them (fpdf's
// SetPage): the page numbers are then known, and nothing is rendered twice,
// so a large report costs no more than without it.

// contentsEntry is a heading as the contents list it.
type contentsEntry struct {
	level int
	text  string
	page  int
	link  int // internal link to the heading's place
}

// contents is the reserved contents pages and the headings written since.
type contents struct {
	first, pages int     // the reserved pages
	top          float64 // y of the first entry on the first page, mm
	entries      []contentsEntry
}

const (
	contentsTitle = "Contents"
	contentsLine  = 5.2 // mm per entry
	// contentsChapters bounds the chapters besides the assets: summary,
	// changes, risk, repair plan, ranked list, the four appendices.
	contentsChapters = 9
)

// reserveContents starts the contents on a new page and reserves as many
// pages as the chapters and assets need; sections are listed when they fit
// in the same pages.
func (d *doc) reserveContents() {
	d.newPage(false)
	d.heading(0, contentsTitle)
	_, ph := d.pdf.GetPageSize()
	c := d.toc
	if c == nil {
		c = &contents{}
	}
	c.first, c.pages, c.top = d.pdf.PageNo(), 1, d.pdf.GetY()+2
	need := contentsChapters + len(d.s.Assets)
	for float64(need)*contentsLine > c.room(ph, c.pages) {
		d.newPage(false)
		c.pages++
	}
	d.toc = c
}

// room is the height for entries on n reserved pages of height ph.
func (c *contents) room(ph float64, n int) float64 {
	first := ph - bottomGap - c.top
	return first + float64(n-1)*(ph-bottomGap-margin)
}

// noteHeading records a heading of level 0 or 1 for the contents, those
// before the contents pages too.
func (d *doc) noteHeading(level int, text string) {
	if level > 1 || text == contentsTitle {
		return
	}
	if d.toc == nil {
		d.toc = &contents{}
	}
	link := d.pdf.AddLink()
	d.pdf.SetLink(link, d.pdf.GetY(), d.pdf.PageNo())
	d.toc.entries = append(d.toc.entries, contentsEntry{level: level, text: text, page: d.pdf.PageNo(), link: link})
}

// writeContents fills the reserved pages: every chapter, and every section
// too when they all fit. The current page is restored after, so the footer
// of the last page and the page count stay right.
func (d *doc) writeContents() {
	c := d.toc
	if c == nil || c.first == 0 {
		return
	}
	p := d.pdf
	last := p.PageNo()
	_, ph := p.GetPageSize()
	entries := c.entries
	if float64(len(entries))*contentsLine > c.room(ph, c.pages) {
		entries = entries[:0:0]
		for _, e := range c.entries {
			if e.level == 0 {
				entries = append(entries, e)
			}
		}
	}
	auto, gap := p.GetAutoPageBreak()
	p.SetAutoPageBreak(false, gap)
	page, y := c.first, c.top
	p.SetPage(page)
	w := d.width()
	for _, e := range entries {
		if y+contentsLine > ph-bottomGap {
			if page == c.first+c.pages-1 {
				break // never onto a page that is not reserved; the outline lists everything
			}
			page++
			p.SetPage(page)
			y = margin
		}
		indent, style := 0.0, "B"
		if e.level == 1 {
			indent, style = 6, ""
		}
		d.font(style, bodySize)
		n := strconv.Itoa(e.page)
		p.SetXY(margin+indent, y)
		text := e.text
		for p.GetStringWidth(text) > w-indent-20 && len([]rune(text)) > 4 {
			r := []rune(text)
			text = string(r[:len(r)-2]) + "…"
		}
		p.CellFormat(w-indent-14, contentsLine, text, "", 0, "L", false, e.link, "")
		p.CellFormat(14, contentsLine, n, "", 0, "R", false, e.link, "")
		y += contentsLine
	}
	p.SetAutoPageBreak(auto, gap)
	p.SetPage(last)
	d.font("", bodySize)
}

// chapter starts a chapter on portrait pages: on the current page when at
// least minRoom mm are left on it, else on a new one, so that no page is left
// with a few lines only because a chapter began.
func (d *doc) chapter(minRoom float64) {
	onContents := d.toc != nil && d.toc.first > 0 && d.pdf.PageNo() < d.toc.first+d.toc.pages
	if d.landscape || onContents || !d.room(minRoom) {
		d.newPage(false)
		return
	}
	d.pdf.Ln(8)
}
