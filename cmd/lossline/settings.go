package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/viper"

	"github.com/lossline/lossline/photo"
	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/plan"
	"github.com/lossline/lossline/survey/wallloss"
	"github.com/lossline/lossline/templates"
)

// SettingsFile is the optional settings file of a survey folder.
const SettingsFile = "lossline.yaml"

// settings are the typed settings every command uses.
type settings struct {
	Policy    wallloss.Policy
	Photos    photo.Settings
	Templates templates.Set
	Display   report.Display
	// AccelerationPct: a CML accelerates when its latest interval's rate is
	// more than this percentage above its long-term rate.
	AccelerationPct float64
	Plan            report.PlanSettings // Budget 0: no plan
	Read            survey.Options
	Sources         []string // files read, lowest precedence first
}

// Setting keys (file keys; environment LOSSLINE_INTERVAL_CAP_YEARS etc.).
const (
	keyIntervalCap = "interval-cap-years"
	keyLongSide    = "photo-long-side"
	keyQuality     = "photo-quality"
	keyTemplates   = "templates"
	keyConfig      = "config"
	keyRateModel   = "rate-model"
	keyRule        = "interval-rule"
	keyTolerance   = "gauge-tolerance-mm"
	keyThickUnits  = "thickness-units"
	keyRateUnits   = "rate-units"
	keyAccel       = "acceleration-percent"
	keyCurrency    = "currency"
	keyUnitCosts   = "unit-costs"
	keyBudget      = "budget"
	keyPlanYears   = "plan-years"
	keyPerYear     = "budget-per-year"
	keyMaxMP       = "max-megapixels"
	keyAutoPlace   = "auto-place"
	keyRadius      = "placement-radius-m"
	keyArea        = "area-radius-m"
)

// settingKeys are every key a settings file may hold.
var settingKeys = []string{keyIntervalCap, keyLongSide, keyQuality, keyTemplates, keyRateModel, keyRule, keyTolerance, keyThickUnits, keyRateUnits, keyAccel, keyCurrency, keyBudget, keyPlanYears, keyPerYear, keyMaxMP, keyAutoPlace, keyRadius, keyArea}

// addSettingFlags declares the flags that override settings files.
func addSettingFlags(c *cobra.Command) {
	f := c.Flags()
	f.String(keyConfig, "", "settings `FILE` read after the survey's lossline.yaml")
	f.Float64(keyIntervalCap, 10, "longest interval to the next inspection, `years`")
	f.Int(keyLongSide, 1600, "longest side of photos in the report, `pixels`")
	f.Int(keyQuality, 80, "JPEG `quality` of photos in the report (1-100)")
	f.String(keyTemplates, "", "`folder` whose report texts replace the built-in ones")
	f.String(keyRateModel, wallloss.ModelMax, "rate `model`: long, short, max or fit")
	f.String(keyRule, "half life", "interval `rule`: half life, API 570 class N, API 510, API 653 shell, API 653 bottom, fixed N years")
	f.Float64(keyTolerance, wallloss.DefaultToleranceMM, "gauge tolerance, `mm`: smaller changes are measurement noise")
	f.String(keyThickUnits, "", "thickness `units` shown in the report: mm or in (default: the survey's)")
	f.Float64(keyAccel, 25, "flag a CML as accelerating when its latest interval's rate exceeds the long-term rate by more than this `percent`")
	f.String(keyCurrency, "currency units", "`name` of the currency of repair costs and budgets")
	f.Float64(keyBudget, 0, "repair budget of the first plan year, in the currency (0: no plan in the report)")
	f.Int(keyPlanYears, 1, "`years` the repair plan covers")
	f.Float64(keyPerYear, 0, "repair budget of each later plan year (default: the first year's)")
	f.Float64(keyMaxMP, survey.DefaultMaxMegapixels, "photos declaring more `megapixels` are skipped before decoding")
	f.Bool(keyAutoPlace, true, "place photos no CML names by their GPS position")
	f.Float64(keyRadius, survey.DefaultPlaceOptions.RadiusM, "a photo within this many `metres` of a CML is placed on it")
	f.Float64(keyArea, survey.DefaultPlaceOptions.AreaRadiusM, "margin in `metres` around a component's or asset's CMLs for placing photos on it")
	f.String(keyRateUnits, "", "rate `units` shown in the report: mm/y, mpy or in/y (default: mm/y for mm, mpy for in)")
}

// loadSettings merges, lowest first: built-in defaults, SURVEY/lossline.yaml,
// --config FILE, LOSSLINE_* environment variables, flags.
func loadSettings(c *cobra.Command, surveyDir string) (settings, error) {
	v := viper.New()
	v.SetDefault(keyIntervalCap, wallloss.DefaultPolicy.IntervalCapYears)
	v.SetDefault(keyLongSide, 1600)
	v.SetDefault(keyQuality, 80)
	v.SetDefault(keyTemplates, "")
	v.SetDefault(keyRateModel, wallloss.ModelMax)
	v.SetDefault(keyRule, "half life")
	v.SetDefault(keyTolerance, wallloss.DefaultToleranceMM)
	v.SetDefault(keyThickUnits, "")
	v.SetDefault(keyRateUnits, "")
	v.SetDefault(keyAccel, 25.0)
	v.SetDefault(keyMaxMP, float64(survey.DefaultMaxMegapixels))
	v.SetDefault(keyAutoPlace, true)
	v.SetDefault(keyRadius, survey.DefaultPlaceOptions.RadiusM)
	v.SetDefault(keyArea, survey.DefaultPlaceOptions.AreaRadiusM)
	v.SetDefault(keyCurrency, "currency units")
	v.SetDefault(keyBudget, 0.0)
	v.SetDefault(keyPlanYears, 1)
	v.SetDefault(keyPerYear, 0.0)
	var s settings
	templatesBase := ""
	for _, file := range []string{filepath.Join(surveyDir, SettingsFile), flagString(c, keyConfig)} {
		if file == "" {
			continue
		}
		if _, err := os.Stat(file); errors.Is(err, os.ErrNotExist) {
			if file == flagString(c, keyConfig) {
				return s, badInput{fmt.Errorf("%s: settings file not found", file)}
			}
			continue
		}
		v.SetConfigFile(file)
		v.SetConfigType("yaml")
		if err := v.MergeInConfig(); err != nil {
			return s, badInput{fmt.Errorf("%s: %v", file, err)}
		}
		if err := unknownKeys(v, file); err != nil {
			return s, err
		}
		if v.InConfig(keyTemplates) {
			templatesBase = filepath.Dir(file)
		}
		s.Sources = append(s.Sources, file)
	}
	v.SetEnvPrefix("LOSSLINE")
	v.SetEnvKeyReplacer(strings.NewReplacer("-", "_"))
	v.AutomaticEnv()
	for _, k := range settingKeys {
		if err := v.BindPFlag(k, c.Flags().Lookup(k)); err != nil {
			return s, err
		}
	}
	rule, err := wallloss.ParseIntervalRule(v.GetString(keyRule))
	if err != nil {
		return s, badInput{fmt.Errorf("%s: %v", keyRule, err)}
	}
	model := strings.ToLower(v.GetString(keyRateModel))
	if !slices.Contains(survey.RateModels, model) {
		return s, badInput{fmt.Errorf("%s %q is not one of %s", keyRateModel, model, strings.Join(survey.RateModels, ", "))}
	}
	s.Policy = wallloss.Policy{IntervalCapYears: v.GetFloat64(keyIntervalCap), RateModel: model, Rule: rule, ToleranceMM: v.GetFloat64(keyTolerance)}
	s.AccelerationPct = v.GetFloat64(keyAccel)
	s.Read = survey.Options{MaxMegapixels: v.GetFloat64(keyMaxMP), Place: survey.PlaceOptions{
		Auto: v.GetBool(keyAutoPlace), RadiusM: v.GetFloat64(keyRadius), AreaRadiusM: v.GetFloat64(keyArea)}}
	if s.Read.MaxMegapixels <= 0 || s.Read.Place.RadiusM < 0 || s.Read.Place.AreaRadiusM < 0 {
		return s, badInput{fmt.Errorf("%s must be positive, %s and %s not negative", keyMaxMP, keyRadius, keyArea)}
	}
	s.Plan = report.PlanSettings{Budget: v.GetFloat64(keyBudget), PerYear: v.GetFloat64(keyPerYear), Years: v.GetInt(keyPlanYears),
		Costs: plan.Costs{Currency: v.GetString(keyCurrency), Unit: map[string]float64{}}}
	for k := range v.GetStringMap(keyUnitCosts) {
		price := v.GetFloat64(keyUnitCosts + "." + k)
		if price < 0 {
			return s, badInput{fmt.Errorf("%s: %s must not be negative", keyUnitCosts, k)}
		}
		s.Plan.Costs.Unit[strings.ToLower(k)] = price
	}
	if s.Plan.Budget < 0 || s.Plan.PerYear < 0 || s.Plan.Years < 1 || s.Plan.Years > 50 {
		return s, badInput{fmt.Errorf("%s and %s must not be negative, %s between 1 and 50", keyBudget, keyPerYear, keyPlanYears)}
	}
	if t := v.GetString(keyThickUnits); t != "" {
		u, ok := survey.ParseUnit(t)
		if !ok {
			return s, badInput{fmt.Errorf("%s %q is not mm or in", keyThickUnits, t)}
		}
		s.Display.Thickness = u
	}
	if r := v.GetString(keyRateUnits); r != "" {
		if !slices.Contains(report.RateUnits, r) {
			return s, badInput{fmt.Errorf("%s %q is not one of %s", keyRateUnits, r, strings.Join(report.RateUnits, ", "))}
		}
		s.Display.Rate = r
	}
	s.Photos = photo.Settings{LongSide: v.GetInt(keyLongSide), Quality: v.GetInt(keyQuality)}
	if off, _ := c.Flags().GetBool("no-photo-cache"); !off {
		if dir, err := os.UserCacheDir(); err == nil { // XDG_CACHE_HOME moves it
			s.Photos.CacheDir = filepath.Join(dir, "lossline", "photos")
		}
	}
	if t := v.GetString(keyTemplates); t != "" {
		if !filepath.IsAbs(t) && templatesBase != "" && !c.Flags().Changed(keyTemplates) && os.Getenv("LOSSLINE_TEMPLATES") == "" {
			t = filepath.Join(templatesBase, t)
		}
		if st, err := os.Stat(t); err != nil || !st.IsDir() {
			return s, badInput{fmt.Errorf("templates folder %s not found", t)}
		}
		s.Templates = templates.Set{Override: t}
	}
	switch {
	case s.Policy.IntervalCapYears <= 0 || s.Policy.IntervalCapYears > 50:
		return s, badInput{fmt.Errorf("%s must be between 0 and 50 years, not %v", keyIntervalCap, s.Policy.IntervalCapYears)}
	case s.Photos.LongSide < 200 || s.Photos.LongSide > 8000:
		return s, badInput{fmt.Errorf("%s must be between 200 and 8000 pixels, not %d", keyLongSide, s.Photos.LongSide)}
	case s.AccelerationPct < 0 || s.AccelerationPct > 1000:
		return s, badInput{fmt.Errorf("%s must be between 0 and 1000, not %v", keyAccel, s.AccelerationPct)}
	case s.Policy.ToleranceMM < 0 || s.Policy.ToleranceMM > 2:
		return s, badInput{fmt.Errorf("%s must be between 0 and 2 mm, not %v", keyTolerance, s.Policy.ToleranceMM)}
	case s.Photos.Quality < 1 || s.Photos.Quality > 100:
		return s, badInput{fmt.Errorf("%s must be between 1 and 100, not %d", keyQuality, s.Photos.Quality)}
	}
	return s, nil
}

// unknownKeys rejects settings files with keys lossline does not know, so a
// misspelt key is not silently ignored.
func unknownKeys(v *viper.Viper, file string) error {
	for _, k := range v.AllKeys() {
		if !slices.Contains(settingKeys, k) && !strings.HasPrefix(k, keyUnitCosts+".") {
			return badInput{fmt.Errorf("%s: unknown setting %q (known: %s)", file, k, strings.Join(settingKeys, ", "))}
		}
	}
	return nil
}

func flagString(c *cobra.Command, name string) string {
	s, _ := c.Flags().GetString(name)
	return s
}
