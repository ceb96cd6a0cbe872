package wallloss

import (
	"fmt"
	"regexp"
	"strings"

	"github.com/lossline/lossline/survey/number"
)

// Interval rule kinds.
const (
	RuleHalfLife    = "half-life"
	RuleAPI570      = "api-570"
	RuleAPI510      = "api-510"
	RuleAPI653Shell = "api-653-shell"
	RuleAPI653Floor = "api-653-bottom"
	RuleFixed       = "fixed"
)

// IntervalRule decides the next inspection from the remaining life.
type IntervalRule struct {
	Kind    string
	Class   int     // API 570 piping class 1..4
	Years   float64 // fixed interval
	Barrier bool    // API 653 bottom: release prevention barrier in place
}

var (
	rule570   = regexp.MustCompile(`^api\s*570\s*(?:class)?\s*([1-4])$`)
	ruleFixed = regexp.MustCompile(`^fixed\s*([0-9.]+)\s*(?:y|years?)?$`)
)

// ParseIntervalRule reads "half life", "API 570 class 2", "API 510",
// "API 653 shell", "API 653 bottom", "fixed 5 years".
func ParseIntervalRule(s string) (IntervalRule, error) {
	t := strings.ToLower(strings.Join(strings.Fields(s), " "))
	switch {
	case t == "half life" || t == "half-life" || t == "":
		return IntervalRule{Kind: RuleHalfLife}, nil
	case rule570.MatchString(t):
		c, _ := number.Parse(rule570.FindStringSubmatch(t)[1]) // one digit, 1 to 4
		return IntervalRule{Kind: RuleAPI570, Class: int(c)}, nil
	case t == "api 510":
		return IntervalRule{Kind: RuleAPI510}, nil
	case t == "api 653 shell":
		return IntervalRule{Kind: RuleAPI653Shell}, nil
	case t == "api 653 bottom":
		return IntervalRule{Kind: RuleAPI653Floor}, nil
	case ruleFixed.MatchString(t):
		y, err := number.Parse(ruleFixed.FindStringSubmatch(t)[1])
		if err == nil && y > 0 && y <= 50 {
			return IntervalRule{Kind: RuleFixed, Years: y}, nil
		}
	}
	return IntervalRule{}, fmt.Errorf("interval rule %q is not one of: half life, API 570 class 1-4, API 510, API 653 shell, API 653 bottom, fixed N years", s)
}

// Code is the rule's stable name in results.json.
func (r IntervalRule) Code() string {
	switch r.Kind {
	case RuleAPI570:
		return fmt.Sprintf("api-570-class-%d", r.Class)
	case RuleFixed:
		return fmt.Sprintf("fixed-%gy", r.Years)
	case "":
		return RuleHalfLife
	}
	return r.Kind
}

// api570Caps is API 570 Table 2's longest thickness-measurement interval by
// piping class, years. Class 4 is optional in the code; lossline uses 10.
var api570Caps = map[int]float64{1: 5, 2: 10, 3: 10, 4: 10}

// Describe names the rule and its source for the report.
func (r IntervalRule) Describe(capYears float64) string {
	switch r.Kind {
	case RuleAPI570:
		return fmt.Sprintf("API 570 Table 2, Class %d: lesser of half the remaining life and %g years", r.Class, api570Caps[r.Class])
	case RuleAPI510:
		return "API 510 internal or on-stream interval: lesser of half the remaining life and 10 years; with less than 4 years left, the full remaining life up to 2 years"
	case RuleAPI653Shell:
		return "API 653 §6.3.3.2: ultrasonic survey at the lesser of RCA/(2N) and 15 years (5 years while N is unknown); external inspection §6.3.2.1 at the lesser of RCA/(4N) and 5 years"
	case RuleAPI653Floor:
		return fmt.Sprintf("API 653 §4.4.7: next internal inspection no later than the bottom reaches its minimum remaining thickness (MRT), at most %g years (20 without, 30 with a release prevention barrier)", r.bottomCap())
	case RuleFixed:
		return fmt.Sprintf("fixed interval of %g years set by the owner, never past the remaining life", r.Years)
	}
	return fmt.Sprintf("lesser of half the remaining life and %g years (lossline default)", capYears)
}

func (r IntervalRule) bottomCap() float64 {
	if r.Barrier {
		return 30
	}
	return 20
}

// maxYears is the longest interval the rule allows (used with no measurable loss).
func (r IntervalRule) maxYears(capYears float64) float64 {
	switch r.Kind {
	case RuleAPI570:
		return api570Caps[r.Class]
	case RuleAPI510:
		return 10
	case RuleAPI653Shell:
		return 15
	case RuleAPI653Floor:
		return r.bottomCap()
	case RuleFixed:
		return r.Years
	}
	return capYears
}

// Interval returns the years to the next inspection for a remaining life
// (life > 0) and what set it.
func (r IntervalRule) Interval(life, capYears float64) (float64, Basis) {
	limit := r.maxYears(capYears)
	var v float64
	var basis BasisKind
	switch r.Kind {
	case RuleAPI510:
		if life < 4 {
			v, basis = min(life, 2), BasisAPI510Short
		} else {
			v, basis = life/2, BasisHalfLife
		}
	case RuleAPI653Floor:
		v, basis = life, BasisMRT
	case RuleFixed:
		v, basis = life, BasisRemainingLife
	default:
		v, basis = life/2, BasisHalfLife
	}
	if v >= limit {
		return limit, Basis{Kind: BasisLimit, Years: limit}
	}
	return v, Basis{Kind: basis}
}

// NoRateInterval is the interval when no rate is known, or 0 when the rule
// gives none (API 653 §6.3.3.2: 5 years while the shell rate is unknown).
func (r IntervalRule) NoRateInterval() float64 {
	if r.Kind == RuleAPI653Shell {
		return 5
	}
	return 0
}
