package required

import (
	"fmt"
	"slices"
	"strings"
)

// Calculation is a required thickness with how it was reached.
type Calculation struct {
	Method     string   // name as the report prints it
	Source     string   // standard, edition and clause
	Inputs     []Input  // every input as written, with what it was read as
	Steps      []string // the formula with numbers, in order
	RequiredMM float64
}

// Input is one named input of a method.
type Input struct {
	Name, Written, Used string
}

// Inputs are the `name: value` items written under a `required:` method.
type Inputs map[string]string

// Methods lists the method names a checklist may write after `required:`.
var Methods = []string{"ASME B31.3 pipe", "API 653 shell", "API 653 shell local", "API 653 bottom", "section loss"}

// Compute dispatches on the method written after `required:`. nominalMM is
// the component's nominal thickness, or 0 when unknown.
func Compute(method string, in Inputs, nominalMM float64) (Calculation, error) {
	m := strings.ToLower(strings.Join(strings.Fields(method), " "))
	norm := Inputs{}
	for k, v := range in {
		norm[strings.ToLower(strings.Join(strings.Fields(k), " "))] = v
	}
	in = norm
	r := &reader{in: in, used: map[string]bool{}}
	var c Calculation
	var err error
	switch {
	case strings.Contains(m, "b31.3"):
		c, err = pipeB313(r)
	case strings.Contains(m, "653") && strings.Contains(m, "bottom"):
		c, err = tankBottom(r)
	case strings.Contains(m, "653") && strings.Contains(m, "local"):
		c, err = tankShell(r, true)
	case strings.Contains(m, "653"):
		c, err = tankShell(r, false)
	case strings.Contains(m, "section loss"):
		c, err = sectionLoss(r, nominalMM)
	default:
		return c, fmt.Errorf("unknown method %q (use a number, or one of: %s)", method, strings.Join(Methods, ", "))
	}
	if err != nil {
		return c, err
	}
	if r.err != nil {
		return c, r.err
	}
	var unused []string
	for k := range in {
		if !r.used[k] {
			unused = append(unused, k)
		}
	}
	slices.Sort(unused)
	if len(unused) > 0 {
		return c, fmt.Errorf("%s does not use %s", c.Method, strings.Join(unused, ", "))
	}
	c.Inputs = r.inputs
	return c, nil
}

// reader takes inputs by name, recording what it used and the first error.
type reader struct {
	in     Inputs
	used   map[string]bool
	inputs []Input
	err    error
}

// names are the keys an input may be written as, first the one printed.
func (r *reader) lookup(names ...string) (string, string, bool) {
	for _, n := range names {
		if v, ok := r.in[n]; ok {
			r.used[n] = true
			return n, v, true
		}
	}
	return names[0], "", false
}

// quantity reads a required input of a kind.
func (r *reader) quantity(kind Kind, names ...string) float64 {
	v, ok := r.optional(kind, names...)
	if !ok && r.err == nil {
		r.err = fmt.Errorf("missing input %q", names[0])
	}
	return v
}

// optional reads an input of a kind if it is written.
func (r *reader) optional(kind Kind, names ...string) (float64, bool) {
	name, text, ok := r.lookup(names...)
	if !ok {
		return 0, false
	}
	q, err := ParseQuantity(text)
	if err != nil {
		err = fmt.Errorf("%s: %w", name, err)
	} else if q.Kind != kind {
		err = fmt.Errorf("%s %q is not a %s", name, text, kind)
	}
	if err != nil {
		if r.err == nil {
			r.err = err
		}
		return 0, false
	}
	r.note(name, text, q.Value, kind)
	return q.Value, true
}

// word reads a text input.
func (r *reader) word(names ...string) (string, bool) {
	name, text, ok := r.lookup(names...)
	if ok {
		r.inputs = append(r.inputs, Input{Name: name, Written: text, Used: text})
	}
	return strings.TrimSpace(text), ok
}

func (r *reader) note(name, text string, v float64, kind Kind) {
	used := map[Kind]string{Length: "%.6g mm", Pressure: "%.6g MPa", Temperature: "%.4g °C", Number: "%.4g"}[kind]
	r.inputs = append(r.inputs, Input{Name: name, Written: text, Used: fmt.Sprintf(used, v)})
}
