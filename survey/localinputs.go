package survey

import (
	"errors"
	"fmt"
	"strings"
	"time"

	"github.com/lossline/lossline/survey/number"
	"github.com/lossline/lossline/survey/required"
)

// localReader takes the inputs written under one local-damage key by name,
// recording each input used (for the report) and each problem at its line.
type localReader struct {
	comp     *Component
	w        LocalWritten
	units    Unit
	date     time.Time // of the survey
	used     map[string]bool
	inputs   []required.Input
	problems *ProblemList
	failed   bool
}

func (lr *localReader) find(name string) (MethodInput, bool) {
	for _, in := range lr.w.Inputs {
		if in.Name == name {
			lr.used[name] = true
			return in, true
		}
	}
	return MethodInput{}, false
}

func (lr *localReader) errorf(line int, format string, args ...any) {
	lr.problems.Errorf(lr.comp.File, line, "%s: "+format, append([]any{lr.w.Key}, args...)...)
	lr.failed = true
}

// value finds an input and parses it; a missing input is an error when need.
func (lr *localReader) value(name string, need bool, parse func(string) (float64, string, error)) (float64, bool) {
	in, ok := lr.find(name)
	if !ok {
		if need {
			lr.errorf(lr.w.Line, "give %s", label(name))
		}
		return 0, false
	}
	v, used, err := parse(in.Value)
	if err != nil {
		lr.errorf(in.Line, "%s: %v", label(name), err)
		return 0, false
	}
	lr.inputs = append(lr.inputs, required.Input{Name: label(name), Written: in.Value, Used: used})
	return v, true
}

// label is an input's name as the report and messages print it.
func label(name string) string {
	switch name {
	case "smys", "maop":
		return strings.ToUpper(name)
	}
	return name
}

// length reads a length or thickness: a bare number is in the survey's units.
func (lr *localReader) length(name string, need bool) (float64, bool) {
	return lr.value(name, need, func(s string) (float64, string, error) {
		v, err := lr.lengthOf(s)
		return v, fmt.Sprintf("%.4g mm", v), err
	})
}

func (lr *localReader) lengthOf(s string) (float64, error) {
	q, err := required.ParseQuantity(s)
	if err != nil {
		return 0, err
	}
	switch q.Kind {
	case required.Number:
		if strings.Contains(s, "%") {
			// "%" parses as a plain number (65 % is 0.65): never a length.
			return 0, fmt.Errorf("%q is a percentage, not a length: write it in mm or in (e.g. 5.3 mm)", s)
		}
		q.Value = lr.units.ToMM(q.Value)
	case required.Length:
	default:
		return 0, fmt.Errorf("%q is not a length (mm or in)", s)
	}
	if !(q.Value > 0) {
		return 0, fmt.Errorf("%q must be greater than zero", s)
	}
	return q.Value, nil
}

// pressure reads a pressure or stress with its unit (MPa, kPa, bar, psi, ksi).
func (lr *localReader) pressure(name string, need bool) (float64, bool) {
	return lr.value(name, need, func(s string) (float64, string, error) {
		q, err := required.ParseQuantity(s)
		if err == nil && q.Kind != required.Pressure {
			err = fmt.Errorf("%q: give the unit (MPa, bar, psi or ksi)", s)
		}
		if err == nil && !(q.Value > 0) {
			err = fmt.Errorf("%q must be greater than zero", s)
		}
		return q.Value, fmt.Sprintf("%.4g MPa", q.Value), err
	})
}

// rate reads a rate: mm/y, in/y or mpy; a bare number is in the survey's unit per year.
func (lr *localReader) rate(name string, need bool) (float64, bool) {
	return lr.value(name, need, func(s string) (float64, string, error) {
		v, err := ParseRate(s, lr.units)
		return v, fmt.Sprintf("%.4g mm/y", v), err
	})
}

// number reads a plain number, optionally followed by `unit` (e.g. "y").
func (lr *localReader) number(name, unit string, need bool) (float64, bool) {
	return lr.value(name, need, func(s string) (float64, string, error) {
		t := strings.TrimSpace(s)
		if unit != "" {
			t = strings.TrimSpace(strings.TrimSuffix(strings.TrimSuffix(t, "years"), unit))
		}
		v, err := number.Parse(t)
		return v, strings.TrimSpace(fmt.Sprintf("%.4g %s", v, unit)), err
	})
}

// area reads an area with its unit: m2, m², mm2, ft2 or in2; held in m².
func (lr *localReader) area(name string, need bool) (float64, bool) {
	return lr.value(name, need, func(s string) (float64, string, error) {
		v, err := parseArea(s)
		return v, fmt.Sprintf("%.6g m²", v), err
	})
}

var areaUnits = map[string]float64{"m2": 1, "m²": 1, "mm2": 1e-6, "mm²": 1e-6, "cm2": 1e-4, "cm²": 1e-4,
	"ft2": 0.09290304, "ft²": 0.09290304, "in2": 0.00064516, "in²": 0.00064516}

func parseArea(s string) (float64, error) {
	t := strings.ReplaceAll(strings.TrimSpace(s), " ", "")
	i := strings.IndexFunc(t, func(r rune) bool { return (r < '0' || r > '9') && r != '.' })
	if i <= 0 {
		return 0, fmt.Errorf("%q is not an area with its unit, such as 0.25 m2", s)
	}
	f, ok := areaUnits[strings.ToLower(t[i:])]
	if !ok {
		return 0, fmt.Errorf("%q: unknown area unit %q (m2, mm2, cm2, ft2 or in2)", s, t[i:])
	}
	v, err := number.Parse(t[:i])
	if err != nil {
		return 0, err
	}
	if !(v > 0) {
		return 0, fmt.Errorf("%q must be greater than zero", s)
	}
	return v * f, nil
}

// word reads a word input as written (lower case, single spaces).
func (lr *localReader) word(name string) (string, int, bool) {
	in, ok := lr.find(name)
	if !ok {
		return "", lr.w.Line, false
	}
	lr.inputs = append(lr.inputs, required.Input{Name: name, Written: in.Value, Used: in.Value})
	return strings.ToLower(strings.Join(strings.Fields(in.Value), " ")), in.Line, true
}

// yesNo reads yes or no.
func yesNo(s string) (bool, error) {
	switch s {
	case "yes", "true":
		return true, nil
	case "no", "false", "none":
		return false, nil
	}
	return false, errors.New("write yes or no")
}

// unused reports the inputs no method read.
// wallOrNominal is the wall written, else the component's nominal thickness,
// recorded as an input used; without either it is an error at the key.
func (lr *localReader) wallOrNominal(wall float64, written bool) float64 {
	switch {
	case written:
	case lr.comp.Design.NominalMM == nil:
		lr.errorf(lr.w.Line, "give wall, or a nominal thickness for the component")
	default:
		wall = *lr.comp.Design.NominalMM
		lr.inputs = append(lr.inputs, required.Input{Name: "wall", Written: "(nominal)", Used: fmt.Sprintf("%.4g mm", wall)})
	}
	return wall
}

func (lr *localReader) unused() {
	for _, in := range lr.w.Inputs {
		if !lr.used[in.Name] {
			lr.errorf(in.Line, "%q is not an input of %s (a slip in its name?)", in.Name, lr.w.Key)
		}
	}
}
