package report

import (
	"fmt"
	"math"
	"strings"
	"time"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/electrochem"
	"github.com/lossline/lossline/survey/wallloss"
)

// electro writes a component's coupons, probes, test points, anodes, coating
// and metal pair: each table with its inputs, steps, result and source.
func (d *doc) electro(c *survey.Component) {
	e := c.Design.Electro
	if e == nil {
		return
	}
	d.governingRates(c)
	stepsOf := func(w electrochem.Working) string { return strings.Join(w.Steps, "\n") }
	if len(e.Coupons) > 0 {
		d.section("Mass-loss coupons")
		var rows [][]string
		for _, cp := range e.Coupons {
			if cp.Rate == nil {
				continue
			}
			in := fmt.Sprintf("%s, %s to %s (%.0f h); %.4g g → %.4g g; %.4g cm²; ρ %.4g g/cm³", cp.Metal, cp.Installed, cp.Removed,
				cp.Coupon.Hours, cp.Coupon.MassBeforeG, cp.Coupon.MassAfterG, cp.Coupon.AreaCM2, cp.Coupon.DensityG)
			res := fmt.Sprintf("%.4g mm/y (%.3g mpy): %s", cp.Rate.MMPerY, cp.Rate.MPY, cp.Rate.Band)
			if cp.Rate.PitMMPerY > 0 {
				res += fmt.Sprintf("; pitting %.4g mm/y: %s", cp.Rate.PitMMPerY, cp.Rate.PitBand)
			}
			rows = append(rows, []string{cp.ID, in, stepsOf(cp.Rate.Working), res})
		}
		d.stepTable("Coupon", rows)
		d.source(electrochem.CouponSource)
	}
	if len(e.ERProbes) > 0 {
		d.section("Electrical-resistance probes")
		var rows [][]string
		for _, p := range e.ERProbes {
			if p.Rate == nil {
				continue
			}
			var rd []string
			for i, dt := range p.Dates {
				rd = append(rd, fmt.Sprintf("%s: %g", dt, p.Readings[i]))
			}
			rows = append(rows, []string{p.ID, fmt.Sprintf("span %.4g mm; readings (divisions) %s", p.SpanMM, strings.Join(rd, ", ")),
				stepsOf(p.Rate.Working), fmt.Sprintf("%.4g mm/y; %.4g mm lost; %.0f %% of the span used", p.Rate.MMPerY, p.Rate.TotalMM, 100*p.Rate.Consumed)})
		}
		d.stepTable("Probe", rows)
		d.source(electrochem.ERSource)
	}
	if len(e.LPRProbes) > 0 {
		d.section("Linear-polarisation probes")
		var rows [][]string
		var src *electrochem.Working
		for _, p := range e.LPRProbes {
			for i, r := range p.Rates {
				rows = append(rows, []string{p.ID + " " + p.Dates[i].String(), fmt.Sprintf("%s; R_p %g Ω·cm²", p.Metal, p.RpOhmCM2[i]),
					stepsOf(r.Working), fmt.Sprintf("i_corr %.4g µA/cm²; %.4g mm/y (%.3g mpy)", r.ICorr, r.MMPerY, r.MPY)})
				src = &p.Rates[i].Working
			}
		}
		d.stepTable("Probe, date", rows)
		if src != nil {
			d.source(src.Source)
		}
	}
	if len(e.TestPoints) > 0 {
		d.testPoints(e)
	}
	if len(e.Anodes) > 0 {
		d.section("Sacrificial anodes")
		var rows [][]string
		var src *electrochem.Working
		for _, an := range e.Anodes {
			if an.Life == nil {
				continue
			}
			a := an.Anode
			inst := "installed mass not given"
			if a.InitialKG > 0 {
				inst = fmt.Sprintf("installed %.4g kg", a.InitialKG)
			}
			in := fmt.Sprintf("%s, ε %g A·h/kg (theoretical %.0f); %s; %.4g kg left; %.4g A; u %.2f (%s)", a.Metal.Name, a.Metal.CapacityAhK,
				electrochem.TheoreticalCapacity(electrochem.Elements[a.Metal.Element]), inst, a.RemainingKG, a.CurrentA, a.Utilisation, an.UseNote)
			rows = append(rows, []string{an.ID, in, stepsOf(an.Life.Working), fmt.Sprintf("%.1f y: replace by %s", an.Life.Years, an.Replace)})
			src = &an.Life.Working
		}
		d.stepTable("Anode", rows)
		if src != nil {
			d.source(src.Source)
		}
	}
	d.coating(c)
	if g := e.Galvanic; g != nil {
		d.section("Metal pair")
		verdict := "within the 0.25 V limit (common practice)"
		if g.Warn {
			verdict = fmt.Sprintf("WARNING: more than 0.25 V apart (common practice): the %s corrodes faster where the two touch in an electrolyte; isolate the pair or protect the anode side", g.Anode.Name)
		}
		d.keyValues([][2]string{
			{"Material", e.Material},
			{"In contact with", e.InContactWith},
			{"Potentials", fmt.Sprintf("%s %.2f to %.2f V, %s %.2f to %.2f V (vs SCE, flowing seawater)", g.Anode.Name, g.Anode.LowV, g.Anode.HighV, g.Cathode.Name, g.Cathode.LowV, g.Cathode.HighV)},
			{"Result", strings.Join(g.Steps, "; ") + ". " + verdict},
			{"Source", g.Source},
		}, 40)
	}
}

// governingRates says, per CML, which of wall, coupon and probe rate governs.
func (d *doc) governingRates(c *survey.Component) {
	var rows [][]string
	var disagree bool
	for _, m := range c.CMLs {
		it := d.assessed(m)
		if it == nil || it.Result.RateWhy == "" {
			continue
		}
		r := it.Result
		from := r.RateFrom
		if from == "" {
			from = "wall"
		}
		flag := ""
		if r.HasFlag(wallloss.FlagRatesDisagree) {
			flag, disagree = "rates disagree", true
		}
		rows = append(rows, []string{m.ID, d.u.rate(r.WallRateMMPerY), from, d.u.rate(r.RateMMPerY), r.RateWhy, flag})
	}
	if len(rows) == 0 {
		return
	}
	d.section("Governing rate: wall, coupons and probes")
	ru := d.u.rateUnit
	d.table([]column{{"CML", 16, "L"}, {"Wall rate (" + ru + ")", 22, "R"}, {"Governs", 26, "L"}, {"Rate used (" + ru + ")", 22, "R"},
		{"Why", d.width() - 114, "L"}, {"Check", 28, "L"}}, rows, func(i int) rowStyle { return rowStyle{bold: rows[i][5] != ""} }, smallSize)
	if disagree {
		d.note("Rates disagree: the larger is more than 3 times the smaller and they differ by more than 0.025 mm/y (common practice). " +
			"Check where the coupon or probe sits against the CMLs, and the readings, before relying on either.")
	}
}

// stepTable draws rows of id, inputs, steps and result.
func (d *doc) stepTable(first string, rows [][]string) {
	w := d.width()
	d.table([]column{{first, 20, "L"}, {"Inputs", 46, "L"}, {"Steps", w - 20 - 46 - 40, "L"}, {"Result", 40, "L"}}, rows, nil, smallSize)
}

// source prints a method's source under its table.
func (d *doc) source(s string) { d.note("Source: " + s + ".") }

// note writes a small italic paragraph.
func (d *doc) note(s string) {
	d.font("I", smallSize)
	d.pdf.MultiCell(0, 3.6, s, "", "L", false)
	d.font("", bodySize)
	d.pdf.Ln(1.5)
}

// testPoints writes the test points' potentials, judgements and chart.
func (d *doc) testPoints(e *survey.Electro) {
	d.section("Cathodic protection test points")
	mv := func(v *float64) string {
		if v == nil {
			return none
		}
		return fmt.Sprintf("%.0f", *v)
	}
	var rows [][]string
	var bold []bool
	caution := false
	for _, tp := range e.TestPoints {
		for i, v := range tp.Visits {
			j := v.Judgement
			p := v.Potentials
			res := j.Status.String()
			if j.Met != "" {
				res += ": " + j.Met
			}
			if len(j.Reasons) > 0 {
				res += ": " + strings.Join(j.Reasons, "; ")
			}
			if i == len(tp.Visits)-1 && tp.Trend != nil {
				res += fmt.Sprintf(". Since the first visit %+.0f mV", tp.Trend.ChangeMV)
				if tp.Trend.Worsening {
					res += " (moving positive: less protection)"
				}
			}
			caution = caution || j.Caution != ""
			rows = append(rows, []string{tp.ID, v.Date.String(), p.Electrode.String(), mv(p.On), mv(p.Off), mv(p.Native), mv(j.OffCSE), mv(j.PolarisationMV), res})
			bold = append(bold, j.Status != electrochem.Protected)
		}
	}
	w := d.width()
	d.table([]column{{"Point", 14, "L"}, {"Date", 19, "L"}, {"Electrode", 20, "L"}, {"On (mV)", 13, "R"}, {"Off (mV)", 13, "R"},
		{"Native (mV)", 15, "R"}, {"Off (mV CSE)", 15, "R"}, {"Polar\u00ad isation (mV)", 15, "R"}, {"Result", w - 124, "L"}}, rows,
		func(i int) rowStyle { return rowStyle{bold: bold[i]} }, smallSize)
	limit := electrochem.PolarisedLimitMV
	if e.Anaerobic {
		limit = electrochem.AnaerobicLimitMV
	}
	over := electrochem.DefaultCriteria.OverLimitMV
	if e.OverLimitMV != nil {
		over = *e.OverLimitMV
	}
	d.note(fmt.Sprintf("Criteria: instant-off %.0f mV CSE or more negative, or at least 100 mV of polarisation (native − off); over-protected below %.0f mV CSE. "+
		"Conversions to CSE: %s. Source: %s.", limit, over, electrochem.OffsetSource, electrochem.CPSource))
	if caution {
		d.note("Caution: " + electrochem.IRDropCaution + ".")
	}
	d.potentialChart(e, limit, over)
}

// potentialChart draws each test point's judged potential (instant-off, or
// on where no off was taken: hollow markers) by visit, with the criterion and
// the over-protection limit as lines.
func (d *doc) potentialChart(e *survey.Electro, limit, over float64) {
	type pt struct {
		t  time.Time
		mv float64
		on bool
	}
	var series [][]pt
	var from, to time.Time
	lo, hi := math.Min(limit, over), limit
	for _, tp := range e.TestPoints {
		var s []pt
		for _, v := range tp.Visits {
			j := v.Judgement
			p := pt{t: v.Date.Time}
			switch {
			case j.OffCSE != nil:
				p.mv = *j.OffCSE
			case j.OnCSE != nil:
				p.mv, p.on = *j.OnCSE, true
			default:
				continue
			}
			s = append(s, p)
			lo, hi = math.Min(lo, p.mv), math.Max(hi, p.mv)
			if from.IsZero() || p.t.Before(from) {
				from = p.t
			}
			if p.t.After(to) {
				to = p.t
			}
		}
		series = append(series, s)
	}
	if from.IsZero() {
		return
	}
	pad := 90 * 24 * time.Hour
	from, to = from.Add(-pad), to.Add(pad)
	lo, hi = lo-50, hi+50
	d.need(chartH + 20)
	d.heading(2, "Potentials by visit")
	p := d.pdf
	x0, y0 := margin+chartLeft, p.GetY()+4
	w, h := d.width()-chartLeft-14, chartH-chartBottom-10
	span := to.Sub(from).Hours()
	xOf := func(t time.Time) float64 { return x0 + t.Sub(from).Hours()/span*w }
	yOf := func(v float64) float64 { return y0 + (hi-v)/(hi-lo)*h } // less negative at the top
	d.timeAxes(x0, y0, w, h, niceTicks(lo, hi, 6), yOf, yearTicks(from, to, 10), xOf, "Potential (mV CSE); more negative is lower")
	for _, ref := range []struct {
		v     float64
		label string
		dash  []float64
	}{{limit, fmt.Sprintf("criterion %.0f mV", limit), []float64{3, 1, 0.6, 1}}, {over, fmt.Sprintf("over-protection %.0f mV", over), []float64{0.5, 1}}} {
		y := yOf(ref.v)
		p.SetLineWidth(0.6)
		p.SetDrawColor(60, 60, 60)
		p.SetDashPattern(ref.dash, 0)
		p.Line(x0, y, x0+w, y)
		p.SetDashPattern(nil, 0)
		p.SetXY(x0+1, y-3.2)
		p.CellFormat(50, 3, ref.label, "", 0, "L", false, 0, "")
	}
	p.SetDrawColor(0, 0, 0)
	for i, s := range series {
		p.SetLineWidth(0.3)
		for j := 1; j < len(s); j++ {
			p.Line(xOf(s[j-1].t), yOf(s[j-1].mv), xOf(s[j].t), yOf(s[j].mv))
		}
		for _, q := range s {
			marker(p, xOf(q.t), yOf(q.mv), i%len(markerShapes), !q.on)
		}
		if len(s) > 0 {
			last := s[len(s)-1]
			p.SetXY(xOf(last.t)+1.5, yOf(last.mv)-1.5)
			p.CellFormat(14, 3, e.TestPoints[i].ID, "", 0, "L", false, 0, "")
		}
	}
	p.SetLineWidth(0.2)
	p.SetXY(margin, y0+h+5)
	d.note("Filled markers: instant-off potentials; hollow: on potentials only (IR drop included). Lines join a point's visits.")
}

// coating writes a component's rust grade, dry-film thickness and
// galvanizing life.
func (d *doc) coating(c *survey.Component) {
	co := c.Design.Electro.Coating
	e := c.Design.Electro
	var pairs [][2]string
	if co.RustedPct != nil {
		pairs = append(pairs, [2]string{"Rust grade", fmt.Sprintf("%g %% of the area rusted: ASTM D610 grade %d (ASTM D610-08 (R2019) Table 1); ISO 4628-3 Ri %d "+
			"(ISO 4628-3:2016, nearest nominal area on a log scale: our convention)", *co.RustedPct, co.D610, co.ISORi)})
	}
	if j := co.DFT; j != nil {
		v := "ACCEPTED"
		if !j.Accepted {
			v = "REJECTED: " + strings.Join(j.Reasons, "; ")
		}
		var rd []string
		for _, r := range co.DFTReadingsUM {
			rd = append(rd, fmt.Sprintf("%g", r))
		}
		pairs = append(pairs, [2]string{"Dry-film thickness", fmt.Sprintf("readings (µm) %s; nominal %g µm. %s. %s (%s)", strings.Join(rd, " "), *co.DFTNominalUM,
			strings.Join(j.Steps, "; "), v, j.Source)})
	}
	if g := co.Galvanizing; g != nil {
		pairs = append(pairs, [2]string{"Galvanizing", fmt.Sprintf("%g µm of zinc. %s; first maintenance by %s (%s)", *co.ZincUM, strings.Join(g.Steps, "; "), co.GalvanizingEnd, g.Source)})
	}
	if co.BreakdownM2 != nil {
		s := fmt.Sprintf("%g m²", *co.BreakdownM2)
		if e.RecoatCostPerM2 != nil {
			cost, _, err := e.RecoatCostPerM2.Times(*co.BreakdownM2)
			if err == nil {
				cur := d.f.Settings.Plan.Costs.Currency // the unit of every cost in the report
				if cur != "" {
					cur = " " + cur
				}
				s += fmt.Sprintf(" × %s%s per m² = %s%s (in the repair plan when a budget is set)", *e.RecoatCostPerM2, cur, cost, cur)
			}
		}
		pairs = append(pairs, [2]string{"Breakdown to recoat", s})
	}
	if len(pairs) > 0 {
		d.section("Coating")
		d.keyValues(pairs, 40)
	}
}

// electroMethods writes the methods appendix's entries for the electro data,
// when the survey has any.
func (d *doc) electroMethods() {
	any := false
	for _, a := range d.s.Assets {
		for _, c := range a.Components {
			any = any || c.Design.Electro != nil
		}
	}
	if !any {
		return
	}
	d.heading(1, "Coupons, probes, cathodic protection, anodes and coatings")
	k1 := electrochem.DerivedK1()
	var b strings.Builder
	for _, s := range []string{
		fmt.Sprintf("Faraday's law m = Q·M/(n·F) with F = %.5f C/mol (e·N_A, exact in the SI; CODATA 2018).", electrochem.Faraday),
		"Coupons: ASTM G1-03 (R2017) §8.1.2 / ASTM G31-21, CR = K·W/(A·T·D), K = 8.76×10⁴ for mm/y and 3.45×10⁶ for mpy; pitting rate = deepest pit × 8760 / hours; bands low < 0.025, moderate ≤ 0.12, high ≤ 0.25, severe > 0.25 mm/y (pitting: 0.13 / 0.20 / 0.38) after NACE SP0775's categories for carbon steel (table from memory).",
		"ER probes: metal loss = span × (reading − first reading) / 1000 (generic instrument formula, common practice); rate = least-squares slope on years of 365.25 days.",
		fmt.Sprintf("LPR probes: Stern–Geary i_corr = B/R_p, B = βa·βc/(2.303(βa+βc)), 26 mV when no slopes are given (common practice); ASTM G102-89 (R2015) CR = K1·i_corr·EW/ρ with K1 = 3.27×10⁻³ mm·g/(µA·cm·y) (from F and the year: %.5g) and EW = 1/Σ(n·f/W) from the alloy's nominal composition (IUPAC atomic weights).", k1),
		"Rate source: with coupons or probes a component's CMLs take the largest of the wall, coupon and probe rates (max, default), or the one named; rates are flagged as disagreeing when the larger is more than 3 times the smaller and 0.025 mm/y apart (common practice).",
		"Cathodic protection: NACE SP0169-2013 §6.2.2.1 and ISO 15589-1:2015: instant-off −850 mV CSE or more negative (−950 mV in anaerobic soil), or 100 mV of polarisation; over-protection limit −1200 mV CSE unless the component sets one. Reference electrodes converted to CSE: " + electrochem.OffsetSource + ". An \"on\" potential more positive than the criterion fails (the IR drop only makes the off potential more positive); one more negative is not determined.",
		"Sacrificial anodes: DNV-RP-B401 (2017) §7, life = usable mass × ε / (I × 8760) years; ε 2000 (Al-Zn-In), 780 (zinc) A·h/kg in seawater and 1100 A·h/kg (magnesium in soil), all below their Faraday limits n·F/M (2980, 820, 2205 A·h/kg); utilisation factors by anode shape (from memory). The anode is due at the survey date plus its life.",
		"Coatings: ASTM D610-08 (R2019) Table 1 and ISO 4628-3:2016 Ri by the nearest nominal rusted area on a log scale (our convention); ISO 19840:2012 dry-film acceptance (mean ≥ nominal, none below 80 % of nominal, at most 20 % of readings below nominal; roughness correction not applied); galvanizing life = zinc thickness / ISO 9223:2012 Table 2 zinc rate of the category (ISO 14713-1:2017), the upper rate giving the shorter life. Recoating is due now at Ri 3 (ISO 12944-1:2017, from memory) or when the galvanizing's shorter life ends.",
		fmt.Sprintf("Metal pairs: galvanic series in flowing seawater (%s); a difference of the ranges' middles over %.2f V is warned about (common practice).", electrochem.GalvanicSource, electrochem.GalvanicWarnV),
	} {
		b.WriteString("- " + s + "\n") // no * or ` in these; a _ inside a word stays literal
	}
	d.markdown(b.String())
}

// electroFindings lists, after the actions, the test points failing their
// criteria, rejected dry-film batches and warned metal pairs, each with its
// checklist line; nothing when there are none.
func (d *doc) electroFindings() {
	fs := d.f.Electro()
	if len(fs) == 0 {
		return
	}
	d.chapter(60) // a chapter of its own: it is in the contents
	d.heading(0, "Cathodic protection, coatings and metal pairs: findings")
	rows := make([][]string, len(fs))
	for i, e := range fs {
		who := e.Component
		if e.Subject != "" {
			who += " / " + e.Subject
		}
		rows[i] = []string{e.Asset, who, electroFindingWords(e), strings.Join(e.Reasons, "; ")}
	}
	w := d.width()
	d.table([]column{{"Asset", 32, "L"}, {"Component / point", 36, "L"}, {"Finding", 26, "L"}, {"Why", w - 94, "L"}}, rows, // checklist lines: results.json and the data checks
		func(int) rowStyle { return rowStyle{bold: true} }, smallSize)
}

// electroFindingWords is a finding's kind and status in words, the status in
// capitals ("cathodic protection: NOT PROTECTED").
func electroFindingWords(e findings.ElectroFinding) string {
	kind := map[string]string{"cp": "cathodic protection", "dft": "dry-film thickness"}[e.Kind]
	if kind == "" {
		kind = e.Kind
	}
	status := e.Status
	if status == "warn" {
		status = "warning"
	}
	return kind + ": " + strings.ToUpper(status)
}

// rateSourcePair is the component header's rate-source row, when the
// component has coupon or probe rates.
func (d *doc) rateSourcePair(c *survey.Component) [][2]string {
	e := c.Design.Electro
	if e == nil || len(e.OtherRates()) == 0 || len(c.CMLs) == 0 {
		return nil
	}
	src, how := string(e.RateSource), " (set for this component)"
	if src == "" {
		src, how = "max", " (default)"
	}
	what := map[string]string{
		"max":    "the largest of the wall, coupon and probe rates governs each CML",
		"wall":   "the wall rate governs; coupon and probe rates are reported",
		"coupon": "the largest coupon rate governs",
		"probe":  "the largest probe rate governs",
	}[src]
	return [][2]string{{"Rate source", src + how + ": " + what + " (see Governing rate below)"}}
}

// section starts a sub-section of a component with room for its heading,
// a table header and a first row of several lines, so that no heading or
// header is left alone at the foot of a page.
func (d *doc) section(title string) {
	d.need(48)
	d.heading(2, title)
}
