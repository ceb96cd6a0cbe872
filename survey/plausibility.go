package survey

import (
	"fmt"
	"math"
	"strconv"

	"github.com/lossline/lossline/survey/wallloss"
)

// Plausibility thresholds. The checks warn, never refuse: an inspector who
// wrote an odd value may be right. The rules are common practice (a reading
// that disagrees with the rest of the record is re-measured before it is
// believed); the numbers are this tool's choices, set so that real wall loss
// rarely trips them and the typing slips they look for always do.
const (
	// slipFarRatio: a reading is far off when it is below a third, or above
	// three times, the CML's other values. Losing two thirds of a wall, or
	// reading three times nominal, is rare enough to ask about.
	slipFarRatio = 3.0
	// slipBandLow, slipBandHigh: the value a slip stands for must lie within
	// 0.5 to 1.2 times the CML's other values: loss up to half the wall, or
	// up to a fifth above (mill tolerance plus gauge error). The bands of the
	// ×10 and ×25.4 slips then never overlap, so the likely intended value is
	// unambiguous.
	slipBandLow  = 0.5
	slipBandHigh = 1.2

	// stepRatio: an interval's loss rate above stepRatio times the median
	// interval rate of the component's other CMLs is out of line with the
	// component, when the loss also exceeds stepMinLossMM and the rate is also
	// above stepRatio times the median of the CML's own other intervals (a
	// spot that has been losing fast all along is corrosion, not a slip).
	stepRatio = 5.0
	// stepRateFloorMMPerY keeps a component with next to no loss from making
	// every small loss suspect: 0.05 mm/y, mid-band of the moderate general
	// corrosion rates of NACE SP0775 (from memory).
	stepRateFloorMMPerY = 0.05
	// stepMinLossMM is the default gauge tolerance plus a margin of 0.5 mm, so
	// that measurement scatter never counts as a step.
	stepMinLossMM = wallloss.DefaultToleranceMM + 0.5
	// stepMinOthers is the number of other CMLs' intervals a median needs.
	stepMinOthers = 3

	// gpsFarM: a CML further than this from the median position of its
	// asset's other CMLs, and further than gpsSpreadFactor times their median
	// distance from that position (long pipelines), is misplaced. A dropped
	// sign or swapped coordinates move a point hundreds of kilometres.
	gpsFarM         = 5000.0
	gpsSpreadFactor = 3.0
	// gpsMinOthers is the number of other positioned CMLs a median needs.
	gpsMinOthers = 2
)

// plausibility warns of readings, steps between visits and positions that
// look like typing slips. It is pure over the merged survey, so earlier
// visits count, and each warning points at the reading's or row's line.
// Each value is judged against a median of the others, found in a list
// sorted once per CML, component or asset: the cost grows as n log n in
// the CMLs of a component or asset.
func plausibility(s *Survey) ProblemList {
	var problems ProblemList
	slipped := map[*Visit]bool{}
	var w plausibilityWork
	for _, a := range s.Assets {
		for _, c := range a.Components {
			for _, m := range c.CMLs {
				problems = append(problems, w.readingSlips(s, c, m, slipped)...)
				problems = append(problems, growth(s, c, m, slipped)...)
			}
			problems = append(problems, w.steps(s, c, slipped)...)
			problems = append(problems, nominalOff(s, c, &w, slipped)...)
		}
		problems = append(problems, farPositions(a)...)
	}
	return problems
}

// plausibilityWork is room the checks reuse from one CML or component to
// the next.
type plausibilityWork struct {
	values, rates, own, mine []float64
	intervals                []stepInterval
	bounds                   []int
}

// reference is a value a reading is judged against, and what it is.
type reference struct {
	mm   float64
	what string // "nominal", "other readings"
	n    int    // how many values it stands for
}

// readingSlips warns of readings that look like a value in the other unit
// (×25.4) or with its decimal point in the wrong place (×10). A reading is
// judged against the median of the CML's other readings (the governing
// readings of its other visits and the other readings of the same visit) and
// against its nominal; it must be far off every one of them, and the value it
// stands for close to one, tried in that order (the record before the design
// value). A lone other reading of the same or a later visit is not used: with
// two values only, the earlier one is trusted. Visits with a slip are marked
// in slipped.
func (w *plausibilityWork) readingSlips(s *Survey, c *Component, m *CML, slipped map[*Visit]bool) ProblemList {
	var problems ProblemList
	work := w.values
	for i := range m.Visits {
		v := &m.Visits[i]
		// The governing readings of the other visits and this visit's
		// readings, sorted; each reading is judged against them without itself.
		work = work[:0]
		lone := true // the only other value is not of an earlier visit
		for k, o := range m.Visits {
			if k != i {
				work = append(work, o.Governing())
				lone = lone && k > i
			}
		}
		work = append(work, v.ReadingsMM...)
		values := newSortedValues(work)
		others := len(values) - 1
		for _, r := range v.ReadingsMM {
			var refs [2]reference
			n := 0
			if others > 1 || others == 1 && !lone {
				refs[n] = reference{values.medianWithout(r), "other readings", others}
				n++
			}
			if c.Design.NominalMM != nil {
				refs[n] = reference{*c.Design.NominalMM, "nominal", 1}
				n++
			}
			if msg := slip(s.Units, r, refs[:n]); msg != "" {
				slipped[v] = true
				problems.Warnf(v.File, v.Line, "CML %s, visit %s: reading %s %s", m.ID, v.Date, written(s.Units, r), msg)
			}
		}
	}
	w.values = work
	return problems
}

// slip says what a reading r far off every reference likely stands for, or "".
func slip(u Unit, r float64, refs []reference) string {
	if len(refs) == 0 {
		return ""
	}
	for _, ref := range refs {
		if r >= ref.mm/slipFarRatio && r <= ref.mm*slipFarRatio {
			return ""
		}
	}
	for _, ref := range refs {
		in := func(x float64) bool { return x >= slipBandLow*ref.mm && x <= slipBandHigh*ref.mm }
		about := "about "
		if ref.n == 1 {
			about = ""
		}
		against := fmt.Sprintf("the CML's %s (%s%s %s)", ref.what, about, u.Format(ref.mm), u)
		switch {
		case r < ref.mm && in(r*MMPerInch):
			return fmt.Sprintf("looks like inches (%s %s), against %s", u.Format(r*MMPerInch), u, against)
		case r < ref.mm && in(r*10):
			return fmt.Sprintf("is about a tenth of %s: did you mean %s?", against, written(u, r*10))
		case r > ref.mm && in(r/10):
			return fmt.Sprintf("is about ten times %s: did you mean %s?", against, written(u, r/10))
		case r > ref.mm && in(r/MMPerInch):
			return fmt.Sprintf("looks like millimetres (%s %s), against %s", u.Format(r/MMPerInch), u, against)
		}
	}
	return ""
}

// written writes a thickness in mm in unit u as an inspector would type it:
// the shortest decimal, to a micrometre or a millionth of an inch.
func written(u Unit, mm float64) string {
	return strconv.FormatFloat(math.Round(u.FromMM(mm)*1e6)/1e6, 'f', -1, 64)
}

// steps warns of intervals whose loss rate is far above the component's
// other CMLs': above stepRatio times the median interval rate of the other
// CMLs (at least stepRateFloorMMPerY) and times the median of the CML's own
// other intervals, with a loss above stepMinLossMM. Intervals that touch a
// reading already warned about as a slip are skipped.
func (w *plausibilityWork) steps(s *Survey, c *Component, slipped map[*Visit]bool) ProblemList {
	all, bounds := w.intervals[:0], w.bounds[:0] // all[bounds[k]:bounds[k+1]] are the intervals of CML k
	for _, m := range c.CMLs {
		bounds = append(bounds, len(all))
		for i := 1; i < len(m.Visits); i++ {
			a, b := &m.Visits[i-1], &m.Visits[i]
			y := wallloss.YearsBetween(a.Date.Time, b.Date.Time)
			if y <= 0 {
				continue
			}
			loss := a.Governing() - b.Governing()
			all = append(all, stepInterval{a, b, loss, loss / y})
		}
	}
	bounds = append(bounds, len(all))
	w.intervals, w.bounds = all, bounds
	rates := w.rates[:0]
	for _, x := range all {
		rates = append(rates, x.mm)
	}
	w.rates = rates
	sorted := newSortedValues(rates)
	var problems ProblemList
	for k, m := range c.CMLs {
		group := all[bounds[k]:bounds[k+1]]
		if len(all)-len(group) < stepMinOthers {
			continue
		}
		mine := w.mine[:0] // this CML's rates, left out of the others'
		for _, o := range group {
			mine = append(mine, o.mm)
		}
		w.mine = mine
		for j, x := range group {
			if x.lossMM <= stepMinLossMM || slipped[x.from] || slipped[x.to] {
				continue
			}
			med := sorted.medianWithout(mine...)
			own := w.own[:0]
			for i, o := range group {
				if i != j {
					own = append(own, o.mm)
				}
			}
			w.own = own
			if x.mm <= stepRatio*max(med, stepRateFloorMMPerY) || len(own) > 0 && x.mm <= stepRatio*medianSorting(own) {
				continue
			}
			problems.Warnf(x.to.File, x.to.Line, "CML %s, visit %s: %s %s lost since %s (%s), over %g times the median interval rate of the other CMLs of %q (%s): re-measure, or confirm the reading",
				m.ID, x.to.Date, s.Units.Format(x.lossMM), s.Units, x.from.Date, rateText(s.Units, x.mm), stepRatio, c.Name, rateText(s.Units, med))
		}
	}
	return problems
}

// stepInterval is the loss between two consecutive visits of a CML.
type stepInterval struct {
	from, to   *Visit
	lossMM, mm float64 // loss, and rate in mm/y
}

// rateText writes a rate in mm/y, or in mils per year in an inch survey.
func rateText(u Unit, mmPerY float64) string {
	if u == Inch {
		return strconv.FormatFloat(mmPerY/MMPerInch*1000, 'f', 1, 64) + " mpy"
	}
	return strconv.FormatFloat(mmPerY, 'f', 2, 64) + " mm/y"
}
