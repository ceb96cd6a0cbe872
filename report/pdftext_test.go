package report

import (
	"bytes"
	"strings"
	"testing"
	"time"
	"unicode/utf8"

	"github.com/go-pdf/fpdf"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/gobolditalic"
	"golang.org/x/image/font/gofont/goitalic"
	"golang.org/x/image/font/gofont/gomono"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/sfnt"

	"github.com/lossline/lossline/survey"
)

// hasGlyph asks a font directly, without drawable's cache.
func hasGlyph(t testing.TB, f *sfnt.Font, r rune) bool {
	var b sfnt.Buffer
	g, err := f.GlyphIndex(&b, r)
	if err != nil {
		t.Fatalf("glyph index of %U: %v", r, err)
	}
	return g != 0
}

func parseFont(t testing.TB, ttf []byte) *sfnt.Font {
	f, err := sfnt.Parse(ttf)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// drawable asks the regular face only; every face the report embeds must
// draw exactly the same characters for that to hold.
func TestGoFontsCoverTheSameRunes(t *testing.T) {
	regular := parseFont(t, goregular.TTF)
	faces := map[string]*sfnt.Font{
		"bold": parseFont(t, gobold.TTF), "italic": parseFont(t, goitalic.TTF),
		"bold italic": parseFont(t, gobolditalic.TTF), "mono": parseFont(t, gomono.TTF),
	}
	for r := rune(0); r <= 0xffff; r++ {
		want := hasGlyph(t, regular, r)
		for name, f := range faces {
			if hasGlyph(t, f, r) != want {
				t.Fatalf("%U: regular has a glyph %v, %s differs", r, want, name)
			}
		}
		if r >= 0x20 && (r < 0x7f || r >= 0xa0) && drawable(r) != want {
			t.Fatalf("drawable(%U) = %v, the font says %v", r, drawable(r), want)
		}
	}
	if !drawable([]rune(Undrawable)[0]) {
		t.Errorf("the replacement %s cannot be drawn itself", Undrawable)
	}
}

func TestDrawableText(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"", ""},
		{"Shell course 1, 9.6 mm ≤ 10 µm ± 0.2 — °C • “x” €", "Shell course 1, 9.6 mm ≤ 10 µm ± 0.2 — °C • “x” €"},
		{"calibrated 🙂 first", "calibrated □ first"},
		{"C2🚀", "C2□"},
		{"flag 🇩🇪", "flag □□"},
		{"family 👨\u200d👩\u200d👧", "family □□□"}, // joiners show nothing and go
		{"heart \u2764\ufe0f", "heart □"},        // no heart in the font; the variation selector goes
		{"thumb 👍🏽", "thumb □□"},                 // the skin tone is a character of its own
		{"e\u0301", "e□"},                        // a combining mark the font lacks
		{"שלום עולם", "□□□□ □□□□"},               // right-to-left script the font lacks
		{"\u202eevil", "evil"},                   // a direction override shows nothing
		{"a\x00b", "a□b"},
		{"bad \xff\xfe bytes", "bad □□ bytes"},
		{"tab\there\r\nnext", "tab here\nnext"},
		{"\x7f\u0085", "□□"},
		{"\ufffd kept", "\ufffd kept"}, // a real replacement character is drawn as such
	} {
		if got := drawableText(c.in); got != c.want {
			t.Errorf("drawableText(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}

func TestChecklistTextWarnsAtTheLine(t *testing.T) {
	src := "---\ntitle: T 🙂\n---\n\nplain line\n| C2🚀 | 9.7 |\nשלום 👍\n\xff\n"
	got := checklistText("s/survey.md", []byte(src))
	want := []string{
		"s/survey.md:2: warning: character 🙂 (U+1F642) cannot be drawn in the PDF; it will show as □",
		"s/survey.md:6: warning: character 🚀 (U+1F680) cannot be drawn in the PDF; it will show as □",
		"s/survey.md:7: warning: these cannot be drawn in the PDF and will show as □: character ש (U+05E9), character ל (U+05DC), character ו (U+05D5), 2 more",
		"s/survey.md:8: warning: a byte that is not UTF-8 cannot be drawn in the PDF; it will show as □",
	}
	if len(got) != len(want) {
		t.Fatalf("got %d warnings, want %d:\n%v", len(got), len(want), got)
	}
	for i := range want {
		if got[i].String() != want[i] {
			t.Errorf("warning %d:\n got %s\nwant %s", i, got[i], want[i])
		}
	}
	s := &survey.Survey{File: "new.md", Source: []byte("ok\n"), History: &survey.History{
		Earlier: []*survey.Survey{{File: "old.md", Source: []byte("x\ny 🙂\n")}}}}
	if ws := TextWarnings(s); len(ws) != 1 || ws[0].File != "old.md" || ws[0].Line != 2 {
		t.Errorf("earlier survey's checklist: %v", ws)
	}
}

func TestFlowPieces(t *testing.T) {
	short := strings.Repeat("word ", 100)
	if got := flowPieces(short); len(got) != 1 || got[0] != short {
		t.Errorf("%d runes cut into %d pieces", len(short), len(got))
	}
	long := strings.Repeat("wörd ", 300) + strings.Repeat("x", 200) + "\nend"
	pieces := flowPieces(long)
	if strings.Join(pieces, "") != long {
		t.Fatal("pieces do not join to the text")
	}
	for i, p := range pieces[:len(pieces)-1] {
		n := utf8.RuneCountInString(p)
		if n > flowPiece || (!strings.HasSuffix(p, " ") && !strings.HasSuffix(p, "\n") && n != flowPiece) {
			t.Errorf("piece %d (%d runes) %q", i, n, p)
		}
	}
}

// A long paragraph takes time in proportion to its length: fpdf's Write
// alone takes minutes on this one.
func TestLongParagraphIsFast(t *testing.T) {
	p := newTextPDF()
	start := time.Now()
	p.Write(5, strings.Repeat("Pitting on the north side, ", 8000)) // 216 000 characters
	if err := p.Error(); err != nil {
		t.Fatal(err)
	}
	if took := time.Since(start); took > 10*time.Second {
		t.Errorf("took %v", took)
	}
}

// newTextPDF is a document with the regular face set, ready for text.
func newTextPDF() textPDF {
	p := textPDF{fpdf.New("P", "mm", "A4", "")}
	p.AddUTF8FontFromBytes(fontFamily, "", goregular.TTF)
	p.SetFont(fontFamily, "", 10)
	p.AddPage()
	return p
}

// drawText passes s through every textPDF method that takes text; fpdf must
// neither panic nor fail.
func drawText(t testing.TB, p textPDF, s string) {
	p.SetTitle(s, true)
	p.SetAuthor(s, true)
	p.Bookmark(s, 0, -1)
	p.CellFormat(40, 5, s, "", 1, "L", false, 0, "")
	p.MultiCell(60, 5, s, "", "L", false)
	p.Write(5, s)
	p.Text(20, 200, s)
	_ = p.SplitText(s, 30)
	_ = p.GetStringWidth(s)
	if err := p.Error(); err != nil {
		t.Fatalf("drawing %q: %v", s, err)
	}
}

var fuzzSeeds = []string{
	"", "plain ASCII", "calibrated 🙂 first", "🇩🇪", "👨\u200d👩\u200d👧", "\u2764\ufe0f", "👍🏽",
	"e\u0301 a\u0308 \u20dd", "שלום עולם", "مرحبا", "\u202eevil\u202c", "a\x00b", "\xff\xfe\xfd",
	"\xed\xa0\x80", // an encoded surrogate: not UTF-8
	"tab\there\r\n", "µ° ± ≤ — •", "漢字", "\U0010ffff", "\ufffd", "{nb}",
}

// Every seed drawn into one document that is then written whole.
func TestSeedsMakeAPDF(t *testing.T) {
	p := newTextPDF()
	for _, s := range fuzzSeeds {
		drawText(t, p, s)
	}
	var b bytes.Buffer
	if err := p.Output(&b); err != nil || b.Len() == 0 {
		t.Fatalf("PDF: %v", err)
	}
}

// FuzzDrawableText: drawableText never panics, returns UTF-8 of characters
// the font has only, is idempotent, and what it returns never makes fpdf
// panic. One document takes many inputs (a new one every 200), so the
// fuzzer runs fast; TestSeedsMakeAPDF writes a document out.
func FuzzDrawableText(f *testing.F) {
	for _, seed := range fuzzSeeds {
		f.Add(seed)
	}
	regular := parseFont(f, goregular.TTF)
	var doc textPDF
	inputs := 0
	f.Fuzz(func(t *testing.T, s string) {
		out := drawableText(s)
		if !utf8.ValidString(out) {
			t.Fatalf("drawableText(%q) = %q: not UTF-8", s, out)
		}
		for _, r := range out {
			if r != '\n' && (r < 0x20 || r > 0xffff || !hasGlyph(t, regular, r)) {
				t.Fatalf("drawableText(%q) = %q holds %U, which the font cannot draw", s, out, r)
			}
		}
		if again := drawableText(out); again != out {
			t.Fatalf("drawableText not idempotent: %q, then %q", out, again)
		}
		if strings.Count(out, Undrawable) < len(undrawableRunes(s)) {
			t.Fatalf("drawableText(%q) = %q replaced fewer characters than undrawableRunes lists", s, out)
		}
		if inputs%200 == 0 {
			doc = newTextPDF()
		}
		inputs++
		drawText(t, doc, s)
	})
}
