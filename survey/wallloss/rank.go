package wallloss

import "cmp"

// Ranked is what the ranking needs of a CML's result.
type Ranked struct {
	Class       LifeClass
	LifeY       float64 // the planning life (PlanningLifeY), for FiniteLife
	Consequence int     // higher is worse
	ID          string
}

// RankedOf takes what the ranking needs of a result.
func RankedOf(r *Result, consequence int, id string) Ranked {
	k := Ranked{Class: r.Class, Consequence: consequence, ID: id}
	if r.Class == FiniteLife {
		k.LifeY = *r.PlanningLifeY()
	}
	return k
}

// CompareUrgency orders two CMLs, most urgent first: at or below required,
// then shortest remaining life (for a fitted rate, its lower bound), then no measurable loss, then unknown; ties
// by higher consequence, then by id.
func CompareUrgency(a, b Ranked) int {
	if c := cmp.Compare(a.Class, b.Class); c != 0 {
		return c
	}
	if a.Class == FiniteLife {
		if c := cmp.Compare(a.LifeY, b.LifeY); c != 0 {
			return c
		}
	}
	if c := cmp.Compare(b.Consequence, a.Consequence); c != 0 {
		return c
	}
	return cmp.Compare(a.ID, b.ID)
}
