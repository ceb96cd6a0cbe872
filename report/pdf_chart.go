package report

import (
	"fmt"
	"math"
	"time"

	"github.com/go-pdf/fpdf"

	"github.com/lossline/lossline/survey"
)

// Chart geometry, mm.
const (
	chartH      = 70.0
	chartLeft   = 16.0 // room for thickness labels
	chartBottom = 9.0  // room for year labels
)

// trend draws a component's trend chart: readings as markers joined by solid
// lines, the projection of the governing rate as a dashed line to the
// retirement date, the required thickness as a heavy dash-dot line. CMLs are
// told apart by marker shape and a label, so the chart reads in grey scale.
func (d *doc) trend(c *survey.Component) {
	ch := buildTrendChart(c, d.f.Item)
	if !ch.repeated() {
		return // one visit per CML: a chart would be points and a guess; the results table says it
	}
	d.need(chartH + 30)
	d.heading(2, "Trend")
	p := d.pdf
	x0, y0 := margin+chartLeft, p.GetY()+4
	w, h := d.width()-chartLeft-14, chartH-chartBottom
	span := ch.To.Sub(ch.From).Hours()
	xOf := func(t time.Time) float64 { return x0 + t.Sub(ch.From).Hours()/span*w }
	yOf := func(mm float64) float64 { return y0 + h - (mm-ch.LowMM)/(ch.HighMM-ch.LowMM)*h }

	d.timeAxes(x0, y0, w, h, niceTicks(d.u.u.FromMM(ch.LowMM), d.u.u.FromMM(ch.HighMM), 7), func(v float64) float64 { return yOf(d.u.u.ToMM(v)) },
		yearTicks(ch.From, ch.To, 10), xOf, "Thickness ("+string(d.u.u)+")")
	p.SetXY(x0+w-40, y0+h+4.5)
	p.CellFormat(40, 3, "Date (year)", "", 0, "R", false, 0, "")

	p.ClipRect(x0, y0, w, h, false)
	for _, ref := range []struct {
		v     *float64
		label string
		width float64
		dash  []float64
		grey  int
	}{
		{ch.RequiredMM, "required", 0.7, []float64{3, 1, 0.6, 1}, 60},
		{ch.NominalMM, "nominal", 0.25, []float64{0.5, 1}, 110},
	} {
		if ref.v == nil {
			continue
		}
		y := yOf(*ref.v)
		p.SetDrawColor(ref.grey, ref.grey, ref.grey)
		p.SetLineWidth(ref.width)
		p.SetDashPattern(ref.dash, 0)
		p.Line(x0, y, x0+w, y)
		p.SetDashPattern(nil, 0)
		p.SetXY(x0+1, y-3.2)
		p.CellFormat(50, 3, fmt.Sprintf("%s %s %s", ref.label, d.u.thick(ref.v), d.u.u), "", 0, "L", false, 0, "")
	}
	p.SetDrawColor(0, 0, 0)
	for i, s := range ch.Series {
		p.SetLineWidth(0.3)
		for j := 1; j < len(s.Points); j++ {
			p.Line(xOf(s.Points[j-1].T), yOf(s.Points[j-1].MM), xOf(s.Points[j].T), yOf(s.Points[j].MM))
		}
		if s.Proj != nil {
			a, b := s.Proj[0], s.Proj[1]
			xb, yb := xOf(b.T), yOf(b.MM)
			if b.T.After(ch.To) { // clip at the edge of the time axis
				f := ch.To.Sub(a.T).Hours() / b.T.Sub(a.T).Hours()
				xb, yb = x0+w, yOf(a.MM+f*(b.MM-a.MM))
			}
			p.SetDashPattern([]float64{1.4, 1}, 0)
			p.Line(xOf(a.T), yOf(a.MM), xb, yb)
			p.SetDashPattern(nil, 0)
			if !b.T.After(ch.To) {
				marker(p, xb, yb, 6, false) // retirement: a small cross on the required line
			}
		}
		for _, pt := range s.Points {
			marker(p, xOf(pt.T), yOf(pt.MM), i%len(markerShapes), i/len(markerShapes)%2 == 1)
		}
	}
	// Labels at each series' last reading, spread apart where readings of
	// the same date lie close, with a leader line where one had to move.
	byDate := map[time.Time][]int{}
	var dates []time.Time
	for i, s := range ch.Series {
		t := s.Points[len(s.Points)-1].T
		if _, ok := byDate[t]; !ok {
			dates = append(dates, t)
		}
		byDate[t] = append(byDate[t], i)
	}
	for _, t := range dates {
		ids := byDate[t]
		ys := make([]float64, len(ids))
		for k, i := range ids {
			s := ch.Series[i]
			ys[k] = yOf(s.Points[len(s.Points)-1].MM)
		}
		at := spreadLabels(ys, 3.2, y0+1.6, y0+h-1.6)
		x := xOf(t)
		for k, i := range ids {
			lx := x + 1.8
			if math.Abs(at[k]-ys[k]) > 0.8 {
				lx = x + 4
				p.SetLineWidth(0.15)
				p.Line(x+1.2, ys[k], lx-0.3, at[k])
			}
			// A white ground keeps the label legible where a projection line runs under it.
			p.SetFillColor(255, 255, 255)
			p.SetXY(lx, at[k]-1.5)
			p.CellFormat(p.GetStringWidth(ch.Series[i].ID)+0.8, 3, ch.Series[i].ID, "", 0, "L", true, 0, "")
		}
	}
	p.ClipEnd()
	p.SetLineWidth(0.2)

	// Legend: marker, CML, retirement date.
	p.SetXY(margin, y0+h+8.5)
	x := margin
	for i, s := range ch.Series {
		retire := "no retirement date"
		if r := d.f.Item(c.CMLs[indexOf(c, s.ID)]); r != nil && r.Result.Retirement != nil {
			retire = "retires " + day(r.Result.Retirement)
		}
		label := s.ID + ": " + retire
		lw := p.GetStringWidth(label) + 9
		if x+lw > margin+d.width() {
			x = margin
			p.SetY(p.GetY() + 4)
		}
		marker(p, x+2, p.GetY()+1.5, i%len(markerShapes), i/len(markerShapes)%2 == 1)
		p.SetXY(x+4.5, p.GetY())
		p.CellFormat(lw-4.5, 3, label, "", 0, "L", false, 0, "")
		x += lw
	}
	p.SetXY(margin, p.GetY()+4)
	d.font("I", smallSize)
	p.MultiCell(0, 3.6, "Solid lines join readings; dashed lines project the governing rate from the current reading to the retirement date (× on the required line); "+
		"projections beyond the chart's right edge are cut there.", "", "L", false)
	d.font("", bodySize)
	p.Ln(2)
}

func indexOf(c *survey.Component, id string) int {
	for i, m := range c.CMLs {
		if m.ID == id {
			return i
		}
	}
	return 0
}

// markerShapes: circle, square, triangle up, diamond, triangle down, plus, cross.
var markerShapes = []string{"circle", "square", "up", "diamond", "down", "plus", "cross"}

// marker draws shape i at (x, y), filled black or hollow.
func marker(p textPDF, x, y float64, i int, filled bool) { markerSized(p, x, y, i, filled, 1.1) }

// markerSized draws shape i of half-width r mm at (x, y), filled black or hollow.
func markerSized(p textPDF, x, y float64, i int, filled bool, r float64) {
	style := "D"
	if filled {
		p.SetFillColor(0, 0, 0)
		style = "FD"
	} else {
		p.SetFillColor(255, 255, 255)
		style = "FD"
	}
	p.SetLineWidth(0.25)
	switch markerShapes[i%len(markerShapes)] {
	case "circle":
		p.Circle(x, y, r, style)
	case "square":
		p.Rect(x-r, y-r, 2*r, 2*r, style)
	case "up":
		p.Polygon([]fpdf.PointType{{X: x, Y: y - r*1.2}, {X: x + r*1.1, Y: y + r*0.8}, {X: x - r*1.1, Y: y + r*0.8}}, style)
	case "diamond":
		p.Polygon([]fpdf.PointType{{X: x, Y: y - r*1.3}, {X: x + r*1.1, Y: y}, {X: x, Y: y + r*1.3}, {X: x - r*1.1, Y: y}}, style)
	case "down":
		p.Polygon([]fpdf.PointType{{X: x, Y: y + r*1.2}, {X: x + r*1.1, Y: y - r*0.8}, {X: x - r*1.1, Y: y - r*0.8}}, style)
	case "plus":
		p.Line(x-r*1.2, y, x+r*1.2, y)
		p.Line(x, y-r*1.2, x, y+r*1.2)
	default:
		p.Line(x-r, y-r, x+r, y+r)
		p.Line(x-r, y+r, x+r, y-r)
	}
}

// niceTicks returns round values between lo and hi, at most about n of them.
func niceTicks(lo, hi float64, n int) []float64 {
	span := hi - lo
	if span <= 0 {
		return []float64{lo}
	}
	raw := span / float64(n)
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	step := mag
	for _, m := range []float64{1, 2, 2.5, 5, 10} {
		if m*mag >= raw {
			step = m * mag
			break
		}
	}
	var out []float64
	for v := math.Ceil(lo/step) * step; v <= hi+1e-9; v += step {
		out = append(out, math.Round(v/step)*step)
	}
	return out
}

// yearTicks returns 1 January of round years between from and to.
func yearTicks(from, to time.Time, n int) []time.Time {
	years := to.Year() - from.Year() + 1
	step := 1
	for _, s := range []int{1, 2, 5, 10, 20, 50} {
		if years/s <= n {
			step = s
			break
		}
	}
	var out []time.Time
	for y := (from.Year()/step + 1) * step; y <= to.Year(); y += step {
		t := time.Date(y, 1, 1, 0, 0, 0, 0, time.UTC)
		if !t.Before(from) && !t.After(to) {
			out = append(out, t)
		}
	}
	return out
}

func trimFloat(v float64) string {
	return fmt.Sprintf("%g", math.Round(v*1000)/1000)
}

// timeAxes draws a time chart's frame, its dotted grid and labels at the
// value ticks (yAt places one) and at the years, and the value axis title.
func (d *doc) timeAxes(x0, y0, w, h float64, ticks []float64, yAt func(float64) float64, years []time.Time, xOf func(time.Time) float64, title string) {
	p := d.pdf
	d.chartFrame(x0, y0, w, h)
	for _, v := range ticks {
		y := yAt(v)
		p.Line(x0, y, x0+w, y)
		p.SetXY(margin, y-1.5)
		p.CellFormat(chartLeft-1.5, 3, trimFloat(v), "", 0, "R", false, 0, "")
	}
	for _, yr := range years {
		x := xOf(yr)
		p.Line(x, y0, x, y0+h)
		p.SetXY(x-6, y0+h+0.8)
		p.CellFormat(12, 3, yr.Format("2006"), "", 0, "C", false, 0, "")
	}
	p.SetDashPattern(nil, 0)
	p.SetDrawColor(0, 0, 0)
	p.SetXY(margin, y0-4)
	p.CellFormat(d.width(), 3, title, "", 0, "L", false, 0, "")
}

// chartFrame draws a chart's frame and readies the small font and the
// dotted grey pen for its grid and tick labels.
func (d *doc) chartFrame(x0, y0, w, h float64) {
	p := d.pdf
	p.SetLineWidth(0.2)
	p.SetDrawColor(0, 0, 0)
	p.Rect(x0, y0, w, h, "D")
	d.font("", 7)
	p.SetDrawColor(200, 200, 200)
	p.SetDashPattern([]float64{0.6, 0.8}, 0)
}
