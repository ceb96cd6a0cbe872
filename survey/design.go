package survey

import (
	"strings"

	"github.com/lossline/lossline/survey/required"
	"github.com/lossline/lossline/survey/wallloss"
)

// ComputeRequired works out the required thickness of every component of s
// whose design list names a method after `required:`, from the inputs written
// under it, and checks each component's required thickness against its
// nominal. It uses only the survey's own design data; Load runs it on each
// checklist before Merge, so a later survey inherits computed values. Problems
// point at the `required:` line. A missing required thickness is judged by
// requiredWarnings, once earlier surveys are merged in.
func ComputeRequired(s *Survey) ProblemList {
	var problems ProblemList
	for _, a := range s.Assets {
		for _, c := range a.Components {
			d := &c.Design
			if err := computeRequired(d); err != nil {
				problems.Errorf(c.File, d.Lines["required"], "required: %v", err)
			}
			if d.NominalMM != nil && d.RequiredMM != nil && *d.RequiredMM > *d.NominalMM {
				problems.Errorf(c.File, d.Lines["required"], "required %s %s is above nominal %s %s in %q",
					s.Units.Format(*d.RequiredMM), s.Units, s.Units.Format(*d.NominalMM), s.Units, c.Name)
			}
		}
	}
	return problems
}

// requiredWarnings warns of components with no required thickness, written,
// computed or inherited from an earlier survey; it runs after Merge, so design
// data a follow-up survey inherits raises nothing.
func requiredWarnings(s *Survey) ProblemList {
	var problems ProblemList
	for _, a := range s.Assets {
		for _, c := range a.Components {
			if c.Design.RequiredMM == nil && (len(c.CMLs) > 0 || c.Design.Electro.Empty()) {
				problems.Warnf(c.File, c.Line, "%q has no required thickness: no remaining life can be computed", c.Name)
			}
		}
	}
	return problems
}

// computeRequired runs the method written after `required:`, if any, and sets
// RequiredCalc and RequiredMM.
func computeRequired(d *Design) error {
	if d.RequiredMethod == "" {
		return nil
	}
	in := required.Inputs{}
	for _, x := range d.RequiredInputs {
		in[x.Name] = x.Value
	}
	nominal := 0.0
	if d.NominalMM != nil {
		nominal = *d.NominalMM
	}
	calc, err := required.Compute(d.RequiredMethod, in, nominal)
	if err != nil {
		return err
	}
	d.RequiredCalc = &calc
	d.RequiredMM = &calc.RequiredMM
	// The API 653 bottom interval depends on whether the tank has a release
	// prevention barrier, which is written among the bottom method's inputs.
	if d.Rule != nil && d.Rule.Kind == wallloss.RuleAPI653Floor {
		v := strings.ToLower(in["release prevention barrier"])
		d.Rule.Barrier = v == "yes" || v == "true"
	}
	return nil
}
