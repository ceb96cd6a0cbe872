package electrochem

import "fmt"

// Faraday is the Faraday constant in C/mol: e·N_A, exact in the SI since 2019
// (CODATA 2018: 96 485.332 12... C/mol).
const Faraday = 1.602176634e-19 * 6.02214076e23

// SecondsPerYear is the year of 365.25 days used to turn rates into per-year
// values, in s.
const SecondsPerYear = 365.25 * 86400

// HoursPerYear is the 8760-hour year of ASTM G1's constants and of anode-life
// formulas (365 days), in h.
const HoursPerYear = 8760

// Element is a metal with its standard atomic weight and the charge of the ion
// it dissolves as.
type Element struct {
	Symbol   string
	MolarG   float64 // molar mass, g/mol (IUPAC standard atomic weight, abridged)
	Valence  int     // electrons given up per atom
	DensityG float64 // density of the pure metal, g/cm³
}

// Elements are the metals the tables use, by symbol. Atomic weights: IUPAC
// standard atomic weights (2013 table; Zn 65.38, Fe 55.845, Al 26.9815385,
// Mg 24.305, Cu 63.546, Ni 58.6934, Cr 51.9961, Mn 54.938044, Mo 95.95).
var Elements = map[string]Element{
	"Fe": {"Fe", 55.845, 2, 7.87},
	"Zn": {"Zn", 65.38, 2, 7.133},
	"Al": {"Al", 26.9815385, 3, 2.70},
	"Mg": {"Mg", 24.305, 2, 1.74},
	"Cu": {"Cu", 63.546, 2, 8.96},
	"Ni": {"Ni", 58.6934, 2, 8.89},
	"Cr": {"Cr", 51.9961, 3, 7.19},
	"Mn": {"Mn", 54.938044, 2, 7.47},
	"Mo": {"Mo", 95.95, 3, 10.28},
}

// MassFromCharge is Faraday's law: the mass in g dissolved by a charge q in C
// for a metal of molar mass molarG (g/mol) going to ions of charge n.
// m = Q·M / (n·F).
func MassFromCharge(q, molarG float64, n int) (float64, error) {
	if n <= 0 || molarG <= 0 {
		return 0, fmt.Errorf("valence %d and molar mass %g g/mol must be positive", n, molarG)
	}
	return q * molarG / (float64(n) * Faraday), nil
}

// TheoreticalCapacity is the charge one kilogram of metal delivers by
// Faraday's law, in A·h/kg: ε = n·F / (3.6·M) with M in g/mol
// (1000 g/kg ÷ 3600 s/h).
func TheoreticalCapacity(e Element) float64 {
	return float64(e.Valence) * Faraday / (3.6 * e.MolarG)
}

// G102K1 is ASTM G102-89 (R2015) §5's constant for the penetration rate,
// 3.27×10⁻³ mm·g/(µA·cm·y), as tabulated.
const G102K1 = 3.27e-3

// G102K1MPY is the same constant for mils per year, 0.1288 mpy·g/(µA·cm).
const G102K1MPY = 0.1288

// DerivedK1 is K1 worked from Faraday's law: 10⁻⁶ A/µA × s/y × 10 mm/cm ÷ F,
// in mm·g/(µA·cm·y) — the check on G102's tabulated value.
func DerivedK1() float64 { return 1e-6 * SecondsPerYear * 10 / Faraday }
