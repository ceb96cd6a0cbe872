package report

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// coverAssets is how many assets the cover names before it counts the rest.
const coverAssets = 8

// cover writes the first page: what was surveyed, by whom, and the headline figures.
func (d *doc) cover() {
	p := d.pdf
	d.newPage(false)
	p.Bookmark("Cover", 0, -1)
	p.SetY(28)
	d.font("B", 10)
	p.SetTextColor(80, 80, 80)
	p.CellFormat(0, 6, "CORROSION THICKNESS SURVEY REPORT", "", 1, "L", false, 0, "")
	p.SetTextColor(0, 0, 0)
	d.font("B", 20)
	p.MultiCell(0, 9, d.s.Title, "", "L", false)
	p.Ln(2)
	d.font("", 12)
	p.MultiCell(0, 6, d.s.Site, "", "L", false)
	p.Ln(5)

	var assets []string
	for _, a := range d.s.Assets {
		assets = append(assets, a.Name)
	}
	if n := len(assets); n > coverAssets {
		// A long list would push the cautions and the summary off their pages.
		assets = append(assets[:coverAssets-1], fmt.Sprintf("and %d more (see the contents)", n-coverAssets+1))
	}
	for _, kv := range [][2]string{
		{"Survey date", d.s.Date.Format(dateLayout)},
		{"Inspector", d.s.Inspector},
		{"Assets", strings.Join(assets, "\n")},
		{"Thickness units", fmt.Sprintf("%s (rates in %s)", d.u.u, d.u.rateUnit)},
		{"Report produced", d.opts.Created.Format(dateLayout) + " by lossline " + d.opts.Version},
	} {
		d.font("B", bodySize)
		y := p.GetY()
		p.CellFormat(38, lineH+0.6, kv[0], "", 0, "L", false, 0, "")
		d.font("", bodySize)
		p.SetXY(margin+38, y)
		p.MultiCell(0, lineH+0.6, kv[1], "", "L", false)
	}
	p.Ln(4)
	d.documentControl()
	d.headlines()
}

// headlines draws the four figures an owner reads first.
func (d *doc) headlines() {
	p := d.pdf
	measured, below, atLocalLimit := 0, 0, 0
	var shortest, earliest *survey.Assessed
	for _, it := range d.items {
		r := it.Result
		if r.ThicknessMM != nil && !r.FromEarlierVisit() {
			measured++
		}
		if r.Class == wallloss.AtOrBelowRequired {
			below++
		} else if life, ok := it.Component.LocalLifeY(); ok && life <= 0 {
			atLocalLimit++
		}
		if r.RemainingLifeY != nil && (shortest == nil || *r.RemainingLifeY < *shortest.Result.RemainingLifeY) {
			shortest = it
		}
		if r.NextInspection != nil && (earliest == nil || r.NextInspection.Before(*earliest.Result.NextInspection)) {
			earliest = it
		}
	}
	type figure struct{ value, label string }
	figs := []figure{
		{fmt.Sprintf("%d of %d", measured, len(d.items)), "CMLs measured at this visit"},
		{strconv.Itoa(below), "CMLs at or below required thickness"},
		{none, "shortest remaining life"},
		{none, "earliest next inspection"},
	}
	if atLocalLimit > 0 { // they rank as at or below required: the cover must not hide them
		figs[1].label += fmt.Sprintf(", and %d more by local damage at its limit", atLocalLimit)
	}
	if shortest != nil {
		figs[2].value = years(shortest.Result.RemainingLifeY) + " years"
		figs[2].label += " (CML " + shortest.CML.ID + ")"
	}
	if earliest != nil {
		figs[3].value = day(earliest.Result.NextInspection)
		figs[3].label += " (CML " + earliest.CML.ID + ")"
	}
	w := (d.width() - 3*3) / 4
	y := p.GetY()
	for i, f := range figs {
		x := margin + float64(i)*(w+3)
		p.SetFillColor(240, 240, 240)
		p.Rect(x, y, w, 26, "FD")
		p.SetXY(x, y+3)
		size := 15.0
		for d.font("B", size); size > 8 && p.GetStringWidth(f.value) > w-3; size-- {
			d.font("B", size-1) // large surveys: "100000 of 100000" fits its box
		}
		p.CellFormat(w, 8, f.value, "", 0, "C", false, 0, "")
		p.SetXY(x+2, y+13)
		d.font("", smallSize)
		p.MultiCell(w-4, 3.6, f.label, "", "C", false)
	}
	p.SetXY(margin, y+32)
}

// cautions writes the boxed cautions: the built-in text, then any the
// templates folder adds.
func (d *doc) cautions() error {
	text, err := d.opts.Templates.Execute("report/cautions.md", nil)
	if err != nil {
		return fmt.Errorf("cautions template: %w", err)
	}
	added, err := d.opts.Templates.Addition("report/cautions.md", nil)
	if err != nil {
		return fmt.Errorf("cautions template: %w", err)
	}
	p := d.pdf
	d.need(80)
	y0 := p.GetY()
	p.SetLeftMargin(margin + 4)
	p.SetRightMargin(margin + 4)
	p.SetXY(margin+4, y0+3)
	d.font("B", 11)
	p.Bookmark("Cautions", 0, -1)
	p.CellFormat(0, 6, "Cautions", "", 1, "L", false, 0, "")
	d.markdown(text)
	p.SetLeftMargin(margin)
	p.SetRightMargin(margin)
	p.SetLineWidth(0.5)
	p.Rect(margin, y0, d.width(), p.GetY()-y0+1, "D")
	p.SetLineWidth(0.2)
	p.SetXY(margin, p.GetY()+4)
	if strings.TrimSpace(added) != "" {
		// The built-in cautions in the box always print; the templates
		// folder may only add to them, below the box.
		d.need(20)
		d.font("B", 11)
		p.Bookmark("Further cautions", 1, -1)
		p.CellFormat(0, 6, "Further cautions", "", 1, "L", false, 0, "")
		d.markdown(added)
		p.Ln(2)
	}
	return nil
}

// summary writes one row per component (governed by its most urgent CML), the
// scope limitations and the survey's general notes.
func (d *doc) summary() {
	d.newPage(false)
	d.heading(0, "Summary")
	d.summaryWords()
	nComp := 0
	for _, a := range d.s.Assets {
		nComp += len(a.Components)
	}
	if d.summaryFirst() {
		d.leftToExports()
		d.heading(1, "Assets")
		d.text(fmt.Sprintf("%s on %s of %s, summarised per asset. Thicknesses in %s, rates in %s, remaining life in years.",
			plural(len(d.items), "CML", "CMLs"), plural(nComp, "component", "components"), plural(len(d.s.Assets), "asset", "assets"),
			d.u.u, d.u.rateUnit))
		d.assetSummaries()
	} else {
		d.text(fmt.Sprintf("%s on %s of %s. Each component is governed by its most urgent CML; "+
			"the full ranking of every CML follows this summary. Thicknesses in %s, rates in %s, remaining life in years.",
			plural(len(d.items), "CML", "CMLs"), plural(nComp, "component", "components"), plural(len(d.s.Assets), "asset", "assets"),
			d.u.u, d.u.rateUnit))
		d.pdf.Ln(2)
		d.componentSummaries()
	}
	if len(d.s.Notes) > 0 {
		d.heading(1, "Survey notes")
		d.notes(d.s.Notes)
	}
}

// componentSummaries writes one row per component, asset by asset.
func (d *doc) componentSummaries() {
	u := string(d.u.u)
	cols := []column{
		{"Asset / component", 52, "L"}, {"CMLs", 9, "R"}, {"Governing CML", 15, "L"},
		{"Thickness / required (" + u + ")", 24, "R"}, {"Rate (" + d.u.rateUnit + ")", 13, "R"}, {"Remaining life (y)", 16, "R"},
		{"Next inspection", 19, "L"}, {"Repair window", d.width() - 148, "L"},
	}
	// A component without CMLs may still carry a finding (a test point not
	// protected, a coating rejected): its row says so, not just "no CMLs".
	found := map[[2]string][]string{}
	for _, e := range d.f.Electro() {
		k := [2]string{e.Asset, e.Component}
		found[k] = append(found[k], electroFindingWords(e))
	}
	var rows [][]string
	var styles []rowStyle
	for _, a := range d.s.Assets {
		for _, c := range a.Components {
			g := d.f.Governing(c)
			row := []string{a.Name + " / " + c.Name, strconv.Itoa(len(c.CMLs)), none, none, none, none, none, "no CMLs"}
			st := rowStyle{}
			if fs := found[[2]string{a.Name, c.Name}]; len(fs) > 0 && g == nil {
				row[7] += "; " + strings.Join(fs, "; ") + " (see the findings)"
				st = rowStyle{bold: true}
			}
			if g != nil {
				r := g.Result
				row[2] = g.CML.ID
				row[3] = d.u.thick(r.ThicknessMM) + " / " + d.u.thick(c.Design.RequiredMM)
				row[4], row[5], row[6], row[7] = d.u.rate(r.RateMMPerY), years(r.RemainingLifeY), day(r.NextInspection), repairWindow(r)+localStatus(g)
				u := urgent(r) || localUrgent(g)
				st = rowStyle{bold: u, shade: u}
			}
			rows = append(rows, row)
			styles = append(styles, st)
		}
	}
	d.table(cols, rows, func(i int) rowStyle { return styles[i] }, smallSize)
}

// ranked writes every CML of the survey in rank order, on landscape pages.
func (d *doc) ranked() {
	if d.summaryFirst() {
		d.attentionList()
		return
	}
	d.newPage(true)
	d.heading(0, "Ranked list of CMLs")
	d.text(fmt.Sprintf("Most urgent first: at or below required, then shortest remaining life; ties by consequence, then CML id. "+
		"Thicknesses in %s, rates in %s (the governing rate, the larger of long- and short-term). Rows at or below "+
		"required or under 5 years of remaining life are in bold and shaded; the repair window column says why.", d.u.u, d.u.rateUnit))
	d.pdf.Ln(2)
	u := string(d.u.u)
	cols := []column{
		{"Rank", 11, "R"}, {"Asset / component", 50, "L"}, {"CML", 15, "L"},
		{"Thickness (" + u + ")", 18, "R"}, {"Required (" + u + ")", 18, "R"}, {"Rate (" + d.u.rateUnit + ")", 16, "R"},
		{"Remaining life (y)", 19, "R"}, {"Retirement date", 21, "L"}, {"Next inspection", 21, "L"},
		{"Conse\u00ad quence", 17, "L"}, {"Repair window", 27, "L"}, {"Flags", 34, "L"},
	}
	rows := make([][]string, len(d.items))
	for i, it := range d.items {
		r := it.Result
		cons := it.Component.Design.Consequence.String()
		if cons == "" {
			cons = none
		}
		rows[i] = []string{
			strconv.Itoa(it.Rank), it.Asset.Name + " / " + it.Component.Name, it.CML.ID,
			d.u.thick(r.ThicknessMM), d.u.thick(it.Component.Design.RequiredMM), d.u.rate(r.RateMMPerY),
			years(r.RemainingLifeY), day(r.Retirement), day(r.NextInspection), cons, repairWindow(r) + localStatus(it), flagsText(r.Flags),
		}
	}
	d.table(cols, rows, func(i int) rowStyle {
		u := urgent(d.items[i].Result) || localUrgent(d.items[i])
		return rowStyle{bold: u, shade: u}
	}, smallSize)
}

// notes writes checklist notes: paragraphs as paragraphs, bullets as bullets.
func (d *doc) notes(notes []survey.Note) {
	var b strings.Builder
	for i, n := range notes {
		if n.Bullet {
			b.WriteString("- " + n.Markdown + "\n")
			if i+1 < len(notes) && !notes[i+1].Bullet {
				b.WriteString("\n")
			}
		} else {
			b.WriteString(n.Markdown + "\n\n")
		}
	}
	d.markdown(b.String())
}
