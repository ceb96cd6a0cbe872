package report

import (
	"fmt"
	"slices"
	"strconv"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
)

// breachShownYears picks at most five plan years to show as columns: all of
// them up to five, else the first three, the middle and the last.
func breachShownYears(n int) []int {
	if n <= 5 {
		out := make([]int, n)
		for i := range out {
			out[i] = i
		}
		return out
	}
	return slices.Compact([]int{0, 1, 2, (n - 1) / 2, n - 1})
}

// percent writes a probability for people: below 0.1 % and above 99.9 % are
// written as bounds, a breach already reached as 100 %.
func percent(p float64, reached bool) string {
	switch {
	case reached:
		return "100 %"
	case p < 0.0005:
		return "< 0.1 %"
	case p >= 0.9995:
		return "> 99.9 %"
	}
	return strconv.FormatFloat(100*p, 'f', 1, 64) + " %"
}

// breachModelShort names a breach's model in a few words.
func breachModelShort(b plan.Breach) string {
	switch {
	case b.Reached:
		return "at or below required"
	case b.Spread.Kind == plan.SpreadStudentT:
		return fmt.Sprintf("fit, Student t (%d dof)", b.Spread.DOF)
	case b.Spread.Kind == plan.SpreadNormal && b.Spread.N > 2:
		return "fit, normal (gauge)"
	case b.Spread.Kind == plan.SpreadNormal:
		return "two visits, normal (gauge)"
	}
	return b.Model()
}

// breachSection lists each CML's probability of reaching its required
// thickness by the end of the plan years, likeliest first; CMLs below 0.1 %
// at the end of the plan and those without a probability are counted and named.
func (d *doc) breachSection() {
	if len(d.items) == 0 {
		return
	}
	d.heading(1, "Probability of reaching the required thickness")
	d.text("From the current reading and the uncertainty of the corrosion rate: for three or more visits the least-squares " +
		"slope with Student t on n − 2 degrees of freedom (or the gauge's own error where the readings scatter less), for two " +
		"visits the gauge tolerance on both readings (normal). Single-visit estimates have no probability. Model, assumptions " +
		"and sources: methods appendix. results.json gives every CML and every plan year.")
	d.pdf.Ln(1)
	type row struct {
		it *survey.Assessed
		b  plan.Breach
	}
	var shown []row
	var low, estimate, other, unknown []string
	var ends []string
	for _, it := range d.items {
		b := d.f.BreachOf(it)
		if ends == nil {
			for _, t := range b.By {
				ends = append(ends, t.Format(dateLayout))
			}
		}
		switch {
		case b.P == nil && b.Spread.Kind == plan.SpreadEstimate && b.MarginMM != nil:
			estimate = append(estimate, it.CML.ID)
		case b.P == nil && b.Spread.Kind == plan.SpreadOtherRate:
			other = append(other, it.CML.ID)
		case b.P == nil:
			unknown = append(unknown, it.CML.ID)
		case !b.Reached && b.P[len(b.P)-1] < 0.0005:
			low = append(low, it.CML.ID)
		default:
			shown = append(shown, row{it, b})
		}
	}
	slices.SortStableFunc(shown, func(a, b row) int {
		pa, pb := a.b.P[len(a.b.P)-1], b.b.P[len(b.b.P)-1]
		switch {
		case pa > pb:
			return -1
		case pa < pb:
			return 1
		}
		return 0
	})
	years := breachShownYears(len(ends))
	cols := []column{{"CML", 16, "L"}, {"Asset / component", 52, "L"}, {"Model", 30, "L"}, {"Rate ± s (" + d.u.rateUnit + ")", 22, "R"}}
	yw := (d.width() - 120) / float64(len(years))
	for _, y := range years {
		cols = append(cols, column{fmt.Sprintf("By %s (year %d)", ends[y], y+1), yw, "R"})
	}
	if len(shown) == 0 {
		d.text("No CML reaches 0.1 % by the end of the plan.")
	} else {
		rows := make([][]string, d.capRows(len(shown)))
		for i, r := range shown[:len(rows)] {
			rate := none
			if s := r.b.Spread; s.Kind >= plan.SpreadNormal {
				rate = d.u.rate(&s.Rate) + " ± " + d.u.rate(&s.Scale)
			}
			rows[i] = []string{r.it.CML.ID, r.it.Asset.Name + " / " + r.it.Component.Name, breachModelShort(r.b), rate}
			for _, y := range years {
				rows[i] = append(rows[i], percent(r.b.P[y], r.b.Reached))
			}
		}
		d.table(cols, rows, nil, smallSize)
		d.leftOut(len(rows), len(shown), JSONFile+" (breach_probability of each item)")
	}
	var md string
	for _, g := range []struct {
		ids  []string
		what string
	}{
		{low, "below 0.1 % by " + ends[len(ends)-1]},
		{estimate, "single-visit estimates: no probability"},
		{other, "whose life a coupon's or probe's rate governs: no probability (the wall readings' spread does not describe that rate)"},
		{unknown, "no probability: no readings or no required thickness"},
	} {
		if len(g.ids) > 0 {
			md += fmt.Sprintf("- %d CMLs %s: %s.\n", len(g.ids), g.what, d.someIDs(g.ids))
		}
	}
	if md != "" {
		d.markdown(md)
	}
}
