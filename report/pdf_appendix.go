package report

import (
	"fmt"
	"strconv"
)

// methods writes the methods appendix from its template and the settings used.
func (d *doc) methods() error {
	text, err := d.opts.Templates.Execute("report/methods.md", map[string]any{
		"Units":            string(d.u.u),
		"IntervalCapYears": d.f.Settings.Policy.IntervalCapYears,
		"PhotoLongSide":    d.opts.Photos.LongSide,
		"ToleranceMM":      d.f.Settings.Policy.ToleranceMM,
		"AccelerationPct":  d.f.Settings.AccelerationPct,
		"AutoPlace":        d.opts.Place.Auto,
		"RadiusM":          d.opts.Place.RadiusM,
		"AreaRadiusM":      d.opts.Place.AreaRadiusM,
		"Flags":            flagMeanings(),
	})
	if err != nil {
		return fmt.Errorf("methods template: %w", err)
	}
	d.newPage(false)
	d.heading(0, "Appendix B — Methods")
	d.markdown(text)
	d.heading(1, "Settings used for this report")
	tmpl := "built in"
	if d.opts.Templates.Override != "" {
		tmpl = d.opts.Templates.Override + " (its methods text replaces the built-in one; its cautions follow the built-in cautions)"
	}
	d.keyValues([][2]string{
		{"Rate model", rateModelText(d.f.Settings.Policy.RateModel) + " (components may set their own)"},
		{"Interval rule", d.f.Settings.Policy.Rule.Describe(d.f.Settings.Policy.IntervalCapYears) + " (components may set their own)"},
		{"Half-life cap", fmt.Sprintf("%g years", d.f.Settings.Policy.IntervalCapYears)},
		{"Gauge tolerance", fmt.Sprintf("%g mm", d.f.Settings.Policy.ToleranceMM)},
		{"Acceleration", fmt.Sprintf("latest interval more than %g %% above the long-term rate", d.f.Settings.AccelerationPct)},
		{"Year length", "365.25 days"},
		{"Display units", fmt.Sprintf("thickness in %s, rates in %s (1 mil = 0.001 in; results.json in mm and mm/y)", d.u.u, d.u.rateUnit)},
		{"Photos", fmt.Sprintf("long side at most %d px, JPEG quality %d", d.opts.Photos.LongSide, d.opts.Photos.Quality)},
		{"Summary-first", d.limitsText()},
		{"Report texts", tmpl},
		{"Program", "lossline " + d.opts.Version},
	}, 40)
	if len(d.opts.Settings) > 0 {
		d.heading(2, "Every setting, its value and where it came from")
		rows := make([][]string, len(d.opts.Settings))
		for i, r := range d.opts.Settings {
			rows[i] = []string{r.Name, r.Value, r.Default, r.Source}
		}
		d.table([]column{{"Setting", 42, "L"}, {"Value", 48, "L"}, {"Default", 40, "L"}, {"From", d.width() - 130, "L"}}, rows, nil, smallSize)
	}
	return nil
}

// warningsAppendix lists every warning with its place.
func (d *doc) warningsAppendix() {
	d.newPage(false)
	d.heading(0, "Appendix C — Warnings")
	all := append(append(d.s.Problems[:0:0], d.s.Problems...), d.warnings...)
	if len(all) == 0 {
		d.text("Reading the survey raised no warnings.")
		return
	}
	d.text("Problems found while reading the survey that did not stop the report. Check each one.")
	d.pdf.Ln(1)
	rows := make([][]string, d.capRows(len(all)))
	for i, w := range all[:len(rows)] {
		place := w.File
		if w.Line > 0 {
			place += ":" + strconv.Itoa(w.Line)
		}
		rows[i] = []string{place, w.Message}
	}
	d.table([]column{{"File and line", 70, "L"}, {"Warning", d.width() - 70, "L"}}, rows, nil, smallSize)
	d.leftOut(len(rows), len(all), JSONFile+" (warnings)")
}
