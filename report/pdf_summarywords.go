package report

import (
	"fmt"
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
		{"Data checks.", d.warningWords()},
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

// warningWords says how many warnings reading the survey raised and where
// they are listed; nothing when there are none.
func (d *doc) warningWords() []string {
	n := len(d.s.Problems) + len(d.warnings)
	if n == 0 {
		return nil
	}
	what := "1 warning; it is"
	if n > 1 {
		what = fmt.Sprintf("%d warnings; each is", n)
	}
	return []string{fmt.Sprintf("Reading the survey raised %s listed at its place in %s, for the inspector to check.", what, dataChecksTitle)}
}
