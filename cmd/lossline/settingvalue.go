package main

import (
	"errors"
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"

	"github.com/lossline/lossline/survey"
)

// kind is how a setting's text is read.
type kind int

const (
	kindNumber kind = iota // a decimal number: 0.28, 10, 1e3
	kindMoney              // an amount of money (survey.Money); digits may be grouped by spaces: 50 000
	kindWhole              // a whole number
	kindSwitch             // true or false
	kindText               // any text
	kindFolder             // a folder; in a settings file, relative to that file
	kindPrices             // item: amount lines; settings files only
	kindColMap             // key: column header lines (import:); settings files only
)

// maxMagnitude bounds every number: float64 holds every whole number exactly
// up to 2^53 (about 9.007e15), and no budget or other setting comes near 1e15.
const maxMagnitude = 1e15

var decimalNumber = regexp.MustCompile(`^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$`)

// fileOnly reports whether settings of the kind are key: value lines, given
// in settings files only.
func (k kind) fileOnly() bool { return k == kindPrices || k == kindColMap }

// parseValue reads text as a value of kind k: float64, survey.Money, int,
// bool or string. Its error completes "value is ...", in words for the user.
func parseValue(k kind, text string) (any, error) {
	t := strings.TrimSpace(text)
	switch k {
	case kindNumber:
		return parseNumber(t)
	case kindMoney:
		return survey.ParseMoney(t)
	case kindWhole:
		x, err := parseNumber(t)
		if err != nil {
			return nil, err
		}
		if x != math.Trunc(x) {
			return nil, errors.New("not a whole number")
		}
		return int(x), nil
	case kindSwitch:
		switch strings.ToLower(t) {
		case "true", "yes", "on", "1":
			return true, nil
		case "false", "no", "off", "0":
			return false, nil
		}
		return nil, errors.New("not true or false")
	case kindPrices:
		return nil, errors.New("not a list of prices (give unit-costs in a settings file)")
	case kindColMap:
		return nil, errors.New("not a list of columns (give import in a settings file, or --map)")
	}
	return text, nil
}

// parseNumber reads a decimal number.
func parseNumber(t string) (float64, error) {
	if !decimalNumber.MatchString(t) {
		low := strings.ToLower(t)
		switch {
		case strings.Contains(low, "inf") || strings.Contains(low, "nan"):
			return 0, errors.New("not a finite number")
		case strings.Contains(t, ","):
			return 0, errors.New("not a number (write decimals with a point: 0.28)")
		}
		return 0, errors.New("not a number")
	}
	x, err := strconv.ParseFloat(t, 64)
	if err != nil || math.Abs(x) > maxMagnitude {
		return 0, errors.New("too large")
	}
	return x, nil
}

// formatValue writes a value as text that parseValue reads back.
func formatValue(v any) string {
	switch x := v.(type) {
	case nil:
		return ""
	case float64:
		return strconv.FormatFloat(x, 'f', -1, 64)
	case survey.Money:
		return x.Plain()
	case int:
		return strconv.Itoa(x)
	case bool:
		return strconv.FormatBool(x)
	}
	return fmt.Sprint(v)
}

// asFloat is a number setting's value as a float64.
func asFloat(v any) float64 {
	if i, ok := v.(int); ok {
		return float64(i)
	}
	return v.(float64)
}

// flagValue is a setting's flag: it reads its text as the setting's kind, so
// a wrong value is refused in the same words as in a settings file.
type flagValue struct {
	kind  kind
	value any
}

func (f *flagValue) String() string { return formatValue(f.value) }

func (f *flagValue) Set(text string) error {
	v, err := parseValue(f.kind, text)
	if err != nil {
		return err
	}
	f.value = v
	return nil
}

// Type names the value as pflag's own flags do, so help and viper treat it alike.
func (f *flagValue) Type() string {
	switch f.kind {
	case kindNumber:
		return "float64"
	case kindMoney:
		return "amount"
	case kindWhole:
		return "int"
	case kindSwitch:
		return "bool"
	}
	return "string"
}

// switchValue is the flag of a true-or-false setting, which may be given
// without a value.
type switchValue struct{ flagValue }

func (f *switchValue) IsBoolFlag() bool { return true }
