package report

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
)

// riskSection writes the 5×5 risk matrix with counts per cell, labelled in
// words, and the components by their highest CML risk.
func (d *doc) riskSection() {
	d.chapter(150)
	d.heading(0, "Risk")
	d.text("Risk per CML = likelihood × consequence, both on five levels. Likelihood comes from the remaining life the " +
		"dates use (for a fitted rate its lower confidence bound, so rate uncertainty can only raise it): " + plan.LifeBands +
		". Consequence is written per component (very low 1 … very high 5; not given: taken as high). Risk level: " +
		"low 1-4, medium 5-9, high 10-14, very high 15-25. The bands are lossline's own. " + bandsDiffer)
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
		name     string
		top      plan.Risk
		cml      string
		cmls, at int // CMLs assessed, and how many of them have the top score
	}
	var comps []compRisk
	for _, a := range d.s.Assets {
		for _, c := range a.Components {
			cr := compRisk{name: a.Name + " / " + c.Name}
			for _, m := range c.CMLs {
				if it := d.f.Item(m); it != nil {
					r := d.f.Risk(it)
					cr.cmls++
					switch {
					case r.Score() > cr.top.Score():
						cr.top, cr.cml, cr.at = r, m.ID, 1
					case r.Score() == cr.top.Score():
						cr.at++
					}
				}
			}
			if cr.cml != "" {
				comps = append(comps, cr)
			}
		}
	}
	// Highest risk first; at equal scores the likelier first. The number of
	// CMLs never orders them: a component's risk is its worst CML's.
	slices.SortStableFunc(comps, func(a, b compRisk) int {
		if a.top.Score() != b.top.Score() {
			return b.top.Score() - a.top.Score()
		}
		return int(b.top.Likelihood) - int(a.top.Likelihood)
	})
	d.heading(1, "Components by risk")
	d.text("A component's risk is that of its worst CML, so a component does not grow riskier by having more CMLs; the repair plan weighs the same risk.")
	d.pdf.Ln(1)
	all := len(comps)
	comps = comps[:d.capRows(all)]
	rows := make([][]string, len(comps))
	styles := make([]rowStyle, len(comps))
	for i, c := range comps {
		rows[i] = []string{c.name, c.cml, c.top.Likelihood.String(), survey.Consequence(c.top.Consequence).String(),
			fmt.Sprintf("%s (%d)", c.top.Level(), c.top.Score()), fmt.Sprintf("%d of %d", c.at, c.cmls)}
		styles[i] = rowStyle{bold: c.top.Level() == "very high", shade: c.top.Level() == "very high"}
	}
	d.table([]column{{"Asset / component", 62, "L"}, {"Highest-risk CML", 22, "L"}, {"Likelihood", 24, "L"},
		{"Consequence", 22, "L"}, {"Risk (worst CML)", 26, "L"}, {"CMLs at that risk", 24, "R"}}, rows, func(i int) rowStyle { return styles[i] }, smallSize)
	d.leftOut(len(comps), all, JSONFile+" (each CML's risk_score and risk_level)")
	d.breachSection()
}

// planSection writes the repair plan for the budget of the settings: the
// funded rows with the numbers they were chosen on, the others with the risk
// they carry at the end of the plan, the notes, the two objectives side by
// side when both were asked for, and the budget curve.
func (d *doc) planSection() {
	rp := d.f.Repairs
	if rp == nil {
		return
	}
	cur := d.f.Settings.Plan.Costs.Currency
	d.chapter(120)
	d.heading(0, "Repair plan")
	p := rp.Plan
	budgets := p.Budgets
	what := fmt.Sprintf("a budget of %s %s for one year from %s", budgets[0], cur, d.s.Date.Format(dateLayout))
	if len(budgets) > 1 {
		what = fmt.Sprintf("%d years from %s: %s %s in the first year, then %s %s a year", len(budgets), d.s.Date.Format(dateLayout),
			budgets[0], cur, budgets[1], cur)
	}
	carry := "Unspent money is not carried over."
	if p.CarryOver {
		carry = "Unspent money is carried over to the next year."
	}
	d.text(fmt.Sprintf("Repairs for %s. Mandatory repairs come first: components with a CML at or below required, then "+
		"those whose retirement date falls inside the plan, in date order, each in the first year whose money covers it. "+
		"The money left buys the selection: the set of the other repairs worth most under the objective (a 0/1 knapsack), "+
		"risk recomputed at the start of each year as walls keep thinning. A repair restores its CMLs to nominal thickness "+
		"(or the repair thickness written) at the same rate. %s A component's risk is its worst CML's. Every row shows the "+
		"numbers it was decided on: the risk at the start of the year the numbers are from (the year funded, or for a row not "+
		"funded the last year it was passed over) and what a repair then removes; the risk a row not funded still carries at "+
		"the end of the plan is in its own column.", what, carry))
	d.pdf.Ln(1)
	for _, pl := range rp.Plans {
		if len(rp.Plans) > 1 {
			d.heading(1, "Plan for the objective "+string(pl.Objective))
		}
		d.planTables(pl, cur, len(rp.Plans) > 1)
		var md string
		notes := append([]string{objectiveNote(pl, cur)}, planNotes(pl, rp.NoCost, cur)...)
		for _, n := range append(notes, totalsNote(pl, cur)...) {
			md += "- " + n + "\n"
		}
		d.markdown(md)
	}
	if len(rp.Plans) > 1 {
		d.heading(1, "The two plans side by side")
		h, rows := comparison(rp.Plans, cur, false)
		for i := range h {
			h[i] = strings.ToUpper(h[i][:1]) + h[i][1:]
		}
		cols := []column{{h[0], 60, "L"}, {h[1], 22, "R"}, {h[2], 22, "R"}, {h[3], 38, "L"}, {h[4], 38, "L"}}
		d.table(cols, rows, nil, smallSize)
	}
	d.budgetCurve(rp.Curve, cur)
}

// planTables draws a plan's funded rows and the others.
func (d *doc) planTables(p plan.Plan, cur string, sub bool) {
	value := func(c plan.Choice) string { return strconv.Itoa(c.Reduction()) }
	valueTitle := "Reduction"
	switch {
	case p.Objective == plan.ObjectiveMoney:
		valueTitle = "Saving (" + cur + ")"
		value = func(c plan.Choice) string { return cents(c.Value, false) }
	case len(p.Budgets) > 1:
		valueTitle = "Risk-years"
		value = func(c plan.Choice) string { return strconv.FormatInt(c.Value, 10) }
	}
	level := 1
	if sub {
		level = 2
	}
	funded, other := p.Funded(), p.Unfunded()
	d.heading(level, "Funded")
	if len(funded) == 0 {
		d.text("Nothing can be funded.")
	} else {
		rows := make([][]string, d.capRows(len(funded)))
		for i, c := range funded[:len(rows)] {
			rows[i] = []string{string(c.Status), strconv.Itoa(c.Year), c.Candidate.Name(), c.Candidate.Cost.String(),
				strconv.Itoa(c.RiskBefore), strconv.Itoa(c.RiskAfter), value(c), c.Why}
		}
		d.table([]column{{"Funding status", 25, "L"}, {"Year", 9, "R"}, {"Asset / component", 36, "L"}, {"Cost (" + cur + ")", 17, "R"},
			{"Risk at year start", 12, "R"}, {"After repair", 12, "R"}, {valueTitle, 14, "R"}, {"Why", 55, "L"}}, rows, nil, 7)
		d.leftOut(len(rows), len(funded), "the output of lossline plan, which lists every row")
	}
	d.heading(level, "Not funded, with the risk they still carry")
	if len(other) == 0 {
		d.text("Nothing is deferred.")
		return
	}
	rows := make([][]string, d.capRows(len(other)))
	for i, c := range other[:len(rows)] {
		missing := ""
		if c.Status == plan.StatusMandatoryUnfunded {
			missing = c.Missing.String()
		}
		rows[i] = []string{string(c.Status), c.Candidate.Name(), c.Candidate.Cost.String(), strconv.Itoa(c.At),
			strconv.Itoa(c.RiskBefore), value(c), strconv.Itoa(c.RiskEnd), missing, c.Why}
	}
	d.table([]column{{"Funding status", 25, "L"}, {"Asset / component", 32, "L"}, {"Cost (" + cur + ")", 16, "R"}, {"Plan year of the numbers", 11, "R"},
		{"Risk at year start", 11, "R"}, {valueTitle, 13, "R"}, {"Risk at end of plan", 12, "R"}, {"Missing (" + cur + ")", 15, "R"},
		{"Why", 45, "L"}}, rows, nil, 7)
	d.leftOut(len(rows), len(other), "the output of lossline plan, which lists every row")
}

// bandsDiffer says in one sentence why the likelihood bands (1, 3, 5, 10
// years; survey/plan) do not share the repair windows' boundaries (2, 5, 10
// years; survey/wallloss).
const bandsDiffer = "The likelihood bands (1, 3, 5 and 10 years) are not the repair windows (2, 5 and 10 years): " +
	"the matrix needs five levels and splits the first five years more finely, while both use the same remaining life " +
	"and meet at 5 and 10 years."
