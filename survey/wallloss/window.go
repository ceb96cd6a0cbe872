package wallloss

// Window is how soon a CML needs repair: the band its remaining life falls in.
// The bands are lossline's own; the report prints them in words.
type Window int

// Repair windows, most urgent first.
const (
	WindowNow     Window = iota // at or below required
	WindowUnder2                // under 2 years
	Window2To5                  // 2 to 5 years
	Window5To10                 // 5 to 10 years
	WindowOver10                // 10 years or more
	WindowNoLoss                // no measurable loss
	WindowUnknown               // no remaining life can be computed
)

var windowNames = []string{"AT OR BELOW REQUIRED", "under 2 years", "2 to 5 years", "5 to 10 years", "10 years or more", "no measurable loss", "unknown"}

// String names the window in words.
func (w Window) String() string { return windowNames[w] }

// WindowOf places a result in its repair window by the remaining life that
// dates use (for a fitted rate, the lower bound).
func WindowOf(r Result) Window {
	switch r.Class {
	case AtOrBelowRequired:
		return WindowNow
	case NoMeasurableLoss:
		return WindowNoLoss
	case LifeUnknown:
		return WindowUnknown
	}
	switch l := *r.PlanningLifeY(); {
	case l < 2:
		return WindowUnder2
	case l < 5:
		return Window2To5
	case l < 10:
		return Window5To10
	}
	return WindowOver10
}
