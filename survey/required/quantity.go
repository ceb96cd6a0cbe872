package required

import (
	"fmt"
	"strings"

	"github.com/lossline/lossline/survey/number"
)

// Kind is the physical quantity a value measures.
type Kind int

// Kinds of quantity. Values are held in mm, MPa, °C, or as plain numbers.
const (
	Number Kind = iota
	Length
	Pressure
	Temperature
)

var kindNames = []string{"number", "length", "pressure or stress", "temperature"}

func (k Kind) String() string { return kindNames[k] }

// Quantity is a value with its kind, in the package's base units, and the text
// it was written as.
type Quantity struct {
	Value float64
	Kind  Kind
	Text  string
}

// Exact unit factors: the international inch and foot (1959) and the pound-force
// (4.4482216152605 N), so 1 psi = 6894.757293168361 Pa.
const (
	mmPerIn   = 25.4
	mmPerFt   = 304.8
	mpaPerPSI = 4.4482216152605 / (0.0254 * 0.0254) / 1e6
)

var units = map[string]struct {
	kind  Kind
	scale float64
}{
	"mm": {Length, 1}, "m": {Length, 1000}, "in": {Length, mmPerIn}, "inch": {Length, mmPerIn}, `"`: {Length, mmPerIn},
	"ft": {Length, mmPerFt}, "feet": {Length, mmPerFt},
	"mpa": {Pressure, 1}, "kpa": {Pressure, 1e-3}, "bar": {Pressure, 0.1}, "psi": {Pressure, mpaPerPSI},
	"psig": {Pressure, mpaPerPSI}, "ksi": {Pressure, 1000 * mpaPerPSI}, "barg": {Pressure, 0.1},
	"%": {Number, 0.01},
}

// ParseQuantity reads "600 psi", "168.3 mm", "200 °C", "0.85", "25 %".
func ParseQuantity(s string) (Quantity, error) {
	q := Quantity{Text: strings.TrimSpace(s)}
	t := strings.ReplaceAll(q.Text, " ", "")
	i := strings.IndexFunc(t, func(r rune) bool {
		return (r < '0' || r > '9') && r != '.' && r != ',' && r != '-' && r != '+'
	})
	num, unit := t, ""
	if i >= 0 {
		num, unit = t[:i], t[i:]
	}
	if strings.Trim(num, "+-.") == "" {
		return q, fmt.Errorf("%q is not a number with a unit", s)
	}
	v, err := number.Parse(num)
	if err != nil {
		return q, err
	}
	u := strings.ToLower(unit)
	switch u {
	case "":
		q.Kind, q.Value = Number, v
	case "°c", "c", "degc":
		q.Kind, q.Value = Temperature, v
	case "°f", "f", "degf":
		q.Kind, q.Value = Temperature, (v-32)*5/9
	default:
		def, ok := units[u]
		if !ok {
			return q, fmt.Errorf("%q: unknown unit %q", s, unit)
		}
		q.Kind, q.Value = def.kind, v*def.scale
	}
	return q, nil
}
