package intake

import (
	"fmt"
	"regexp"
	"strings"

	"github.com/lossline/lossline/survey"
)

// Value is one reading as it is written into survey.md — the digits as
// given, with a decimal point, and the unit when it is not the survey's —
// and its thickness in millimetres.
type Value struct {
	Text string
	MM   float64
}

// notTaken are the cells that say a reading was not taken.
var notTaken = []string{"", "-", "—", "–"}

// token is one value of a cell: its number and the unit written with it.
type token struct{ num, unit string }

// tokens splits a cell into its values: "8.9 9.0", "9.1mm 9.0 mm",
// "0.375 in". A unit alone belongs to the number before it.
func tokens(text string) []token {
	var out []token
	for _, f := range strings.Fields(text) {
		if _, ok := survey.ParseUnit(f); ok && len(out) > 0 && out[len(out)-1].unit == "" && !strings.ContainsAny(f, "0123456789") {
			out[len(out)-1].unit = f
			continue
		}
		i := strings.LastIndexAny(f, "0123456789.,")
		if i < 0 || i == len(f)-1 {
			out = append(out, token{num: f})
			continue
		}
		out = append(out, token{num: f[:i+1], unit: f[i+1:]})
	}
	return out
}

// commaNumber and pointNumber are a number with a decimal comma or point.
var (
	commaNumber = regexp.MustCompile(`^[+-]?\d*,\d+$`)
	pointNumber = regexp.MustCompile(`^[+-]?\d*\.\d+$`)
)

// parseValues reads the readings of a cell through the survey's own
// thickness reader, with its bounds: each value in unit (the survey's when
// ""), or in the unit written after it. With comma, a decimal comma is read
// as a point. Its error completes "reading …".
func parseValues(text string, comma bool, unit, surveyUnit survey.Unit) ([]Value, error) {
	if unit == "" {
		unit = surveyUnit
	}
	var out []Value
	for _, t := range tokens(text) {
		num := t.num
		if comma && commaNumber.MatchString(num) {
			num = strings.Replace(num, ",", ".", 1)
		}
		u := unit
		if t.unit != "" {
			pu, ok := survey.ParseUnit(t.unit)
			if !ok {
				// Let the survey's reader name the slip (a letter O for a zero, a unit).
				_, err := survey.ParseThicknesses(num+t.unit, unit)
				if err == nil {
					err = fmt.Errorf("%q: unknown unit %q (use mm or in)", t.num+t.unit, t.unit)
				}
				return nil, err
			}
			u = pu
		}
		mm, err := survey.ParseThickness(num, u)
		if err != nil {
			return nil, err
		}
		written := num
		if u != surveyUnit {
			written += " " + string(u)
		}
		out = append(out, Value{Text: written, MM: mm})
	}
	return out, nil
}

// joinValues writes values as a checklist cell holds them.
func joinValues(vs []Value) string {
	parts := make([]string, len(vs))
	for i, v := range vs {
		parts[i] = v.Text
	}
	return strings.Join(parts, " ")
}

// decimalMarks counts the numbers written with a decimal comma and with a
// decimal point in a cell.
func decimalMarks(text string) (commas, points int) {
	for _, t := range tokens(text) {
		switch {
		case commaNumber.MatchString(t.num):
			commas++
		case pointNumber.MatchString(t.num):
			points++
		}
	}
	return commas, points
}
