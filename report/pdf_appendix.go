package report

import (
	"fmt"
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
	d.heading(0, "Appendix C — Methods")
	d.markdown(text)
	d.electroMethods()
	if err := d.localMethods(); err != nil { // pdf_local.go
		return err
	}
	d.heading(1, "Settings used for this report")
	tmpl := "built in"
	if d.opts.Templates.Override != "" {
		tmpl = "from the templates folder named in " + dataChecksTitle + " (its methods text replaces the built-in one; its cautions follow the built-in cautions)"
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
		d.text("Where each setting came from (built in, the settings file, the environment or a flag) is listed in " + dataChecksTitle + ".")
	}
	return nil
}
