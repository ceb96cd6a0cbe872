package report

import (
	"fmt"
	"slices"
	"strings"

	"github.com/lossline/lossline/survey"
)

// changesSection writes "Changes since the last visit": what changed per CML,
// the rate over each interval, CMLs dropped, design changes, and before/after photos.
func (d *doc) changesSection() {
	var changed, withIntervals []survey.Change
	for _, it := range d.items {
		c := d.f.Change(it.CML)
		if len(c.Codes) > 0 {
			changed = append(changed, c)
		}
		if len(c.Intervals) > 0 {
			withIntervals = append(withIntervals, c)
		}
	}
	h := d.s.History
	if len(withIntervals) == 0 && h == nil {
		return
	}
	if d.summaryFirst() {
		changed = seriousChanges(changed)
	}
	d.newPage(false)
	d.heading(0, "Changes since the last visit")
	intro := fmt.Sprintf("Each CML's latest visit compared with its previous one, with the same design data and settings. "+
		"A CML is accelerating when the rate of its latest interval exceeds its long-term rate by more than %g %%. "+
		"Thicknesses in %s, rates in %s.", d.f.Settings.AccelerationPct, d.u.u, d.u.rateUnit)
	if h != nil {
		var files []string
		for _, e := range h.Earlier {
			files = append(files, earlierSurveyWords(e))
		}
		intro += " Earlier surveys merged in: " + strings.Join(files, "; ") + " (their files: " + dataChecksTitle + ")."
	}
	if d.summaryFirst() {
		intro += " This report is summary-first: only CMLs that crossed the required thickness or are accelerating are listed; " +
			"every CML's change and intervals are in " + d.exportsText() + "."
	}
	d.text(intro)
	d.pdf.Ln(1)

	d.heading(1, "What changed")
	if len(changed) == 0 {
		d.text("Nothing changed at any CML.")
	} else {
		u := string(d.u.u)
		all := len(changed)
		changed = changed[:d.capRows(all)]
		rows := make([][]string, len(changed))
		styles := make([]rowStyle, len(changed))
		for i, c := range changed {
			it, r := c.Item, c.Item.Result
			before, now := none, day(r.CurrentDate)+": "+d.u.thick(r.ThicknessMM)
			if n := len(it.CML.Visits); n >= 2 && !r.FromEarlierVisit() {
				prev := it.CML.Visits[n-2]
				before = prev.Date.String() + ": " + d.u.u.Format(prev.Governing())
			}
			window := repairWindow(r)
			if c.Previous != nil {
				window = repairWindow(*c.Previous) + " → " + window
			}
			window += localStatus(it) // as the summary and the ranked list say it
			var words []string
			for _, code := range c.Codes {
				words = append(words, code.Describe())
			}
			rows[i] = []string{it.CML.ID, it.Asset.Name + " / " + it.Component.Name, before, now, window, strings.Join(words, "; ")}
			serious := slices.ContainsFunc(c.Codes, survey.ChangeCode.Serious)
			styles[i] = rowStyle{bold: serious, shade: serious}
		}
		d.table([]column{{"CML", 14, "L"}, {"Asset / component", 42, "L"}, {"Previous (" + u + ")", 24, "L"},
			{"Now (" + u + ")", 24, "L"}, {"Repair window before → now", 34, "L"}, {"What changed", 42, "L"}},
			rows, func(i int) rowStyle { return styles[i] }, smallSize)
		d.leftOut(len(changed), all, d.exportsText()+" (the change column)")
	}

	if h == nil {
		return
	}
	if len(h.Dropped) > 0 {
		d.heading(1, "CMLs no longer listed")
		rows := make([][]string, d.capRows(len(h.Dropped)))
		for i, x := range h.Dropped[:len(rows)] {
			rows[i] = []string{x.ID, x.Asset + " / " + x.Component, x.Last.Date.String() + ": " + d.u.u.Format(x.Last.Governing())}
		}
		d.table([]column{{"CML", 16, "L"}, {"Asset / component", 90, "L"}, {"Last reading (" + string(d.u.u) + ")", d.width() - 106, "L"}}, rows, nil, smallSize)
		d.leftOut(len(rows), len(h.Dropped), JSONFile+" (dropped)")
	}
	if len(h.DesignChanges) > 0 {
		d.heading(1, "Design data that changed")
		rows := make([][]string, len(h.DesignChanges))
		for i, x := range h.DesignChanges {
			rows[i] = []string{x.Asset + " / " + x.Component, x.Field, d.u.thick(&x.OldMM) + " → " + d.u.thick(&x.NewMM), d.surveyOfFile(x.OldFile)}
		}
		d.table([]column{{"Asset / component", 70, "L"}, {"Thickness", 20, "L"}, {"Before → now (" + string(d.u.u) + ")", 30, "L"}, {"Earlier value from", 60, "L"}}, rows, nil, smallSize)
	}
	pairs := d.beforeAfterPairs()
	if len(pairs) > 0 {
		d.need(photoMaxH + 20)
		d.heading(1, "Before and after")
		d.text(fmt.Sprintf("The same CML at an earlier visit and now, side by side (%s).", d.figureRange(len(pairs))))
		d.pdf.Ln(1)
		d.photoGrid(pairs)
	}
}

// surveyOfFile names the earlier survey read from file by its date and
// inspector; the file itself is printed only in the data checks appendix.
func (d *doc) surveyOfFile(file string) string {
	if h := d.s.History; h != nil {
		for _, e := range h.Earlier {
			if e.File == file {
				return earlierSurveyWords(e)
			}
		}
	}
	return "an earlier survey (see " + dataChecksTitle + ")"
}

// beforeAfterPairs are the CMLs with a photo at an earlier visit and now: the
// earlier photo, then the current one.
func (d *doc) beforeAfterPairs() []photoShown {
	if d.s.History == nil {
		return nil
	}
	var pairs []photoShown
	for _, it := range d.items {
		c := d.f.Change(it.CML)
		if len(c.PhotosBefore) == 0 || len(c.PhotosCurrent) == 0 {
			continue
		}
		before, after := d.photos[c.PhotosBefore[0].Name+"@before"], d.photos[c.PhotosCurrent[0].Name]
		if before == nil || after == nil {
			continue
		}
		pairs = append(pairs, photoShown{entry: before, cml: it.CML.ID, label: "Before"}, photoShown{entry: after, cml: it.CML.ID, label: "Now"})
	}
	return pairs
}

// seriousChanges keeps the changes with a serious code (crossed the required
// thickness, accelerating), for a summary-first report.
func seriousChanges(cs []survey.Change) []survey.Change {
	return slices.DeleteFunc(cs, func(c survey.Change) bool { return !slices.ContainsFunc(c.Codes, survey.ChangeCode.Serious) })
}
