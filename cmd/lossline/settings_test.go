package main

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey"
)

// libraryText is error text of Go libraries that must never reach the user.
var libraryText = []string{"strconv", "ParseFloat", "ParseInt", "invalid syntax", "yaml: line", "cannot unmarshal", "unable to cast", "While parsing config"}

func assertNoLibraryText(t *testing.T, out string) {
	t.Helper()
	for _, lib := range libraryText {
		if strings.Contains(out, lib) {
			t.Errorf("output shows library text %q:\n%s", lib, out)
		}
	}
}

// writeSettings writes a lossline.yaml into a new folder and returns the folder.
func writeSettings(t *testing.T, text string) string {
	t.Helper()
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, SettingsFile), []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return dir
}

// A settings file with a value of the wrong type is refused at its line,
// whatever command reads it, never read as zero.
func TestSettingsFileWrongType(t *testing.T) {
	for _, c := range []struct {
		file string
		want string // after "DIR/lossline.yaml:"
	}{
		{"gauge-tolerance-mm: 0,28\n", `1: gauge-tolerance-mm "0,28" is not a number (write decimals with a point: 0.28)`},
		{"currency: EUR\nunit-costs:\n  recoat-m2: 85\n  pipe-m: nine hundred\n", `4: unit-costs: pipe-m "nine hundred" is not a number` + "\n"},
		{"# plan\nbudget: lots\n", `2: budget "lots" is not a number` + "\n"},
		{"interval-cap-years: ten\n", `1: interval-cap-years "ten" is not a number` + "\n"},
		{"photo-quality: 80.5\n", `1: photo-quality "80.5" is not a whole number`},
		{"auto-place: sometimes\n", `1: auto-place "sometimes" is not true or false`},
		{"budget: .nan\n", `1: budget ".nan" is not a finite number`},
		{"budget: -.inf\n", `1: budget "-.inf" is not a finite number`},
		{"budget: 1e300\n", `1: budget "1e300" is too large`},
		{"budget: 50,000\n", `1: budget "50,000" is not a number (group digits in threes`},
		{"budget:\n", `1: budget has no value`},
		{"budget: [1, 2]\n", `1: budget must be a single value, not a list`},
		{"unit-costs: 950\n", `1: unit-costs must be item: price lines`},
		{"unit-costs:\n  pipe-m: -5\n", `2: unit-costs: pipe-m "-5" is negative`},
		{"rate-model: fastest\n", `1: rate-model "fastest" is not one of long, short, max, fit`},
		{"interval-cap-yeras: 8\n", `1: unknown setting "interval-cap-yeras"`},
		{"budget: 1\nbudget: 2\n", `2: budget is set twice (first on line 1)`},
		{"budget: [1, 2\n", `1: not valid YAML: did not find expected ',' or ']'`},
	} {
		dir := writeSettings(t, c.file)
		// check uses none of these settings, yet refuses the file.
		code, out, errOut := runCLI(t, "check", dir)
		want := filepath.Join(dir, SettingsFile) + ":" + c.want
		if code != exitBadInput || !strings.Contains(errOut, want) {
			t.Errorf("%q: exit %d, want %d; stderr lacks %q:\n%s%s", c.file, code, exitBadInput, want, out, errOut)
		}
		assertNoLibraryText(t, out+errOut)
	}
}

// All problems of a settings file are reported at once, in line order.
func TestSettingsFileAllProblems(t *testing.T) {
	dir := writeSettings(t, "budget: lots\nplan-years: 0\ninterval-cap-years: ten\n")
	_, _, errOut := runCLI(t, "check", dir)
	file := filepath.Join(dir, SettingsFile)
	want := file + `:1: budget "lots" is not a number` + "\n" +
		file + ":2: plan-years must be between 1 and 50 years, not 0\n" +
		file + `:3: interval-cap-years "ten" is not a number` + "\n"
	if errOut != want {
		t.Errorf("stderr:\n%s\nwant:\n%s", errOut, want)
	}
}

// A wrong value in the environment names the variable; on the command line,
// the flag (a usage error).
func TestSettingsEnvironmentAndFlagWrongType(t *testing.T) {
	t.Setenv("LOSSLINE_INTERVAL_CAP_YEARS", "ten")
	code, out, errOut := runCLI(t, "check", "../../testdata/demo")
	if code != exitBadInput || !strings.Contains(errOut, `LOSSLINE_INTERVAL_CAP_YEARS: interval-cap-years "ten" is not a number`) {
		t.Errorf("environment: exit %d\n%s%s", code, out, errOut)
	}
	assertNoLibraryText(t, out+errOut)
	os.Unsetenv("LOSSLINE_INTERVAL_CAP_YEARS")

	t.Setenv("LOSSLINE_UNIT_COSTS", "pipe-m=950")
	code, _, errOut = runCLI(t, "check", "../../testdata/demo")
	if code != exitBadInput || !strings.Contains(errOut, "LOSSLINE_UNIT_COSTS: unit-costs can be given in a settings file only") {
		t.Errorf("unit-costs in the environment: exit %d\n%s", code, errOut)
	}
	os.Unsetenv("LOSSLINE_UNIT_COSTS")

	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"report", "x", "--interval-cap-years", "ten"}, `invalid argument "ten" for "--interval-cap-years" flag: not a number`},
		{[]string{"plan", "x", "--budget", "NaN"}, `invalid argument "NaN" for "--budget" flag: not a finite number`},
		{[]string{"plan", "x", "--plan-years", "2.5"}, `invalid argument "2.5" for "--plan-years" flag: not a whole number`},
		{[]string{"photos", "x", "--auto-place=perhaps"}, `invalid argument "perhaps" for "--auto-place" flag: not true or false`},
	} {
		code, out, errOut := runCLI(t, c.args...)
		if code != exitUsage || !strings.Contains(errOut, c.want) {
			t.Errorf("lossline %v: exit %d, want %d; stderr lacks %q:\n%s%s", c.args, code, exitUsage, c.want, out, errOut)
		}
		assertNoLibraryText(t, out+errOut)
	}
}

// Money settings take digits grouped by spaces or thin spaces.
func TestSettingsGroupedAmounts(t *testing.T) {
	dir := writeSettings(t, "budget: 50 000\nbudget-per-year: 45\u2009000.50\nplan-years: 2\nunit-costs:\n  pipe-m: 1\u202f250\n  recoat-m2: 85\n")
	c := newPlanCmd()
	s, err := loadSettings(c, dir)
	if err != nil {
		t.Fatal(err)
	}
	if s.Plan.Budget != 50000_00 || s.Plan.PerYear != 45000_50 || s.Plan.Years != 2 ||
		s.Plan.Costs.Unit["pipe-m"] != 1250_00 || s.Plan.Costs.Unit["recoat-m2"] != 85_00 {
		t.Errorf("plan settings: %+v", s.Plan)
	}
	c = newPlanCmd()
	if err := c.ParseFlags([]string{"--budget", "1 000 000"}); err != nil {
		t.Fatal(err)
	}
	if s, err := loadSettings(c, dir); err != nil || s.Plan.Budget != 1_000_000_00 {
		t.Errorf("--budget \"1 000 000\": %v %v", s.Plan.Budget, err)
	}
	// Through the command: --config's budget replaces the demo's 60 000.
	code, out, errOut := runCLI(t, "plan", "../../testdata/demo", "--config", filepath.Join(dir, SettingsFile), "--plan-years", "1")
	if code != exitOK || !strings.Contains(out, "budget 50 000 EUR") {
		t.Errorf("plan with budget: 50 000: exit %d\n%s%s", code, out, errOut)
	}
}

func TestParseValue(t *testing.T) {
	for _, c := range []struct {
		kind kind
		text string
		want any    // nil: refused
		why  string // the refusal
	}{
		{kindNumber, "0.28", 0.28, ""},
		{kindNumber, " 10 ", 10.0, ""},
		{kindNumber, "1e3", 1000.0, ""},
		{kindNumber, ".5", 0.5, ""},
		{kindNumber, "50 000", nil, "not a number"}, // grouping is for amounts
		{kindNumber, "0,28", nil, "not a number (write decimals with a point: 0.28)"},
		{kindNumber, "0x10", nil, "not a number"},
		{kindNumber, "1_000", nil, "not a number"},
		{kindNumber, "Inf", nil, "not a finite number"},
		{kindNumber, "1e16", nil, "too large"},
		{kindNumber, "1e400", nil, "too large"},
		{kindMoney, "50 000", survey.Money(50000_00), ""},
		{kindMoney, "50\u2009000", survey.Money(50000_00), ""},
		{kindMoney, "50\u00a0000", survey.Money(50000_00), ""},
		{kindMoney, "1 250 000.75", survey.Money(1250000_75), ""},
		{kindMoney, "1e6", survey.Money(1_000_000_00), ""},
		{kindMoney, "-1 000", nil, "negative"},
		{kindMoney, "5 0000", nil, "not a number (group digits"},
		{kindMoney, "50 00", nil, "not a number (group digits"},
		{kindMoney, "9 999 999 999 999.99", survey.Money(999_999_999_999_999), ""},
		{kindMoney, "10 000 000 000 000", nil, "too large"},
		{kindMoney, "1e30", nil, "too large"},
		{kindMoney, "0.005", nil, "finer than a cent"},
		{kindMoney, "nine hundred", nil, "not a number"},
		{kindWhole, "80", 80, ""},
		{kindWhole, "80.0", 80, ""},
		{kindWhole, "80.5", nil, "not a whole number"},
		{kindSwitch, "yes", true, ""},
		{kindSwitch, "False", false, ""},
		{kindSwitch, "0", false, ""},
		{kindSwitch, "maybe", nil, "not true or false"},
		{kindText, " half life ", " half life ", ""},
	} {
		got, err := parseValue(c.kind, c.text)
		switch {
		case c.want == nil && (err == nil || !strings.HasPrefix(err.Error(), c.why)):
			t.Errorf("parseValue(%d, %q) = %v, %v; want refusal %q", c.kind, c.text, got, err, c.why)
		case c.want != nil && (err != nil || got != c.want):
			t.Errorf("parseValue(%d, %q) = %v, %v; want %v", c.kind, c.text, got, err, c.want)
		}
	}
}

// Every default is a value of its kind, reads back as itself and is in range;
// every command a setting names exists.
func TestSettingKeysTable(t *testing.T) {
	commands := map[string]bool{}
	for _, c := range newRoot(&bytes.Buffer{}, &bytes.Buffer{}).Commands() {
		commands[c.Name()] = true
	}
	seen := map[string]bool{}
	for _, k := range settingKeys {
		if seen[k.Name] {
			t.Errorf("%s listed twice", k.Name)
		}
		seen[k.Name] = true
		for _, c := range k.Used {
			if !commands[c] {
				t.Errorf("%s: no command %q", k.Name, c)
			}
		}
		if k.Kind.fileOnly() {
			if k.Default != nil {
				t.Errorf("%s: prices have no default", k.Name)
			}
			continue
		}
		v, why := k.read(formatValue(k.Default), "")
		if why != "" || v != k.Default {
			t.Errorf("%s: default %#v reads back as %#v (%s)", k.Name, k.Default, v, why)
		}
		if !strings.Contains(k.Help, "`") && k.Kind != kindSwitch {
			t.Errorf("%s: help names no argument with its unit: %q", k.Name, k.Help)
		}
	}
}

// A command's help lists the flags of the settings it uses and no others.
func TestHelpListsOnlySettingsUsed(t *testing.T) {
	for _, cmd := range allCommands {
		code, out, _ := runCLI(t, cmd, "--help")
		if code != exitOK {
			t.Fatalf("%s --help: exit %d", cmd, code)
		}
		for _, k := range settingKeys {
			listed := strings.Contains(out, "--"+k.Name+" ")
			if want := k.usedBy(cmd) && !k.Kind.fileOnly(); listed != want {
				t.Errorf("%s --help lists --%s: %v, want %v", cmd, k.Name, listed, want)
			}
		}
		if !strings.Contains(out, "Examples:\n  lossline "+cmd) {
			t.Errorf("%s --help has no example:\n%s", cmd, out)
		}
	}
	// A setting a command does not use is no flag of it.
	if code, _, errOut := runCLI(t, "photos", "../../testdata/demo", "--budget", "5000"); code != exitUsage || !strings.Contains(errOut, "unknown flag: --budget") {
		t.Errorf("photos --budget: exit %d %s", code, errOut)
	}
	if code, _, errOut := runCLI(t, "compare", "a", "b", "--photo-quality", "70"); code != exitUsage || !strings.Contains(errOut, "unknown flag: --photo-quality") {
		t.Errorf("compare --photo-quality: exit %d %s", code, errOut)
	}
}

// The listing gives each setting the command uses, its value, its default
// and where the value came from.
func TestSettingsListing(t *testing.T) {
	dir := writeSettings(t, "currency: EUR\nbudget: 60 000\nunit-costs:\n  pipe-m: 950\n")
	t.Setenv("LOSSLINE_PLAN_YEARS", "3")
	c := newPlanCmd()
	if err := c.ParseFlags([]string{"--budget-per-year", "45000"}); err != nil {
		t.Fatal(err)
	}
	s, err := loadSettings(c, dir)
	if err != nil {
		t.Fatal(err)
	}
	file := filepath.Join(dir, SettingsFile)
	var got []string
	for _, r := range s.Listing {
		got = append(got, fmt.Sprintf("%s=%s (default %s) from %s", r.Name, r.Value, r.Default, r.Source))
	}
	want := []string{
		"interval-cap-years=10 (default 10) from built in",
		"rate-model=max (default max) from built in",
		"interval-rule=half life (default half life) from built in",
		"gauge-tolerance-mm=0.28 (default 0.28) from built in",
		"currency=EUR (default currency units) from " + file + ":1",
		"unit-costs.pipe-m=950 (default ) from " + file + ":4",
		"budget=60000 (default 0) from " + file + ":2",
		"plan-years=3 (default 1) from LOSSLINE_PLAN_YEARS",
		"budget-per-year=45000 (default 0) from --budget-per-year",
		"carry-over=false (default false) from built in",
		"objective=risk (default risk) from built in",
		"failure-cost-very-low=0 (default 0) from built in",
		"failure-cost-low=0 (default 0) from built in",
		"failure-cost-medium=0 (default 0) from built in",
		"failure-cost-high=0 (default 0) from built in",
		"failure-cost-very-high=0 (default 0) from built in",
		"discount-rate-percent=0 (default 0) from built in",
		"max-megapixels=200 (default 200) from built in",
		"auto-place=true (default true) from built in",
		"placement-radius-m=15 (default 15) from built in",
		"area-radius-m=50 (default 50) from built in",
	}
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Errorf("listing:\n%s\nwant:\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
}

// A templates folder in a settings file is relative to that file.
func TestSettingsTemplatesRelativeToFile(t *testing.T) {
	dir := writeSettings(t, "templates: texts\n")
	if err := os.Mkdir(filepath.Join(dir, "texts"), 0o755); err != nil {
		t.Fatal(err)
	}
	s, err := loadSettings(newReportCmd(), dir)
	if err != nil || s.Templates.Override != filepath.Join(dir, "texts") {
		t.Errorf("templates: %q %v", s.Templates.Override, err)
	}
	dir = writeSettings(t, "templates: missing\n")
	_, err = loadSettings(newReportCmd(), dir)
	if want := filepath.Join(dir, SettingsFile) + ":1: templates folder " + filepath.Join(dir, "missing") + " not found"; err == nil || err.Error() != want {
		t.Errorf("missing templates: %v, want %s", err, want)
	}
}

// Errors keep their exit code however deeply they are wrapped.
func TestExitCodeOfWrappedErrors(t *testing.T) {
	input := survey.InputError{Problems: survey.ProblemList{{File: "survey.md", Line: 3, Severity: survey.Error, Message: "bad"}}}
	for _, c := range []struct {
		err  error
		code int
	}{
		{nil, exitOK},
		{fmt.Errorf("loading: %w", badInput{errors.New("templates folder x not found")}), exitBadInput},
		{fmt.Errorf("a: %w", fmt.Errorf("b: %w", badInput{errors.New("x")})), exitBadInput},
		{fmt.Errorf("reading: %w", input), exitBadInput},
		{fmt.Errorf("parsing: %w", usageError{errors.New("x")}), exitUsage},
		{fmt.Errorf("done: %w", silentExit(exitBadInput)), exitBadInput},
		{errors.New("disk full"), exitOther},
		{fmt.Errorf("writing: %w", os.ErrPermission), exitOther},
	} {
		var stderr bytes.Buffer
		if got := exitCode(c.err, &stderr); got != c.code {
			t.Errorf("exitCode(%v) = %d, want %d", c.err, got, c.code)
		}
		if c.err != nil && c.code != exitOK && !errors.As(c.err, new(silentExit)) && !strings.Contains(stderr.String(), c.err.Error()) {
			t.Errorf("exitCode(%v) printed %q", c.err, stderr.String())
		}
	}
}

// Cobra's own usage errors are known by type: a misspelt command, an
// unknown flag, a wrong number of arguments.
func TestUsageErrors(t *testing.T) {
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"frobnicate"}, `unknown command "frobnicate" for "lossline"`},
		{[]string{"reprot", "x"}, "did you mean report?"},
		{[]string{"--no-such-flag"}, "unknown flag: --no-such-flag"},
		{[]string{"check", "x", "--no-such-flag"}, "unknown flag: --no-such-flag"},
		{[]string{"check", "-z", "x"}, "unknown shorthand flag: 'z' in -z"},
		{[]string{"check"}, "accepts 1 arg(s), received 0"},
		{[]string{"compare", "a", "b", "c"}, "accepts 2 arg(s), received 3"},
		{[]string{"completion", "bash", "x"}, `unknown command "x"`},
	} {
		code, out, errOut := runCLI(t, c.args...)
		if code != exitUsage || !strings.Contains(errOut, c.want) || !strings.Contains(errOut, "Run 'lossline --help' for usage.") {
			t.Errorf("lossline %v: exit %d, want %d; stderr lacks %q:\n%s%s", c.args, code, exitUsage, c.want, out, errOut)
		}
	}
	if code, out, _ := runCLI(t); code != exitOK || !strings.Contains(out, "Available Commands:") {
		t.Errorf("lossline alone: exit %d\n%s", code, out)
	}
}

// Budgets and prices that are not finite, negative or 10^13 and over are
// refused where they were given: settings file and line, environment
// variable or flag; never turned into a plan.
func TestMoneySettingsRefusedAtTheirPlace(t *testing.T) {
	for _, c := range []struct{ file, want string }{
		{"budget: 1e30\n", `:1: budget "1e30" is too large (amounts of money must be under 10 000 000 000 000)`},
		{"currency: EUR\nbudget: .inf\n", `:2: budget ".inf" is not a finite number`},
		{"budget-per-year: NaN\n", `:1: budget-per-year "NaN" is not a finite number`},
		{"budget: 10 000 000 000 000\n", `:1: budget "10 000 000 000 000" is too large`},
		{"budget: 100.001\n", `:1: budget "100.001" is finer than a cent`},
		{"unit-costs:\n  pipe-m: 950\n  recoat-m2: 1e30\n", `:3: unit-costs: recoat-m2 "1e30" is too large`},
		{"unit-costs:\n  pipe-m: .nan\n", `:2: unit-costs: pipe-m ".nan" is not a finite number`},
	} {
		dir := writeSettings(t, c.file)
		code, out, errOut := runCLI(t, "plan", "../../testdata/demo", "--config", filepath.Join(dir, SettingsFile))
		want := filepath.Join(dir, SettingsFile) + c.want
		if code != exitBadInput || !strings.Contains(errOut, want) || strings.Contains(out, "optimal") {
			t.Errorf("%q: exit %d, want %d; stderr lacks %q:\n%s%s", c.file, code, exitBadInput, want, out, errOut)
		}
	}
	for _, b := range []string{"1e30", "Inf", "-1", "NaN"} {
		t.Setenv("LOSSLINE_BUDGET", b)
		code, out, errOut := runCLI(t, "plan", "../../testdata/demo")
		if code != exitBadInput || !strings.Contains(errOut, `LOSSLINE_BUDGET: budget "`+b+`" is`) || out != "" {
			t.Errorf("LOSSLINE_BUDGET=%s: exit %d\n%s%s", b, code, out, errOut)
		}
		os.Unsetenv("LOSSLINE_BUDGET")
		code, out, errOut = runCLI(t, "plan", "../../testdata/demo", "--budget", b)
		if code != exitUsage || !strings.Contains(errOut, `invalid argument "`+b+`" for "--budget" flag: `) || out != "" {
			t.Errorf("--budget %s: exit %d\n%s%s", b, code, out, errOut)
		}
	}
}

// A budget at or above the total cost of the demo's repairs (315 660 EUR: recoating of XG-3 and the local-damage components included; the anode replacement falls in year 2)
// funds them all, and the plan says so rather than "optimal".
func TestBudgetCoveringAllRepairs(t *testing.T) {
	code, out, errOut := runCLI(t, "plan", "../../testdata/demo", "--plan-years", "1", "--budget", "315 660")
	if code != exitOK || strings.Contains(out, "deferred") || !strings.Contains(out, "spent 315 660.") ||
		!strings.Contains(out, "The budget covers every repair: all are funded.") {
		t.Errorf("budget of the total: exit %d\n%s%s", code, out, errOut)
	}
	_, out, _ = runCLI(t, "plan", "../../testdata/demo", "--plan-years", "1", "--budget", "315 659.99")
	if !strings.Contains(out, "deferred") || !strings.Contains(out, "Each year's selection is optimal") {
		t.Errorf("budget a cent short of the total:\n%s", out)
	}
}
