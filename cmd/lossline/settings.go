package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/viper"

	"github.com/lossline/lossline/report"
	"github.com/lossline/lossline/survey/wallloss"
	"github.com/lossline/lossline/templates"
)

// SettingsFile is the optional settings file of a survey folder.
const SettingsFile = "lossline.yaml"

// settings are the typed settings every command uses.
type settings struct {
	Policy    wallloss.Policy
	Photos    report.PhotoSettings
	Templates templates.Set
	Sources   []string // files read, lowest precedence first
}

// Setting keys (file keys; environment LOSSLINE_INTERVAL_CAP_YEARS etc.).
const (
	keyIntervalCap = "interval-cap-years"
	keyLongSide    = "photo-long-side"
	keyQuality     = "photo-quality"
	keyTemplates   = "templates"
	keyConfig      = "config"
)

// addSettingFlags declares the flags that override settings files.
func addSettingFlags(c *cobra.Command) {
	f := c.Flags()
	f.String(keyConfig, "", "settings `FILE` read after the survey's lossline.yaml")
	f.Float64(keyIntervalCap, 10, "longest interval to the next inspection, `years`")
	f.Int(keyLongSide, 1600, "longest side of photos in the report, `pixels`")
	f.Int(keyQuality, 80, "JPEG `quality` of photos in the report (1-100)")
	f.String(keyTemplates, "", "`folder` whose report texts replace the built-in ones")
}

// loadSettings merges, lowest first: built-in defaults, SURVEY/lossline.yaml,
// --config FILE, LOSSLINE_* environment variables, flags.
func loadSettings(c *cobra.Command, surveyDir string) (settings, error) {
	v := viper.New()
	v.SetDefault(keyIntervalCap, wallloss.DefaultPolicy.IntervalCapYears)
	v.SetDefault(keyLongSide, 1600)
	v.SetDefault(keyQuality, 80)
	v.SetDefault(keyTemplates, "")
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
	for _, k := range []string{keyIntervalCap, keyLongSide, keyQuality, keyTemplates} {
		if err := v.BindPFlag(k, c.Flags().Lookup(k)); err != nil {
			return s, err
		}
	}
	s.Policy = wallloss.Policy{IntervalCapYears: v.GetFloat64(keyIntervalCap)}
	s.Photos = report.PhotoSettings{LongSide: v.GetInt(keyLongSide), Quality: v.GetInt(keyQuality)}
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
	case s.Photos.Quality < 1 || s.Photos.Quality > 100:
		return s, badInput{fmt.Errorf("%s must be between 1 and 100, not %d", keyQuality, s.Photos.Quality)}
	}
	return s, nil
}

// unknownKeys rejects settings files with keys lossline does not know, so a
// misspelt key is not silently ignored.
func unknownKeys(v *viper.Viper, file string) error {
	known := map[string]bool{keyIntervalCap: true, keyLongSide: true, keyQuality: true, keyTemplates: true}
	for _, k := range v.AllKeys() {
		if !known[k] {
			return badInput{fmt.Errorf("%s: unknown setting %q (known: %s, %s, %s, %s)", file, k, keyIntervalCap, keyLongSide, keyQuality, keyTemplates)}
		}
	}
	return nil
}

func flagString(c *cobra.Command, name string) string {
	s, _ := c.Flags().GetString(name)
	return s
}
