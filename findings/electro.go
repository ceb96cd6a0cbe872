package findings

import (
	"fmt"
	"strings"

	"github.com/lossline/lossline/survey"
)

// ElectroFinding is an electrochemical result that needs action: a cathodic
// protection test point not protected (or over-protected, or not judged), a
// dry-film thickness batch rejected, or a metal pair far apart in the
// galvanic series. File and Line point at the row or key it comes from.
type ElectroFinding struct {
	Kind      string // "cp", "dft" or "metal pair"
	Asset     string
	Component string
	Subject   string // the test point, or "" for the component
	Status    string // e.g. "not protected", "rejected", "warn"
	Reasons   []string
	File      string
	Line      int
}

// Text is the finding in one line.
func (e ElectroFinding) Text() string {
	who := e.Asset + " / " + e.Component
	if e.Subject != "" {
		who += " / " + e.Subject
	}
	return fmt.Sprintf("%s: %s %s: %s", who, e.Kind, e.Status, strings.Join(e.Reasons, "; "))
}

// CPFailing are the test points whose latest visit does not meet the
// cathodic-protection criteria, with why, in checklist order.
func (f *Findings) CPFailing() []survey.FailingPoint { return f.Survey.FailingTestPoints() }

// Electro lists every electrochemical finding: failing test points, then per
// component a rejected dry-film thickness batch and a warned metal pair.
func (f *Findings) Electro() []ElectroFinding {
	var out []ElectroFinding
	for _, p := range f.CPFailing() {
		out = append(out, ElectroFinding{"cp", p.Asset, p.Component, p.Point, p.Status.String(), p.Reasons, p.File, p.Line})
	}
	for _, a := range f.Survey.Assets {
		for _, c := range a.Components {
			e := c.Design.Electro
			if e == nil {
				continue
			}
			if j := e.Coating.DFT; j != nil && !j.Accepted {
				out = append(out, ElectroFinding{"dft", a.Name, c.Name, "", "rejected", j.Reasons, c.File, c.Design.Lines["dft readings"]})
			}
			if g := e.Galvanic; g != nil && g.Warn {
				out = append(out, ElectroFinding{"metal pair", a.Name, c.Name, "", "warn",
					[]string{fmt.Sprintf("%s and %s are %.2f V apart in seawater; the %s corrodes", g.Anode.Name, g.Cathode.Name, g.DifferenceV, g.Anode.Name)},
					c.File, c.Design.Lines["in contact with"]})
			}
		}
	}
	return out
}
