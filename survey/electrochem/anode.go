package electrochem

import (
	"errors"
	"fmt"
	"strings"
)

// AnodeMetal is a sacrificial-anode material with its practical design
// capacity and the element whose Faraday capacity bounds it.
type AnodeMetal struct {
	Name        string
	Element     string  // symbol in Elements
	CapacityAhK float64 // design electrochemical capacity, A·h/kg
	Source      string
}

// AnodeMetals are the design capacities by anode material. Al-Zn-In and zinc:
// DNV-RP-B401 (2017) design electrochemical capacity table, seawater up to
// 30 °C (from memory); magnesium in soil: ISO 15589-1 / manufacturers'
// practical value at about 50 % efficiency (from memory).
var AnodeMetals = map[string]AnodeMetal{
	"aluminium": {"Al-Zn-In", "Al", 2000, "DNV-RP-B401 (2017), design capacity of Al-Zn-In in seawater ≤ 30 °C (from memory)"},
	"zinc":      {"zinc", "Zn", 780, "DNV-RP-B401 (2017), design capacity of zinc in seawater ≤ 50 °C (from memory)"},
	"magnesium": {"magnesium", "Mg", 1100, "practical capacity of magnesium in soil, about 50 % efficiency (ISO 15589-1; from memory)"},
}

// FindAnodeMetal looks an anode material up by name.
func FindAnodeMetal(name string) (AnodeMetal, error) {
	k := strings.ToLower(strings.TrimSpace(name))
	switch k {
	case "al", "al-zn-in", "aluminum", "aluminium":
		k = "aluminium"
	case "zn", "zinc":
		k = "zinc"
	case "mg", "magnesium":
		k = "magnesium"
	}
	m, ok := AnodeMetals[k]
	if !ok {
		return AnodeMetal{}, fmt.Errorf("anode material %q is not aluminium, zinc or magnesium", name)
	}
	return m, nil
}

// Anode is one sacrificial anode as surveyed.
type Anode struct {
	Metal       AnodeMetal
	CapacityAhK float64 // 0 to use Metal.CapacityAhK
	RemainingKG float64 // net anode mass left, kg
	InitialKG   float64 // net mass as installed, kg; 0 when unknown
	Utilisation float64 // fraction of the initial mass usable before the anode stops working
	CurrentA    float64 // mean current delivered, A
}

// AnodeLife is an anode's remaining life.
type AnodeLife struct {
	UsableKG, Years float64
	Working
}

// AnodeLifeOf is DNV-RP-B401 (2017) §7's life T = m·u·ε / (I·8760) in years.
// With the installed mass known, the usable mass is what remains above the
// unusable part (1 − u)·m_initial; without it, u is applied to the remaining
// mass as the formula is written.
func AnodeLifeOf(a Anode) (AnodeLife, error) {
	eps := a.CapacityAhK
	if eps == 0 {
		eps = a.Metal.CapacityAhK
	}
	switch {
	case a.CurrentA <= 0:
		return AnodeLife{}, errors.New("anode current must be positive")
	case a.Utilisation <= 0 || a.Utilisation > 1:
		return AnodeLife{}, fmt.Errorf("utilisation factor %g is not between 0 and 1", a.Utilisation)
	case a.RemainingKG < 0 || eps <= 0:
		return AnodeLife{}, errors.New("remaining mass must not be negative and capacity must be positive")
	case a.InitialKG > 0 && a.RemainingKG > a.InitialKG:
		return AnodeLife{}, fmt.Errorf("remaining mass %g kg is more than the installed %g kg", a.RemainingKG, a.InitialKG)
	}
	var l AnodeLife
	l.Source = "DNV-RP-B401 (2017) §7, T = m·u·ε/(I·8760); capacity: " + a.Metal.Source
	if a.InitialKG > 0 {
		l.UsableKG = max(0, a.RemainingKG-(1-a.Utilisation)*a.InitialKG)
		l.step("usable mass = m_left − (1 − u)·m_installed = %.4g − %.4g × %.4g = %.4g kg", a.RemainingKG, 1-a.Utilisation, a.InitialKG, l.UsableKG)
	} else {
		l.UsableKG = a.RemainingKG * a.Utilisation
		l.step("usable mass = m·u = %.4g × %.4g = %.4g kg", a.RemainingKG, a.Utilisation, l.UsableKG)
	}
	l.Years = l.UsableKG * eps / (a.CurrentA * HoursPerYear)
	l.step("T = %.4g kg × %.4g A·h/kg / (%.4g A × 8760 h/y) = %.4g y", l.UsableKG, eps, a.CurrentA, l.Years)
	return l, nil
}

// Utilisation factors by anode shape, DNV-RP-B401 (2017) table of design
// utilisation factors (from memory).
var Utilisation = map[string]float64{
	"long slender stand-off":  0.90,
	"short slender stand-off": 0.85,
	"long flush":              0.85,
	"short flush":             0.80,
	"bracelet half-shell":     0.80,
	"bracelet segmented":      0.75,
}
