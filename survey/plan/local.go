package plan

import (
	"time"

	"github.com/lossline/lossline/survey"
)

// withLocalDamage is the shorter of a CML's wall life left at t and its
// component's local-damage life left at t (years; NaN unknown).
func withLocalDamage(c *survey.Component, life float64, t time.Time) float64 {
	if l, ok := c.LocalLifeAt(t); ok && !(life <= l) {
		return l
	}
	return life
}
