package wallloss

import (
	"math"
	"time"
)

// DaysPerYear is the Julian year used to turn day counts into years.
const DaysPerYear = 365.25

// YearsBetween returns the years from a to b as days / 365.25.
func YearsBetween(a, b time.Time) float64 {
	return b.Sub(a).Hours() / 24 / DaysPerYear
}

// AddYears adds y years to t: whole years as calendar years (2023-06-01 + 10 y
// = 2033-06-01), the fraction as days of 365.25, rounded down so a computed
// date is never later than the exact one.
func AddYears(t time.Time, y float64) time.Time {
	whole := math.Floor(y)
	days := math.Floor((y - whole) * DaysPerYear)
	return t.AddDate(int(whole), 0, int(days))
}
