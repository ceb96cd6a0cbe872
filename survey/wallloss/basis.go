package wallloss

import "fmt"

// BasisKind is what set a CML's next inspection date.
type BasisKind int

// Next-inspection bases.
const (
	BasisNone          BasisKind = iota // no next inspection computed
	BasisNow                            // at or below required: now
	BasisRateUnknown                    // API 653 shell with no rate: a fixed interval
	BasisNoLoss                         // no measurable loss: the rule's longest interval
	BasisHalfLife                       // half the remaining life
	BasisAPI510Short                    // API 510 with under 4 years left: up to 2 years
	BasisMRT                            // API 653 bottom: when the minimum remaining thickness is reached
	BasisRemainingLife                  // a fixed interval, cut to the remaining life
	BasisLimit                          // the rule's longest interval
	BasisLocalDamage                    // the life of the component's local-damage assessments (halved except for API 653 bottom pitting; 0: now)
)

// Basis is what set the next inspection, with the years where they matter.
type Basis struct {
	Kind  BasisKind
	Years float64
}

// String is the basis as results.json writes it ("" for none).
func (b Basis) String() string {
	switch b.Kind {
	case BasisNow:
		return "now"
	case BasisRateUnknown:
		return fmt.Sprintf("rate unknown: %g years", b.Years)
	case BasisNoLoss:
		return "no measurable loss"
	case BasisHalfLife:
		return "half life"
	case BasisAPI510Short:
		return "API 510: remaining life under 4 years, up to 2 years"
	case BasisMRT:
		return "remaining life (MRT)"
	case BasisRemainingLife:
		return "remaining life"
	case BasisLimit:
		return fmt.Sprintf("%g-year limit", b.Years)
	case BasisLocalDamage:
		if b.Years <= 0 {
			return "local damage at its limit: now"
		}
		return fmt.Sprintf("local damage: life %.1f years", b.Years)
	}
	return ""
}
