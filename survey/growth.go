package survey

// growthMinMM is how much thicker a later reading must be than the one
// before it to be asked about: the default gauge tolerance plus 0.5 mm, as
// for steps of loss (stepMinLossMM), so measurement scatter never counts.
const growthMinMM = stepMinLossMM

// nominalFarRatio: a component's nominal thickness is asked about when the
// median of its CMLs' readings is below a third of it (the ×10 slip or a
// nominal in the other unit) or above slipBandHigh times it (a wall does not
// read a fifth over its nominal: mill tolerance plus gauge error).
const nominalFarRatio = slipFarRatio

// growth warns where a CML's governing reading is much thicker than its
// reading of the visit before, with no repair recorded between: a wall does
// not grow, so a transposed digit or date columns out of order are likely;
// the rate of such an interval is taken as zero and would hide the loss.
// A visit already warned of as a slip is left to that warning; a visit
// warned of here is marked in slipped too.
func growth(s *Survey, c *Component, m *CML, slipped map[*Visit]bool) ProblemList {
	var problems ProblemList
	for i := 1; i < len(m.Visits); i++ {
		a, b := m.Visits[i-1], m.Visits[i]
		up := b.Governing() - a.Governing()
		if up <= growthMinMM || slipped[&m.Visits[i-1]] || slipped[&m.Visits[i]] || repairedBetween(c, m, a.Date, b.Date) {
			continue
		}
		slipped[&m.Visits[i]] = true // suspect: the steps and the nominal check leave it out
		problems.Warnf(b.File, b.Line, "CML %s, visit %s: %s %s is %s %s thicker than on %s (%s %s): a wall does not grow; "+
			"check the reading (a transposed digit?) and the order of the date columns, or record the repair (repaired:)",
			m.ID, b.Date, written(s.Units, b.Governing()), s.Units, s.Units.Format(up), s.Units, a.Date, written(s.Units, a.Governing()), s.Units)
	}
	return problems
}

// repairedBetween reports whether a repair of m is dated after visit a and
// no later than visit b.
func repairedBetween(c *Component, m *CML, a, b VisitDate) bool {
	for _, e := range c.Design.Repairs {
		if e.Covers(m) && e.Date.Time.After(a.Time) && !e.Date.Time.After(b.Time) {
			return true
		}
	}
	return false
}

// nominalOff warns at a component's nominal when its CMLs' latest readings
// sit far from it: the median below a third of it or above a fifth over it.
// Readings already warned of as slips are left out.
func nominalOff(s *Survey, c *Component, w *plausibilityWork, slipped map[*Visit]bool) ProblemList {
	var problems ProblemList
	if c.Design.NominalMM == nil || len(c.CMLs) == 0 {
		return nil
	}
	work := w.mine[:0]
	for _, m := range c.CMLs {
		if n := len(m.Visits); n > 0 && !slipped[&m.Visits[n-1]] {
			work = append(work, m.Visits[n-1].Governing())
		}
	}
	w.mine = work
	if len(work) == 0 {
		return nil
	}
	med := newSortedValues(work).medianWithout()
	nom := *c.Design.NominalMM
	if med >= nom/nominalFarRatio && med <= nom*slipBandHigh {
		return nil
	}
	what := "far below"
	if med > nom {
		what = "over a fifth above"
	}
	problems.Warnf(c.File, c.Design.Lines["nominal"], "the median of the latest readings of %q (%s %s) is %s its nominal %s %s: "+
		"check the nominal (a slipped decimal point? the other unit?)", c.Name, written(s.Units, med), s.Units, what, written(s.Units, nom), s.Units)
	return problems
}
