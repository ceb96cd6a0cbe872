package report

import (
	"bytes"
	"fmt"
	"strings"

	"github.com/lossline/lossline/findings"
)

// Comparison renders the changes of a survey as an aligned text table, or as
// CSV: one row per CML in rank order, then the CMLs no longer listed and the
// design data that changed.
func Comparison(f *findings.Findings, disp Display, asCSV bool) ([]byte, error) {
	s := f.Survey
	disp = disp.resolve(s.Units)
	u := units{disp.Thickness, disp.Rate}
	tu, ru := string(u.u), u.rateUnit
	header := []string{"rank", "cml", "asset", "component", "previous_date", "previous_" + tu, "date", "thickness_" + tu,
		"latest_interval_" + ru, "long_term_" + ru, "window_before", "window_now", "change"}
	var rows [][]string
	for _, c := range f.Changes {
		it, r := c.Item, c.Item.Result
		prevDate, prevT, latest := "", "", ""
		if n := len(it.CML.Visits); n >= 2 {
			p := it.CML.Visits[n-2]
			prevDate, prevT = p.Date.String(), u.u.Format(p.Governing())
		}
		if n := len(c.Intervals); n > 0 {
			latest = u.rate(&c.Intervals[n-1].RateMMPerY)
		}
		before := ""
		if c.Previous != nil {
			before = repairWindow(*c.Previous)
		}
		rows = append(rows, []string{fmt.Sprint(it.Rank), it.CML.ID, it.Asset.Name, it.Component.Name, prevDate, prevT,
			day(r.CurrentDate), u.thick(r.ThicknessMM), latest, u.rate(r.RateLongMMPerY), before, repairWindow(r), strings.Join(codes(c.Codes), " ")})
	}
	for _, row := range rows {
		for i, v := range row {
			if v == none {
				row[i] = ""
			}
		}
	}
	out, err := textTable(header, rows, asCSV)
	if err != nil || asCSV {
		return out, err
	}
	b := bytes.NewBuffer(out)
	if h := s.History; h != nil {
		for _, x := range h.Dropped {
			fmt.Fprintf(b, "\nno longer listed: CML %s (%s / %s), last read %s at %s %s, %s:%d", x.ID, x.Asset, x.Component,
				x.Last.Date, u.u.Format(x.Last.Governing()), tu, x.Last.File, x.Last.Line)
		}
		for _, x := range h.DesignChanges {
			fmt.Fprintf(b, "\ndesign change: %s / %s %s thickness %s -> %s %s (was at %s:%d)", x.Asset, x.Component, x.Field,
				u.thick(&x.OldMM), u.thick(&x.NewMM), tu, x.OldFile, x.OldLine)
		}
		if len(h.Dropped)+len(h.DesignChanges) > 0 {
			b.WriteString("\n")
		}
	}
	return b.Bytes(), nil
}
