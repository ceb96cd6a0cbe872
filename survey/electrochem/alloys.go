package electrochem

import (
	"fmt"
	"sort"
	"strings"
)

// Alloy is a metal or alloy with the composition its equivalent weight is
// computed from and its density.
type Alloy struct {
	Name     string
	Parts    []Part  // elements above 1 % by mass, the balance element included
	DensityG float64 // g/cm³
}

// Part is one element of an alloy with its mass fraction.
type Part struct {
	Symbol   string
	Fraction float64
}

// EquivalentWeight is ASTM G102-89 (R2015) §6's equivalent weight in g/eq:
// 1 / Σ(n_i·f_i / W_i) over the alloy's elements, each at the lowest common
// valence G102 assigns.
func (a Alloy) EquivalentWeight() float64 {
	s := 0.0
	for _, p := range a.Parts {
		e := Elements[p.Symbol]
		s += float64(e.Valence) * p.Fraction / e.MolarG
	}
	return 1 / s
}

// Alloys are the metals a survey may name for a probe or coupon, keyed by the
// name written. Compositions are nominal mid-range values of the alloy's
// specification (from memory); densities are handbook values (from memory).
var Alloys = map[string]Alloy{
	"carbon steel":        {"carbon steel", []Part{{"Fe", 1}}, 7.87},
	"304 stainless":       {"304 stainless", []Part{{"Fe", 0.70}, {"Cr", 0.19}, {"Ni", 0.09}, {"Mn", 0.02}}, 7.94},
	"316 stainless":       {"316 stainless", []Part{{"Fe", 0.655}, {"Cr", 0.17}, {"Ni", 0.12}, {"Mo", 0.025}, {"Mn", 0.02}}, 7.98},
	"aluminium":           {"aluminium", []Part{{"Al", 1}}, 2.70},
	"copper":              {"copper", []Part{{"Cu", 1}}, 8.96},
	"zinc":                {"zinc", []Part{{"Zn", 1}}, 7.133},
	"90-10 copper-nickel": {"90-10 copper-nickel", []Part{{"Cu", 0.88}, {"Ni", 0.10}, {"Fe", 0.015}, {"Mn", 0.005}}, 8.94},
	"nickel":              {"nickel", []Part{{"Ni", 1}}, 8.89},
}

// AlloyNames lists the names Alloys knows, sorted.
func AlloyNames() []string {
	var n []string
	for k := range Alloys {
		n = append(n, k)
	}
	sort.Strings(n)
	return n
}

// FindAlloy looks an alloy up by name; "steel", "mild steel" and "aluminum"
// are read as carbon steel and aluminium.
func FindAlloy(name string) (Alloy, error) {
	k := strings.ToLower(strings.Join(strings.Fields(name), " "))
	switch k {
	case "steel", "mild steel", "c-steel", "carbon-steel":
		k = "carbon steel"
	case "aluminum":
		k = "aluminium"
	case "304", "304 ss", "304 stainless steel":
		k = "304 stainless"
	case "316", "316 ss", "316 stainless steel":
		k = "316 stainless"
	}
	a, ok := Alloys[k]
	if !ok {
		return Alloy{}, fmt.Errorf("metal %q is not in the equivalent-weight table (%s)", name, strings.Join(AlloyNames(), ", "))
	}
	return a, nil
}
