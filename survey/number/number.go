// Package number reads numbers as people type them into a checklist, a
// settings file, the environment or a flag. It accepts plain decimal numbers
// only and refuses, with a message that says what to write instead, what a
// general-purpose parser would take or mangle: NaN and infinities, absurd
// magnitudes, a decimal comma, a letter O for a zero. Its messages never show a
// library's own error text.
package number

import (
	"fmt"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Limit is the largest magnitude any value may have: no thickness, rate,
// position, quantity or amount of money in a survey comes near it.
const Limit = 1e15

// Error is why a text is not a number, worded for the person who wrote it.
type Error struct {
	Text string // the text as given
	What string // "a number", "an amount"
	Why  string // what is wrong, or what to write instead; may be empty
}

func (e *Error) Error() string {
	if e.Why == "" {
		return fmt.Sprintf("%q is not %s", e.Text, e.What)
	}
	return fmt.Sprintf("%q is not %s: %s", e.Text, e.What, e.Why)
}

// Parse reads a decimal number: an optional sign, digits with an optional
// decimal point, and an optional exponent ("12.5", "-61.35078", "1e-3").
// Surrounding spaces are ignored.
func Parse(s string) (float64, error) {
	return parse(s, "a number")
}

func parse(s, what string) (float64, error) {
	t := strings.TrimSpace(s)
	fail := func(why string) (float64, error) { return 0, &Error{Text: s, What: what, Why: why} }
	if t == "" {
		return fail("it is empty")
	}
	if why := words(t); why != "" {
		return fail(why)
	}
	if !strings.ContainsAny(t, "0123456789") {
		return fail("")
	}
	if why := shape(t); why != "" {
		return fail(why)
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil || v >= Limit || v <= -Limit {
		return fail("it is too large (a value must stay below 1e15)")
	}
	return v, nil
}

// shape says what keeps t from being a plain decimal number, or "".
func shape(t string) string {
	digits, points, exp := 0, 0, false
	for i, r := range t {
		switch {
		case r >= '0' && r <= '9':
			digits++
		case r == '.':
			if exp {
				return "a decimal point in the exponent"
			}
			if points++; points > 1 {
				return "two decimal points"
			}
		case (r == '+' || r == '-') && (i == 0 || exp && (t[i-1] == 'e' || t[i-1] == 'E')):
		case (r == 'e' || r == 'E') && digits > 0 && !exp && i+1 < len(t):
			exp = true
		case r == ',':
			return comma(t)
		case unicode.IsLetter(r):
			return letter(t, r)
		case unicode.IsSpace(r):
			return "a space inside it"
		default:
			return fmt.Sprintf("%q is not part of a number", r)
		}
	}
	if digits == 0 {
		return "no digits"
	}
	last, _ := utf8.DecodeLastRuneInString(t)
	if last == 'e' || last == 'E' || last == '+' || last == '-' {
		return "it ends in " + string(last)
	}
	return ""
}

// words names the spelt-out values a general-purpose parser accepts.
func words(t string) string {
	switch strings.TrimLeft(strings.ToLower(t), "+-") {
	case "nan":
		return "NaN is not a value: write the number measured or given"
	case "inf", "infinity":
		return "infinity is not a value: write the number measured or given"
	}
	if l := strings.ToLower(strings.TrimLeft(t, "+-")); strings.HasPrefix(l, "0x") || strings.HasPrefix(l, "0b") || strings.HasPrefix(l, "0o") {
		return "write it in decimal digits"
	}
	return ""
}

// comma explains a comma: a decimal comma gets its fix.
func comma(t string) string {
	if whole, frac, ok := strings.Cut(t, ","); ok && !strings.Contains(frac, ",") && isDigits(strings.TrimLeft(whole, "+-")) && isDigits(frac) {
		fixed := whole + "." + frac
		return fmt.Sprintf("write %s, not %s (decimals take a point)", fixed, t)
	}
	return "a comma inside it (decimals take a point; no thousands separators)"
}

// lookalike maps letters typed for digits to the digit meant.
var lookalike = map[rune]rune{'O': '0', 'o': '0', 'l': '1', 'I': '1'}

// letter names a letter in a number, and the digit meant when the letter
// looks like one and the text reads as a number with it.
func letter(t string, r rune) string {
	if _, ok := lookalike[r]; ok {
		fixed := strings.Map(func(c rune) rune {
			if x, ok := lookalike[c]; ok {
				return x
			}
			return c
		}, t)
		if shape(fixed) == "" {
			return fmt.Sprintf("letter %c in %s: did you mean %s?", r, t, fixed)
		}
	}
	return fmt.Sprintf("letter %c in %s", r, t)
}

func isDigits(s string) bool {
	if s == "" {
		return false
	}
	for _, r := range s {
		if r < '0' || r > '9' {
			return false
		}
	}
	return true
}
