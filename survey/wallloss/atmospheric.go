package wallloss

import (
	"fmt"
	"math"
	"strings"
)

// Corrosivity is an ISO 9223:2012 atmospheric corrosivity category.
type Corrosivity string

// firstYearSteelUM is the upper limit of each category's first-year corrosion
// rate of carbon steel, µm/a (ISO 9223:2012 Table 2). Using the upper limit
// gives the conservative end of the category.
var firstYearSteelUM = map[Corrosivity]float64{"C1": 1.3, "C2": 25, "C3": 50, "C4": 80, "C5": 200, "CX": 700}

// ParseCorrosivity reads C1 … C5 or CX.
func ParseCorrosivity(s string) (Corrosivity, error) {
	c := Corrosivity(strings.ToUpper(strings.TrimSpace(s)))
	if _, ok := firstYearSteelUM[c]; !ok {
		return "", fmt.Errorf("corrosivity %q is not an ISO 9223 category C1, C2, C3, C4, C5 or CX", s)
	}
	return c, nil
}

// FirstYearRateUM is the category's first-year rate r_corr for carbon steel, µm/a.
func (c Corrosivity) FirstYearRateUM() float64 { return firstYearSteelUM[c] }

// ISO9224SteelExponentB2 is the time exponent b for carbon steel in ISO
// 9224:2012 (B2, the upper value for design; B1, the average, is 0.523).
const ISO9224SteelExponentB2 = 0.575

// ISO9224Loss is the metal loss in µm after t years of ISO 9224:2012's model:
// D = r_corr·t^b up to 20 years, then the linear continuation
// D = r_corr·(20^b + b·20^(b−1)·(t − 20)).
func ISO9224Loss(rCorrUM, b, t float64) float64 {
	if t <= 0 {
		return 0
	}
	if t <= 20 {
		return rCorrUM * math.Pow(t, b)
	}
	return rCorrUM * (math.Pow(20, b) + b*math.Pow(20, b-1)*(t-20))
}

// ISO9224Life returns the years from age a (years of exposure) until a
// further loss of marginUM µm: the inverse of ISO9224Loss.
func ISO9224Life(rCorrUM, b, age, marginUM float64) float64 {
	target := ISO9224Loss(rCorrUM, b, age) + marginUM
	var t float64
	if at20 := ISO9224Loss(rCorrUM, b, 20); target <= at20 {
		t = math.Pow(target/rCorrUM, 1/b)
	} else {
		t = 20 + (target/rCorrUM-math.Pow(20, b))/(b*math.Pow(20, b-1))
	}
	return t - age
}
