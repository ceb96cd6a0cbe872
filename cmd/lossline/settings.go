package main

import (
	"errors"
	"fmt"
	"io/fs"
	"maps"
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
	Plan            plan.Settings // Budget 0: no plan
	Read            survey.Options
	Limits          report.Limits // when report.pdf turns summary-first
	Import          columnMap     // import: the headers of import files' columns by key (intake.MapKeys)
	Sources         []string      // files read, lowest precedence first
	Listing         []settingRow  // the settings the command uses, in the order of settingKeys
}

// settingRow is one setting a command used: its value and its default as
// text, and where the value came from: "built in", file:line, an
// environment variable or a flag.
type settingRow = report.SettingRow

// settingProblem is a setting refused: where it was given (a file and line,
// an environment variable or a flag) and why.
type settingProblem struct {
	Where string
	Line  int // 0: none
	Msg   string
}

func (p settingProblem) String() string {
	if p.Line > 0 {
		return fmt.Sprintf("%s:%d: %s", p.Where, p.Line, p.Msg)
	}
	return p.Where + ": " + p.Msg
}

// settingProblems are all settings refused, in the order they were read.
type settingProblems []settingProblem

func (ps settingProblems) Error() string {
	lines := make([]string, len(ps))
	for i, p := range ps {
		lines[i] = p.String()
	}
	return strings.Join(lines, "\n")
}

// addSettingFlags declares --config and a flag for each setting the command
// uses; flags override settings files and the environment.
func addSettingFlags(c *cobra.Command) {
	f := c.Flags()
	f.String("config", "", "settings `FILE` read after the survey's lossline.yaml")
	for _, k := range settingKeys {
		if !k.usedBy(c.Name()) || k.Kind.fileOnly() {
			continue
		}
		if k.Kind == kindSwitch {
			f.Var(&switchValue{flagValue{kind: k.Kind, value: k.Default}}, k.Name, k.Help)
			f.Lookup(k.Name).NoOptDefVal = "true"
			continue
		}
		f.Var(&flagValue{kind: k.Kind, value: k.Default}, k.Name, k.Help)
	}
}

// loadSettings merges, lowest first: built-in defaults, SURVEY/lossline.yaml,
// --config FILE, LOSSLINE_* environment variables, flags. Every value given
// anywhere is read as its setting's kind and checked against its range, also
// for settings this command does not use: all refusals are reported at once.
func loadSettings(c *cobra.Command, surveyDir string) (settings, error) {
	var s settings
	v := viper.New()
	for _, k := range settingKeys {
		if k.Default != nil {
			v.SetDefault(k.Name, k.Default)
		}
	}
	source := map[string]string{} // key (unit-costs items: unit-costs.ITEM) → where its value is from
	var problems settingProblems
	config := flagString(c, "config")
	for _, file := range []string{filepath.Join(surveyDir, SettingsFile), config} {
		if file == "" {
			continue
		}
		if _, err := os.Stat(file); errors.Is(err, fs.ErrNotExist) {
			if file == config {
				problems = append(problems, settingProblem{Where: file, Msg: "settings file not found"})
			}
			continue
		}
		read, ps := readSettingsFile(file)
		problems = append(problems, ps...)
		if err := v.MergeConfigMap(read.Values); err != nil {
			return s, err
		}
		maps.Copy(source, read.Places)
		s.Sources = append(s.Sources, file)
	}
	// The environment merges as the last settings layer: over every file,
	// under the flags.
	env, places, ps := readEnvironment()
	problems = append(problems, ps...)
	if err := v.MergeConfigMap(env); err != nil {
		return s, err
	}
	maps.Copy(source, places)
	for _, k := range settingKeys {
		f := c.Flags().Lookup(k.Name)
		if f == nil || !k.usedBy(c.Name()) {
			continue
		}
		if err := v.BindPFlag(k.Name, f); err != nil {
			return s, err
		}
		if f.Changed {
			if _, why := k.read(f.Value.String(), ""); why != "" {
				problems = append(problems, settingProblem{Where: "--" + k.Name, Msg: k.Name + " " + why})
			}
			source[k.Name] = "--" + k.Name
		}
	}
	if len(problems) > 0 {
		return s, badInput{problems}
	}
	for _, k := range settingKeys {
		val := valueOf(v, k)
		k.Set(&s, val)
		if k.usedBy(c.Name()) {
			s.Listing = append(s.Listing, k.rows(val, source)...)
		}
	}
	if off, _ := c.Flags().GetBool("no-photo-cache"); !off {
		if dir, err := os.UserCacheDir(); err == nil { // XDG_CACHE_HOME moves it
			s.Photos.CacheDir = filepath.Join(dir, "lossline", "photos")
		}
	}
	return s, nil
}

// readEnvironment reads the LOSSLINE_* variable of every setting; an empty
// variable counts as unset.
func readEnvironment() (values map[string]any, places map[string]string, problems settingProblems) {
	values, places = map[string]any{}, map[string]string{}
	for _, k := range settingKeys {
		name := k.envName()
		text := os.Getenv(name)
		if text == "" {
			continue
		}
		if k.Kind.fileOnly() {
			problems = append(problems, settingProblem{Where: name, Msg: k.Name + " can be given in a settings file only"})
			continue
		}
		v, why := k.read(text, "")
		if why != "" {
			problems = append(problems, settingProblem{Where: name, Msg: k.Name + " " + why})
			continue
		}
		values[k.Name], places[k.Name] = v, name
	}
	return values, places, problems
}

// read reads text given for the setting: its value, or why it is refused in
// words that follow the setting's name. base is the folder of the settings
// file that holds the text, "" elsewhere.
func (k settingKey) read(text, base string) (any, string) {
	v, err := parseValue(k.Kind, text)
	if err != nil {
		return nil, fmt.Sprintf("%q is %v", text, err)
	}
	if p, ok := v.(string); ok && k.Kind == kindFolder && base != "" && p != "" && !filepath.IsAbs(p) {
		v = filepath.Join(base, p)
	}
	if k.Check != nil {
		if err := k.Check(v); err != nil {
			return nil, err.Error()
		}
	}
	return v, ""
}

// valueOf is the setting's merged value. Every layer holds values already
// read as the setting's kind (flags as their canonical text), so viper's
// conversions lose nothing.
func valueOf(v *viper.Viper, k settingKey) any {
	switch k.Kind {
	case kindNumber:
		return v.GetFloat64(k.Name)
	case kindMoney:
		return moneyOf(v.Get(k.Name))
	case kindWhole:
		return v.GetInt(k.Name)
	case kindSwitch:
		return v.GetBool(k.Name)
	case kindPrices:
		prices := map[string]survey.Money{}
		for item, p := range v.GetStringMap(k.Name) {
			prices[item] = moneyOf(p)
		}
		return prices
	case kindColMap:
		columns := columnMap{}
		for key, h := range v.GetStringMap(k.Name) {
			columns[key] = fmt.Sprint(h)
		}
		return columns
	}
	return v.GetString(k.Name)
}

// moneyOf is an amount as viper holds it: the value a settings file or the
// environment gave, or a flag's text (already read once, so it reads again).
func moneyOf(v any) survey.Money {
	if m, ok := v.(survey.Money); ok {
		return m
	}
	m, _ := survey.ParseMoney(fmt.Sprint(v))
	return m
}

// rows lists the setting's value for a listing of the settings used.
func (k settingKey) rows(v any, source map[string]string) []settingRow {
	from := func(key string) string {
		if s, ok := source[key]; ok {
			return s
		}
		return "built in"
	}
	if columns, ok := v.(columnMap); ok {
		var rows []settingRow
		for _, key := range slices.Sorted(maps.Keys(columns)) {
			rows = append(rows, settingRow{Name: k.Name + "." + key, Value: columns[key], Source: from(k.Name + "." + key)})
		}
		return rows
	}
	prices, ok := v.(map[string]survey.Money)
	if !ok {
		return []settingRow{{Name: k.Name, Value: formatValue(v), Default: formatValue(k.Default), Source: from(k.Name)}}
	}
	var rows []settingRow
	for _, item := range slices.Sorted(maps.Keys(prices)) {
		key := k.Name + "." + item
		rows = append(rows, settingRow{Name: key, Value: prices[item].Plain(), Source: from(key)})
	}
	return rows
}

func flagString(c *cobra.Command, name string) string {
	s, _ := c.Flags().GetString(name)
	return s
}
