package report

import (
	"strings"

	"github.com/lossline/lossline/findings"
)

// summaryWords writes the summary in words at the head of the summary page,
// before any table: what is urgent, what is due when, what was not done and
// what changed, each group a short paragraph led by its name in bold.
func (d *doc) summaryWords() {
	u := d.u
	w := d.f.Summarize(findings.WordUnits{
		Thickness: func(mm float64) string { return u.thick(&mm) + " " + string(u.u) },
		Rate:      func(r float64) string { return u.rate(&r) + " " + u.rateUnit },
	})
	p := d.pdf
	for _, g := range []struct {
		lead  string
		lines []string
	}{
		{"Urgent.", w.Urgent}, {"Due.", w.Due}, {"Not done.", w.NotDone}, {"Changed since the last visit.", w.Changed},
	} {
		if len(g.lines) == 0 {
			continue
		}
		d.font("B", bodySize)
		p.Write(lineH, g.lead+" ")
		d.font("", bodySize)
		p.Write(lineH, strings.Join(g.lines, " "))
		p.Ln(lineH + 1.5)
	}
	p.Ln(1)
}
