package number

import (
	"fmt"
	"strings"
)

// groupSeparators may stand between digit groups of an amount: space, no-break
// space, thin space, narrow no-break space, underscore.
const groupSeparators = " \u00a0\u2009\u202f_"

// ParseMoney reads a non-negative amount of money or a quantity of a priced
// item: "50000", "50 000" (digit groups of three separated by spaces, thin or
// no-break spaces, or underscores), "85.50"; a trailing word without digits is
// the currency and is ignored ("12 000 EUR").
func ParseMoney(s string) (float64, error) {
	fail := func(why string) (float64, error) { return 0, &Error{Text: s, What: "an amount", Why: why} }
	t := strings.TrimSpace(s)
	if i := strings.LastIndexAny(t, groupSeparators); i >= 0 && !strings.ContainsAny(t[i:], "0123456789") {
		t = strings.TrimRight(t[:i], groupSeparators) // a currency name
	}
	groups := strings.FieldsFunc(t, func(r rune) bool { return strings.ContainsRune(groupSeparators, r) })
	if len(groups) == 0 {
		return fail("it is empty")
	}
	if strings.Contains(t, ",") {
		whole, frac, _ := strings.Cut(groups[len(groups)-1], ",")
		if len(groups) == 1 && len(frac) == 3 && isDigits(whole) && isDigits(frac) {
			return fail(fmt.Sprintf("write %s%s or %s %s (a comma could be a decimal or a thousands separator)", whole, frac, whole, frac))
		}
	}
	if len(groups) > 1 {
		for i, g := range groups {
			whole, _, _ := strings.Cut(g, ".")
			if i < len(groups)-1 && whole != g {
				return fail("a decimal point before the last digit group")
			}
			first := i == 0 && len(whole) >= 1 && len(whole) <= 3
			if !isDigits(strings.TrimLeft(whole, "+-")) || (!first && len(whole) != 3) {
				return fail(fmt.Sprintf("digit groups are separated by spaces in threes (12 500); %q is not a group", g))
			}
		}
	}
	v, err := parse(strings.Join(groups, ""), "an amount")
	if err != nil {
		e := err.(*Error)
		e.Text = s
		return 0, e
	}
	if v < 0 {
		return fail("it must not be negative")
	}
	return v, nil
}
