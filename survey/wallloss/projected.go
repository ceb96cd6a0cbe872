package wallloss

import (
	"math"
	"time"
)

// Projected is the thickness a CML is expected to have at date at: its
// current thickness less the governing rate times the years since the
// current reading — the straight line of the remaining-life formula of
// API 570 §7.1.1 (remaining life = (t_actual − t_required) / rate), read the
// other way. It is nil without a thickness or a rate, never negative, and
// the current thickness for a date before the current reading.
func (r Result) Projected(at time.Time) *float64 {
	if r.ThicknessMM == nil || r.CurrentDate == nil || r.RateMMPerY == nil {
		return nil
	}
	years := max(YearsBetween(*r.CurrentDate, at), 0)
	return ptr(math.Max(*r.ThicknessMM-math.Max(*r.RateMMPerY, 0)*years, 0))
}
