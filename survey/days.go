package survey

import (
	"fmt"
	"slices"
	"time"
)

// LastDay is the last day of the survey: Date plus Days-1 days.
func (s *Survey) LastDay() time.Time { return s.Date.AddDate(0, 0, max(s.Days, 1)-1) }

// InDays reports whether t falls on one of the survey's days.
func (s *Survey) InDays(t time.Time) bool {
	return !t.Before(s.Date) && !t.After(s.LastDay())
}

// dayLimit names the last day a visit column may carry, for messages.
func (s *Survey) dayLimit() string {
	if s.Days <= 1 {
		return "this visit's date " + s.Date.Format("2006-01-02")
	}
	return fmt.Sprintf("this visit's last day %s (date %s, days: %d)", s.LastDay().Format("2006-01-02"), s.Date.Format("2006-01-02"), s.Days)
}

// joinSurveyDays makes the readings a CML got on several of the survey's days
// one visit, dated the first of them: they belong to this visit, and an
// interval of a day between them would give a meaningless rate.
func joinSurveyDays(s *Survey) {
	if s.Days <= 1 {
		return
	}
	for loc := range s.CMLs() {
		m := loc.CML
		first := -1
		var kept []Visit
		for _, v := range m.Visits {
			if !s.InDays(v.Date.Time) {
				kept = append(kept, v)
				continue
			}
			if first < 0 {
				first = len(kept)
				v.ReadingsMM = slices.Clone(v.ReadingsMM)
				kept = append(kept, v)
				continue
			}
			kept[first].ReadingsMM = append(kept[first].ReadingsMM, v.ReadingsMM...)
		}
		m.Visits = kept
	}
}
