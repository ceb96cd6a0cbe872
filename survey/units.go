package survey

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Unit is a length unit for wall thickness.
type Unit string

// Thickness units a checklist may use.
const (
	MM   Unit = "mm"
	Inch Unit = "in"
)

// MMPerInch is exact by definition (international inch, 1959).
const MMPerInch = 25.4

// ParseUnit reads "mm" or "in" (also "inch", "inches", `"`).
func ParseUnit(s string) (Unit, bool) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "mm":
		return MM, true
	case "in", "inch", "inches", `"`:
		return Inch, true
	}
	return "", false
}

// ToMM converts a value in unit u to millimetres.
func (u Unit) ToMM(v float64) float64 {
	if u == Inch {
		return v * MMPerInch
	}
	return v
}

// FromMM converts millimetres to unit u.
func (u Unit) FromMM(mm float64) float64 {
	if u == Inch {
		return mm / MMPerInch
	}
	return mm
}

// Decimals is how many decimals a thickness in u is shown with
// (gauge resolution 0.01 mm / 0.001 in).
func (u Unit) Decimals() int {
	if u == Inch {
		return 3
	}
	return 2
}

// Format writes a thickness given in mm in unit u, without the unit.
func (u Unit) Format(mm float64) string {
	return strconv.FormatFloat(u.FromMM(mm), 'f', u.Decimals(), 64)
}

// ParseThicknesses reads one or more thickness values separated by spaces,
// each optionally followed by its unit ("8.9 9.0", "0.375 in", "9.1mm 9.0mm").
// Bare numbers are in def. Results are in millimetres.
func ParseThicknesses(s string, def Unit) ([]float64, error) {
	fields := strings.Fields(s)
	var out []float64
	for i := 0; i < len(fields); i++ {
		f := fields[i]
		if strings.Contains(f, ",") {
			return nil, fmt.Errorf("reading %q is not a number (decimals take a point; readings are separated by spaces)", f)
		}
		num, unit := splitUnit(f)
		u := def
		if unit != "" {
			pu, ok := ParseUnit(unit)
			if !ok {
				return nil, fmt.Errorf("reading %q: unknown unit %q (use mm or in)", f, unit)
			}
			u = pu
		} else if i+1 < len(fields) {
			if pu, ok := ParseUnit(fields[i+1]); ok {
				u = pu
				i++
			}
		}
		v, err := strconv.ParseFloat(num, 64)
		if err != nil {
			return nil, fmt.Errorf("reading %q is not a number", f)
		}
		if v <= 0 {
			return nil, fmt.Errorf("reading %q must be greater than zero", f)
		}
		out = append(out, u.ToMM(v))
	}
	return out, nil
}

// ParseThickness reads exactly one thickness value.
func ParseThickness(s string, def Unit) (float64, error) {
	vs, err := ParseThicknesses(s, def)
	if err != nil {
		return 0, err
	}
	if len(vs) != 1 {
		return 0, fmt.Errorf("%q: expected one thickness", s)
	}
	return vs[0], nil
}

// splitUnit splits "9.1mm" into "9.1" and "mm".
func splitUnit(f string) (num, unit string) {
	i := strings.IndexFunc(f, func(r rune) bool {
		return (r < '0' || r > '9') && r != '.' && r != '-' && r != '+' && r != 'e' && r != 'E'
	})
	if i <= 0 {
		return f, ""
	}
	return f[:i], f[i:]
}

// ParseRate reads a corrosion rate: "0.12 mm/y", "4.5 mpy" (mils per year,
// 1 mil = 0.001 in), "0.004 in/y"; a bare number is in the survey's unit per
// year. The result is in mm/y.
func ParseRate(s string, def Unit) (float64, error) {
	t := strings.ToLower(strings.ReplaceAll(s, " ", ""))
	i := strings.IndexFunc(t, func(r rune) bool { return (r < '0' || r > '9') && r != '.' })
	num, unit := t, ""
	if i >= 0 {
		num, unit = t[:i], t[i:]
	}
	v, err := strconv.ParseFloat(num, 64)
	if err != nil || v < 0 {
		return 0, fmt.Errorf("%q is not a rate such as 0.12 mm/y or 4.5 mpy", s)
	}
	switch unit {
	case "":
		return def.ToMM(v), nil
	case "mm/y", "mm/yr", "mm/a", "mm/year":
		return v, nil
	case "in/y", "in/yr", "in/year":
		return v * MMPerInch, nil
	case "mpy", "mil/y", "mils/y", "mils/yr":
		return v * MMPerInch / 1000, nil
	case "µm/a", "um/y", "µm/y", "um/a":
		return v / 1000, nil
	}
	return 0, fmt.Errorf("%q: unknown rate unit %q (use mm/y, in/y or mpy)", s, unit)
}

// ParseAmount reads a quantity of 0 or more: "12000", "12 000", "12_000",
// "85.50"; a trailing word is ignored ("12000 EUR"). Amounts of money are
// read by ParseMoney.
func ParseAmount(s string) (float64, error) {
	f := strings.Fields(s)
	if len(f) > 1 {
		if _, err := strconv.ParseFloat(f[len(f)-1], 64); err != nil {
			f = f[:len(f)-1] // a currency name
		}
	}
	t := strings.ReplaceAll(strings.Join(f, ""), "_", "")
	v, err := strconv.ParseFloat(t, 64)
	if err != nil || v < 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not an amount such as 12000", s)
	}
	return v, nil
}
