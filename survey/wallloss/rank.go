package wallloss

import "cmp"

// Ranked is a result with what the ranking needs besides it.
type Ranked struct {
	Result      Result
	Consequence int // higher is worse
	ID          string
}

// CompareUrgency orders two CMLs, most urgent first: at or below required,
// then shortest remaining life (for a fitted rate, its lower bound), then no measurable loss, then unknown; ties
// by higher consequence, then by id.
func CompareUrgency(a, b Ranked) int {
	if c := cmp.Compare(a.Result.Class, b.Result.Class); c != 0 {
		return c
	}
	if a.Result.Class == FiniteLife {
		if c := cmp.Compare(*a.Result.PlanningLifeY(), *b.Result.PlanningLifeY()); c != 0 {
			return c
		}
	}
	if c := cmp.Compare(b.Consequence, a.Consequence); c != 0 {
		return c
	}
	return cmp.Compare(a.ID, b.ID)
}
