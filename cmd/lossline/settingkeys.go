package main

import (
	"fmt"
	"os"
	"slices"
	"strings"

	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
	"github.com/lossline/lossline/survey/wallloss"
	"github.com/lossline/lossline/templates"
)

// settingKey is one setting: its key in a settings file, which is also its
// flag (--name) and, in capitals with _ for -, its environment variable
// (LOSSLINE_NAME); how its text is read; its default; its range; the
// commands that use it; and where its value goes in the typed settings.
type settingKey struct {
	Name    string
	Kind    kind
	Default any    // float64, survey.Money, int, bool or string by Kind; nil for kindPrices and kindColMap
	Help    string // flag help with the unit; a `word` names the flag's argument
	// Check refuses a value of the right kind outside the setting's range or
	// list, with a message that follows the setting's name; nil: any value.
	Check func(v any) error
	Used  []string // the commands that use it; only they have its flag
	Set   func(s *settings, v any)
}

// Commands that read settings.
var (
	allCommands = []string{"report", "check", "compare", "plan", "photos", "import", "sheet", "due"}
	assessing   = []string{"report", "compare", "plan", "sheet", "due"} // commands that compute rates and dates
	planning    = []string{"report", "plan"}
	comparing   = []string{"report", "compare", "sheet"}
	reportOnly  = []string{"report"}
	importing   = []string{"import"}
)

// settingKeys are every setting lossline knows, grouped by what they govern.
var settingKeys = []settingKey{
	{Name: "interval-cap-years", Kind: kindNumber, Default: wallloss.DefaultPolicy.IntervalCapYears,
		Help:  "longest interval to the next inspection, `years`",
		Check: within(0, 50, "years", false), Used: assessing,
		Set: func(s *settings, v any) { s.Policy.IntervalCapYears = v.(float64) }},
	{Name: "rate-model", Kind: kindText, Default: string(wallloss.ModelMax),
		Help:  "rate `model`: " + orList(rateModelNames()),
		Check: oneOf(rateModelNames(), true), Used: assessing,
		Set: func(s *settings, v any) { s.Policy.RateModel, _ = wallloss.ParseRateModel(v.(string)) }},
	{Name: "interval-rule", Kind: kindText, Default: "half life",
		Help:  "interval `rule`: half life, API 570 class N, API 510, API 653 shell, API 653 bottom, fixed N years",
		Check: intervalRule, Used: assessing,
		Set: func(s *settings, v any) { s.Policy.Rule, _ = wallloss.ParseIntervalRule(v.(string)) }},
	{Name: "gauge-tolerance-mm", Kind: kindNumber, Default: wallloss.DefaultToleranceMM,
		Help:  "gauge tolerance, `mm`: smaller changes are measurement noise",
		Check: within(0, 2, "mm", true), Used: assessing,
		Set: func(s *settings, v any) { s.Policy.ToleranceMM = v.(float64) }},
	{Name: "acceleration-percent", Kind: kindNumber, Default: 25.0,
		Help:  "flag a CML as accelerating when its latest interval's rate exceeds the long-term rate by more than this `percent`",
		Check: within(0, 1000, "", true), Used: comparing,
		Set: func(s *settings, v any) { s.AccelerationPct = v.(float64) }},
	{Name: "thickness-units", Kind: kindText, Default: "",
		Help:  "thickness `units` shown in the report: mm or in (default: the survey's)",
		Check: thicknessUnit, Used: comparing,
		Set: func(s *settings, v any) { s.Display.Thickness, _ = survey.ParseUnit(v.(string)) }},
	{Name: "rate-units", Kind: kindText, Default: "",
		Help:  "rate `units` shown in the report: " + orList(report.RateUnits) + " (default: mm/y for mm, mpy for in)",
		Check: oneOf(append([]string{""}, report.RateUnits...), false), Used: comparing,
		Set: func(s *settings, v any) { s.Display.Rate = v.(string) }},
	{Name: "currency", Kind: kindText, Default: "currency units",
		Help: "`name` of the currency of repair costs and budgets", Used: planning,
		Set: func(s *settings, v any) { s.Plan.Costs.Currency = v.(string) }},
	{Name: "unit-costs", Kind: kindPrices,
		Help: "prices of repair items named in the checklists, in the currency (settings files only)",
		Used: planning,
		Set:  func(s *settings, v any) { s.Plan.Costs.Unit = v.(map[string]survey.Money) }},
	{Name: "budget", Kind: kindMoney, Default: survey.Money(0),
		Help: "repair budget of the first plan year, `amount` in the currency (0: no plan in the report)",
		Used: planning,
		Set:  func(s *settings, v any) { s.Plan.Budget = v.(survey.Money) }},
	{Name: "plan-years", Kind: kindWhole, Default: 1,
		Help:  "`years` the repair plan covers",
		Check: within(1, 50, "years", true), Used: planning,
		Set: func(s *settings, v any) { s.Plan.Years = v.(int) }},
	{Name: "budget-per-year", Kind: kindMoney, Default: survey.Money(0),
		Help: "repair budget of each later plan year, `amount` in the currency (default: the first year's)",
		Used: planning,
		Set:  func(s *settings, v any) { s.Plan.PerYear = v.(survey.Money) }},
	{Name: "carry-over", Kind: kindSwitch, Default: false,
		Help: "carry money a plan year leaves unspent over to the next", Used: planning,
		Set: func(s *settings, v any) { s.Plan.CarryOver = v.(bool) }},
	{Name: "objective", Kind: kindText, Default: "risk",
		Help:  "`objective` of the plan's selection: risk (the most removed), money (the most expected saving) or both (two plans side by side)",
		Check: oneOf(plan.ObjectiveNames, true), Used: planning,
		Set: func(s *settings, v any) { s.Plan.Objective = strings.ToLower(v.(string)) }},
	failureCost(survey.ConsequenceVeryLow), failureCost(survey.ConsequenceLow), failureCost(survey.ConsequenceMedium),
	failureCost(survey.ConsequenceHigh), failureCost(survey.ConsequenceVeryHigh),
	{Name: "discount-rate-percent", Kind: kindNumber, Default: 0.0,
		Help:  "discount rate of money a year, `percent`, for the money objective (0: none)",
		Check: within(0, 100, "%", true), Used: planning,
		Set: func(s *settings, v any) { s.Plan.Money.DiscountPct = v.(float64) }},
	{Name: "max-megapixels", Kind: kindNumber, Default: float64(survey.DefaultMaxMegapixels),
		Help:  "photos declaring more `megapixels` are skipped before decoding",
		Check: above(0), Used: allCommands,
		Set: func(s *settings, v any) { s.Read.MaxMegapixels = v.(float64) }},
	{Name: "auto-place", Kind: kindSwitch, Default: survey.DefaultPlaceOptions.Auto,
		Help: "place photos no CML names by their GPS position", Used: allCommands,
		Set: func(s *settings, v any) { s.Read.Place.Auto = v.(bool) }},
	{Name: "placement-radius-m", Kind: kindNumber, Default: survey.DefaultPlaceOptions.RadiusM,
		Help:  "a photo within this many `metres` of a CML is placed on it",
		Check: atLeast(0), Used: allCommands,
		Set: func(s *settings, v any) { s.Read.Place.RadiusM = v.(float64) }},
	{Name: "area-radius-m", Kind: kindNumber, Default: survey.DefaultPlaceOptions.AreaRadiusM,
		Help:  "margin in `metres` around a component's or asset's CMLs for placing photos on it",
		Check: atLeast(0), Used: allCommands,
		Set: func(s *settings, v any) { s.Read.Place.AreaRadiusM = v.(float64) }},
	{Name: "photo-long-side", Kind: kindWhole, Default: 1600,
		Help:  "longest side of photos in the report, `pixels`",
		Check: within(200, 8000, "pixels", true), Used: reportOnly,
		Set: func(s *settings, v any) { s.Photos.LongSide = v.(int) }},
	{Name: "photo-quality", Kind: kindWhole, Default: 80,
		Help:  "JPEG `quality` of photos in the report (1-100)",
		Check: within(1, 100, "", true), Used: reportOnly,
		Set: func(s *settings, v any) { s.Photos.Quality = v.(int) }},
	{Name: "full-detail-max-cmls", Kind: kindWhole, Default: report.DefaultLimits.FullDetailMaxCMLs,
		Help:  "above this many `CMLs` report.pdf is summary-first: what needs attention, a summary per asset, the most urgent components in full",
		Check: atLeast(1), Used: reportOnly,
		Set: func(s *settings, v any) { s.Limits.FullDetailMaxCMLs = v.(int) }},
	{Name: "full-detail-max-components", Kind: kindWhole, Default: report.DefaultLimits.FullDetailMaxComponents,
		Help:  "above this many `components` report.pdf is summary-first",
		Check: atLeast(1), Used: reportOnly,
		Set: func(s *settings, v any) { s.Limits.FullDetailMaxComponents = v.(int) }},
	{Name: "detail-window-years", Kind: kindNumber, Default: report.DefaultLimits.DetailWindowYears,
		Help:  "in a summary-first report, CMLs with this many `years` of remaining life or less need attention",
		Check: within(0, 100, "years", true), Used: reportOnly,
		Set: func(s *settings, v any) { s.Limits.DetailWindowYears = v.(float64) }},
	{Name: "list-max-rows", Kind: kindWhole, Default: report.DefaultLimits.ListMaxRows,
		Help:  "longest list in a summary-first report, `rows`; it says how many more are in the exports",
		Check: atLeast(1), Used: reportOnly,
		Set: func(s *settings, v any) { s.Limits.ListMaxRows = v.(int) }},
	{Name: "import", Kind: kindColMap,
		Help: "the columns of import files by their headers: id, reading, date, unit, note, location, points, sheet (settings files only)",
		Used: importing,
		Set:  func(s *settings, v any) { s.Import = v.(columnMap) }},
	{Name: "templates", Kind: kindFolder, Default: "",
		Help:  "`folder` whose report texts replace the built-in ones (in a settings file: relative to it)",
		Check: isFolder, Used: reportOnly,
		Set: func(s *settings, v any) { s.Templates = templates.Set{Override: v.(string)} }},
}

// failureCost is the setting of the failure cost of a consequence level.
func failureCost(c survey.Consequence) settingKey {
	return settingKey{Name: "failure-cost-" + strings.ReplaceAll(c.String(), " ", "-"), Kind: kindMoney, Default: survey.Money(0),
		Help: "what a failure of a component of consequence " + c.String() + " costs, `amount` in the currency (money objective; 0: not given)",
		Used: planning,
		Set:  func(s *settings, v any) { s.Plan.Money.FailureCost[c] = v.(survey.Money) }}
}

// settingNames lists the keys a settings file may hold.
func settingNames() []string {
	names := make([]string, len(settingKeys))
	for i, k := range settingKeys {
		names[i] = k.Name
	}
	return names
}

// lookupSetting finds a setting by its key.
func lookupSetting(name string) (settingKey, bool) {
	i := slices.IndexFunc(settingKeys, func(k settingKey) bool { return k.Name == name })
	if i < 0 {
		return settingKey{}, false
	}
	return settingKeys[i], true
}

// usedBy reports whether the command named cmd uses the setting.
func (k settingKey) usedBy(cmd string) bool { return slices.Contains(k.Used, cmd) }

// envName is the setting's environment variable.
func (k settingKey) envName() string {
	return "LOSSLINE_" + strings.ToUpper(strings.ReplaceAll(k.Name, "-", "_"))
}

// orList writes "a, b or c".
func orList(items []string) string {
	if len(items) < 2 {
		return strings.Join(items, "")
	}
	return strings.Join(items[:len(items)-1], ", ") + " or " + items[len(items)-1]
}

// within accepts numbers from lo to hi; lo itself only when closed.
func within(lo, hi float64, unit string, closed bool) func(any) error {
	if unit != "" {
		unit = " " + unit
	}
	return func(v any) error {
		x := asFloat(v)
		if x < lo || x == lo && !closed || x > hi {
			return fmt.Errorf("must be between %v and %v%s, not %s", lo, hi, unit, formatValue(v))
		}
		return nil
	}
}

// atLeast accepts numbers of lo or more.
func atLeast(lo float64) func(any) error {
	return func(v any) error {
		if asFloat(v) < lo {
			if lo == 0 {
				return fmt.Errorf("must not be negative, not %s", formatValue(v))
			}
			return fmt.Errorf("must be at least %v, not %s", lo, formatValue(v))
		}
		return nil
	}
}

// above accepts numbers greater than lo.
func above(lo float64) func(any) error {
	return func(v any) error {
		if asFloat(v) <= lo {
			if lo == 0 {
				return fmt.Errorf("must be positive, not %s", formatValue(v))
			}
			return fmt.Errorf("must be more than %v, not %s", lo, formatValue(v))
		}
		return nil
	}
}

// oneOf accepts the texts listed, in any case when fold is set.
func oneOf(list []string, fold bool) func(any) error {
	return func(v any) error {
		s := v.(string)
		if fold {
			s = strings.ToLower(s)
		}
		if !slices.Contains(list, s) {
			shown := slices.DeleteFunc(slices.Clone(list), func(x string) bool { return x == "" })
			return fmt.Errorf("%q is not one of %s", v, strings.Join(shown, ", "))
		}
		return nil
	}
}

// intervalRule accepts the rules wallloss knows.
func intervalRule(v any) error {
	if _, err := wallloss.ParseIntervalRule(v.(string)); err != nil {
		return fmt.Errorf("is not valid: %v", err)
	}
	return nil
}

// thicknessUnit accepts mm, in or nothing (the survey's units).
func thicknessUnit(v any) error {
	if s := v.(string); s != "" {
		if _, ok := survey.ParseUnit(s); !ok {
			return fmt.Errorf("%q is not mm or in", s)
		}
	}
	return nil
}

// isFolder accepts an existing folder or nothing.
func isFolder(v any) error {
	if p := v.(string); p != "" {
		if st, err := os.Stat(p); err != nil || !st.IsDir() {
			return fmt.Errorf("folder %s not found", p)
		}
	}
	return nil
}

// rateModelNames are the rate models a setting may name.
func rateModelNames() []string {
	names := make([]string, len(wallloss.ChoosableRateModels))
	for i, m := range wallloss.ChoosableRateModels {
		names[i] = string(m)
	}
	return names
}
