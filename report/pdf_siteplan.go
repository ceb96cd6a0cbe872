package report

import (
	"fmt"
	"math"
	"strconv"

	"github.com/go-pdf/fpdf"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// Site plan geometry, mm.
const (
	planBoxH = 130.0
	planPad  = 12.0 // margin inside the frame for labels
)

// windowShapes are the CML symbols by repair window: shape and fill carry the
// status, and the legend names them in words.
var windowShapes = map[wallloss.Window]struct {
	shape  int // index into markerShapes
	filled bool
}{
	wallloss.WindowNow: {1, true}, wallloss.WindowUnder2: {2, true}, wallloss.Window2To5: {2, false},
	wallloss.Window5To10: {3, false}, wallloss.WindowOver10: {0, false}, wallloss.WindowNoLoss: {0, true},
	wallloss.WindowUnknown: {6, false},
}

// sitePlan draws an asset's CMLs and photos on a local metric plane, with
// ids, a scale bar and a north arrow. Nothing is drawn for an asset without
// positions. No map tiles: the plan shows only what the survey recorded.
func (d *doc) sitePlan(a *survey.Asset) {
	type mark struct {
		at     survey.LatLon
		label  string
		window wallloss.Window
		photo  bool
	}
	var marks []mark
	var cmlPos []survey.LatLon
	for _, c := range a.Components {
		for _, m := range c.CMLs {
			if m.GPS != nil {
				w := wallloss.WindowUnknown
				if it := d.f.Item(m); it != nil {
					w = wallloss.WindowOf(it.Result)
				}
				label := m.ID
				if w <= wallloss.Window2To5 {
					label += " · " + w.String()
				}
				marks = append(marks, mark{at: *m.GPS, label: label, window: w})
				cmlPos = append(cmlPos, *m.GPS)
			}
		}
	}
	if len(cmlPos) == 0 {
		return
	}
	var photoNotes []string
	figs := d.plannedFigures()
	for _, ph := range d.s.Photos {
		if ph.GPS != nil && ph.Placement.Asset == a.Name {
			n := len(photoNotes) + 1
			marks = append(marks, mark{at: *ph.GPS, label: fmt.Sprintf("P%d", n), photo: true})
			fig := "not shown"
			if f, ok := figs[ph.Name]; ok {
				fig = "Figure " + strconv.Itoa(f)
			}
			note := fmt.Sprintf("P%d, %s: %s", n, fig, placedOn(ph.Placement))
			if ph.Placement.DistanceM != nil {
				note += fmt.Sprintf(" (%.0f m, %s)", *ph.Placement.DistanceM, ph.Placement.Basis)
			}
			photoNotes = append(photoNotes, note)
		}
	}
	plane := survey.LocalPlane{Origin: survey.Centroid(cmlPos)}
	minX, minY, maxX, maxY := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	xs, ys := make([]float64, len(marks)), make([]float64, len(marks))
	for i, m := range marks {
		xs[i], ys[i] = plane.XY(m.at)
		minX, maxX = math.Min(minX, xs[i]), math.Max(maxX, xs[i])
		minY, maxY = math.Min(minY, ys[i]), math.Max(maxY, ys[i])
	}
	// At least 20 m across, same scale on both axes.
	cx, cy := (minX+maxX)/2, (minY+maxY)/2
	spanX, spanY := math.Max(maxX-minX, 20), math.Max(maxY-minY, 20)
	w, h := d.width(), planBoxH
	scale := math.Min((w-2*planPad)/spanX, (h-2*planPad)/spanY) // mm per metre

	d.need(planBoxH + 50)
	d.heading(1, "Site plan")
	p := d.pdf
	x0, y0 := margin, p.GetY()+10 // the north arrow stands above the frame
	toPage := func(x, y float64) (float64, float64) {
		return x0 + w/2 + (x-cx)*scale, y0 + h/2 - (y-cy)*scale
	}
	p.SetLineWidth(0.3)
	p.Rect(x0, y0, w, h, "D")
	p.ClipRect(x0, y0, w, h, false)
	d.font("", 6.5)
	for i, m := range marks {
		px, py := toPage(xs[i], ys[i])
		if m.photo {
			p.SetLineWidth(0.2)
			p.Rect(px-1.3, py-0.9, 2.6, 1.8, "D")
			p.Circle(px, py, 0.5, "D")
			p.SetTextColor(70, 70, 70)
		} else {
			ws := windowShapes[m.window]
			marker(p, px, py, ws.shape, ws.filled)
			p.SetTextColor(0, 0, 0)
		}
		lw := p.GetStringWidth(m.label) + 1
		if m.photo { // photo labels to the left, CML labels to the right
			p.SetXY(px-1.8-lw, py-1.6)
		} else {
			p.SetXY(px+1.8, py-1.6)
		}
		p.CellFormat(lw, 3, m.label, "", 0, "L", false, 0, "")
	}
	p.SetTextColor(0, 0, 0)
	p.ClipEnd()
	d.northArrow(x0+w-4, y0-10)
	d.scaleBar(x0+6, y0+h-6, scale, w/4)

	// Legend in words.
	p.SetXY(margin, y0+h+2)
	x := margin
	for _, wnd := range []wallloss.Window{wallloss.WindowNow, wallloss.WindowUnder2, wallloss.Window2To5, wallloss.Window5To10,
		wallloss.WindowOver10, wallloss.WindowNoLoss, wallloss.WindowUnknown} {
		ws := windowShapes[wnd]
		label := wnd.String()
		lw := p.GetStringWidth(label) + 8
		if x+lw > margin+d.width() {
			x = margin
			p.SetY(p.GetY() + 4)
		}
		marker(p, x+2, p.GetY()+1.5, ws.shape, ws.filled)
		p.SetXY(x+4.5, p.GetY())
		p.CellFormat(lw-4.5, 3, label, "", 0, "L", false, 0, "")
		x += lw
	}
	p.SetXY(margin, p.GetY()+4.5)
	d.font("I", 7)
	p.MultiCell(0, 3.3, fmt.Sprintf("CMLs by repair window (shape; the urgent ones also say it beside their id) and photos (P1, P2 … as listed below) "+
		"on a local plane: equirectangular projection about %s (WGS 84), north up, scale error under 0.5 %% within a few km. "+
		"Positions from the checklist's gps column and the photos' EXIF; no map background.", latLon(&plane.Origin)), "", "L", false)
	if len(photoNotes) > 0 {
		d.font("", 7)
		for _, n := range photoNotes {
			p.MultiCell(0, 3.3, n, "", "L", false)
		}
	}
	d.font("", bodySize)
	p.Ln(2)
}

// northArrow draws an arrow pointing up (north on the plan) with an N.
func (d *doc) northArrow(x, y float64) {
	p := d.pdf
	p.SetFillColor(0, 0, 0)
	d.font("B", 8)
	p.SetXY(x-9, y+1.5)
	p.CellFormat(5, 3.5, "N", "", 0, "R", false, 0, "")
	p.Polygon([]fpdf.PointType{{X: x, Y: y}, {X: x + 2, Y: y + 7}, {X: x, Y: y + 5.5}, {X: x - 2, Y: y + 7}}, "FD")
}

// scaleBar draws a bar of a round length near maxMM long, labelled in metres.
func (d *doc) scaleBar(x, y, mmPerM, maxMM float64) {
	metres := maxMM / mmPerM
	step := math.Pow(10, math.Floor(math.Log10(metres)))
	for _, m := range []float64{5, 2, 1} {
		if m*step <= metres {
			step *= m
			break
		}
	}
	l := step * mmPerM
	p := d.pdf
	p.SetFillColor(0, 0, 0)
	p.Rect(x, y-1, l/2, 1.2, "FD")
	p.SetFillColor(255, 255, 255)
	p.Rect(x+l/2, y-1, l/2, 1.2, "FD")
	d.font("", 7)
	p.SetXY(x, y-4.5)
	p.CellFormat(l, 3, fmt.Sprintf("%g m", step), "", 0, "C", false, 0, "")
}
