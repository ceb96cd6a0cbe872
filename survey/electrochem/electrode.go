package electrochem

import (
	"fmt"
	"strings"
)

// Electrode is a reference electrode a structure potential is read against.
type Electrode int

// Reference electrodes.
const (
	CSE          Electrode = iota // copper/copper sulphate, saturated
	SCE                           // saturated calomel
	AgClSeawater                  // silver/silver chloride in seawater
	AgClKCl                       // silver/silver chloride, saturated KCl
	ZincSeawater                  // zinc in seawater
	SHE                           // standard hydrogen electrode
)

var electrodeNames = []string{"Cu/CuSO4", "SCE", "Ag/AgCl seawater", "Ag/AgCl sat. KCl", "Zn", "SHE"}

func (e Electrode) String() string { return electrodeNames[e] }

// overCSE is what to add, in mV, to a potential read against CSE to get it
// against each electrode. From the electrodes' potentials against the
// standard hydrogen electrode at 25 °C (CSE +316 mV, SCE +241 mV,
// Ag/AgCl sat. KCl +197 mV; from memory) and the offshore equivalences of
// DNV-RP-B401 / ISO 15589-2 (−850 mV CSE ≈ −800 mV Ag/AgCl seawater ≈
// +250 mV Zn; from memory).
var overCSE = []float64{0, 75, 50, 119, 1100, 316}

// OffsetSource names where the conversions come from.
const OffsetSource = "electrode potentials vs SHE at 25 °C (CSE +0.316 V, SCE +0.241 V, Ag/AgCl sat. KCl +0.197 V); " +
	"seawater equivalences −850 mV CSE = −800 mV Ag/AgCl(sw) = +250 mV Zn (DNV-RP-B401, ISO 15589-2); all from memory"

// Convert turns a potential in mV read against from into one against to.
func Convert(mV float64, from, to Electrode) float64 {
	return mV - overCSE[from] + overCSE[to]
}

// ParseElectrode reads an electrode name as a survey writes it.
func ParseElectrode(s string) (Electrode, error) {
	k := strings.ToLower(strings.Join(strings.Fields(s), " "))
	k = strings.NewReplacer("₄", "4", "(", " ", ")", " ").Replace(k)
	k = strings.Join(strings.Fields(k), " ")
	switch k {
	case "cse", "cu/cuso4", "cu-cuso4", "copper sulphate", "copper sulfate", "copper/copper sulphate":
		return CSE, nil
	case "sce", "calomel", "saturated calomel":
		return SCE, nil
	case "ag/agcl sw", "ag/agcl seawater", "ag/agcl/seawater", "silver chloride seawater", "ssc":
		return AgClSeawater, nil
	case "ag/agcl kcl", "ag/agcl sat kcl", "ag/agcl sat. kcl", "ag/agcl saturated kcl":
		return AgClKCl, nil
	case "zn", "zinc":
		return ZincSeawater, nil
	case "she", "hydrogen":
		return SHE, nil
	}
	return 0, fmt.Errorf("reference electrode %q is not CSE, SCE, Ag/AgCl seawater, Ag/AgCl KCl, Zn or SHE", s)
}
