package report

import (
	"fmt"
	"strings"
	"sync"
	"unicode"
	"unicode/utf8"

	"github.com/go-pdf/fpdf"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/sfnt"
)

// Undrawable is what the PDF shows in place of a character the embedded fonts
// cannot draw.
const Undrawable = "□"

// glyphs answers, once per character, whether the embedded fonts draw it.
// The five Go fonts cover the same characters (checked by a test), so the
// regular face answers for all of them.
var glyphs struct {
	once  sync.Once
	font  *sfnt.Font
	mu    sync.Mutex
	known [0x10000]uint8 // per BMP code point: 0 not asked yet, 1 drawable, 2 not
}

// drawable reports whether the embedded fonts have a glyph for r. Nothing
// outside the Basic Multilingual Plane is: fpdf's UTF-8 fonts index their
// widths by BMP code point and fail on anything beyond.
func drawable(r rune) bool {
	if r >= 0x20 && r < 0x7f {
		return true
	}
	if r < 0x20 || r > 0xffff || (r >= 0x7f && r < 0xa0) {
		return false
	}
	glyphs.once.Do(func() {
		f, err := sfnt.Parse(goregular.TTF)
		if err != nil {
			panic("report: the embedded Go font does not parse: " + err.Error())
		}
		glyphs.font = f
	})
	glyphs.mu.Lock()
	defer glyphs.mu.Unlock()
	if k := glyphs.known[r]; k != 0 {
		return k == 1
	}
	var b sfnt.Buffer
	g, err := glyphs.font.GlyphIndex(&b, r)
	ok := err == nil && g != 0
	glyphs.known[r] = 2
	if ok {
		glyphs.known[r] = 1
	}
	return ok
}

// invisible reports whether r is a formatting character that shows nothing
// by itself (zero-width joiners, direction marks, variation selectors): when
// the fonts lack it, it is left out rather than replaced.
func invisible(r rune) bool {
	return unicode.In(r, unicode.Cf, unicode.Variation_Selector)
}

// fate is what drawableText does with a character.
type fate int

const (
	keep    fate = iota
	space        // a tab becomes a space
	drop         // carriage returns; invisible formatting the fonts lack
	replace      // becomes Undrawable
)

// fateOf decides for the character r decoded from size bytes (a size of 1
// with utf8.RuneError is a byte that is not UTF-8).
func fateOf(r rune, size int) fate {
	switch {
	case r == utf8.RuneError && size == 1:
		return replace
	case r == '\n' || drawable(r):
		return keep
	case r == '\t':
		return space
	case r == '\r' || invisible(r):
		return drop
	}
	return replace
}

// drawableText returns s as the PDF can draw it: every character the
// embedded fonts lack becomes Undrawable, bytes that are not UTF-8 too;
// invisible formatting characters the fonts lack are left out; tabs become
// spaces, carriage returns go and line feeds stay. Text reaches fpdf only
// through it (textPDF).
func drawableText(s string) string {
	i := 0
	for i < len(s) {
		r, size := utf8.DecodeRuneInString(s[i:])
		if fateOf(r, size) != keep {
			break
		}
		i += size
	}
	if i == len(s) {
		return s
	}
	var b strings.Builder
	b.Grow(len(s) + 8)
	b.WriteString(s[:i])
	for i < len(s) {
		r, size := utf8.DecodeRuneInString(s[i:])
		switch fateOf(r, size) {
		case keep:
			b.WriteString(s[i : i+size])
		case space:
			b.WriteByte(' ')
		case replace:
			b.WriteString(Undrawable)
		}
		i += size
	}
	return b.String()
}

// undrawableRunes lists, once each and in order, the characters of s that
// drawableText replaces by Undrawable; utf8.RuneError stands for bytes that
// are not UTF-8.
func undrawableRunes(s string) []rune {
	var out []rune
	for i := 0; i < len(s); {
		r, size := utf8.DecodeRuneInString(s[i:])
		i += size
		if fateOf(r, size) == replace && !containsRune(out, r) {
			out = append(out, r)
		}
	}
	return out
}

func containsRune(rs []rune, r rune) bool {
	for _, x := range rs {
		if x == r {
			return true
		}
	}
	return false
}

// describeRune names a character of undrawableRunes for a message: itself
// when it is visible, and its code point.
func describeRune(r rune) string {
	if r == utf8.RuneError {
		return "a byte that is not UTF-8"
	}
	if unicode.IsGraphic(r) && !unicode.IsSpace(r) && !unicode.In(r, unicode.Mn, unicode.Me) {
		return fmt.Sprintf("character %c (%U)", r, r)
	}
	return fmt.Sprintf("character %U", r)
}

// textPDF is the fpdf document with every method that takes text in its own
// version, which passes the text through drawableText first. The report
// draws through it only, so no text reaches fpdf unchecked.
type textPDF struct{ *fpdf.Fpdf }

// Cell draws text in a cell; see fpdf.
func (p textPDF) Cell(w, h float64, txt string) { p.Fpdf.Cell(w, h, drawableText(txt)) }

// Cellf draws formatted text in a cell; see fpdf.
func (p textPDF) Cellf(w, h float64, format string, args ...any) {
	p.Cell(w, h, fmt.Sprintf(format, args...))
}

// CellFormat draws text in a cell with borders and alignment; see fpdf.
func (p textPDF) CellFormat(w, h float64, txt, border string, ln int, align string, fill bool, link int, linkStr string) {
	p.Fpdf.CellFormat(w, h, drawableText(txt), border, ln, align, fill, link, linkStr)
}

// MultiCell draws wrapped text; see fpdf.
func (p textPDF) MultiCell(w, h float64, txt, border, align string, fill bool) {
	p.Fpdf.MultiCell(w, h, drawableText(txt), border, align, fill)
}

// Write draws flowing text; see fpdf. fpdf's Write takes time in the
// square of the text's length, so long text goes in short pieces.
func (p textPDF) Write(h float64, txt string) {
	for _, piece := range flowPieces(drawableText(txt)) {
		p.Fpdf.Write(h, piece)
	}
}

// Flowing text longer than flowWhole characters is written in pieces of at
// most flowPiece characters.
const (
	flowWhole = 512
	flowPiece = 64
)

// flowPieces cuts long text into pieces that each end after a space or a
// line feed where there is one, so that writing them one after another
// wraps lines as writing the whole would.
func flowPieces(s string) []string {
	if utf8.RuneCountInString(s) <= flowWhole {
		return []string{s}
	}
	var pieces []string
	for len(s) > 0 {
		end, lastBreak, n := len(s), -1, 0
		for i, r := range s {
			if n == flowPiece {
				end = i
				break
			}
			n++
			if r == ' ' || r == '\n' {
				lastBreak = i + 1
			}
		}
		if end < len(s) && lastBreak > 0 {
			end = lastBreak
		}
		pieces = append(pieces, s[:end])
		s = s[end:]
	}
	return pieces
}

// Writef draws formatted flowing text; see fpdf.
func (p textPDF) Writef(h float64, format string, args ...any) {
	p.Write(h, fmt.Sprintf(format, args...))
}

// WriteAligned draws aligned flowing text; see fpdf.
func (p textPDF) WriteAligned(w, h float64, txt, align string) {
	p.Fpdf.WriteAligned(w, h, drawableText(txt), align)
}

// WriteLinkString draws flowing text linked to a URL; see fpdf.
func (p textPDF) WriteLinkString(h float64, txt, target string) {
	for _, piece := range flowPieces(drawableText(txt)) {
		p.Fpdf.WriteLinkString(h, piece, target)
	}
}

// WriteLinkID draws flowing text linked inside the document; see fpdf.
func (p textPDF) WriteLinkID(h float64, txt string, link int) {
	for _, piece := range flowPieces(drawableText(txt)) {
		p.Fpdf.WriteLinkID(h, piece, link)
	}
}

// Text draws text at a position; see fpdf.
func (p textPDF) Text(x, y float64, txt string) { p.Fpdf.Text(x, y, drawableText(txt)) }

// SplitText wraps text to a width, as MultiCell would draw it; see fpdf.
func (p textPDF) SplitText(txt string, w float64) []string {
	return p.Fpdf.SplitText(drawableText(txt), w)
}

// GetStringWidth measures text as it will be drawn; see fpdf.
func (p textPDF) GetStringWidth(s string) float64 { return p.Fpdf.GetStringWidth(drawableText(s)) }

// GetStringSymbolWidth measures text in glyph units as it will be drawn; see fpdf.
func (p textPDF) GetStringSymbolWidth(s string) int {
	return p.Fpdf.GetStringSymbolWidth(drawableText(s))
}

// Bookmark adds an outline entry; see fpdf.
func (p textPDF) Bookmark(txt string, level int, y float64) {
	p.Fpdf.Bookmark(drawableText(txt), level, y)
}

// SetTitle sets the document title; see fpdf.
func (p textPDF) SetTitle(s string, isUTF8 bool) { p.Fpdf.SetTitle(drawableText(s), isUTF8) }

// SetSubject sets the document subject; see fpdf.
func (p textPDF) SetSubject(s string, isUTF8 bool) { p.Fpdf.SetSubject(drawableText(s), isUTF8) }

// SetAuthor sets the document author; see fpdf.
func (p textPDF) SetAuthor(s string, isUTF8 bool) { p.Fpdf.SetAuthor(drawableText(s), isUTF8) }

// SetKeywords sets the document keywords; see fpdf.
func (p textPDF) SetKeywords(s string, isUTF8 bool) { p.Fpdf.SetKeywords(drawableText(s), isUTF8) }

// SetCreator sets the document creator; see fpdf.
func (p textPDF) SetCreator(s string, isUTF8 bool) { p.Fpdf.SetCreator(drawableText(s), isUTF8) }
