package survey

import (
	"strings"
	"testing"
)

// Amounts are kept in cents and written as lossline's README states:
// groups of three, a point for decimals, at most two decimals (keeping money
// in whole minor units is common practice in accounting software).
func TestParseMoney(t *testing.T) {
	for _, c := range []struct {
		text string
		want Money
	}{
		{"0", 0}, {"12000", 12000_00}, {"12 000", 12000_00}, {"12_000", 12000_00},
		{"1\u202f250\u2009000.5", 1250000_50}, {"85.5", 85_50}, {"85.50", 85_50}, {"85.500", 85_50},
		{".25", 25}, {"7.", 7_00}, {"+3", 3_00}, {"-0", 0}, {"1e6", 1_000_000_00}, {"1.5E3", 1500_00},
		{"2500e-2", 25_00}, {"1e-2", 1}, {"0e999999999999", 0}, {" 60000 ", 60000_00},
		{"9 999 999 999 999.99", MoneyLimit - 1},
	} {
		got, err := ParseMoney(c.text)
		if err != nil || got != c.want {
			t.Errorf("ParseMoney(%q) = %d, %v; want %d cents", c.text, got, err, c.want)
		}
	}
	for _, c := range []struct{ text, why string }{
		{"Inf", "not a finite number"}, {"-inf", "not a finite number"}, {"NaN", "not a finite number"},
		{"+Infinity", "not a finite number"},
		{"-5", "negative"}, {"-1e30", "negative"},
		{"1e30", "too large"}, {"1e13", "too large"}, {"10 000 000 000 000", "too large"},
		{"1e99999999999999999999", "too large"}, {"99999999999999999999999", "too large"},
		{"0.001", "finer than a cent"}, {"12.345", "finer than a cent"}, {"1e-3", "finer than a cent"},
		{"5e-99999999999999999999", "finer than a cent"},
		{"50,000", "not a number (group digits in threes"}, {"12 5", "not a number (group digits in threes"},
		{"1 2000", "not a number (group digits"}, {"0x10", "not a number"}, {"lots", "not a number"},
		{"", "not a number"}, {".", "not a number"}, {"1e", "not a number"}, {"12,50 EUR", "not a number (write decimals"},
	} {
		if got, err := ParseMoney(c.text); err == nil || !strings.HasPrefix(err.Error(), c.why) {
			t.Errorf("ParseMoney(%q) = %d, %v; want refusal %q", c.text, got, err, c.why)
		}
	}
}

func TestMoneyFormat(t *testing.T) {
	for _, c := range []struct {
		m           Money
		text, plain string
	}{
		{0, "0", "0"}, {5, "0.05", "0.05"}, {85_50, "85.50", "85.50"}, {2550_00, "2 550", "2550"},
		{1066_63, "1 066.63", "1066.63"}, {1250000_00, "1 250 000", "1250000"}, {-4200_00, "-4 200", "-4200"},
		{MoneyLimit - 1, "9 999 999 999 999.99", "9999999999999.99"},
	} {
		if got := c.m.String(); got != c.text {
			t.Errorf("%d cents: String %q, want %q", c.m, got, c.text)
		}
		if got := c.m.Plain(); got != c.plain {
			t.Errorf("%d cents: Plain %q, want %q", c.m, got, c.plain)
		}
		if c.m < 0 {
			continue
		}
		for _, s := range []string{c.text, c.plain} {
			if back, err := ParseMoney(s); err != nil || back != c.m {
				t.Errorf("%q reads back as %d, %v; want %d", s, back, err, c.m)
			}
		}
	}
}

func TestParseCost(t *testing.T) {
	for in, want := range map[string]Money{"12000": 12000_00, "12 000": 12000_00, "12_000": 12000_00, "85.5": 85_50,
		"12000 EUR": 12000_00, "6 500 EUR": 6500_00, "38 000 €": 38000_00} {
		if got, err := ParseCost(in); err != nil || got != want {
			t.Errorf("ParseCost(%q) = %d %v, want %d", in, got, err, want)
		}
	}
	for _, bad := range []string{"", "-5", "lots", "12,000.5.1", "Inf", "NaN EUR", "1e30 EUR", "EUR"} {
		if _, err := ParseCost(bad); err == nil {
			t.Errorf("ParseCost(%q): no error", bad)
		}
	}
}

// Quantity × unit price is exact to the cent for decimal quantities and says
// when it had to round (half away from zero, common practice).
func TestMoneyTimes(t *testing.T) {
	for _, c := range []struct {
		price   Money
		q       float64
		want    Money
		rounded bool
	}{
		{950_00, 36, 34200_00, false},
		{85_00, 0.1, 8_50, false}, // 0.1 is no binary fraction, yet the cost is exact
		{1_00, 0.07, 7, false},
		{85_33, 12.5, 1066_63, true},  // 1 066.625
		{85_33, 12.25, 1045_29, true}, // 1 045.2925
		{3, 0.5, 2, true},             // 1.5 cents
		{0, 1e300, 0, false},
	} {
		got, rounded, err := c.price.Times(c.q)
		if err != nil || got != c.want || rounded != c.rounded {
			t.Errorf("%v × %s = %d (rounded %v, %v); want %d (rounded %v)", c.q, c.price, got, rounded, err, c.want, c.rounded)
		}
	}
	for _, c := range []struct {
		price Money
		q     float64
	}{{950_00, 1e12}, {MoneyLimit - 1, 2}, {1, 1e300}} {
		if got, _, err := c.price.Times(c.q); err == nil || !strings.HasPrefix(err.Error(), "too large") {
			t.Errorf("%v × %s = %d, %v; want too large", c.q, c.price, got, err)
		}
	}
}

func TestMoneyAddSaturates(t *testing.T) {
	big := MoneyLimit - 1
	var sum Money
	for range 10_000 { // 10 000 × 10^13 units is more than an int64 of cents holds
		sum = sum.Add(big)
	}
	if sum != MoneySaturated {
		t.Errorf("sum %d, want MoneySaturated", sum)
	}
	if got := Money(5).Add(7); got != 12 {
		t.Errorf("5 + 7 cents = %d", got)
	}
}

// A repair cost that is not a finite amount under the limit is refused at
// its line of the design list, as is a repair quantity that is not finite.
func TestRepairCostRefused(t *testing.T) {
	head := "---\ntitle: x\ndate: 2025-01-01\nunits: mm\n---\n## C\n\n- nominal: 10\n"
	for _, c := range []struct{ list, want string }{
		{"- repair cost: Inf\n", `survey.md:9: repair cost: "Inf" is not an amount: infinity is not a value`},
		{"- repair cost: NaN\n", `survey.md:9: repair cost: "NaN" is not an amount: NaN is not a value`},
		{"- repair cost: 1e30\n", `survey.md:9: repair cost: "1e30" is not an amount: it is too large`},
		{"- repair cost: 10 000 000 000 000 EUR\n", `survey.md:9: repair cost: "10 000 000 000 000 EUR" is too large`},
		{"- repair cost: -500\n", `survey.md:9: repair cost: "-500" is not an amount: it must not be negative`},
		{"- repair cost: 12.505\n", `survey.md:9: repair cost: "12.505" is finer than a cent`},
		{"- repair: Inf pipe-m\n", `survey.md:9: repair: "Inf" is not an amount`},
		{"- repair: NaN pipe-m\n", `survey.md:9: repair: "NaN" is not an amount`},
		{"- repair: 1e400 pipe-m\n", `survey.md:9: repair: "1e400" is not an amount`},
	} {
		src := head + c.list + "\n| CML | 2024-01-01 |\n|---|---|\n| A | 9 |\n"
		_, problems := readChecklist("survey.md", []byte(src))
		wantProblem(t, c.list, problems, c.want)
	}
	s, problems := readChecklist("survey.md", []byte(head+"- repair cost: 38 000 EUR\n\n| CML | 2024-01-01 |\n|---|---|\n| A | 9 |\n"))
	if problems.HasErrors() || *s.Assets[0].Components[0].Design.RepairCost != 38000_00 {
		t.Errorf("repair cost 38 000 EUR: %v", problems)
	}
}

// FuzzParseMoney: any text is an amount or a refusal, never a panic; an
// amount is in range and reads back from both of its written forms.
func FuzzParseMoney(f *testing.F) {
	for _, s := range []string{"0", "12 000", "12_000", "1\u202f250\u2009000.50", "85.5", ".25", "1e6", "2500e-2",
		"9 999 999 999 999.99", "10 000 000 000 000", "1e30", "-1e30", "Inf", "-Inf", "NaN", "+Infinity", "-5", "0.005",
		"50,000", "5 0000", "1e99999999999999999999", "0e999999999999", "0x10", "38 000 EUR", "", "."} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		m, err := ParseMoney(s)
		if c, cerr := ParseCost(s); err == nil && (cerr != nil || c != m) {
			t.Fatalf("ParseMoney(%q) = %d but ParseCost = %d, %v", s, m, c, cerr)
		}
		if err != nil {
			return
		}
		if m < 0 || m >= MoneyLimit {
			t.Fatalf("ParseMoney(%q) = %d cents, out of range", s, m)
		}
		for _, w := range []string{m.String(), m.Plain()} {
			if back, err := ParseMoney(w); err != nil || back != m {
				t.Fatalf("ParseMoney(%q) = %d, written %q, reads back as %d, %v", s, m, w, back, err)
			}
		}
	})
}
