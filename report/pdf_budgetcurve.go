package report

import (
	"fmt"
	"math"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
)

// Budget curve chart geometry, mm.
const (
	curveH      = 72.0
	curveLeft   = 16.0
	curveBottom = 10.0
)

// budgetCurve draws the risk the first year's selection removes against the
// first-year budget: a black step line (or points, when only sampled
// amounts are known), the plan's budget as a dashed vertical line and the
// knee as a ringed point, each labelled in words so the chart reads in grey
// scale.
func (d *doc) budgetCurve(c plan.Curve, cur string) {
	unit := "risk removed"
	if c.RiskYear {
		unit = "risk-years removed"
	}
	d.need(curveH + 50) // heading, text and chart on one page
	d.heading(1, "Budget curve")
	d.text(fmt.Sprintf("The most %s by the first year's selection for each first-year budget, the year's mandatory repairs "+
		"(%s %s) paid first: what more money would buy. %s The command lossline plan --curve writes its steps as CSV.",
		unit, c.Forced, cur, CurveMethod(c, cur)))
	if c.Total == 0 {
		d.text("No repair is left for the selection, so there is no curve.")
		return
	}
	d.need(curveH + 20)
	p := d.pdf
	x0, y0 := margin+curveLeft, p.GetY()+6
	w, h := d.width()-curveLeft-6, curveH-curveBottom
	top := c.Points[len(c.Points)-1].Removed
	for _, pt := range c.Points {
		top = max(top, int64(math.Ceil(pt.Bound)))
	}
	top = max(top, 1)
	// Plotting positions only: amounts become page coordinates here.
	lo, hi := float64(c.Forced)/100, float64(c.Forced.Add(c.Total))/100
	xOf := func(m survey.Money) float64 { return x0 + (float64(c.Forced.Add(m))/100-lo)/(hi-lo)*w }
	yOf := func(v float64) float64 { return y0 + h - v/float64(top)*h }

	d.chartFrame(x0, y0, w, h)
	for _, v := range niceTicks(0, float64(top), 6) {
		y := yOf(v)
		p.Line(x0, y, x0+w, y)
		p.SetXY(margin, y-1.5)
		p.CellFormat(curveLeft-1.5, 3, trimFloat(v), "", 0, "R", false, 0, "")
	}
	for _, v := range niceTicks(lo, hi, 6) {
		x := x0 + (v-lo)/(hi-lo)*w
		p.Line(x, y0, x, y0+h)
		p.SetXY(x-10, y0+h+0.8)
		p.CellFormat(20, 3, survey.Money(math.Round(v*100)).String(), "", 0, "C", false, 0, "")
	}
	p.SetDashPattern(nil, 0)
	p.SetDrawColor(0, 0, 0)
	p.SetXY(margin, y0-4.5)
	p.CellFormat(80, 3, "Risk removed"+map[bool]string{true: " (risk-years)", false: ""}[c.RiskYear], "", 0, "L", false, 0, "")
	p.SetXY(x0+w-80, y0+h+4.5)
	p.CellFormat(80, 3, "First-year budget ("+cur+")", "", 0, "R", false, 0, "")

	// The curve.
	p.SetLineWidth(0.5)
	if c.Steps {
		for i, pt := range c.Points {
			end := c.Total
			if i+1 < len(c.Points) {
				end = c.Points[i+1].Money
			}
			p.Line(xOf(pt.Money), yOf(float64(pt.Removed)), xOf(end), yOf(float64(pt.Removed)))
			if i+1 < len(c.Points) {
				p.Line(xOf(end), yOf(float64(pt.Removed)), xOf(end), yOf(float64(c.Points[i+1].Removed)))
			}
		}
	} else {
		p.SetLineWidth(0.2)
		for _, pt := range c.Points {
			marker(p, xOf(pt.Money), yOf(float64(pt.Removed)), 0, pt.Exact)
			if !pt.Exact {
				p.Line(xOf(pt.Money), yOf(float64(pt.Removed)), xOf(pt.Money), yOf(pt.Bound))
			}
		}
	}
	// The plan's budget.
	bx := xOf(c.Money)
	p.SetLineWidth(0.35)
	p.SetDashPattern([]float64{1.6, 1}, 0)
	p.Line(bx, y0, bx, y0+h)
	p.SetDashPattern(nil, 0)
	d.font("B", 7)
	label := fmt.Sprintf("this plan: %s, removes %d", c.Forced.Add(c.Money), c.AtMoney)
	lw := p.GetStringWidth(label) + 2
	lx := bx + 1
	if lx+lw > x0+w {
		lx = bx - 1 - lw
	}
	p.SetXY(lx, y0+1)
	p.CellFormat(lw, 3, label, "", 0, "L", false, 0, "")
	// The knee.
	if c.Knee >= 0 {
		k := c.Points[c.Knee]
		kx, ky := xOf(k.Money), yOf(float64(k.Removed))
		p.SetLineWidth(0.3)
		p.SetFillColor(255, 255, 255)
		p.Circle(kx, ky, 1.8, "D")
		marker(p, kx, ky, 0, true)
		klabel := fmt.Sprintf("knee: %s, removes %d", k.Budget, k.Removed)
		kw := p.GetStringWidth(klabel) + 2
		kxl := kx + 2.5
		if kxl+kw > x0+w {
			kxl = kx - 2.5 - kw
		}
		p.SetXY(kxl, min(ky+2, y0+h-4))
		p.CellFormat(kw, 3, klabel, "", 0, "L", false, 0, "")
	}
	p.SetLineWidth(0.2)
	p.SetXY(margin, y0+h+9)
	d.font("I", smallSize)
	how := "The black steps are the curve: each level holds from its budget to the next step."
	if !c.Steps {
		how = "Points are the amounts computed (filled: exact; hollow, with a line up to its bound: the search stopped at its limit); nothing is known between them."
	}
	p.MultiCell(0, 3.6, how+" The dashed line is this plan's first-year budget; the ringed point is the knee, where the curve lies "+
		"farthest above the straight line from no money to the money that funds every repair (both axes scaled to 1), so beyond it "+
		"each further amount buys less.", "", "L", false)
	d.font("", bodySize)
	d.pdf.Ln(2)
}
