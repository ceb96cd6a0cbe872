package survey

import (
	"fmt"
	"regexp"
	"slices"
	"strconv"
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

// minVisitYear is the earliest year a visit or installation date may have:
// an earlier one is a typing slip.
const minVisitYear = 1900

// looksLikeDate matches what was meant as a date: digits joined by -, / or .
var looksLikeDate = regexp.MustCompile(`^\d+([-/.]\d+)+$|^(19|20)\d\d$`)

// dateInside finds a date among other words of a header.
var dateInside = regexp.MustCompile(`\b\d{4}[-/.]\d{1,2}([-/.]\d{1,2})?\b|\b\d{1,2}[-/.]\d{1,2}[-/.]\d{4}\b`)

// VisitDateMistake says why s, which looks like an attempt at a date, is not
// a valid one, in the words check uses; "" when s is a valid date or does not
// look like one.
func VisitDateMistake(s string) string { return visitDateMistake(s) }

// visitDateMistake says why s, which looks like an attempt at a date, is not
// a valid one; "" when s is a valid date or does not look like one.
func visitDateMistake(s string) string {
	s = strings.TrimSpace(s)
	if _, ok := ParseVisitDate(s); ok {
		return ""
	}
	if !looksLikeDate.MatchString(s) {
		if m := dateInside.FindString(s); m != "" {
			if why := visitDateMistake(m); why != "" {
				return why
			}
			return fmt.Sprintf("write the date alone (%s) and anything else in a note", m)
		}
		return ""
	}
	parts := strings.FieldsFunc(s, func(r rune) bool { return r == '-' || r == '/' || r == '.' })
	if len(parts) == 1 {
		return fmt.Sprintf("a year alone is not a visit: write %s-MM-DD, or %s-MM for a month", s, s)
	}
	if strings.ContainsAny(s, "/.") || len(parts) > 3 {
		if len(parts) == 3 && len(parts[0]) == 4 {
			if fixed := strings.Join(parts, "-"); visitDateMistake(fixed) == "" {
				return fmt.Sprintf("write %s (ISO 8601: year, month, day with hyphens)", fixed)
			}
		}
		return "write the date as YYYY-MM-DD (ISO 8601), e.g. 2025-06-03"
	}
	if len(parts[0]) != 4 {
		return fmt.Sprintf("the year %s needs four digits (YYYY-MM-DD)", parts[0])
	}
	year, _ := strconv.Atoi(parts[0])
	month, _ := strconv.Atoi(parts[1])
	if month < 1 || month > 12 {
		return fmt.Sprintf("month %s", parts[1])
	}
	if len(parts) == 3 {
		day, _ := strconv.Atoi(parts[2])
		last := time.Date(year, time.Month(month)+1, 0, 0, 0, 0, 0, time.UTC).Day()
		switch {
		case day < 1:
			return fmt.Sprintf("day %s", parts[2])
		case day > last && month == 2:
			return fmt.Sprintf("February %d has %d days", year, last)
		case day > last:
			return fmt.Sprintf("%s has %d days", time.Month(month), last)
		}
	}
	names := []string{"", "month", "day"}
	padded := slices.Clone(parts)
	for i := 1; i < len(parts); i++ {
		switch len(parts[i]) {
		case 1:
			padded[i] = "0" + parts[i]
		case 2:
		default:
			return fmt.Sprintf("%s %s: write it with two digits", names[i], parts[i])
		}
	}
	for i := 1; i < len(parts); i++ {
		if len(parts[i]) == 1 {
			return fmt.Sprintf("one-digit %s, write %s", names[i], strings.Join(padded, "-"))
		}
	}
	return "write the date as YYYY-MM-DD (ISO 8601), e.g. 2025-06-03"
}
