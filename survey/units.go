package survey

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/lossline/lossline/survey/number"
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

// MaxThicknessMM is the largest wall thickness read: a value above it is a
// slip (a missing decimal point, a wrong unit), not a wall.
const MaxThicknessMM = 1000

// ParseThicknesses reads one or more thickness values separated by spaces,
// each optionally followed by its unit ("8.9 9.0", "0.375 in", "9.1mm 9.0mm").
// Bare numbers are in def. Results are in millimetres, each greater than zero
// and at most MaxThicknessMM.
func ParseThicknesses(s string, def Unit) ([]float64, error) {
	out, err := appendThicknesses(nil, s, def)
	if err != nil {
		return nil, err
	}
	return out, nil
}

// appendThicknesses is ParseThicknesses appending the values to dst.
func appendThicknesses(dst []float64, s string, def Unit) ([]float64, error) {
	var buf [8]string
	fields := buf[:0]
	for f := range strings.FieldsSeq(s) {
		fields = append(fields, f)
	}
	out := dst
	for i := 0; i < len(fields); i++ {
		f := fields[i]
		if whole, frac, ok := strings.Cut(f, ","); ok && (frac == "" || strings.ContainsAny(frac, ".,")) {
			return nil, fmt.Errorf("%q: separate readings with spaces, not commas", f)
		} else if ok && whole == "" {
			return nil, fmt.Errorf("%q is not a number", f)
		}
		num, unit := splitUnit(f)
		u := def
		if unit != "" {
			pu, ok := ParseUnit(unit)
			if !ok {
				if _, err := number.Parse(f); err != nil && strings.Contains(err.Error(), "did you mean") {
					return nil, err // a letter typed for a digit
				}
				return nil, fmt.Errorf("%q: unknown unit %q (use mm or in)", f, unit)
			}
			u = pu
		} else if i+1 < len(fields) {
			if pu, ok := ParseUnit(fields[i+1]); ok {
				u = pu
				i++
			}
		}
		v, err := number.Parse(num)
		if err != nil {
			return nil, err
		}
		if v <= 0 {
			return nil, fmt.Errorf("%q must be greater than zero", f)
		}
		if u.ToMM(v) > MaxThicknessMM {
			return nil, fmt.Errorf("%q is not a wall thickness: more than %.4g %s", f, u.FromMM(MaxThicknessMM), u)
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

// splitUnit splits "9.1mm" into "9.1" and "mm": the unit is the run of
// characters after the last digit or point.
func splitUnit(f string) (num, unit string) {
	i := strings.LastIndexAny(f, "0123456789.")
	if i < 0 || i == len(f)-1 {
		return f, ""
	}
	return f[:i+1], f[i+1:]
}

// MaxRateMMPerY is the largest corrosion rate read; anything above it is a slip.
const MaxRateMMPerY = 100

// ParseRate reads a corrosion rate: "0.12 mm/y", "4.5 mpy" (mils per year,
// 1 mil = 0.001 in), "0.004 in/y"; a bare number is in the survey's unit per
// year. The result is in mm/y, from 0 to MaxRateMMPerY.
func ParseRate(s string, def Unit) (float64, error) {
	t := strings.ToLower(strings.ReplaceAll(s, " ", ""))
	i := strings.IndexFunc(t, func(r rune) bool { return (r < '0' || r > '9') && r != '.' && r != ',' && r != '-' && r != '+' })
	num, unit := t, ""
	if i >= 0 {
		num, unit = t[:i], t[i:]
	}
	if num == "" {
		return 0, fmt.Errorf("%q is not a rate such as 0.12 mm/y or 4.5 mpy", s)
	}
	v, err := number.Parse(num)
	if err != nil {
		return 0, err
	}
	if v < 0 {
		return 0, fmt.Errorf("%q: a corrosion rate is not negative", s)
	}
	switch unit {
	case "":
		v = def.ToMM(v)
	case "mm/y", "mm/yr", "mm/a", "mm/year":
	case "in/y", "in/yr", "in/year":
		v *= MMPerInch
	case "mpy", "mil/y", "mils/y", "mils/yr":
		v *= MMPerInch / 1000
	case "µm/a", "um/y", "µm/y", "um/a":
		v /= 1000
	default:
		return 0, fmt.Errorf("%q: unknown rate unit %q (use mm/y, in/y or mpy)", s, unit)
	}
	if v > MaxRateMMPerY {
		return 0, fmt.Errorf("%q is more than %d mm/y: not a corrosion rate", s, MaxRateMMPerY)
	}
	return v, nil
}

// ParseAmount reads a non-negative amount of money or a quantity: "12000",
// "12 000", "12_000", "85.50"; a trailing currency word is ignored
// ("12000 EUR"). See number.ParseMoney.
func ParseAmount(s string) (float64, error) { return number.ParseMoney(s) }
