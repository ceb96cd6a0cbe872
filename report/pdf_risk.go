package report

import (
	"fmt"
	"slices"
	"strconv"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
)

// riskSection writes the 5×5 risk matrix with counts per cell, labelled in
// words, and the components by their highest CML risk.
func (d *doc) riskSection() {
	d.newPage(false)
	d.heading(0, "Risk")
	d.text("Risk per CML = likelihood × consequence, both on five levels. Likelihood comes from the remaining life the " +
		"dates use (for a fitted rate its lower confidence bound, so rate uncertainty can only raise it): " + plan.LifeBands +
		". Consequence is written per component (very low 1 … very high 5; not given: taken as high). Risk level: " +
		"low 1-4, medium 5-9, high 10-14, very high 15-25. The bands are lossline's own.")
	d.pdf.Ln(2)
	m := d.f.Matrix
	p := d.pdf
	labelW, cellW, cellH := 30.0, 28.0, 12.0
	x0, y0 := margin+8, p.GetY()+6
	d.need(6*cellH + 20)
	d.font("B", smallSize)
	p.SetXY(x0+labelW, y0-5)
	p.CellFormat(5*cellW, 4, "Consequence →", "", 0, "C", false, 0, "")
	for c := 1; c <= 5; c++ {
		p.SetXY(x0+labelW+float64(c-1)*cellW, y0)
		p.CellFormat(cellW, 5, survey.Consequence(c).String(), "1", 0, "C", false, 0, "")
	}
	for row := 0; row < 5; row++ {
		l := plan.Likelihood(5 - row)
		y := y0 + 5 + float64(row)*cellH
		d.font("B", smallSize)
		p.SetXY(x0, y)
		p.CellFormat(labelW, cellH, l.String(), "1", 0, "L", false, 0, "")
		for c := 1; c <= 5; c++ {
			r := plan.Risk{Likelihood: l, Consequence: c}
			x := x0 + labelW + float64(c-1)*cellW
			grey := map[string]int{"low": 250, "medium": 225, "high": 195, "very high": 160}[r.Level()]
			p.SetFillColor(grey, grey, grey)
			p.Rect(x, y, cellW, cellH, "FD")
			n := m[l-1][c-1]
			d.font("B", 10)
			p.SetXY(x, y+1.5)
			count := strconv.Itoa(n)
			if n == 0 {
				count = "–"
			}
			p.CellFormat(cellW, 5, count, "", 0, "C", false, 0, "")
			d.font("", 6.5)
			p.SetXY(x, y+7)
			p.CellFormat(cellW, 3.5, fmt.Sprintf("%s (%d)", r.Level(), r.Score()), "", 0, "C", false, 0, "")
		}
	}
	d.font("B", smallSize)
	p.TransformBegin()
	p.TransformRotate(90, x0-3, y0+5+2.5*cellH)
	p.SetXY(x0-3-20, y0+5+2.5*cellH-2)
	p.CellFormat(40, 4, "Likelihood →", "", 0, "C", false, 0, "")
	p.TransformEnd()
	p.SetXY(margin, y0+5+5*cellH+3)
	d.font("I", smallSize)
	p.MultiCell(0, 3.6, "Each cell: the number of CMLs, then the risk level and score. Shading darkens with the level; the words carry it.", "", "L", false)
	d.font("", bodySize)

	type compRisk struct {
		name  string
		top   plan.Risk
		cml   string
		total int
	}
	var comps []compRisk
	for _, a := range d.s.Assets {
		for _, c := range a.Components {
			cr := compRisk{name: a.Name + " / " + c.Name}
			for _, m := range c.CMLs {
				if it := d.f.Item(m); it != nil {
					r := d.f.Risk(it)
					cr.total += r.Score()
					if r.Score() > cr.top.Score() {
						cr.top, cr.cml = r, m.ID
					}
				}
			}
			if cr.cml != "" {
				comps = append(comps, cr)
			}
		}
	}
	slices.SortStableFunc(comps, func(a, b compRisk) int {
		if a.top.Score() != b.top.Score() {
			return b.top.Score() - a.top.Score()
		}
		return b.total - a.total
	})
	d.heading(1, "Components by risk")
	rows := make([][]string, len(comps))
	styles := make([]rowStyle, len(comps))
	for i, c := range comps {
		rows[i] = []string{c.name, c.cml, c.top.Likelihood.String(), survey.Consequence(c.top.Consequence).String(),
			fmt.Sprintf("%s (%d)", c.top.Level(), c.top.Score()), strconv.Itoa(c.total)}
		styles[i] = rowStyle{bold: c.top.Level() == "very high", shade: c.top.Level() == "very high"}
	}
	d.table([]column{{"Asset / component", 62, "L"}, {"Highest-risk CML", 22, "L"}, {"Likelihood", 24, "L"},
		{"Consequence", 22, "L"}, {"Risk", 26, "L"}, {"Sum of CML scores", 24, "R"}}, rows, func(i int) rowStyle { return styles[i] }, smallSize)
}

// planSection writes the repair plan for the budget of the settings.
func (d *doc) planSection() {
	rp := d.f.Repairs
	if rp == nil {
		return
	}
	p, noCost, cur := rp.Plan, rp.NoCost, d.f.Settings.Plan.Costs.Currency
	d.newPage(false)
	d.heading(0, "Repair plan")
	budgets := p.Budgets
	what := fmt.Sprintf("a budget of %s %s for one year from %s", budgets[0], cur, d.s.Date.Format(dateLayout))
	if len(budgets) > 1 {
		what = fmt.Sprintf("%d years from %s: %s %s in the first year, then %s %s a year", len(budgets), d.s.Date.Format(dateLayout),
			budgets[0], cur, budgets[1], cur)
	}
	d.text(fmt.Sprintf("Repairs for %s. Components with a CML at or below required come first; "+
		"then, year by year, components whose retirement date falls inside the plan, in date order, each in the first year "+
		"whose budget covers it; then the set of the others that removes the most risk for what is left (a 0/1 knapsack, "+
		"risk recomputed at the start of each year as walls keep thinning). A repair restores its CMLs to nominal thickness "+
		"(or the repair thickness written) at the same rate. Unspent money is not carried over. Risk scores as in the Risk section.",
		what))
	d.pdf.Ln(1)
	rows := planRows(p, false)
	funded := rows[:len(p.Chosen)]
	deferred := rows[len(p.Chosen):]
	cols := []column{{"Year", 13, "L"}, {"Asset / component", 56, "L"}, {"Cost (" + cur + ")", 22, "R"},
		{"Risk before", 15, "R"}, {"Risk after", 15, "R"}, {"Retirement date", 21, "L"}, {"Why", 38, "L"}}
	pick := func(rs [][]string) [][]string {
		var out [][]string
		for _, r := range rs {
			out = append(out, []string{r[0], r[2], r[3], r[4], r[5], r[7], r[8]})
		}
		return out
	}
	d.heading(1, "Funded")
	if len(funded) == 0 {
		d.text("Nothing can be funded.")
	} else {
		d.table(cols, pick(funded), nil, smallSize)
	}
	d.heading(1, "Deferred, with the risk they still carry")
	if len(deferred) == 0 {
		d.text("Nothing is deferred.")
	} else {
		rows := pick(deferred)
		for _, r := range rows {
			r[0] = none
		}
		d.table(cols, rows, nil, smallSize)
	}
	var md string
	for _, n := range planNotes(p, noCost, cur) {
		md += "- " + n + "\n"
	}
	d.markdown(md)
}
