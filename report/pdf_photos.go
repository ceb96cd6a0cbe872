package report

import (
	"bytes"
	"fmt"

	"github.com/go-pdf/fpdf"

	"github.com/lossline/lossline/photo"
	"github.com/lossline/lossline/survey"
)

// photoShown is a photo placed in the report, with the CML it belongs to ("" if none).
type photoShown struct {
	entry *photoEntry
	cml   string
	label string // "Before" or "Now" in before/after pairs
}

// PhotoStage prepares photo files for the PDF and hands each result to use in
// the order of srcs, e.g. photo.Stage with the report's photo settings.
type PhotoStage func(srcs []photo.Source, use func(i int, p photo.Prepared, err error))

// prepareAllPhotos has every photo the report shows prepared by
// opts.PreparePhotos and registers each once. A photo that cannot be prepared
// becomes a warning naming the file.
func (d *doc) prepareAllPhotos() error { return d.preparePhotos(nil, true) }

// preparePhotos prepares the photos keep accepts (nil: all), and those
// of earlier visits when before is set.
func (d *doc) preparePhotos(keep func(*survey.Photo) bool, before bool) error {
	var photos []*survey.Photo
	var keys []string
	for _, ph := range d.s.Photos {
		if keep == nil || keep(ph) {
			photos, keys = append(photos, ph), append(keys, ph.Name)
		}
	}
	if h := d.s.History; h != nil && before {
		for _, it := range d.items {
			for _, ph := range h.PreviousPhotos[it.CML] {
				photos, keys = append(photos, ph), append(keys, ph.Name+"@before")
			}
		}
	}
	if len(photos) == 0 {
		return nil
	}
	if d.opts.PreparePhotos == nil {
		return fmt.Errorf("report: %d photos to show and no PreparePhotos in the options", len(photos))
	}
	srcs := make([]photo.Source, len(photos))
	for i, ph := range photos {
		srcs[i] = photo.Source{Path: ph.Path, Hash: ph.Hash, Orientation: ph.Orientation}
	}
	if d.spool == nil {
		spool, err := newPhotoSpool()
		if err != nil {
			return err
		}
		d.spool = spool
	}
	var spoolErr error
	d.opts.PreparePhotos(srcs, func(i int, p photo.Prepared, err error) {
		ph, key := photos[i], keys[i]
		if _, done := d.photos[key]; done || spoolErr != nil {
			return
		}
		if err != nil {
			d.warnings.Warnf(ph.Path, 0, "photo left out of the report: %v", err)
			return
		}
		// The photo waits in the spool file; fpdf holds only its stand-in.
		stand, err := d.spool.add(p.JPEG)
		if err != nil {
			spoolErr = err
			return
		}
		d.pdf.RegisterImageOptionsReader(key, fpdf.ImageOptions{ImageType: "JPG"}, bytes.NewReader(stand))
		d.photos[key] = &photoEntry{key: key, photo: ph, prep: photo.Prepared{Width: p.Width, Height: p.Height}}
	})
	return spoolErr
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
		for j, s := range pair {
			_, h := fit(s.entry.prep, cellW, photoMaxH)
			lines := len(p.SplitText(d.caption(s, len(d.figures)+j+1), cellW))
			rowH = max(rowH, h+2+float64(lines)*captionLine)
		}
		d.need(rowH + 4)
		y := p.GetY()
		for j, s := range pair {
			d.figures = append(d.figures, figure{shown: s, page: p.PageNo()})
			x := margin + float64(j)*(cellW+photoGap)
			w, h := fit(s.entry.prep, cellW, photoMaxH)
			p.ImageOptions(s.entry.key, x+(cellW-w)/2, y, w, h, false, fpdf.ImageOptions{ImageType: "JPG"}, 0, "")
			p.Rect(x+(cellW-w)/2, y, w, h, "D")
			p.SetXY(x, y+h+1.5)
			d.font("", captionSize)
			p.MultiCell(cellW, captionLine, d.caption(s, len(d.figures)), "", "L", false)
		}
		p.SetXY(margin, y+rowH+4)
	}
	d.font("", bodySize)
}

// fit scales a photo into a box of w × h mm, keeping its shape.
func fit(pp photo.Prepared, w, h float64) (float64, float64) {
	ratio := float64(pp.Height) / float64(pp.Width)
	if w*ratio <= h {
		return w, w * ratio
	}
	return h / ratio, h
}

// caption numbers figure n and says which CML, which file, when and where.
func (d *doc) caption(s photoShown, n int) string {
	ph := s.entry.photo
	pl := ph.Placement
	who := "Not placed"
	switch {
	case s.cml != "":
		who = "CML " + s.cml
	case pl.Component != "":
		who = "Component " + pl.Component
	case pl.Asset != "":
		who = "Asset " + pl.Asset
	}
	if s.label != "" {
		who = s.label + ": " + who
	}
	taken := "time not recorded"
	if ph.Taken != nil {
		taken = "taken " + ph.Taken.Format("2006-01-02 15:04")
	}
	text := fmt.Sprintf("Figure %d. %s · %s\n%s · %s", n, who, ph.Name, taken, latLon(ph.GPS))
	switch {
	case s.label != "" || pl.Basis == "" || pl.Basis == survey.PlacedNamed:
	case pl.Placed():
		text += "\nplaced by position: " + pl.Words()
		if pl.DistanceM != nil {
			text += fmt.Sprintf(", %.0f m", *pl.DistanceM)
		}
	default:
		text += "\n" + pl.Words()
		if pl.DistanceM != nil {
			text += fmt.Sprintf(" (nearest CML %.0f m away)", *pl.DistanceM)
		}
	}
	// A warning about the photo itself (its clock, its date) is said where
	// the photo is, in words; its file and the warning's place are in the
	// data checks appendix.
	if ph.Path != "" {
		for _, m := range d.warningsAt(ph.Path, 0) {
			text += "\nNote: " + m
		}
	}
	return text
}

// unlinkedPhotos writes the appendix of photos placed on no CML or
// component: those placed on an asset only, the unplaced ones with the
// reason, and the files skipped.
func (d *doc) unlinkedPhotos() {
	d.chapter(photoMaxH + 50)
	d.heading(0, "Appendix A — Photos not placed on a CML or component")
	if d.opts.PhotosApart && !d.photoBook {
		d.text("The photos are in " + PhotosFile + " beside this report, each captioned with the CML, component or asset it was placed on.")
		return
	}
	shown := d.unplacedPhotos()
	if len(shown) == 0 {
		d.text("Every photo is placed on a CML or component.")
	} else {
		d.text(fmt.Sprintf("%s neither named in a reading table nor close enough to a CML or component to be placed "+
			"on one (placement radius %g m, area margin %g m). Each caption says where the photo was placed, if anywhere, and why.",
			map[bool]string{true: "1 photo is", false: fmt.Sprintf("%d photos are", len(shown))}[len(shown) == 1], d.opts.Place.RadiusM, d.opts.Place.AreaRadiusM))
		d.pdf.Ln(2)
		d.photoGrid(shown)
	}
	if len(d.s.Skipped) > 0 {
		d.pdf.Ln(2)
		d.text(fmt.Sprintf("%s in the photos folder could not be used (listed with the reason in %s).",
			map[bool]string{true: "1 file", false: fmt.Sprintf("%d files", len(d.s.Skipped))}[len(d.s.Skipped) == 1], dataChecksTitle))
	}
}

// unplacedPhotos are the photos placed on no CML or component.
func (d *doc) unplacedPhotos() []photoShown {
	var shown []photoShown
	for _, ph := range d.s.Photos {
		pl := ph.Placement
		if e := d.photos[ph.Name]; e != nil && pl.CML == "" && pl.Component == "" {
			shown = append(shown, photoShown{entry: e})
		}
	}
	return shown
}
