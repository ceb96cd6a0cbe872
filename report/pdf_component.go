package report

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/required"
	"github.com/lossline/lossline/survey/wallloss"
)

// asset writes an asset's heading and notes, then each of its components.
func (d *doc) asset(a *survey.Asset) {
	room := 110.0
	if hasPositions(a) {
		room = planBoxH + 70 // the heading stays with its site plan
	}
	d.chapter(room)
	d.heading(0, a.Name)
	if len(a.Notes) > 0 {
		d.notes(a.Notes)
	}
	d.sitePlan(a)
	for _, c := range a.Components {
		d.component(a, c)
	}
}

// component writes design data, readings, results, scope, notes and photos.
func (d *doc) component(a *survey.Asset, c *survey.Component) {
	d.heading(1, c.Name)
	des := c.Design
	installed, cons := none, des.Consequence.String()
	if des.Installed != nil {
		installed = des.Installed.String()
	}
	if cons == "" {
		cons = "not given"
	}
	u := string(d.u.u)
	req := d.u.thick(des.RequiredMM) + " " + u + " (as written in the checklist)"
	if des.RequiredCalc != nil {
		req = d.u.thick(des.RequiredMM) + " " + u + " by " + des.RequiredCalc.Method + " (derivation below)"
	} else if des.RequiredMM == nil {
		req = "not given: no remaining life"
	}
	model, modelText := d.f.Settings.Policy.RateModel, ""
	if des.RateModel != "" {
		model, modelText = des.RateModel, " (set for this component)"
	}
	rule := d.f.Settings.Policy.Rule
	if des.Rule != nil {
		rule = *des.Rule
	}
	pairs := [][2]string{
		{"Nominal thickness", d.u.thick(des.NominalMM) + " " + u},
		{"Required thickness", req},
		{"Installed", installed},
		{"Consequence", cons},
		{"CMLs", strconv.Itoa(len(c.CMLs))},
		{"Rate model", string(model) + modelText + ": " + model.Describe()},
		{"Interval rule", rule.Describe(d.f.Settings.Policy.IntervalCapYears)},
	}
	if des.AssumedRateMMPerY != nil {
		pairs = append(pairs, [2]string{"Assumed rate", d.u.rate(des.AssumedRateMMPerY) + " " + d.u.rateUnit + " (single-visit estimate written by the engineer)"})
	}
	if des.Corrosivity != "" {
		metal := des.Metal
		if metal == "" {
			metal = wallloss.CarbonSteel
		}
		pairs = append(pairs, [2]string{"Corrosivity", fmt.Sprintf("%s (ISO 9223): first-year rate of %s up to %g µm/a, ISO 9224 exponent b = %g (single-visit estimate)",
			des.Corrosivity, metal, des.Corrosivity.FirstYearRateUM(metal), wallloss.ISO9224ExponentB(metal))})
	}
	pairs = append(pairs, d.rateSourcePair(c)...)
	if g := d.f.Governing(c); g != nil {
		r := g.Result
		life := "; remaining life " + years(r.RemainingLifeY) + " y"
		if r.RemainingLifeY == nil {
			life = "" // the repair window says why there is none
		}
		gov := fmt.Sprintf("CML %s: %s%s%s; next inspection %s",
			g.CML.ID, repairWindow(r), localStatus(g), life, day(r.NextInspection))
		var unknown []string
		for _, m := range c.CMLs {
			if it := d.assessed(m); it != nil && it.Result.Class == wallloss.LifeUnknown {
				unknown = append(unknown, m.ID)
			}
		}
		if len(unknown) > 0 {
			gov += ". No remaining life can be computed for " + strings.Join(unknown, ", ") + " (see flags)."
		}
		pairs = append(pairs, [2]string{"Governed by", gov})
	}
	pairs = append(pairs, localPairs(c)...)     // pdf_local.go
	if len(c.CMLs) > 0 || des.Electro.Empty() { // a component of electro data only has no wall to describe
		d.keyValues(append(pairs, d.componentRecords(c)...), 40)
	}
	if des.RequiredCalc != nil {
		d.derivation(des.RequiredCalc)
	}
	if len(c.CMLs) > 0 {
		d.readings(c)
		d.results(c)
		d.cmlWarnings(c)
		d.trend(c)
	}
	d.electro(c)
	d.localDamage(c) // grids and local-damage assessments (pdf_local.go)
	if len(c.Scope) > 0 {
		d.heading(2, "Scope checklist")
		rows := make([][]string, len(c.Scope))
		for i, it := range c.Scope {
			rows[i] = []string{map[bool]string{true: "done", false: "NOT DONE"}[it.Done], stripInline(it.Text)}
		}
		d.table([]column{{"Done", 22, "L"}, {"Item", d.width() - 22, "L"}}, rows, func(i int) rowStyle {
			return rowStyle{bold: !c.Scope[i].Done}
		}, bodySize-1)
	}
	if len(c.Notes) > 0 {
		d.heading(2, "Notes")
		d.notes(c.Notes)
	}
	if shown := d.componentPhotos(c); len(shown) > 0 {
		d.need(photoMaxH + 20) // keep the heading with the first row
		d.heading(2, "Photos: "+d.figureRange(len(shown)))
		d.photoGrid(shown)
	}
}

// componentPhotos are the photos a component's pages show: its CMLs' first,
// then its own.
func (d *doc) componentPhotos(c *survey.Component) []photoShown {
	var shown []photoShown
	for _, m := range c.CMLs {
		for _, ph := range d.f.Photos.OfCML(m) {
			if e := d.photos[ph.Name]; e != nil {
				shown = append(shown, photoShown{entry: e, cml: m.ID})
			}
		}
	}
	for _, ph := range d.f.Photos.OfComponent(c) {
		if e := d.photos[ph.Name]; e != nil {
			shown = append(shown, photoShown{entry: e})
		}
	}
	return shown
}

// derivation shows how a required thickness was computed: inputs, steps, source.
func (d *doc) derivation(c *required.Calculation) {
	d.heading(2, "Required thickness: derivation")
	rows := make([][]string, len(c.Inputs))
	for i, in := range c.Inputs {
		rows[i] = []string{in.Name, in.Written, in.Used}
	}
	d.table([]column{{"Input", 60, "L"}, {"As written", 60, "L"}, {"Used as", 60, "L"}}, rows, nil, smallSize)
	var b strings.Builder
	for _, st := range c.Steps {
		b.WriteString("- " + mdEscape(st) + "\n")
	}
	b.WriteString(fmt.Sprintf("\nResult: **%s %s** (%s).\n", d.u.thick(&c.RequiredMM), d.u.u, mdEscape(c.Source)))
	d.markdown(b.String())
}

// mdEscape keeps formula text literal when rendered as Markdown.
func mdEscape(s string) string {
	return strings.NewReplacer("*", "\\*", "_", "\\_", "`", "\\`").Replace(s)
}

// rateModelText names a rate model and explains it in words.
func rateModelText(m wallloss.RateModel) string { return string(m) + ": " + m.Describe() }

// visitsPerTable is how many visit columns fit on a portrait page.
const visitsPerTable = 6

// readings writes every visit's readings, in tables of at most six visits.
func (d *doc) readings(c *survey.Component) {
	d.heading(2, fmt.Sprintf("Readings (%s)", d.u.u))
	dates := c.VisitDates
	for start := 0; start < len(dates) || start == 0; start += visitsPerTable {
		chunk := dates[start:min(start+visitsPerTable, len(dates))]
		cols := []column{{"CML", 16, "L"}, {"Location", 52, "L"}}
		vw := (d.width() - 68) / float64(max(len(chunk), 1))
		for _, dt := range chunk {
			cols = append(cols, column{dt.String(), vw, "R"})
		}
		rows := make([][]string, len(c.CMLs))
		for i, m := range c.CMLs {
			row := []string{m.ID, m.Location}
			for _, dt := range chunk {
				row = append(row, d.visitCell(m, dt))
			}
			rows[i] = row
		}
		d.table(cols, rows, nil, smallSize)
		if len(dates) == 0 {
			break
		}
	}
	d.remarks(c)
	d.font("I", smallSize)
	d.pdf.MultiCell(0, 3.8, "Where a visit holds several readings the governing (minimum) reading is shown first and all readings follow in brackets. — means not measured.", "", "L", false)
	d.font("", bodySize)
}

// remarks writes the remarks column of the reading table, when it has any.
func (d *doc) remarks(c *survey.Component) {
	var rows [][]string
	for _, m := range c.CMLs {
		if m.Remarks != "" {
			rows = append(rows, []string{m.ID, stripInline(m.Remarks)})
		}
	}
	if len(rows) > 0 {
		d.table([]column{{"CML", 16, "L"}, {"Remarks", d.width() - 16, "L"}}, rows, nil, smallSize)
	}
}

func (d *doc) visitCell(m *survey.CML, dt survey.VisitDate) string {
	for _, v := range m.Visits {
		if v.Date.Time.Equal(dt.Time) {
			g := d.u.u.Format(v.Governing())
			if len(v.ReadingsMM) == 1 {
				return g
			}
			all := make([]string, len(v.ReadingsMM))
			for i, r := range v.ReadingsMM {
				all[i] = d.u.u.Format(r)
			}
			return g + " (" + strings.Join(all, " ") + ")"
		}
	}
	return none
}

// results writes each CML's rates, remaining life and dates.
func (d *doc) results(c *survey.Component) {
	d.need(45) // the heading with the table's header and first rows
	d.heading(2, "Results")
	u, ru := string(d.u.u), d.u.rateUnit
	cols := []column{
		{"CML", 14, "L"}, {"Thick\u00ad ness (" + u + ")", 16, "R"}, {"Long- term rate (" + ru + ")", 17, "R"},
		{"Short- term rate (" + ru + ")", 17, "R"}, {"Governing rate (" + ru + ")", 18, "R"}, {"Remaining life (y)", 18, "R"},
		{"Retirement date", 21, "L"}, {"Next inspection", 23, "L"}, {"Repair window and flags", 36, "L"},
	}
	var rows [][]string
	var res []wallloss.Result
	for _, m := range c.CMLs {
		it := d.assessed(m)
		if it == nil {
			continue
		}
		r := it.Result
		thick := d.u.thick(r.ThicknessMM)
		if r.FromEarlierVisit() {
			thick += " (" + day(r.CurrentDate) + ")"
		}
		next := day(r.NextInspection)
		if b := r.NextBasis.String(); b != "" {
			next += " (" + b + ")"
		}
		if r.NextExternal != nil {
			next += "; external " + day(r.NextExternal)
		}
		rate := d.u.rate(r.RateMMPerY)
		if r.RateModel == wallloss.ModelISO9224 {
			rate += " ISO 9224" // the standard's name, as the methods appendix writes it
		} else if r.RateModel != "" && r.RateModel != wallloss.ModelMax {
			rate += " " + string(r.RateModel)
		}
		if r.RateUpperMMPerY != nil {
			rate += ", upper " + d.u.rate(r.RateUpperMMPerY)
		}
		life := years(r.RemainingLifeY)
		if r.RemainingLifeLowY != nil {
			life += " (low " + years(r.RemainingLifeLowY) + ")"
		}
		st := repairWindow(r)
		var flags []wallloss.Flag
		for _, f := range r.Flags {
			if strings.ReplaceAll(string(f), "-", " ") != st {
				flags = append(flags, f)
			}
		}
		if len(flags) > 0 {
			st += "; " + flagsText(flags)
		}
		rows = append(rows, []string{m.ID, thick, d.u.rate(r.RateLongMMPerY), d.u.rate(r.RateShortMMPerY),
			rate, life, day(r.Retirement), next, st})
		res = append(res, r)
	}
	d.table(cols, rows, func(i int) rowStyle { return rowStyle{bold: urgent(res[i]), shade: urgent(res[i])} }, smallSize)
}

func (d *doc) assessed(m *survey.CML) *survey.Assessed {
	return d.f.Item(m)
}

// stripInline removes Markdown emphasis markers for table cells.
func stripInline(s string) string {
	return strings.NewReplacer("**", "", "__", "", "`", "").Replace(s)
}

// hasPositions reports whether some CML of the asset has a position, so that
// the asset has a site plan.
func hasPositions(a *survey.Asset) bool {
	for _, c := range a.Components {
		for _, m := range c.CMLs {
			if m.GPS != nil {
				return true
			}
		}
	}
	return false
}
