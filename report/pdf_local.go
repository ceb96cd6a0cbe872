package report

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/localdamage"
	"github.com/lossline/lossline/survey/wallloss"
)

// localDamage writes a component's grids of readings and its local-damage
// assessments, each with its inputs, steps, source, result and chart.
func (d *doc) localDamage(c *survey.Component) {
	ld := c.Design.Local
	if ld == nil {
		return
	}
	for _, g := range ld.Grids {
		if g.Stats.Count > 0 {
			d.grid(g)
		}
	}
	for _, la := range ld.Assessments {
		d.localAssessment(la)
	}
}

// grid writes a grid's statistics and draws it as a grey-scale matrix with
// the values printed: darker is thinner, below required is bold with a heavy
// border, so it reads without colour.
func (d *doc) grid(g *survey.GridReadings) {
	cell := min(18.0, (d.width()-14)/float64(len(g.Cols)))
	const cellH = 6.5
	d.need(float64(len(g.Rows)+1)*cellH + 45)
	d.heading(2, fmt.Sprintf("Grid of readings at CML %s, %s (%s)", g.CML, g.Date, d.u.u))
	st := g.Stats
	below := "no required thickness"
	if g.RequiredMM > 0 {
		below = fmt.Sprintf("%d of %d below required %s %s", st.BelowCount, st.Count, d.u.u.Format(g.RequiredMM), d.u.u)
	}
	d.keyValues([][2]string{
		{"Readings", fmt.Sprintf("%d (%d rows × %d columns)", st.Count, len(g.Rows), len(g.Cols))},
		{"Minimum", fmt.Sprintf("%s %s at row %s, column %s", d.u.u.Format(st.MinMM), d.u.u, g.Rows[st.MinRow], g.Cols[st.MinCol])},
		{"Mean, standard deviation", fmt.Sprintf("%s %s, %s %s (sample, n − 1)", d.u.u.Format(st.MeanMM), d.u.u, d.u.u.Format(st.StdDevMM), d.u.u)},
		{"Below required", below},
	}, 45)
	p := d.pdf
	x0, y0 := margin+12, p.GetY()+1
	d.font("B", 7.5)
	for j, c := range g.Cols {
		p.SetXY(x0+float64(j)*cell, y0)
		p.CellFormat(cell, cellH-1.5, c, "", 0, "C", false, 0, "")
	}
	y0 += cellH - 1.5
	span := 0.0
	lo := st.MinMM
	for _, row := range g.CellsMM {
		for _, v := range row {
			if !math.IsNaN(v) {
				span = max(span, v-lo)
			}
		}
	}
	for i, row := range g.CellsMM {
		y := y0 + float64(i)*cellH
		d.font("B", 7.5)
		p.SetXY(margin, y)
		p.CellFormat(11, cellH, g.Rows[i], "", 0, "R", false, 0, "")
		for j, v := range row {
			x := x0 + float64(j)*cell
			p.SetLineWidth(0.2)
			if math.IsNaN(v) {
				p.SetFillColor(255, 255, 255)
				p.Rect(x, y, cell, cellH, "D")
				d.font("", 7.5)
				p.SetXY(x, y)
				p.CellFormat(cell, cellH, none, "", 0, "C", false, 0, "")
				continue
			}
			f := 1.0
			if span > 0 {
				f = (v - lo) / span
			}
			grey := int(95 + f*155) // thinnest 95, thickest 250
			p.SetFillColor(grey, grey, grey)
			p.Rect(x, y, cell, cellH, "FD")
			low := g.RequiredMM > 0 && v < g.RequiredMM
			if low {
				p.SetLineWidth(0.8)
				p.Rect(x+0.4, y+0.4, cell-0.8, cellH-0.8, "D")
			}
			if grey < 160 {
				p.SetTextColor(255, 255, 255)
			}
			d.font(map[bool]string{true: "B", false: ""}[low || (i == st.MinRow && j == st.MinCol)], 7.5)
			p.SetXY(x, y)
			p.CellFormat(cell, cellH, d.u.u.Format(v), "", 0, "C", false, 0, "")
			p.SetTextColor(0, 0, 0)
		}
	}
	p.SetLineWidth(0.2)
	p.SetXY(margin, y0+float64(len(g.Rows))*cellH+1.5)
	d.font("I", smallSize)
	p.MultiCell(0, 3.6, fmt.Sprintf("Shade by thickness: darkest is the thinnest reading (%s %s), lightest the thickest; the minimum is in bold; "+
		"a heavy inner border marks a reading below required; %s means not read. The grid's minimum is among the readings of the CML's row "+
		"for %s, so it is the governing reading and the rate uses it; the mean is shown, not used.", d.u.u.Format(lo), d.u.u, none, g.Date), "", "L", false)
	d.font("", bodySize)
	p.Ln(2)
}

// localAssessment writes one assessment: inputs, steps, result, source, and
// the chart or table that goes with it.
func (d *doc) localAssessment(la *survey.LocalAssessment) {
	d.heading(2, "Local damage: "+la.Method)
	rows := make([][]string, len(la.Inputs))
	for i, in := range la.Inputs {
		rows[i] = []string{in.Name, in.Written, in.Used}
	}
	d.table([]column{{"Input", 55, "L"}, {"As written", 62, "L"}, {"Used as", d.width() - 117, "L"}}, rows, nil, smallSize)
	d.plainSteps("Steps (mm, MPa, years):", la.Steps)
	p := d.pdf
	d.font("B", bodySize)
	p.MultiCell(0, lineH, "Result: "+la.Result+".", "", "L", false)
	d.font("", bodySize)
	switch {
	case la.LifeY != nil && *la.LifeY <= 0:
		p.MultiCell(0, lineH, "Limit reached now: "+la.Limit+". The component ranks as at or below required.", "", "L", false)
	case la.LifeY != nil:
		p.MultiCell(0, lineH, fmt.Sprintf("Life to the limit (%s): %.1f years from the survey date; the ranking and the plan use it where it is shorter than the wall's.", la.Limit, *la.LifeY), "", "L", false)
	default:
		p.MultiCell(0, lineH, "No life follows from this assessment (no rate or no limit given); it does not change the ranking.", "", "L", false)
	}
	p.MultiCell(0, lineH, "Source: "+la.Source+".", "", "L", false)
	p.Ln(1)
	if la.Pits != nil {
		d.gumbelPlot(la.Pits)
	}
	if la.Member != nil {
		d.memberTable(la.Member)
	}
}

// plainSteps writes a title and its steps as bullets, as text (formulas
// keep their underscores and asterisks).
func (d *doc) plainSteps(title string, steps []string) {
	p := d.pdf
	d.font("", bodySize)
	p.MultiCell(0, lineH, title, "", "L", false)
	left := d.left()
	for _, st := range steps {
		d.need(lineH * 2)
		p.SetX(left)
		p.CellFormat(4, lineH, "•", "", 0, "L", false, 0, "")
		p.SetLeftMargin(left + 4)
		p.MultiCell(0, lineH, st, "", "L", false)
		p.SetLeftMargin(left)
	}
	p.SetX(left)
}

// memberTable lists the section's properties, nominal and measured.
func (d *doc) memberTable(m *survey.MemberDetail) {
	n, s := m.Loss.Nominal, m.Loss.Measured
	vals := map[string][2]float64{"area": {n.AreaMM2, s.AreaMM2}, "Ix": {n.IxMM4, s.IxMM4}, "Iy": {n.IyMM4, s.IyMM4}, "Sx": {n.SxMM3, s.SxMM3}, "Sy": {n.SyMM3, s.SyMM3}}
	unit := map[string]string{"area": "mm²", "Ix": "mm⁴", "Iy": "mm⁴", "Sx": "mm³", "Sy": "mm³"}
	var rows [][]string
	for _, q := range localdamage.Quantities {
		limit := ""
		if q == m.LimitQuantity {
			limit = fmt.Sprintf("allowed %.4g %%: %s", m.LimitPct, map[bool]string{true: "EXCEEDED", false: "within"}[m.Exceeded])
		}
		rows = append(rows, []string{q + " (" + unit[q] + ")", fmt.Sprintf("%.4g", vals[q][0]), fmt.Sprintf("%.4g", vals[q][1]), fmt.Sprintf("%.1f", m.Loss.LossPct[q]), limit})
	}
	d.table([]column{{"Property", 30, "L"}, {"Nominal", 30, "R"}, {"Measured", 30, "R"}, {"Loss (%)", 22, "R"}, {"Limit", d.width() - 112, "L"}}, rows,
		func(i int) rowStyle {
			hit := localdamage.Quantities[i] == m.LimitQuantity && m.Exceeded
			return rowStyle{bold: hit, shade: hit}
		}, smallSize)
}

// gumbelPlot draws the Gumbel plot: each sample's depth against the reduced
// variate of its plotting position i/(n+1), the least-squares line (solid)
// and the maximum-likelihood line (dashed), the return period's reduced
// variate as a dash-dot line with both estimates and the ML 95 % band on it,
// and the depth that leaves the required thickness as a dotted line.
func (d *doc) gumbelPlot(p *survey.PitDetail) {
	const h = 62.0
	d.need(h + 22)
	d.pdf.Ln(1)
	d.font("B", 9)
	d.pdf.CellFormat(0, 5, "Gumbel plot", "", 1, "L", false, 0, "")
	e := p.Estimate
	x := slices.Sorted(slices.Values(p.DepthsMM))
	y := make([]float64, len(x))
	for i := range x {
		y[i] = -math.Log(-math.Log(localdamage.PlottingPosition(i+1, len(x))))
	}
	reqDepth := math.NaN()
	if p.RequiredMM > 0 {
		reqDepth = p.WallMM - p.RequiredMM
	}
	xLo := 0.0
	xHi := max(e.UpperMLMM, e.DepthMM, x[len(x)-1]) * 1.1
	if !math.IsNaN(reqDepth) && reqDepth < xHi*1.6 {
		xHi = max(xHi, reqDepth*1.05)
	}
	yLo, yHi := math.Floor(y[0]-0.5), math.Ceil(e.ReducedVariate+0.5)
	pdf := d.pdf
	x0, y0 := margin+chartLeft, pdf.GetY()+3
	w := d.width() - chartLeft - 6
	xOf := func(mm float64) float64 { return x0 + (mm-xLo)/(xHi-xLo)*w }
	yOf := func(v float64) float64 { return y0 + h - (v-yLo)/(yHi-yLo)*h }
	d.chartFrame(x0, y0, w, h)
	for _, v := range niceTicks(yLo, yHi, 8) {
		pdf.Line(x0, yOf(v), x0+w, yOf(v))
		pdf.SetXY(margin, yOf(v)-1.5)
		pdf.CellFormat(chartLeft-1.5, 3, trimFloat(v), "", 0, "R", false, 0, "")
	}
	for _, v := range niceTicks(d.u.u.FromMM(xLo), d.u.u.FromMM(xHi), 10) {
		xx := xOf(d.u.u.ToMM(v))
		pdf.Line(xx, y0, xx, y0+h)
		pdf.SetXY(xx-6, y0+h+0.8)
		pdf.CellFormat(12, 3, trimFloat(v), "", 0, "C", false, 0, "")
	}
	pdf.SetDashPattern(nil, 0)
	pdf.SetDrawColor(0, 0, 0)
	pdf.SetXY(margin, y0-3.5)
	pdf.CellFormat(80, 3, "Reduced variate y = −ln(−ln F)", "", 0, "L", false, 0, "")
	pdf.SetXY(x0+w-60, y0+h+4)
	pdf.CellFormat(60, 3, "Deepest pit of a sample ("+string(d.u.u)+")", "", 0, "R", false, 0, "")

	pdf.ClipRect(x0, y0, w, h, false)
	line := func(f localdamage.GumbelFit, dash []float64, width float64) {
		pdf.SetLineWidth(width)
		pdf.SetDashPattern(dash, 0)
		// x = λ + α·y, drawn across the y range.
		pdf.Line(xOf(f.Location+f.Scale*yLo), yOf(yLo), xOf(f.Location+f.Scale*yHi), yOf(yHi))
		pdf.SetDashPattern(nil, 0)
	}
	line(e.LeastSquares, nil, 0.35)
	line(e.MaxLikelihood, []float64{1.4, 1}, 0.35)
	pdf.SetLineWidth(0.6)
	pdf.SetDrawColor(60, 60, 60)
	pdf.SetDashPattern([]float64{3, 1, 0.6, 1}, 0)
	pdf.Line(x0, yOf(e.ReducedVariate), x0+w, yOf(e.ReducedVariate))
	pdf.SetDashPattern(nil, 0)
	if !math.IsNaN(reqDepth) {
		pdf.SetDashPattern([]float64{0.5, 1}, 0)
		pdf.Line(xOf(reqDepth), y0, xOf(reqDepth), y0+h)
		pdf.SetDashPattern(nil, 0)
		pdf.SetXY(xOf(reqDepth)-41, y0+1)
		pdf.CellFormat(40, 3, fmt.Sprintf("wall − required = %s", d.u.u.Format(reqDepth)), "", 0, "R", false, 0, "")
	}
	pdf.SetDrawColor(0, 0, 0)
	// The ML band on the y_T line, with end ticks.
	yt := yOf(e.ReducedVariate)
	pdf.SetLineWidth(0.5)
	pdf.Line(xOf(e.LowerMLMM), yt+1.6, xOf(e.UpperMLMM), yt+1.6)
	pdf.Line(xOf(e.LowerMLMM), yt+0.6, xOf(e.LowerMLMM), yt+2.6)
	pdf.Line(xOf(e.UpperMLMM), yt+0.6, xOf(e.UpperMLMM), yt+2.6)
	for i := range x {
		marker(pdf, xOf(x[i]), yOf(y[i]), 0, true)
	}
	marker(pdf, xOf(e.DepthLSMM), yt, 1, true)
	marker(pdf, xOf(e.DepthMLMM), yt, 3, false)
	pdf.SetXY(x0+1, yt-4)
	pdf.CellFormat(90, 3, fmt.Sprintf("T = %.4g: y_T = %.2f; LS %s, ML %s %s", e.ReturnPeriod, e.ReducedVariate, d.u.u.Format(e.DepthLSMM), d.u.u.Format(e.DepthMLMM), d.u.u), "", 0, "L", false, 0, "")
	pdf.ClipEnd()
	pdf.SetLineWidth(0.2)
	pdf.SetXY(margin, y0+h+8)
	d.font("I", smallSize)
	pdf.MultiCell(0, 3.6, "Filled circles: the samples' deepest pits at plotting position i/(n+1). Solid line: least-squares fit; dashed line: "+
		"maximum-likelihood fit. Dash-dot line: the reduced variate of the return period T = total area / sample area, with the "+
		"least-squares estimate (filled square), the maximum-likelihood estimate (open diamond) and its 95 % band (bar under the line). "+
		"Dotted line: the depth that leaves the required thickness.", "", "L", false)
	d.font("", bodySize)
	pdf.Ln(2)
}

// localMethods writes the methods of local damage when a component has any.
func (d *doc) localMethods() error {
	has := false
	for _, a := range d.s.Assets {
		for _, c := range a.Components {
			has = has || c.Design.Local != nil
		}
	}
	if !has {
		return nil
	}
	text, err := d.opts.Templates.Execute("report/methods-local.md", nil)
	if err != nil {
		return fmt.Errorf("methods template: %w", err)
	}
	d.markdown(text)
	return nil
}

// localStatus is what a CML's component's local damage adds to its status
// in the ranked list, when it ranks the CML: "" otherwise.
func localStatus(it *survey.Assessed) string {
	life, ok := it.Component.LocalLifeY()
	if !ok {
		return ""
	}
	r := it.Result
	switch {
	case life <= 0:
		return "; local damage: limit reached"
	case r.Class != wallloss.AtOrBelowRequired && (r.PlanningLifeY() == nil || life < *r.PlanningLifeY()):
		return fmt.Sprintf("; ranked by local damage, %.1f y", life)
	}
	return ""
}

// localPairs is the component's local-damage summary for its design table.
func localPairs(c *survey.Component) [][2]string {
	if c.Design.Local == nil || len(c.Design.Local.Assessments) == 0 {
		return nil
	}
	var parts []string
	for _, la := range c.Design.Local.Assessments {
		parts = append(parts, la.Key+": "+la.Result)
	}
	v := strings.Join(parts, "\n")
	if life, ok := c.LocalLifeY(); ok {
		v += fmt.Sprintf("\nshortest life to a local-damage limit: %.1f y (derivations below)", life)
	}
	return [][2]string{{"Local damage", v}}
}

// localUrgent reports a CML whose component's local damage leaves under 5
// years, the ranked list's mark for an urgent row.
func localUrgent(it *survey.Assessed) bool {
	life, ok := it.Component.LocalLifeY()
	return ok && life < 5
}
