package report

import (
	"bytes"
	"fmt"
	"io"
	"time"

	"github.com/go-pdf/fpdf"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/gobolditalic"
	"golang.org/x/image/font/gofont/goitalic"
	"golang.org/x/image/font/gofont/gomono"
	"golang.org/x/image/font/gofont/goregular"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/photo"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/templates"
)

// Options are the settings the report follows.
type Options struct {
	Display Display
	// Photos are the settings the photos are prepared with, printed in the
	// methods appendix; PreparePhotos prepares them.
	Photos        photo.Settings
	PreparePhotos PhotoStage
	Place         survey.PlaceOptions // how photos were placed, stated in the methods appendix
	Templates     templates.Set
	Created       time.Time // printed as the report date and written as the PDF's creation date
	Version       string    // lossline version, printed on the cover
	// Settings lists every setting the report used, printed in the methods appendix.
	Settings []SettingRow
	// Limits say when the report turns summary-first; zero: DefaultLimits.
	Limits Limits
	// Detail: one detail PDF per asset beside report.pdf (--detail assets).
	Detail bool
	// PhotosApart: the photos go to photos.pdf, which report.pdf refers to.
	PhotosApart bool
}

// SettingRow is one setting as used: its value and its default as text, and
// where the value came from ("built in", file:line, an environment variable
// or a flag).
type SettingRow struct {
	Name, Value, Default, Source string
}

// Page geometry, mm (A4).
const (
	margin     = 15.0
	bottomGap  = 18.0
	lineH      = 4.6
	bodySize   = 9.5
	smallSize  = 8.0
	fontFamily = "go"
	monoFamily = "gomono"
)

// doc is the PDF being written and what the sections share.
type doc struct {
	pdf       textPDF // all text goes through it
	f         *findings.Findings
	s         *survey.Survey
	items     []*survey.Assessed
	opts      Options
	u         units
	landscape bool
	photos    map[string]*photoEntry
	warnings  survey.ProblemList
	toc       *contents           // the printed contents, filled at the end
	figures   []figure            // the photos drawn, in order: figure i+1 is figures[i]
	warnAt    map[string][]string // warning messages by place (file:line, or file alone)
	figPlan   map[string]int      // plannedFigures, computed once
	attn      *attention          // what a summary-first report shows in full; nil: every component in full
	photoBook bool                // this is photos.pdf
	spool     *photoSpool         // the prepared photos until output; nil: no photos
}

// photoEntry is a photo prepared once, however many CMLs show it.
type photoEntry struct {
	key   string // name the image is registered under in the PDF
	photo *survey.Photo
	prep  photo.Prepared
}

// PDF renders report.pdf in memory. Photos that cannot be read are left out
// and come back as warnings, as do checklist lines with characters the
// fonts cannot draw (TextWarnings).
func PDF(f *findings.Findings, opts Options) ([]byte, survey.ProblemList, error) {
	var b bytes.Buffer
	warnings, err := WritePDF(&b, f, opts)
	if err != nil {
		return nil, nil, err
	}
	return b.Bytes(), warnings, nil
}

// WritePDF renders report.pdf to w, summary-first when the survey is over
// the limits of opts.
func WritePDF(w io.Writer, f *findings.Findings, opts Options) (survey.ProblemList, error) {
	d := newDoc(f, opts)
	defer func() { d.spool.close() }() // on the ways out before output
	nComp := 0
	for _, a := range d.s.Assets {
		nComp += len(a.Components)
	}
	if overLimits(d.opts.Limits, len(d.items), nComp) {
		d.attn = d.findAttention()
	}
	if !d.opts.PhotosApart {
		if err := d.prepareAllPhotos(); err != nil {
			return nil, err
		}
	}
	if err := d.sections(); err != nil {
		return nil, err
	}
	return d.warnings, d.output(w)
}

// newDoc starts a PDF with the report's fonts, metadata and footer.
func newDoc(f *findings.Findings, opts Options) *doc {
	if opts.Limits == (Limits{}) {
		opts.Limits = DefaultLimits
	}
	pdf := textPDF{fpdf.New("P", "mm", "A4", "")}
	s := f.Survey
	disp := opts.Display.resolve(s.Units)
	d := &doc{pdf: pdf, f: f, s: s, items: f.Items, opts: opts, u: units{disp.Thickness, disp.Rate}, photos: map[string]*photoEntry{},
		warnings: TextWarnings(s)}
	pdf.SetMargins(margin, margin, margin)
	pdf.SetAutoPageBreak(true, bottomGap)
	pdf.SetCellMargin(0) // tables pad their own cells; SplitText then measures the same width
	// Pages are compressed on output by pageCompressor, with one compressor.
	pdf.SetCompression(false)
	pdf.AddUTF8FontFromBytes(fontFamily, "", goregular.TTF)
	pdf.AddUTF8FontFromBytes(fontFamily, "B", gobold.TTF)
	pdf.AddUTF8FontFromBytes(fontFamily, "I", goitalic.TTF)
	pdf.AddUTF8FontFromBytes(fontFamily, "BI", gobolditalic.TTF)
	pdf.AddUTF8FontFromBytes(monoFamily, "", gomono.TTF)
	pdf.SetTitle(s.Title, true)
	pdf.SetSubject("Corrosion thickness survey: "+s.Site, true)
	pdf.SetAuthor(s.Inspector, true)
	pdf.SetCreator("lossline "+opts.Version, true)
	pdf.SetCreationDate(opts.Created)
	pdf.SetModificationDate(opts.Created)
	pdf.SetCatalogSort(true)
	pdf.AliasNbPages("{nb}")
	pdf.SetFooterFunc(d.footer)
	return d
}

// output writes the finished PDF to w, its pages compressed.
func (d *doc) output(w io.Writer) error {
	defer d.spool.close()
	if err := d.pdf.Error(); err != nil {
		return fmt.Errorf("PDF: %w", err)
	}
	if err := d.pdf.Output(&pageCompressor{w: w, photos: d.spool}); err != nil {
		return fmt.Errorf("PDF: %w", err)
	}
	return nil
}

// sections writes the report's sections in order.
func (d *doc) sections() error {
	d.cover()
	if err := d.cautions(); err != nil {
		return err
	}
	d.summary()
	d.reserveContents()
	d.actionsSection()
	d.electroFindings()
	d.changesSection()
	d.riskSection()
	d.planSection()
	d.ranked()
	d.assets()
	d.unlinkedPhotos()
	d.photoIndex()
	if err := d.methods(); err != nil {
		return err
	}
	d.recordsAppendix()
	d.dataChecks()
	d.writeContents()
	return nil
}

func (d *doc) footer() {
	p := d.pdf
	d.pageMarks()
	p.SetY(-12)
	d.font("", smallSize)
	p.SetTextColor(90, 90, 90)
	w := d.width()
	p.CellFormat(w*0.75, 5, d.footerText(), "", 0, "L", false, 0, "")
	p.CellFormat(w*0.25, 5, fmt.Sprintf("page %d of {nb}", p.PageNo()), "", 0, "R", false, 0, "")
	p.SetTextColor(0, 0, 0)
}

// font sets the body family in a style ("", "B", "I", "BI") and size (pt).
func (d *doc) font(style string, size float64) { d.pdf.SetFont(fontFamily, style, size) }

// newPage starts a page in portrait or landscape.
func (d *doc) newPage(landscape bool) {
	d.landscape = landscape
	if landscape {
		d.pdf.AddPageFormat("L", fpdf.SizeType{Wd: 210, Ht: 297})
	} else {
		d.pdf.AddPageFormat("P", fpdf.SizeType{Wd: 210, Ht: 297})
	}
}

// left is the current left margin.
func (d *doc) left() float64 {
	l, _, _, _ := d.pdf.GetMargins()
	return l
}

// width is the usable text width of the current page.
func (d *doc) width() float64 {
	w, _ := d.pdf.GetPageSize()
	return w - 2*margin
}

// room reports whether h mm fit above the bottom margin.
func (d *doc) room(h float64) bool {
	_, ph := d.pdf.GetPageSize()
	return d.pdf.GetY()+h <= ph-bottomGap
}

// need starts a new page unless h mm fit on this one.
func (d *doc) need(h float64) {
	if !d.room(h) {
		d.newPage(d.landscape)
	}
}

// heading writes a section heading and its outline entry. Level 0 starts a
// new page.
func (d *doc) heading(level int, text string) {
	defer d.noteHeading(level, text)
	switch level {
	case 0:
		d.font("B", 16)
		d.pdf.Bookmark(text, 0, -1)
		d.pdf.MultiCell(0, 8, text, "", "L", false)
		d.pdf.Ln(2)
	case 1:
		d.need(30)
		d.pdf.Ln(3)
		d.font("B", 13)
		d.pdf.Bookmark(text, 1, -1)
		d.pdf.MultiCell(0, 6.5, text, "B", "L", false)
		d.pdf.Ln(2)
	default:
		d.need(20)
		d.pdf.Ln(2)
		d.font("B", 10.5)
		d.pdf.MultiCell(0, 5.5, text, "", "L", false)
		d.pdf.Ln(0.5)
	}
	d.font("", bodySize)
}

// text writes a plain paragraph.
func (d *doc) text(s string) {
	d.font("", bodySize)
	d.pdf.MultiCell(0, lineH, s, "", "L", false)
}
