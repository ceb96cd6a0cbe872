package report

import (
	"fmt"
	"math"
	"sort"
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
	size   float64 // half-width, mm: the most urgent largest
}{
	wallloss.WindowNow: {1, true, 2.0}, wallloss.WindowUnder2: {2, true, 1.6}, wallloss.Window2To5: {2, false, 1.4},
	wallloss.Window5To10: {3, false, 1.2}, wallloss.WindowOver10: {0, false, 1.0}, wallloss.WindowNoLoss: {5, false, 1.0},
	wallloss.WindowUnknown: {6, false, 1.0},
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
	if d.figPlan == nil {
		d.figPlan = d.plannedFigures()
	}
	figs := d.figPlan
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
				note += fmt.Sprintf(" (%.0f m; %s)", *ph.Placement.DistanceM, ph.Placement.Words())
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
	// Photos first, then CMLs from the least urgent to the most, so a CML is
	// never hidden under a photo and the most urgent is drawn on top.
	order := make([]int, len(marks))
	for i := range order {
		order[i] = i
	}
	urgency := func(m mark) int {
		if m.photo {
			return -1
		}
		return int(wallloss.WindowUnknown) - int(m.window)
	}
	sort.SliceStable(order, func(a, b int) bool { return urgency(marks[order[a]]) < urgency(marks[order[b]]) })
	pxs, pys := make([]float64, len(marks)), make([]float64, len(marks))
	for i := range marks {
		pxs[i], pys[i] = toPage(xs[i], ys[i])
	}
	for _, i := range order {
		m, px, py := marks[i], pxs[i], pys[i]
		if m.photo {
			p.SetLineWidth(0.2)
			p.SetDrawColor(90, 90, 90)
			p.Rect(px-1.3, py-0.9, 2.6, 1.8, "D")
			p.Circle(px, py, 0.5, "D")
			p.SetDrawColor(0, 0, 0)
		} else {
			ws := windowShapes[m.window]
			markerSized(p, px, py, ws.shape, ws.filled, ws.size)
		}
	}
	// Labels, the most urgent placed first (nearest its marker); labels set
	// off from a crowd of markers get a leader line.
	byPriority := make([]int, len(order))
	for k := range order {
		byPriority[k] = order[len(order)-1-k]
	}
	lxs, lys, lws, lrs := make([]float64, len(marks)), make([]float64, len(marks)), make([]float64, len(marks)), make([]float64, len(marks))
	for k, i := range byPriority {
		lxs[k], lys[k], lrs[k] = pxs[i], pys[i], 1.6
		if !marks[i].photo {
			lrs[k] = windowShapes[marks[i].window].size + 0.4
		}
		d.font(map[bool]string{true: "B", false: ""}[!marks[i].photo && marks[i].window == wallloss.WindowNow], 6.5)
		lws[k] = p.GetStringWidth(marks[i].label) + 0.6
	}
	spots := placeLabels(lxs, lys, lws, lrs, 2.8, box{x0 + 0.5, y0 + 0.5, w - 1, h - 1})
	for k, i := range byPriority {
		m, sp := marks[i], spots[k]
		if sp.Leader {
			p.SetLineWidth(0.15)
			p.SetDrawColor(90, 90, 90)
			cx := math.Max(sp.Box.X, math.Min(lxs[k], sp.Box.X+sp.Box.W))
			cy := math.Max(sp.Box.Y, math.Min(lys[k], sp.Box.Y+sp.Box.H))
			p.Line(lxs[k], lys[k], cx, cy)
			p.SetDrawColor(0, 0, 0)
		}
		style := ""
		if m.photo {
			p.SetTextColor(70, 70, 70)
		} else {
			p.SetTextColor(0, 0, 0)
			if m.window == wallloss.WindowNow {
				style = "B"
			}
		}
		d.font(style, 6.5)
		p.SetXY(sp.Box.X, sp.Box.Y)
		p.CellFormat(sp.Box.W, sp.Box.H, m.label, "", 0, "L", false, 0, "")
	}
	d.font("", 6.5)
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
		markerSized(p, x+2, p.GetY()+1.5, ws.shape, ws.filled, min(ws.size, 1.5))
		p.SetXY(x+4.5, p.GetY())
		p.CellFormat(lw-4.5, 3, label, "", 0, "L", false, 0, "")
		x += lw
	}
	p.SetXY(margin, p.GetY()+4.5)
	d.font("I", 7)
	p.MultiCell(0, 3.3, fmt.Sprintf("CMLs by repair window (shape; the more urgent, the larger and darker, drawn above the others and above photos; the urgent ones also say it beside their id) and photos (P1, P2 … as listed below) "+
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
