package required

import (
	"fmt"
	"strings"
)

// Unknown-material strengths of API 653 §4.3.3.1: yield 30 000 psi, tensile 55 000 psi.
const (
	unknownYieldPSI   = 30000
	unknownTensilePSI = 55000
)

// ShellAllowableStressPSI is API 653 §4.3.3.1's S for a course: the lesser of
// 0.80·Y and 0.429·T for the bottom and second course, 0.88·Y and 0.472·T for
// the others; T is capped at 80 000 psi.
func ShellAllowableStressPSI(course int, yieldPSI, tensilePSI float64) float64 {
	t := min(tensilePSI, 80000)
	if course <= 2 {
		return min(0.80*yieldPSI, 0.429*t)
	}
	return min(0.88*yieldPSI, 0.472*t)
}

// ShellMinThicknessUS is API 653 §4.3.3.1 in US customary units: the whole
// course t_min = 2.6·(H − 1)·D·G / (S·E), a locally thinned area
// 2.6·H·D·G / (S·E); H and D in ft, S in psi, t in inches.
func ShellMinThicknessUS(hFt, dFt, g, sPSI, e float64, local bool) float64 {
	h := hFt - 1
	if local {
		h = hFt
	}
	return 2.6 * h * dFt * g / (sPSI * e)
}

// ShellMinThicknessSI is the SI form: 4.9·(H − 0.3)·D·G / (S·E) for the whole
// course, 4.9·H·D·G / (S·E) locally; H and D in m, S in MPa, t in mm.
func ShellMinThicknessSI(hM, dM, g, sMPa, e float64, local bool) float64 {
	h := hM - 0.3
	if local {
		h = hM
	}
	return 4.9 * h * dM * g / (sMPa * e)
}

// tankShell is API 653 §4.3.3.1, minimum thickness of a shell course (tanks
// up to 200 ft / 61 m in diameter), with its floor of 0.1 in (2.5 mm in SI).
func tankShell(r *reader, local bool) (Calculation, error) {
	c := Calculation{Method: "API 653 tank shell course, whole course", Source: "API 653 §4.3.3.1"}
	if local {
		c.Method = "API 653 tank shell, locally thinned area"
	}
	h := r.quantity(Length, "fill height", "height", "h")
	_, dText, _ := r.lookup("diameter", "d")
	delete(r.used, "diameter")
	d := r.quantity(Length, "diameter", "d")
	g := r.quantity(Number, "specific gravity", "g")
	e := r.quantity(Number, "joint efficiency", "e")
	s, hasS := r.optional(Pressure, "allowable stress", "s")
	course, hasCourse := r.optional(Number, "course")
	yield, hasYield := r.optional(Pressure, "yield strength")
	tensile, hasTensile := r.optional(Pressure, "tensile strength")
	if r.err != nil {
		return c, r.err
	}
	if !hasS {
		if !hasCourse {
			return c, fmt.Errorf("give allowable stress, or the course number (1 = bottom) to derive it")
		}
		yPSI, tPSI := float64(unknownYieldPSI), float64(unknownTensilePSI)
		basis := "unknown material: Y = 30 000 psi, T = 55 000 psi"
		if hasYield && hasTensile {
			yPSI, tPSI = yield/mpaPerPSI, tensile/mpaPerPSI
			basis = fmt.Sprintf("Y = %.0f psi, T = %.0f psi", yPSI, tPSI)
		}
		sPSI := ShellAllowableStressPSI(int(course), yPSI, tPSI)
		s = sPSI * mpaPerPSI
		c.Steps = append(c.Steps, fmt.Sprintf("S = %.0f psi for course %d (%s; §4.3.3.1)", sPSI, int(course), basis))
	}
	if d <= 0 || g <= 0 || s <= 0 || e <= 0 || e > 1 {
		return c, fmt.Errorf("diameter, specific gravity and stress must be greater than zero, joint efficiency in (0, 1]")
	}
	if d > 200*mmPerFt {
		return c, fmt.Errorf("diameter over 200 ft (61 m): §4.3.3.1 does not apply, use the variable-design-point method")
	}
	us := strings.HasSuffix(strings.ToLower(strings.TrimSpace(dText)), "ft") || strings.HasSuffix(strings.ToLower(strings.TrimSpace(dText)), "feet")
	hTerm := map[bool]string{false: "(H − 1)", true: "H"}[local]
	var t, floor float64
	if us {
		hFt, dFt, sPSI := h/mmPerFt, d/mmPerFt, s/mpaPerPSI
		tIn := ShellMinThicknessUS(hFt, dFt, g, sPSI, e, local)
		c.Steps = append(c.Steps, fmt.Sprintf("t_min = 2.6·%s·D·G / (S·E) = 2.6 × %s × %.4g × %.4g / (%.0f × %.3g) = %.5f in",
			hTerm, map[bool]string{false: fmt.Sprintf("(%.4g − 1)", hFt), true: fmt.Sprintf("%.4g", hFt)}[local], dFt, g, sPSI, e, tIn))
		t, floor = tIn*mmPerIn, 0.1*mmPerIn
	} else {
		hM, dM := h/1000, d/1000
		t = ShellMinThicknessSI(hM, dM, g, s, e, local)
		hTermSI := map[bool]string{false: "(H − 0.3)", true: "H"}[local]
		c.Steps = append(c.Steps, fmt.Sprintf("t_min = 4.9·%s·D·G / (S·E) = 4.9 × %s × %.4g × %.4g / (%.4g × %.3g) = %.4f mm",
			hTermSI, map[bool]string{false: fmt.Sprintf("(%.4g − 0.3)", hM), true: fmt.Sprintf("%.4g", hM)}[local], dM, g, s, e, t))
		floor = 2.5
	}
	if t < floor {
		c.Steps = append(c.Steps, fmt.Sprintf("below the floor of %s: t_min = %.2f mm (§4.3.3.1)", map[bool]string{true: "0.1 in", false: "2.5 mm"}[us], floor))
		t = floor
	}
	c.RequiredMM = t
	return c, nil
}

// BottomMinRemainingIn is API 653 Table 4.4's minimum remaining thickness of a
// tank bottom at the next inspection: 0.10 in, or 0.05 in where a release
// prevention barrier (leak detection and containment) is in place.
func BottomMinRemainingIn(barrier bool) float64 {
	if barrier {
		return 0.05
	}
	return 0.10
}

// tankBottom is API 653 §4.4.7, bottom plate minimum remaining thickness.
func tankBottom(r *reader) (Calculation, error) {
	c := Calculation{Method: "API 653 tank bottom, minimum remaining thickness", Source: "API 653 §4.4.7, Table 4.4"}
	v, ok := r.word("release prevention barrier", "barrier")
	if !ok {
		return c, fmt.Errorf("give release prevention barrier: yes or no")
	}
	var barrier bool
	switch strings.ToLower(v) {
	case "yes", "true":
		barrier = true
	case "no", "false", "none":
	default:
		return c, fmt.Errorf("release prevention barrier: %q is not yes or no", v)
	}
	in := BottomMinRemainingIn(barrier)
	c.Steps = append(c.Steps, fmt.Sprintf("MRT_min = %.2f in (%s) = %.3f mm", in,
		map[bool]string{true: "with a release prevention barrier", false: "no means to detect and contain a bottom leak"}[barrier], in*mmPerIn))
	c.RequiredMM = in * mmPerIn
	return c, nil
}

// sectionLoss is a structural member's allowed section loss, set by the
// responsible engineer as a percentage of nominal thickness.
func sectionLoss(r *reader, nominalMM float64) (Calculation, error) {
	c := Calculation{Method: "structural member, allowed section loss", Source: "set by the responsible engineer"}
	_, text, ok := r.lookup("allowed section loss", "section loss")
	delete(r.used, "allowed section loss")
	delete(r.used, "section loss")
	loss := r.quantity(Number, "allowed section loss", "section loss")
	if by, ok := r.word("set by"); ok {
		c.Source = "set by " + by
	}
	if r.err != nil {
		return c, r.err
	}
	if !strings.Contains(text, "%") || !ok {
		return c, fmt.Errorf("write the allowed section loss as a percentage of nominal, e.g. 25 %%")
	}
	if loss <= 0 || loss >= 1 {
		return c, fmt.Errorf("allowed section loss must be between 0 and 100 %%")
	}
	if nominalMM <= 0 {
		return c, fmt.Errorf("section loss needs the component's nominal thickness")
	}
	c.RequiredMM = nominalMM * (1 - loss)
	c.Steps = append(c.Steps, fmt.Sprintf("t_required = nominal × (1 − loss) = %.3f × (1 − %.3g) = %.3f mm", nominalMM, loss, c.RequiredMM))
	return c, nil
}
