package survey

import (
	"errors"
	"math"
	"math/big"
	"regexp"
	"strconv"
	"strings"
)

// Money is an amount of money in hundredths of the currency unit (cents). It
// is exact: costs, prices and budgets are added and compared as whole numbers,
// so a plan never rests on binary fractions of a currency unit.
type Money int64

// MoneyLimit is the smallest amount lossline refuses, 10^13 currency units:
// far above any repair budget, and small enough that thousands of amounts
// under it add up without leaving the range of Money.
const MoneyLimit Money = 1e13 * 100

// MoneySaturated is what Add gives for a sum too large for Money.
const MoneySaturated Money = math.MaxInt64

var (
	// moneyGrouped is an amount whose whole part is grouped in threes by
	// spaces, no-break spaces, (narrow) thin spaces or underscores: 1 250 000.50.
	moneyGrouped = regexp.MustCompile(`^\d{1,3}([ _\x{00A0}\x{2009}\x{202F}]\d{3})+(\.\d*)?$`)
	moneyGroups  = strings.NewReplacer(" ", "", "_", "", "\u00a0", "", "\u2009", "", "\u202f", "")
	// moneyDecimal is an ungrouped amount, optionally with an exponent: 12000, 85.50, 1e6.
	moneyDecimal = regexp.MustCompile(`^(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$`)
	// moneyLike is text made of digits and separators only: a number written
	// in another convention (50,000 or 50 00).
	moneyLike = regexp.MustCompile(`^[\d., _\x{00A0}\x{2009}\x{202F}]+$`)
)

// ParseMoney reads an amount of money: digits with at most two decimals after
// a point, the whole part grouped in threes by spaces or underscores if at
// all ("1 250 000.50"), or a decimal with an exponent ("1e6"). It refuses
// what is not a finite number, negative amounts, amounts finer than a cent
// and amounts of MoneyLimit or more. Its error completes "text is ...".
func ParseMoney(s string) (Money, error) {
	t := strings.TrimSpace(s)
	if low := strings.ToLower(t); strings.Contains(low, "inf") || strings.Contains(low, "nan") {
		return 0, errors.New("not a finite number")
	}
	neg := strings.HasPrefix(t, "-")
	t = strings.TrimPrefix(strings.TrimPrefix(t, "-"), "+")
	if moneyGrouped.MatchString(t) {
		t = moneyGroups.Replace(t)
	}
	m := moneyDecimal.FindStringSubmatch(t)
	if m == nil || m[1] == "" && m[2] == "" {
		switch {
		case moneyLike.MatchString(t):
			return 0, errors.New("not a number (group digits in threes by spaces and write decimals with a point: 50 000.50)")
		case strings.Contains(t, ","):
			return 0, errors.New("not a number (write decimals with a point: 50000.50)")
		}
		return 0, errors.New("not a number")
	}
	// The amount is digits × 10^(shift-2) units, so digits × 10^shift cents.
	digits := strings.TrimLeft(m[1]+m[2], "0")
	if digits == "" {
		return 0, nil
	}
	if neg {
		return 0, errors.New("negative (an amount of money is 0 or more)")
	}
	tooLarge := errors.New("too large (amounts of money must be under " + MoneyLimit.String() + ")")
	finer := errors.New("finer than a cent (write at most two decimals)")
	shift := 2 - len(m[2])
	if m[3] != "" {
		exp, err := strconv.Atoi(m[3])
		switch {
		case err != nil && strings.HasPrefix(m[3], "-"), exp < -100:
			return 0, finer
		case err != nil, exp > 100:
			return 0, tooLarge
		}
		shift += exp
	}
	if shift < 0 {
		cut := len(digits) + shift
		if cut <= 0 || strings.Trim(digits[cut:], "0") != "" {
			return 0, finer
		}
		digits = digits[:cut]
	} else {
		digits += strings.Repeat("0", min(shift, 20))
	}
	// MoneyLimit is 10^15 cents: 15 digits or fewer are under it.
	if len(digits) > 15 {
		return 0, tooLarge
	}
	cents, err := strconv.ParseInt(digits, 10, 64)
	if err != nil {
		return 0, tooLarge
	}
	return Money(cents), nil
}

// ParseCost reads a cost as a checklist gives it: an amount (ParseMoney),
// optionally followed by the name of its currency ("38 000 EUR").
func ParseCost(s string) (Money, error) {
	t := strings.TrimSpace(s)
	if i := strings.LastIndexAny(t, " \t"); i > 0 {
		if word := t[i+1:]; strings.IndexFunc(word, isLetter) >= 0 && !strings.ContainsAny(word, "0123456789") {
			t = strings.TrimSpace(t[:i])
		}
	}
	return ParseMoney(t)
}

func isLetter(r rune) bool {
	return r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r > 0x7f && !strings.ContainsRune("\u00a0\u2009\u202f", r)
}

// Times is q × m rounded to the cent, and whether it had to be rounded. It
// refuses a quantity that is not finite or negative and a product of
// MoneyLimit or more. The quantity is taken as the shortest decimal that
// reads back as q, which is what was written for any quantity of up to 15
// digits, so 0.1 × 85.00 is 8.50 exactly.
func (m Money) Times(q float64) (Money, bool, error) {
	if math.IsNaN(q) || math.IsInf(q, 0) || q < 0 {
		return 0, false, errors.New("quantity is not a finite number of 0 or more")
	}
	r, ok := new(big.Rat).SetString(strconv.FormatFloat(q, 'g', -1, 64))
	if !ok {
		return 0, false, errors.New("quantity is not a number")
	}
	r.Mul(r, new(big.Rat).SetInt64(int64(m)))
	// Round half away from zero (both factors are 0 or more).
	num, den := r.Num(), r.Denom()
	quo, rem := new(big.Int).QuoRem(num, den, new(big.Int))
	rounded := rem.Sign() != 0
	if rounded && new(big.Int).Lsh(rem, 1).Cmp(den) >= 0 {
		quo.Add(quo, big.NewInt(1))
	}
	if !quo.IsInt64() || Money(quo.Int64()) >= MoneyLimit {
		return 0, false, errors.New("too large (amounts of money must be under " + MoneyLimit.String() + ")")
	}
	return Money(quo.Int64()), rounded, nil
}

// Add is m + n; a sum too large for Money gives MoneySaturated.
func (m Money) Add(n Money) Money {
	s := m + n
	switch {
	case n > 0 && s < m:
		return MoneySaturated
	case n < 0 && s > m:
		return math.MinInt64
	}
	return s
}

// String writes the amount with its whole part grouped in threes by spaces,
// and cents only when there are any: "12 000", "1 066.63".
func (m Money) String() string { return m.format(true) }

// Plain writes the amount without grouping: "12000", "1066.63".
// ParseMoney reads both forms back.
func (m Money) Plain() string { return m.format(false) }

func (m Money) format(grouped bool) string {
	u := uint64(m)
	sign := ""
	if m < 0 {
		sign, u = "-", -u
	}
	whole := strconv.FormatUint(u/100, 10)
	if grouped {
		var b strings.Builder
		for i, r := range whole {
			if i > 0 && (len(whole)-i)%3 == 0 {
				b.WriteByte(' ')
			}
			b.WriteRune(r)
		}
		whole = b.String()
	}
	if c := u % 100; c != 0 {
		return sign + whole + "." + strconv.FormatUint(c/10, 10) + strconv.FormatUint(c%10, 10)
	}
	return sign + whole
}
