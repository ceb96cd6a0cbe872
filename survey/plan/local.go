package plan

import (
	"fmt"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// withLocalDamage is the shorter of a CML's wall life left at t and its
// component's local-damage life left at t (years; NaN unknown).
func withLocalDamage(c *survey.Component, life float64, t time.Time) float64 {
	if l, ok := c.LocalLifeAt(t); ok && !(life <= l) {
		return l
	}
	return life
}

// localDeadline is the date a component's local damage reaches its limit,
// nil when no assessment gives a life.
func localDeadline(c *survey.Component) *time.Time {
	life, ok := c.LocalLifeY()
	if !ok {
		return nil
	}
	d := wallloss.AddYears(c.Design.Local.Date, life)
	return &d
}

// localReason says why a candidate is mandatory or due by its deadline when
// its component's local damage sets it; "" otherwise.
func localReason(c *Candidate, v valuation) string {
	d := localDeadline(c.Component)
	if d == nil {
		return ""
	}
	if life, _ := c.Component.LocalLifeY(); life <= 0 {
		return "local damage at its limit (" + limitOf(c.Component) + ")"
	}
	if c.Deadline == nil || !d.Equal(*c.Deadline) {
		return ""
	}
	return fmt.Sprintf("local damage reaches its limit %s (plan year %d: %s)", d.Format("2006-01-02"), deadlineYear(v.start, *d), limitOf(c.Component))
}

// limitOf names the limit of the component's most urgent local-damage assessment.
func limitOf(c *survey.Component) string {
	best := ""
	var life float64
	for _, a := range c.Design.Local.Assessments {
		if a.LifeY != nil && (best == "" || *a.LifeY < life) {
			best, life = a.Limit, *a.LifeY
		}
	}
	return best
}
