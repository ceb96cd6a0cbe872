package number

import (
	"strings"
	"testing"
)

func TestParseAccepts(t *testing.T) {
	for in, want := range map[string]float64{
		"12.5": 12.5, " 12.5 ": 12.5, "-61.35078": -61.35078, "+3": 3, ".5": 0.5, "5.": 5, "1e-3": 0.001, "2.5E2": 250, "0": 0,
	} {
		if got, err := Parse(in); err != nil || got != want {
			t.Errorf("Parse(%q) = %v %v, want %v", in, got, err, want)
		}
	}
}

// Every refusal says what is wrong in words, never with strconv's text.
func TestParseRefuses(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"12,5", `"12,5" is not a number: write 12.5, not 12,5`},
		{"1O.2", `"1O.2" is not a number: letter O in 1O.2: did you mean 10.2?`},
		{"12.l", `"12.l" is not a number: letter l in 12.l: did you mean 12.1?`},
		{"12x", `"12x" is not a number: letter x in 12x`},
		{"NaN", `"NaN" is not a number: NaN is not a value`},
		{"-Inf", `"-Inf" is not a number: infinity is not a value`},
		{"infinity", `"infinity" is not a number: infinity is not a value`},
		{"1e308", `"1e308" is not a number: it is too large`},
		{"1e999", `"1e999" is not a number: it is too large`},
		{"-2e15", `"-2e15" is not a number: it is too large`},
		{"0x1p3", `"0x1p3" is not a number: write it in decimal digits`},
		{"1.2.3", `"1.2.3" is not a number: two decimal points`},
		{"1 2", `"1 2" is not a number: a space inside it`},
		{"12e", `"12e" is not a number: letter e in 12e`},
		{"1e+", `"1e+" is not a number: it ends in +`},
		{"abc", `"abc" is not a number`},
		{"", `"" is not a number: it is empty`},
		{"1_000", `"1_000" is not a number: '_' is not part of a number`},
		{"12#", `"12#" is not a number: '#' is not part of a number`},
		{"1,2,3", `"1,2,3" is not a number: a comma inside it`},
	} {
		_, err := Parse(c.in)
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("Parse(%q): %v, want %q", c.in, err, c.want)
		}
		if err != nil && strings.Contains(err.Error(), "strconv") {
			t.Errorf("Parse(%q) shows strconv: %v", c.in, err)
		}
	}
}

func TestParseMoney(t *testing.T) {
	for in, want := range map[string]float64{
		"50000": 50000, "50 000": 50000, "50\u2009000": 50000, "50\u202f000": 50000, "50\u00a0000": 50000,
		"1 250 000": 1250000, "12_000": 12000, "85.50": 85.5, "12 000 EUR": 12000, "6 500 EUR": 6500, "0": 0,
		"38 000.75": 38000.75,
	} {
		if got, err := ParseMoney(in); err != nil || got != want {
			t.Errorf("ParseMoney(%q) = %v %v, want %v", in, got, err, want)
		}
	}
	for _, c := range []struct{ in, want string }{
		{"lots", `"lots" is not an amount`},
		{"-5", `"-5" is not an amount: it must not be negative`},
		{"50,000", `"50,000" is not an amount: write 50000 or 50 000`},
		{"12,50", `"12,50" is not an amount: write 12.50, not 12,50`},
		{"50 00", `"50 00" is not an amount: digit groups are separated by spaces in threes`},
		{"5.0 000", `"5.0 000" is not an amount: a decimal point before the last digit group`},
		{"1e15", `"1e15" is not an amount: it is too large`},
		{"NaN", `"NaN" is not an amount: NaN is not a value`},
		{"", `"" is not an amount: it is empty`},
		{"12,000.5.1", `"12,000.5.1" is not an amount: a comma inside it`},
	} {
		_, err := ParseMoney(c.in)
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("ParseMoney(%q): %v, want %q", c.in, err, c.want)
		}
	}
}
