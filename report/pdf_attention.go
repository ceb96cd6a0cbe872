package report

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// Limits say when report.pdf turns summary-first and how long its lists may
// grow then. At or below both thresholds the report shows every component
// in full.
type Limits struct {
	FullDetailMaxCMLs       int     // more CMLs than this: summary-first; also the most CMLs shown in full then
	FullDetailMaxComponents int     // more components than this: summary-first; also the most components shown in full then
	DetailWindowYears       float64 // a CML with this much remaining life or less needs attention, years
	ListMaxRows             int     // the longest list a summary-first report prints, rows
}

// DefaultLimits are the limits of the settings' defaults.
var DefaultLimits = Limits{FullDetailMaxCMLs: 1000, FullDetailMaxComponents: 60, DetailWindowYears: 5, ListMaxRows: 500}

// attention is what a summary-first report shows in full: the CMLs that need
// attention in rank order, and the components shown in full.
type attention struct {
	items    []*survey.Assessed
	reasons  map[*survey.Assessed]string
	detailed map[*survey.Component]bool // components shown in full, with all their CMLs
	nDetail  int                        // components shown in full
	nComps   int                        // components with a CML needing attention
}

// summaryFirst reports whether the survey is over either threshold.
func (d *doc) summaryFirst() bool { return d.attn != nil }

// overLimits reports whether a survey of n CMLs on comps components is
// reported summary-first.
func overLimits(l Limits, n, comps int) bool {
	return n > l.FullDetailMaxCMLs || comps > l.FullDetailMaxComponents
}

// why lists the reasons a CML needs attention ("" for none): at or below
// required, remaining life within the window, accelerating, not re-measured
// at this visit, next inspection past due at the survey date.
func (d *doc) why(it *survey.Assessed) string {
	r := it.Result
	var rs []string
	if r.Class == wallloss.AtOrBelowRequired {
		rs = append(rs, "at or below required")
	} else if r.RemainingLifeY != nil && *r.RemainingLifeY <= d.opts.Limits.DetailWindowYears {
		rs = append(rs, fmt.Sprintf("remaining life within %g y", d.opts.Limits.DetailWindowYears))
	}
	if survey.Has(d.f.Change(it.CML).Codes, survey.ChangeAccelerating) {
		rs = append(rs, "accelerating")
	}
	if r.HasFlag(wallloss.FlagNotMeasuredLatest) {
		rs = append(rs, "not re-measured")
	}
	if r.NextInspection != nil && r.NextInspection.Before(d.s.Date) {
		rs = append(rs, "inspection past due")
	}
	return strings.Join(rs, "; ")
}

// findAttention picks the CMLs needing attention and the components shown in
// full: those of the most urgent attention CMLs, in rank order, while at most
// FullDetailMaxComponents components and FullDetailMaxCMLs CMLs are shown
// (always at least one). One pass over the ranked CMLs.
func (d *doc) findAttention() *attention {
	l := d.opts.Limits
	a := &attention{reasons: map[*survey.Assessed]string{}, detailed: map[*survey.Component]bool{}}
	seen := map[*survey.Component]bool{}
	shown := 0
	for _, it := range d.items {
		w := d.why(it)
		if w == "" {
			continue
		}
		a.items = append(a.items, it)
		a.reasons[it] = w
		c := it.Component
		if seen[c] {
			continue
		}
		seen[c] = true
		a.nComps++
		fits := a.nDetail < l.FullDetailMaxComponents && shown+len(c.CMLs) <= l.FullDetailMaxCMLs
		if fits || a.nDetail == 0 {
			a.detailed[c] = true
			a.nDetail++
			shown += len(c.CMLs)
		}
	}
	return a
}

// capRows is how many of n rows a list shows: all of them unless the report
// is summary-first, then at most ListMaxRows.
func (d *doc) capRows(n int) int {
	if d.summaryFirst() && n > d.opts.Limits.ListMaxRows {
		return d.opts.Limits.ListMaxRows
	}
	return n
}

// leftOut says below a list cut by capRows how many rows it left out and
// where they are.
func (d *doc) leftOut(shown, n int, where string) {
	if shown >= n {
		return
	}
	d.font("I", smallSize)
	d.pdf.MultiCell(0, 3.8, fmt.Sprintf("The first %d of %d rows are shown (list-max-rows); the other %d are in %s.",
		shown, n, n-shown, where), "", "L", false)
	d.font("", bodySize)
	d.pdf.Ln(1)
}

// exportsText names the files that hold every CML.
func (d *doc) exportsText() string {
	s := CSVFile + " and " + JSONFile
	if d.opts.Detail {
		s += ", and in full in the detail PDF of each asset"
	}
	return s
}

// leftToExports is the paragraph of a summary-first report saying what it
// leaves to the exports and the detail files.
func (d *doc) leftToExports() {
	a, l := d.attn, d.opts.Limits
	nComp := 0
	for _, as := range d.s.Assets {
		nComp += len(as.Components)
	}
	d.heading(1, "What this report leaves to the exports")
	detail := "Run lossline report with --detail assets for one detail PDF per asset showing all its components in full."
	if d.opts.Detail {
		detail = "Each asset's detail PDF (detail-<asset>.pdf beside this report) shows all its components in full."
	}
	d.text(fmt.Sprintf("This survey has %d CMLs on %d components, more than this report shows in full (%d CMLs or %d components; "+
		"the thresholds are settings, stated in the methods appendix). This report is summary-first: %d CMLs need attention "+
		"(at or below required, remaining life within %g years, accelerating, not re-measured at this visit, or inspection past due); "+
		"they are ranked in the list of what needs attention (at most %d rows). %d of the %d components with such a CML are shown "+
		"in full, the most urgent first. Every other component is summarised per asset only; its CMLs' readings, rates, "+
		"remaining life and dates are in %s. Long lists are cut at %d rows, each saying how many rows it left out. %s",
		len(d.items), nComp, l.FullDetailMaxCMLs, l.FullDetailMaxComponents, len(a.items), l.DetailWindowYears,
		l.ListMaxRows, a.nDetail, a.nComps, CSVFile+" and "+JSONFile, l.ListMaxRows, detail))
}

// attentionList writes the CMLs needing attention in rank order, with why.
func (d *doc) attentionList() {
	d.newPage(true)
	d.heading(0, "What needs attention")
	a := d.attn
	d.text(fmt.Sprintf("The %d CMLs that need attention, most urgent first (the survey's ranking: at or below required, then "+
		"shortest remaining life; ties by consequence, then CML id). Thicknesses in %s, rates in %s. A CML needs attention when "+
		"it is at or below required, its remaining life is within %g years (detail-window-years), it is accelerating, it was not "+
		"re-measured at this visit, or its next inspection was due before the survey date; the last column says which.",
		len(a.items), d.u.u, d.u.rateUnit, d.opts.Limits.DetailWindowYears))
	d.pdf.Ln(2)
	if len(a.items) == 0 {
		d.text("No CML needs attention.")
		return
	}
	u := string(d.u.u)
	cols := []column{
		{"Rank", 12, "R"}, {"Asset / component", 48, "L"}, {"CML", 17, "L"},
		{"Thickness (" + u + ")", 18, "R"}, {"Required (" + u + ")", 18, "R"}, {"Rate (" + d.u.rateUnit + ")", 16, "R"},
		{"Remaining life (y)", 17, "R"}, {"Next inspection", 21, "L"}, {"Repair window", 40, "L"}, {"Needs attention because", 60, "L"},
	}
	n := d.capRows(len(a.items))
	rows := make([][]string, n)
	for i, it := range a.items[:n] {
		r := it.Result
		rows[i] = []string{
			strconv.Itoa(it.Rank), it.Asset.Name + " / " + it.Component.Name, it.CML.ID,
			d.u.thick(r.ThicknessMM), d.u.thick(it.Component.Design.RequiredMM), d.u.rate(r.RateMMPerY),
			years(r.RemainingLifeY), day(r.NextInspection), repairWindow(r), a.reasons[it],
		}
	}
	d.table(cols, rows, func(i int) rowStyle {
		u := urgent(a.items[i].Result)
		return rowStyle{bold: u, shade: u}
	}, smallSize)
	d.leftOut(n, len(a.items), d.exportsText()+" (every CML, in rank order; the flags column names the same conditions)")
}

// assetFigures are the counts of one asset in a summary-first report.
type assetFigures struct {
	cmls, comps, below, window, accelerating, notMeasured, attention int
	worst, shortest, earliest                                        *survey.Assessed
}

// assetSummaries writes one table with a row per asset: its counts, worst
// CML, shortest remaining life and earliest next inspection (and its detail
// PDF). One pass over the CMLs.
func (d *doc) assetSummaries() {
	figs := map[*survey.Asset]*assetFigures{}
	for _, a := range d.s.Assets {
		figs[a] = &assetFigures{comps: len(a.Components)}
	}
	for _, it := range d.items {
		f := figs[it.Asset]
		if f == nil {
			continue
		}
		r := it.Result
		f.cmls++
		if f.worst == nil {
			f.worst = it // items are in rank order
		}
		if r.Class == wallloss.AtOrBelowRequired {
			f.below++
		} else if r.RemainingLifeY != nil && *r.RemainingLifeY <= d.opts.Limits.DetailWindowYears {
			f.window++
		}
		if survey.Has(d.f.Change(it.CML).Codes, survey.ChangeAccelerating) {
			f.accelerating++
		}
		if r.HasFlag(wallloss.FlagNotMeasuredLatest) {
			f.notMeasured++
		}
		if d.attn.reasons[it] != "" {
			f.attention++
		}
		if r.RemainingLifeY != nil && (f.shortest == nil || *r.RemainingLifeY < *f.shortest.Result.RemainingLifeY) {
			f.shortest = it
		}
		if r.NextInspection != nil && (f.earliest == nil || r.NextInspection.Before(*f.earliest.Result.NextInspection)) {
			f.earliest = it
		}
	}
	u := string(d.u.u)
	detail := DetailFiles(d.s.Assets)
	rows := make([][]string, len(d.s.Assets))
	for i, a := range d.s.Assets {
		f := figs[a]
		worst, shortest, earliest := none, none, none
		if w := f.worst; w != nil {
			worst = fmt.Sprintf("%s (%s): %s / %s, %s", w.CML.ID, w.Component.Name, d.u.thick(w.Result.ThicknessMM),
				d.u.thick(w.Component.Design.RequiredMM), repairWindow(w.Result))
		}
		if s := f.shortest; s != nil {
			shortest = fmt.Sprintf("%s (%s)", years(s.Result.RemainingLifeY), s.CML.ID)
		}
		if e := f.earliest; e != nil {
			earliest = fmt.Sprintf("%s (%s)", day(e.Result.NextInspection), e.CML.ID)
		}
		rows[i] = []string{a.Name, fmt.Sprintf("%d / %d", f.cmls, f.comps), strconv.Itoa(f.below), strconv.Itoa(f.window),
			strconv.Itoa(f.accelerating), strconv.Itoa(f.notMeasured), strconv.Itoa(f.attention), worst, shortest, earliest}
		if d.opts.Detail {
			rows[i][0] += " (" + detail[i] + ")"
		}
	}
	w := d.width()
	cols := []column{{"Asset", 20, "L"}, {"CMLs / compo\u00ad nents", 14, "R"}, {"At or below required", 12, "R"},
		{fmt.Sprintf("Life within %g years", d.opts.Limits.DetailWindowYears), 12, "R"}, {"Accel\u00ad erating", 13, "R"},
		{"Not re- measured", 13, "R"}, {"Need atten\u00ad tion", 12, "R"},
		{"Worst CML (component): thickness / required (" + u + ")", 0, "L"},
		{"Shortest life (y, CML)", 16, "L"}, {"Earliest next inspection (CML)", 19, "L"}}
	if d.opts.Detail {
		cols[0].title = "Asset (its detail PDF: every component in full)"
		cols[0].width = 30
	}
	fixed := 0.0
	for _, c := range cols {
		fixed += c.width
	}
	cols[7].width = w - fixed
	d.text(fmt.Sprintf("One row per asset. Life within %g years counts the CMLs besides those at or below required; "+
		"need attention counts each CML once, whatever its reasons.", d.opts.Limits.DetailWindowYears))
	d.pdf.Ln(1)
	d.table(cols, rows, func(i int) rowStyle {
		b := figs[d.s.Assets[i]].below > 0
		return rowStyle{bold: b}
	}, smallSize)
}

// DetailFiles are the names of the assets' detail PDFs, in order:
// detail-<slug>.pdf, the slug the asset's name in lower case with every run
// of other characters as one dash; a slug already taken gets -2, -3, ...
func DetailFiles(assets []*survey.Asset) []string {
	names := make([]string, len(assets))
	taken := map[string]bool{}
	for i, a := range assets {
		slug := assetSlug(a.Name)
		name := "detail-" + slug + ".pdf"
		for k := 2; taken[name]; k++ {
			name = fmt.Sprintf("detail-%s-%d.pdf", slug, k)
		}
		taken[name] = true
		names[i] = name
	}
	return names
}

// assetSlug is an asset's name in lower-case letters and digits, runs of
// anything else as one dash ("asset" when nothing is left), at most maxSlug
// bytes.
func assetSlug(asset string) string {
	var b strings.Builder
	dash := false
	for _, r := range strings.ToLower(asset) {
		if r >= 'a' && r <= 'z' || r >= '0' && r <= '9' {
			if dash && b.Len() > 0 {
				b.WriteByte('-')
			}
			b.WriteRune(r)
			dash = false
		} else {
			dash = true
		}
	}
	if b.Len() == 0 {
		return "asset"
	}
	// File systems refuse names over 255 bytes; a long asset name is cut.
	return strings.TrimRight(b.String()[:min(b.Len(), maxSlug)], "-")
}

// maxSlug is the longest asset part of a detail file's name, in bytes.
const maxSlug = 80

// assets writes each asset with all its components in full, or in a
// summary-first report only the components chosen to be shown in full.
func (d *doc) assets() {
	for _, a := range d.s.Assets {
		if !d.summaryFirst() {
			d.asset(a)
			continue
		}
		var comps []*survey.Component
		for _, c := range a.Components {
			if d.attn.detailed[c] {
				comps = append(comps, c)
			}
		}
		if len(comps) == 0 {
			continue
		}
		d.newPage(false)
		d.heading(0, a.Name)
		d.text(fmt.Sprintf("%d of the asset's %d components, shown in full because a CML of each needs attention; "+
			"the asset's summary is in the Summary and its other components are in %s.", len(comps), len(a.Components), d.exportsText()))
		for _, c := range comps {
			d.component(a, c)
		}
	}
}

// limitsText states the thresholds of the summary-first report and whether
// this report is one.
func (d *doc) limitsText() string {
	l := d.opts.Limits
	mode := "this report is not: every component is shown in full"
	if d.summaryFirst() {
		mode = "this report is summary-first"
	}
	return fmt.Sprintf("above %d CMLs (full-detail-max-cmls) or %d components (full-detail-max-components) the report is "+
		"summary-first (%s): it ranks the CMLs needing attention (at or below required, remaining life within %g years "+
		"(detail-window-years), accelerating, not re-measured, inspection past due), shows in full at most that many components "+
		"and CMLs, the most urgent first, and cuts long lists at %d rows (list-max-rows); the exports hold every CML",
		l.FullDetailMaxCMLs, l.FullDetailMaxComponents, mode, l.DetailWindowYears, l.ListMaxRows)
}

// someIDs joins CML ids, in a summary-first report at most 40 of them
// followed by how many more results.json names.
func (d *doc) someIDs(ids []string) string {
	if !d.summaryFirst() || len(ids) <= 40 {
		return strings.Join(ids, ", ")
	}
	return fmt.Sprintf("%s and %d more (%s)", strings.Join(ids[:40], ", "), len(ids)-40, JSONFile)
}
