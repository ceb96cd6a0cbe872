package required

import (
	"fmt"
	"strings"
)

// yTable is ASME B31.3 Table 304.1.1, coefficient Y for t < D/6, by material
// and design temperature (°C: ≤482, 510, 538, 566, 593, ≥621); the table's
// note permits interpolation between the temperatures.
var yTemps = []float64{482, 510, 538, 566, 593, 621}

var yTable = map[string][]float64{
	"ferritic":      {0.4, 0.5, 0.7, 0.7, 0.7, 0.7},
	"austenitic":    {0.4, 0.4, 0.4, 0.4, 0.5, 0.7},
	"other ductile": {0.4, 0.4, 0.4, 0.4, 0.4, 0.4},
}

// CoefficientY returns Y from Table 304.1.1 for a material ("ferritic",
// "austenitic", "other ductile", "cast iron") at a temperature in °C.
func CoefficientY(material string, tempC float64) (float64, error) {
	material = strings.ToLower(strings.TrimSpace(material))
	if material == "cast iron" {
		return 0, nil
	}
	row, ok := yTable[material]
	if !ok {
		return 0, fmt.Errorf("material %q is not ferritic, austenitic, other ductile or cast iron", material)
	}
	if tempC <= yTemps[0] {
		return row[0], nil
	}
	for i := 1; i < len(yTemps); i++ {
		if tempC <= yTemps[i] {
			f := (tempC - yTemps[i-1]) / (yTemps[i] - yTemps[i-1])
			return row[i-1] + f*(row[i]-row[i-1]), nil
		}
	}
	return row[len(row)-1], nil
}

// PipePressureThickness is ASME B31.3 Eq. (3a): t = P·D / (2·(S·E·W + P·Y)),
// any consistent units (P and S alike, t and D alike).
func PipePressureThickness(p, d, s, e, w, y float64) float64 {
	return p * d / (2 * (s*e*w + p*y))
}

// pipeB313 is straight pipe under internal pressure, ASME B31.3 §304.1.2.
func pipeB313(r *reader) (Calculation, error) {
	c := Calculation{Method: "ASME B31.3 straight pipe under internal pressure", Source: "ASME B31.3 §304.1.2, Eq. (3a); Y from Table 304.1.1"}
	p := r.quantity(Pressure, "pressure", "design pressure")
	d := r.quantity(Length, "outside diameter", "od", "d")
	s := r.quantity(Pressure, "allowable stress", "stress", "s")
	e := r.quantity(Number, "joint factor", "joint efficiency", "quality factor", "e")
	temp, hasTemp := r.optional(Temperature, "temperature", "design temperature")
	w, hasW := r.optional(Number, "weld strength factor", "w")
	y, hasY := r.optional(Number, "coefficient y", "y")
	material, hasMaterial := r.word("material")
	allowance, _ := r.optional(Length, "allowance", "c")
	structural, hasStructural := r.optional(Length, "structural minimum", "mechanical minimum")
	if r.err != nil {
		return c, r.err
	}
	if !hasW {
		// Table 302.3.5 gives W = 1.0 up to 427 °C (800 °F) [from memory].
		if hasTemp && temp > 427 {
			return c, fmt.Errorf("weld strength factor: give W above 427 °C (ASME B31.3 Table 302.3.5)")
		}
		w = 1
		c.Steps = append(c.Steps, "W = 1.0 (weld strength factor at or below 427 °C, Table 302.3.5)")
	}
	if !hasY {
		if !hasMaterial || !hasTemp {
			return c, fmt.Errorf("give coefficient Y, or material and temperature to take Y from Table 304.1.1")
		}
		var err error
		if y, err = CoefficientY(material, temp); err != nil {
			return c, err
		}
		c.Steps = append(c.Steps, fmt.Sprintf("Y = %.3g (Table 304.1.1, %s at %.4g °C)", y, material, temp))
	}
	switch {
	case p <= 0 || d <= 0 || s <= 0:
		return c, fmt.Errorf("pressure, outside diameter and allowable stress must be greater than zero")
	case e <= 0 || e > 1 || w <= 0 || w > 1:
		return c, fmt.Errorf("joint factor and weld strength factor must be in (0, 1]")
	case y < 0 || y >= 1:
		return c, fmt.Errorf("coefficient Y must be in [0, 1)")
	case p/(s*e) > 0.385:
		return c, fmt.Errorf("P/(S·E) = %.3f exceeds 0.385: Eq. (3a) does not apply, special consideration is required (§304.1.2(b))", p/(s*e))
	}
	t := PipePressureThickness(p, d, s, e, w, y)
	if t >= d/6 {
		return c, fmt.Errorf("t = %.3f mm is not less than D/6: Eq. (3a) does not apply, special consideration is required (§304.1.2(b))", t)
	}
	c.Steps = append(c.Steps,
		fmt.Sprintf("t = P·D / (2·(S·E·W + P·Y)) = %.5g × %.5g / (2 × (%.5g × %.4g × %.4g + %.5g × %.3g)) = %.4f mm",
			p, d, s, e, w, p, y, t))
	req := t + allowance
	if allowance > 0 {
		c.Steps = append(c.Steps, fmt.Sprintf("t_m = t + c = %.4f + %.4f = %.4f mm", t, allowance, req))
	}
	if hasStructural && structural > req {
		c.Steps = append(c.Steps, fmt.Sprintf("structural minimum %.4f mm governs over %.4f mm", structural, req))
		req = structural
	}
	c.RequiredMM = req
	return c, nil
}
