package report

import (
	"bytes"
	"fmt"

	"github.com/go-pdf/fpdf"

	"github.com/lossline/lossline/survey"
)

// photoShown is a photo placed in the report, with the CML it belongs to ("" if none).
type photoShown struct {
	entry *photoEntry
	cml   string
	label string // "Before" or "Now" in before/after pairs
}

// prepareAllPhotos reduces and registers every readable photo once. A photo
// that cannot be decoded becomes a warning naming the file.
func (d *doc) prepareAllPhotos() {
	for _, ph := range d.s.Photos {
		d.preparePhoto(ph, ph.Name)
	}
	if h := d.s.History; h != nil {
		for _, it := range d.items {
			for _, ph := range h.PreviousPhotos[it.CML] {
				d.preparePhoto(ph, ph.Name+"@before")
			}
		}
	}
}

// preparePhoto reduces one photo and registers it under key.
func (d *doc) preparePhoto(ph *survey.Photo, key string) {
	if _, done := d.photos[key]; done {
		return
	}
	e := &photoEntry{key: key, photo: ph}
	e.prep, e.err = preparePhoto(ph.Path, ph.Orientation, d.opts.Photos)
	if e.err != nil {
		d.warnings.Warnf(ph.Path, 0, "photo left out of the report: %v", e.err)
		return
	}
	d.pdf.RegisterImageOptionsReader(key, fpdf.ImageOptions{ImageType: "JPG"}, bytes.NewReader(e.prep.JPEG))
	d.photos[key] = e
}

// Photo grid geometry, mm.
const (
	photoGap    = 6.0
	photoMaxH   = 66.0
	captionSize = 7.5
	captionLine = 3.4
)

// photoGrid places photos two to a row, each with its caption below.
func (d *doc) photoGrid(shown []photoShown) {
	p := d.pdf
	cellW := (d.width() - photoGap) / 2
	for i := 0; i < len(shown); i += 2 {
		pair := shown[i:min(i+2, len(shown))]
		rowH := 0.0
		d.font("", captionSize)
		for _, s := range pair {
			_, h := fit(s.entry.prep, cellW, photoMaxH)
			lines := len(p.SplitText(d.caption(s), cellW))
			rowH = max(rowH, h+2+float64(lines)*captionLine)
		}
		d.need(rowH + 4)
		y := p.GetY()
		for j, s := range pair {
			x := margin + float64(j)*(cellW+photoGap)
			w, h := fit(s.entry.prep, cellW, photoMaxH)
			p.ImageOptions(s.entry.key, x+(cellW-w)/2, y, w, h, false, fpdf.ImageOptions{ImageType: "JPG"}, 0, "")
			p.Rect(x+(cellW-w)/2, y, w, h, "D")
			p.SetXY(x, y+h+1.5)
			d.font("", captionSize)
			p.MultiCell(cellW, captionLine, d.caption(s), "", "L", false)
		}
		p.SetXY(margin, y+rowH+4)
	}
	d.font("", bodySize)
}

// fit scales a photo into a box of w × h mm, keeping its shape.
func fit(pp preparedPhoto, w, h float64) (float64, float64) {
	ratio := float64(pp.Height) / float64(pp.Width)
	if w*ratio <= h {
		return w, w * ratio
	}
	return h / ratio, h
}

// caption says which CML, which file, when and where.
func (d *doc) caption(s photoShown) string {
	ph := s.entry.photo
	who := "Not linked to a CML"
	if s.cml != "" {
		who = "CML " + s.cml
	}
	if s.label != "" {
		who = s.label + ": " + who
	}
	taken := "time not recorded"
	if ph.Taken != nil {
		taken = "taken " + ph.Taken.Format("2006-01-02 15:04")
	}
	return fmt.Sprintf("%s · %s\n%s · %s", who, ph.Name, taken, latLon(ph.GPS))
}

// unlinkedPhotos writes the appendix of photos no CML names.
func (d *doc) unlinkedPhotos() {
	d.newPage(false)
	d.heading(0, "Appendix A — Photos not linked to a CML")
	var shown []photoShown
	for _, ph := range d.s.Photos {
		if e := d.photos[ph.Name]; e != nil && len(ph.CMLs) == 0 {
			shown = append(shown, photoShown{entry: e})
		}
	}
	if len(shown) == 0 {
		d.text("Every photo in the survey's photos folder is named by a CML.")
		return
	}
	d.text(fmt.Sprintf("%d photos in the photos folder are not named in any reading table. They are shown here with their time and position.", len(shown)))
	d.pdf.Ln(2)
	d.photoGrid(shown)
}
