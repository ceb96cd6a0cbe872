package report

import (
	"fmt"
	"io"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
)

// WriteAssetPDF writes an asset's detail PDF to w: a title page and the
// cautions, then every component of the asset in full, as report.pdf shows
// them below its thresholds. Rankings, methods and warnings stay in report.pdf.
func WriteAssetPDF(w io.Writer, f *findings.Findings, opts Options, a *survey.Asset) error {
	d := newDoc(f, opts)
	defer func() { d.spool.close() }() // on the ways out before output
	photos := "notes and photos"
	if opts.PhotosApart {
		photos = "notes (the photos are in " + PhotosFile + ")"
	}
	d.titlePage("Detail of "+a.Name, fmt.Sprintf("Every component of %s in full: design data, readings, results, trend, scope, "+
		"%s. The ranking of all CMLs, the plan, the methods and the warnings are in %s, which this file belongs to.", a.Name, photos, PDFFile))
	if err := d.cautions(); err != nil {
		return err
	}
	if !opts.PhotosApart {
		if err := d.preparePhotos(func(ph *survey.Photo) bool { return ph.Placement.Asset == a.Name }, false); err != nil {
			return err
		}
	}
	d.asset(a)
	return d.output(w)
}

// WritePhotosPDF writes photos.pdf to w: the photos report.pdf leaves out
// with Options.PhotosApart, component by component, then those placed on no
// CML or component. Photos that cannot be read come back as warnings.
func WritePhotosPDF(w io.Writer, f *findings.Findings, opts Options) (survey.ProblemList, error) {
	d := newDoc(f, opts)
	defer func() { d.spool.close() }() // on the ways out before output
	d.warnings = nil                   // the text warnings are report.pdf's
	d.photoBook = true
	d.titlePage("Photos", fmt.Sprintf("The photos of the survey, component by component, each captioned with its CML, file, time and position. "+
		"The results they illustrate are in %s, which this file belongs to.", PDFFile))
	if err := d.cautions(); err != nil {
		return nil, err
	}
	if err := d.prepareAllPhotos(); err != nil {
		return nil, err
	}
	for _, a := range d.s.Assets {
		for _, c := range a.Components {
			if shown := d.componentPhotos(c); len(shown) > 0 {
				d.need(photoMaxH + 20)
				d.heading(1, a.Name+" / "+c.Name)
				d.photoGrid(shown)
			}
		}
	}
	d.unlinkedPhotos()
	return d.warnings, d.output(w)
}

// titlePage starts a companion PDF with the survey's title, what the file
// holds, and the date.
func (d *doc) titlePage(what, about string) {
	p := d.pdf
	d.newPage(false)
	p.Bookmark(what, 0, -1)
	p.SetY(28)
	d.font("B", 10)
	p.SetTextColor(80, 80, 80)
	p.CellFormat(0, 6, "CORROSION THICKNESS SURVEY — "+what, "", 1, "L", false, 0, "")
	p.SetTextColor(0, 0, 0)
	d.font("B", 18)
	p.MultiCell(0, 8, d.s.Title, "", "L", false)
	d.font("", 11)
	p.MultiCell(0, 6, d.s.Site+" · survey of "+d.s.Date.Format(dateLayout), "", "L", false)
	p.Ln(4)
	d.text(about)
	d.text("Report produced " + d.opts.Created.Format(dateLayout) + " by lossline " + d.opts.Version + ".")
	p.Ln(6)
}
