package electrochem

import (
	"fmt"
	"sort"
	"strings"
)

// SeriesEntry is one metal of the galvanic series in flowing seawater with
// its corrosion-potential range in V against SCE.
type SeriesEntry struct {
	Name        string
	LowV, HighV float64 // most negative and least negative, V vs SCE
	Aliases     []string
}

// MidV is the middle of the entry's range, V vs SCE.
func (s SeriesEntry) MidV() float64 { return (s.LowV + s.HighV) / 2 }

// GalvanicSource names the series.
const GalvanicSource = "galvanic series in flowing seawater, ambient temperature, V vs SCE (ASTM G82 guide, edition from memory; data as reproduced from LaQue's series by the Australasian Corrosion Association)"

// GalvanicWarnV is the potential difference above which a pair is warned
// about: 0.25 V, the usual limit for a normal (not controlled) environment
// (common practice; MIL-STD-889 anodic-index guidance, from memory).
const GalvanicWarnV = 0.25

// GalvanicSeries is the series, most active first.
var GalvanicSeries = []SeriesEntry{
	{"magnesium", -1.63, -1.60, []string{"mg"}},
	{"zinc", -1.03, -0.98, []string{"zn", "galvanized steel", "galvanised steel"}},
	{"aluminium alloy", -1.00, -0.76, []string{"aluminium", "aluminum", "al"}},
	{"cadmium", -0.74, -0.70, nil},
	{"mild steel", -0.72, -0.60, []string{"carbon steel", "steel", "cast iron"}},
	{"low-alloy steel", -0.63, -0.57, nil},
	{"410 stainless (active)", -0.57, -0.45, []string{"430 stainless (active)"}},
	{"304 stainless (active)", -0.58, -0.44, nil},
	{"Ni-resist cast iron", -0.54, -0.43, nil},
	{"316 stainless (active)", -0.46, -0.33, nil},
	{"aluminium bronze, brass", -0.40, -0.31, []string{"aluminium bronze", "naval brass", "brass"}},
	{"copper", -0.37, -0.30, []string{"cu"}},
	{"90-10 copper-nickel", -0.28, -0.22, []string{"90-10 cu-ni"}},
	{"lead", -0.25, -0.19, nil},
	{"70-30 copper-nickel", -0.24, -0.17, []string{"70-30 cu-ni"}},
	{"304 stainless (passive)", -0.10, -0.04, []string{"304 stainless", "304"}},
	{"nickel-copper 400", -0.14, -0.03, nil},
	{"316 stainless (passive)", -0.10, 0, []string{"316 stainless", "316", "stainless steel"}},
	{"titanium", -0.04, 0.06, []string{"ti"}},
	{"graphite", 0.2, 0.3, []string{"carbon fibre"}},
}

// FindInSeries finds a material in the series by name or alias.
func FindInSeries(name string) (SeriesEntry, error) {
	k := strings.ToLower(strings.Join(strings.Fields(name), " "))
	for _, s := range GalvanicSeries {
		if strings.ToLower(s.Name) == k {
			return s, nil
		}
		for _, a := range s.Aliases {
			if strings.ToLower(a) == k {
				return s, nil
			}
		}
	}
	var names []string
	for _, s := range GalvanicSeries {
		names = append(names, s.Name)
	}
	sort.Strings(names)
	return SeriesEntry{}, fmt.Errorf("material %q is not in the galvanic series (%s)", name, strings.Join(names, ", "))
}

// GalvanicPair is two metals in contact compared on the series.
type GalvanicPair struct {
	Anode, Cathode SeriesEntry
	DifferenceV    float64 // between the middles of the ranges
	Warn           bool
	Working
}

// PairOf compares two metals in contact in seawater.
func PairOf(a, b SeriesEntry) GalvanicPair {
	if b.MidV() < a.MidV() {
		a, b = b, a
	}
	p := GalvanicPair{Anode: a, Cathode: b, DifferenceV: b.MidV() - a.MidV()}
	p.Warn = p.DifferenceV > GalvanicWarnV
	p.Source = GalvanicSource
	verdict := "within"
	if p.Warn {
		verdict = "more than"
	}
	p.step("%s %.2f V and %s %.2f V (middles, V vs SCE): ΔE = %.2f V, %s %.2f V; %s is the anode",
		a.Name, a.MidV(), b.Name, b.MidV(), p.DifferenceV, verdict, GalvanicWarnV, a.Name)
	return p
}
