package survey

import (
	"strings"
	"time"
)

// ParseVisitDate reads an ISO 8601 calendar date (2019-05-14) or a month
// (2019-05). A month stands for its 15th day, so the error of a date taken
// from it is at most about half a month either way.
func ParseVisitDate(s string) (VisitDate, bool) {
	s = strings.TrimSpace(s)
	if t, err := time.Parse("2006-01-02", s); err == nil {
		return VisitDate{Time: t}, true
	}
	if t, err := time.Parse("2006-01", s); err == nil {
		return VisitDate{Time: t.AddDate(0, 0, 14), MonthOnly: true}, true
	}
	return VisitDate{}, false
}

// After reports whether d is later than day at the precision d was written with.
func (d VisitDate) After(day time.Time) bool {
	if d.MonthOnly {
		y, m, _ := day.Date()
		return d.Time.After(time.Date(y, m, 1, 0, 0, 0, 0, time.UTC).AddDate(0, 1, -1))
	}
	return d.Time.After(day)
}
