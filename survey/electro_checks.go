package survey

import (
	"fmt"
	"slices"
	"time"

	"github.com/lossline/lossline/survey/electrochem"
)

// Plausible ranges of the electro tables' values. Outside them a value is
// far more likely a unit or column slip than a measurement (common practice:
// a value that disagrees with what the instrument can show is re-measured or
// re-typed before it is believed); the limits are this tool's choices.
const (
	// A potential of steel (mV, any reference electrode of the table) above
	// this is a dropped minus sign; between it and voltsBelowMV, volts.
	potentialMaxMV = 0.0
	voltsBelowMV   = 10.0
	// An instant-off potential more negative than the on potential by more
	// than this (mV) suggests the on and off columns are swapped: switching
	// the current off removes the IR drop, which makes the potential less
	// negative.
	offBeyondOnMV = 50.0
	// Coupon mass (g) and area (cm²) outside these look like kg or m² / mm².
	couponMinG, couponMinCM2, couponMaxCM2 = 1.0, 1.0, 1000.0
	// A coupon's deepest pit (mm) over this is deeper than flush and strip
	// coupons are thick (a few mm): µm written for mm.
	couponMaxPitMM = 5.0
	// An anode's current (A) or mass (kg) above these look like mA or g.
	anodeMaxA, anodeMaxKG = 10.0, 1000.0
	// An ER span (mm) above this looks like mils.
	erMaxSpanMM = 2.5
	// A polarisation resistance (Ω·cm²) below this looks like kΩ·cm².
	lprMinOhmCM2 = 10.0
	// A Tafel slope or Stern–Geary B (mV) below this looks like volts:
	// published B values are some 13 to 52 mV (ASTM G102, from memory).
	tafelMinMV = 1.0
	// A coating thickness (µm) below this looks like mm.
	coatingMinUM = 1.0
)

// checkPotential refuses a potential that is positive against CSE (a dropped
// minus sign) or so near 0 mV against CSE that it was written in volts. A zinc
// electrode reads protected steel positive (+250 mV Zn is −850 mV CSE), so
// the limits apply to the potential converted to CSE.
func checkPotential(name string, v *float64, el electrochem.Electrode) error {
	if v == nil {
		return nil
	}
	cse := electrochem.Convert(*v, el, electrochem.CSE)
	switch {
	case cse > potentialMaxMV && cse < voltsBelowMV && el == electrochem.CSE:
		return fmt.Errorf("%s potential %g mV %s looks like volts without the minus sign: write millivolts (%.6g)", name, *v, el, -*v*1000)
	case cse > potentialMaxMV:
		return fmt.Errorf("%s potential %g mV %s is %+.0f mV against CSE: the potential of protected steel is negative, write it with its minus sign", name, *v, el, cse)
	case cse > -voltsBelowMV && cse != 0:
		return fmt.Errorf("%s potential %g mV %s looks like volts: write millivolts (%.6g)", name, *v, el, *v*1000)
	}
	return nil
}

// duplicateID returns the line of an earlier row with the same id, 0 if none.
func duplicateID[T any](rows []T, id string, idLine func(T) (string, int)) int {
	for _, r := range rows {
		if i, l := idLine(r); i == id {
			return l
		}
	}
	return 0
}

// checkPlausible warns at values of the electro tables that look like unit
// or column slips, and refuses dates after the survey.
func (e *Electro) checkPlausible(file string, today time.Time, problems *ProblemList) {
	after := func(line int, what string, d VisitDate) {
		if !today.IsZero() && d.Time.After(today) {
			problems.Errorf(file, line, "%s %s is after the survey date %s", what, d, today.Format(time.DateOnly))
		}
	}
	for _, c := range e.Coupons {
		after(c.Line, "coupon "+c.ID+": removed", c.Removed)
		if c.Coupon.MassBeforeG > 0 && c.Coupon.MassBeforeG < couponMinG {
			problems.Warnf(file, c.Line, "coupon %s: mass %g g is under %g g: looks like kilograms, write grams (%.6g)", c.ID, c.Coupon.MassBeforeG, couponMinG, c.Coupon.MassBeforeG*1000)
		}
		if p := c.Coupon.PitDepthMM; p > couponMaxPitMM {
			problems.Warnf(file, c.Line, "coupon %s: deepest pit %g mm is over %g mm, deeper than a coupon is thick: looks like µm, write mm (%.6g)", c.ID, p, couponMaxPitMM, p/1000)
		}
		if a := c.Coupon.AreaCM2; a > 0 && a < couponMinCM2 {
			problems.Warnf(file, c.Line, "coupon %s: area %g cm² is under %g cm²: looks like m², write cm² (%.6g)", c.ID, a, couponMinCM2, a*1e4)
		} else if a > couponMaxCM2 {
			problems.Warnf(file, c.Line, "coupon %s: area %g cm² is over %g cm²: looks like mm², write cm² (%.6g)", c.ID, a, couponMaxCM2, a/100)
		}
	}
	for _, p := range e.ERProbes {
		if len(p.Dates) > 0 {
			after(p.Line, "ER probe "+p.ID+": reading on", p.Dates[len(p.Dates)-1])
		}
		if p.SpanMM > erMaxSpanMM {
			problems.Warnf(file, p.Line, "ER probe %s: span %g mm is over %g mm: looks like mils, write mm (%.6g)", p.ID, p.SpanMM, erMaxSpanMM, p.SpanMM*0.0254)
		}
	}
	for _, p := range e.LPRProbes {
		if len(p.Dates) > 0 {
			after(p.Line, "LPR probe "+p.ID+": reading on", p.Dates[len(p.Dates)-1])
		}
		if slices.ContainsFunc(p.RpOhmCM2, func(r float64) bool { return r > 0 && r < lprMinOhmCM2 }) {
			problems.Warnf(file, p.Line, "LPR probe %s: a polarisation resistance under %g Ω·cm² looks like kΩ·cm²: write Ω·cm² (2.9 kΩ·cm² is 2900)", p.ID, lprMinOhmCM2)
		}
	}
	for _, tp := range e.TestPoints {
		for _, v := range tp.Visits {
			after(v.Line, "test point "+tp.ID+": date", v.Date)
			on, off := v.Potentials.On, v.Potentials.Off
			if on != nil && off != nil && *off < *on-offBeyondOnMV {
				problems.Warnf(file, v.Line, "test point %s: off %g mV is more negative than on %g mV: are the on and off columns swapped? (switching off makes the potential less negative)", tp.ID, *off, *on)
			}
		}
	}
	for _, a := range e.Anodes {
		if a.Anode.CurrentA > anodeMaxA {
			problems.Warnf(file, a.Line, "anode %s: current %g A is over %g A for one anode: looks like mA, write amperes (%.6g)", a.ID, a.Anode.CurrentA, anodeMaxA, a.Anode.CurrentA/1000)
		}
		if m := max(a.Anode.InitialKG, a.Anode.RemainingKG); m > anodeMaxKG {
			problems.Warnf(file, a.Line, "anode %s: mass %g kg is over %g kg for one anode: looks like grams, write kg (%.6g)", a.ID, m, anodeMaxKG, m/1000)
		}
	}
}

// coatingMicrons refuses a coating thickness under a micrometre: a value
// written in mm.
func coatingMicrons(key string, v float64) error {
	if v > 0 && v < coatingMinUM {
		return fmt.Errorf("%s: %g µm is under %g µm: looks like mm, write micrometres (%.6g µm)", key, v, coatingMinUM, v*1000)
	}
	return nil
}

// tafelMillivolts refuses Tafel slopes or a B written in volts.
func tafelMillivolts(written string, vs ...float64) error {
	for _, v := range vs {
		if v > 0 && v < tafelMinMV {
			return fmt.Errorf("the B column %q: %g mV is under %g mV: looks like volts, write millivolts (e.g. 120/120 for 0.12/0.12 V per decade)", written, v, tafelMinMV)
		}
	}
	return nil
}
