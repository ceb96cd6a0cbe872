package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// TestMain keeps the tests' photo cache out of the user's cache folder.
func TestMain(m *testing.M) {
	dir, err := os.MkdirTemp("", "lossline-cache-")
	if err != nil {
		panic(err)
	}
	// The go command's build cache lives under the user cache folder too: pin
	// it first, so building the binary in the end-to-end test stays fast.
	if os.Getenv("GOCACHE") == "" {
		if out, err := exec.Command("go", "env", "GOCACHE").Output(); err == nil {
			os.Setenv("GOCACHE", strings.TrimSpace(string(out)))
		}
	}
	os.Setenv("XDG_CACHE_HOME", dir)
	code := m.Run()
	os.RemoveAll(dir)
	os.Exit(code)
}

func runCLI(t *testing.T, args ...string) (int, string, string) {
	t.Helper()
	var out, errb bytes.Buffer
	code := run(args, &out, &errb)
	return code, out.String(), errb.String()
}

func TestExitCodes(t *testing.T) {
	for _, c := range []struct {
		args []string
		code int
		want string // in stdout or stderr
	}{
		{[]string{"check", "../../testdata/demo"}, exitOK, "0 errors, 2 warnings"},
		{[]string{"check", "../../testdata/broken"}, exitBadInput, "broken/survey.md:29: reading \"abc\" is not a number"},
		{[]string{"report", "../../testdata/bad/duplicate-cml", "-o", "OUT"}, exitBadInput, "survey.md:20: CML C1 is listed twice"},
		{[]string{"check", "../../testdata/no-such-survey"}, exitBadInput, "survey.md: no checklist"},
		{[]string{"report"}, exitUsage, "accepts 1 arg"},
		{[]string{"report", "a", "--no-such-flag"}, exitUsage, "unknown flag"},
		{[]string{"frobnicate"}, exitUsage, "unknown command"},
		{[]string{"report", "../../testdata/demo", "-o", "OUT", "--interval-cap-years", "0"}, exitBadInput, "--interval-cap-years: interval-cap-years must be between"},
	} {
		for i, a := range c.args {
			if a == "OUT" {
				c.args[i] = t.TempDir()
			}
		}
		code, out, errOut := runCLI(t, c.args...)
		if code != c.code || !strings.Contains(out+errOut, c.want) {
			t.Errorf("lossline %v: exit %d, want %d; output lacks %q?\n%s%s", c.args, code, c.code, c.want, out, errOut)
		}
	}
}

func TestCompareCommand(t *testing.T) {
	code, out, errOut := runCLI(t, "compare", "../../testdata/demo-2022", "../../testdata/demo")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	lines := strings.Split(out, "\n")
	if !strings.HasPrefix(lines[0], "RANK  CML") || !strings.Contains(lines[1], "A-03") || !strings.Contains(lines[1], "crossed-required") {
		t.Errorf("compare table:\n%s", out)
	}
	code, out, _ = runCLI(t, "compare", "../../testdata/demo-2022", "../../testdata/demo", "--csv")
	if code != exitOK || !strings.HasPrefix(out, "rank,cml,asset,component,previous_date") {
		t.Errorf("compare --csv: %d\n%s", code, out)
	}
	if code, _, _ := runCLI(t, "compare", "../../testdata/demo"); code != exitUsage {
		t.Errorf("compare with one folder: exit %d", code)
	}
}

func TestPhotosCommand(t *testing.T) {
	code, out, errOut := runCLI(t, "photos", "../../testdata/demo")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	for _, re := range []string{
		`line-p220/p220-b02-rack\.jpg\s+2026-11-18 11:40:51\s+45\.601205\s+-61\.349120\s+3\s+CML B-02\s+1\.0\s+nearest-cml`,
		`overview-east\.jpg .* too-far`,
		`IMG_2231\.HEIC\s+(-\s+)+skipped: HEIC photo`,
		`bridge-fb2/fb2-deck\.jpg .* Footbridge FB-2 / Girder G1 bottom flange .* component-area`,
	} {
		if !regexp.MustCompile(re).MatchString(out) {
			t.Errorf("photos output does not match %s:\n%s", re, out)
		}
	}
}

// lossline plan prints the plan the demo report carries (same budget from lossline.yaml).
func TestPlanCommand(t *testing.T) {
	code, out, errOut := runCLI(t, "plan", "../../testdata/demo")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errOut)
	}
	if !regexp.MustCompile(`Transfer line P-220 / Circuit P-220-A \(above ground, coastal exposure\) +34 200`).MatchString(out) {
		t.Errorf("plan output lacks the P-220-A row:\n%s", out)
	}
	for _, want := range []string{
		"at or below required",
		"Year 1 (from 2026-11-18): budget 60 000 EUR, spent 59 120.", "Each year's selection is optimal",
	} {
		if !strings.Contains(out, want) {
			t.Errorf("plan output lacks %q:\n%s", want, out)
		}
	}
	// A budget that cannot pay for the repair at or below required says so plainly.
	_, out, _ = runCLI(t, "plan", "../../testdata/demo", "--budget", "30000", "--plan-years", "1")
	if !strings.Contains(out, "alone cost 58 700 EUR, 28 700 more than the first year's budget") {
		t.Errorf("over-budget plan:\n%s", out)
	}
	// CSV: plain numbers.
	_, out, _ = runCLI(t, "plan", "../../testdata/demo", "--csv")
	if !strings.HasPrefix(out, "status,year,decided_in_year,asset / component,cost_eur,risk_at_year_start,risk_after_repair,risk_reduction,") ||
		!strings.Contains(out, "\nmandatory-funded,1,1,\"Transfer line P-220 / Circuit P-220-A (above ground, coastal exposure)\",34200,25,5,20,60,") {
		t.Errorf("plan --csv:\n%s", out)
	}
	// The budget curve: steps as CSV, the plan's budget and the knee marked,
	// how it was computed on stderr.
	code, out, errOut = runCLI(t, "plan", "../../testdata/demo", "--curve")
	if code != exitOK || !strings.HasPrefix(out, "budget_eur,selection_money_eur,risk_years_removed,exact,upper_bound,mark\n") ||
		!strings.Contains(out, "\n59120,0,0,true,0,budget\n") || !strings.Contains(out, ",knee\n") ||
		!strings.Contains(errOut, "exact at every budget") {
		t.Errorf("plan --curve: exit %d\n%s%s", code, out, errOut)
	}
	// Several surveys in one plan; components without a repair cost are named.
	_, out, _ = runCLI(t, "plan", "../../testdata/demo", "../../testdata/demo-2021")
	if !strings.Contains(out, "Footbridge FB-2 / Girder G1 bottom flange is not in the plan: no repair cost in the checklist.") {
		t.Errorf("plan of two surveys:\n%s", out)
	}
	if code, _, _ := runCLI(t, "plan"); code != exitUsage {
		t.Errorf("plan without folders: exit %d", code)
	}
}

// Settings precedence: defaults < lossline.yaml < --config < LOSSLINE_* < flags.
func TestSettingsPrecedence(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, SettingsFile), []byte("interval-cap-years: 8\nphoto-quality: 70\n"), 0o644)
	extra := filepath.Join(dir, "extra.yaml")
	os.WriteFile(extra, []byte("interval-cap-years: 6\n"), 0o644)
	load := func(env string, args ...string) settings {
		t.Helper()
		t.Setenv("LOSSLINE_INTERVAL_CAP_YEARS", env)
		if env == "" {
			os.Unsetenv("LOSSLINE_INTERVAL_CAP_YEARS")
		}
		c := newReportCmd()
		if err := c.ParseFlags(args); err != nil {
			t.Fatal(err)
		}
		s, err := loadSettings(c, dir)
		if err != nil {
			t.Fatal(err)
		}
		return s
	}
	if s := load(""); s.Policy.IntervalCapYears != 8 || s.Photos.Quality != 70 || s.Photos.LongSide != 1600 {
		t.Errorf("survey file: %+v", s)
	}
	if s := load("", "--config", extra); s.Policy.IntervalCapYears != 6 || s.Photos.Quality != 70 {
		t.Errorf("--config: %+v", s)
	}
	if s := load("5", "--config", extra); s.Policy.IntervalCapYears != 5 {
		t.Errorf("environment: %+v", s)
	}
	if s := load("5", "--config", extra, "--interval-cap-years", "3"); s.Policy.IntervalCapYears != 3 {
		t.Errorf("flag: %+v", s)
	}
	os.WriteFile(filepath.Join(dir, SettingsFile), []byte("interval-cap-yeras: 8\n"), 0o644)
	c := newReportCmd()
	if _, err := loadSettings(c, dir); err == nil || !strings.Contains(err.Error(), `unknown setting "interval-cap-yeras"`) {
		t.Errorf("misspelt key: %v", err)
	}
}

func TestNewNeverOverwrites(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "site-2027")
	if code, out, errOut := runCLI(t, "new", dir); code != exitOK {
		t.Fatalf("new: %d %s %s", code, out, errOut)
	}
	// Left untouched, every placeholder line is an error; with the ⟨⟩ marks
	// taken away the scaffold is a valid survey.
	code, out, _ := runCLI(t, "check", dir)
	if code != exitBadInput {
		t.Errorf("check of an untouched new survey: exit %d\n%s", code, out)
	}
	src, _ := os.ReadFile(filepath.Join(dir, "survey.md"))
	var want []string
	for i, l := range strings.Split(string(src), "\n") {
		if strings.Contains(l, "⟨") {
			want = append(want, fmt.Sprintf("survey.md:%d: placeholder", i+1))
		}
	}
	if len(want) < 10 || !strings.Contains(out, fmt.Sprintf("%d errors, 0 warnings", len(want))) {
		t.Errorf("untouched survey: want %d placeholder errors and nothing else:\n%s", len(want), out)
	}
	for _, w := range want {
		if !strings.Contains(out, w) {
			t.Errorf("untouched survey: no %q in\n%s", w, out)
		}
	}
	filled := strings.NewReplacer("⟨", "", "⟩", "").Replace(string(src))
	os.WriteFile(filepath.Join(dir, "survey.md"), []byte(filled), 0o644)
	if code, out, _ := runCLI(t, "check", dir); code != exitOK || strings.Contains(out, "⟨") {
		t.Errorf("check of a filled-in new survey: exit %d\n%s", code, out)
	}
	os.WriteFile(filepath.Join(dir, "survey.md"), []byte("mine"), 0o644)
	if code, _, errOut := runCLI(t, "new", dir); code != exitBadInput || !strings.Contains(errOut, "already exists") {
		t.Errorf("second new: exit %d %s", code, errOut)
	}
	if b, _ := os.ReadFile(filepath.Join(dir, "survey.md")); string(b) != "mine" {
		t.Error("survey.md overwritten")
	}
}

// poppler reads the PDF back: an independent reader of what we wrote.
func poppler(t *testing.T) {
	t.Helper()
	for _, tool := range []string{"pdftotext", "pdfimages", "pdfinfo"} {
		if _, err := exec.LookPath(tool); err != nil {
			if os.Getenv("LOSSLINE_REQUIRE_POPPLER") != "" {
				t.Fatalf("%s not installed (poppler-utils)", tool)
			}
			t.Skipf("%s not installed (poppler-utils)", tool)
		}
	}
}

// The built binary on the demo survey: three files, and a PDF whose text,
// pages and images poppler reads back.
func TestEndToEndDemo(t *testing.T) {
	poppler(t)
	bin := filepath.Join(t.TempDir(), "lossline")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("build: %v\n%s", err, out)
	}
	out := t.TempDir()
	cache := t.TempDir()
	cmd := exec.Command(bin, "report", "../../testdata/demo", "-o", out)
	cmd.Env = append(os.Environ(), "XDG_CACHE_HOME="+cache)
	if b, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("report: %v\n%s", err, b)
	}
	// XDG_CACHE_HOME moves the photo cache (os.UserCacheDir): one file per reduced photo.
	cached, _ := filepath.Glob(filepath.Join(cache, "lossline", "photos", "*", "*.jpg"))
	if len(cached) != 12 {
		t.Errorf("%d photos in the cache, want 12 (10 of this survey, 2 earlier ones)", len(cached))
	}
	for _, f := range []string{"report.pdf", "results.json", "results.csv", "locations.geojson"} {
		if st, err := os.Stat(filepath.Join(out, f)); err != nil || st.Size() == 0 {
			t.Errorf("%s missing or empty", f)
		}
	}
	pdf := filepath.Join(out, "report.pdf")
	text, err := exec.Command("pdftotext", "-layout", pdf, "-").Output()
	if err != nil {
		t.Fatal(err)
	}
	txt := string(text)
	for _, want := range []string{
		"CORROSION THICKNESS SURVEY REPORT", "Cautions", "Screening calculations, not an engineering assessment",
		"Summary", "Not covered by the results", "Contents", "Ranked list of CMLs", "Tank T-101", "Shell course 1", "Readings (mm)", "Results",
		"Scope checklist", "Appendix A — Photos not placed on a CML or component", "Appendix B — Photo index", "Appendix C — Methods", "Appendix D — Data checks",
		"AT OR BELOW REQUIRED", "below-required", "thickness-increase", "nominal-based",
		"10.96 (11.02 10.96 11.10)",        // multi-reading cell: governing first
		"API 570 §7.1.1", "µA/cm²", "270°", // Unicode through the embedded font
		"Magnetic-particle test at nozzle N3",
		"Required thickness: derivation", "API 653 §4.3.3.1", "ASME B31.3 §304.1.2", "Table 4.4", "set by M. Varga",
		"API 570 Table 2, Class 1", "API 510", "fixed interval of 6 years", "ISO 9223", "(low ",
		"no-measurable-loss", "estimate",
		"Changes since the last visit", "CROSSED THE REQUIRED", "ACCELERATING",
		"CMLs no longer listed", "G2-04", "Design data that changed", "Before and after", "Before: CML A-03", "Trend",
		"the survey of 2022-05-10 by K. Lindqvist", "Figure 1. Before: CML A-03",
		"Site plan", "equirectangular projection", "placed by position: nearest CML within the placement radius, 1 m",
		"Files in the photos folder not used", "IMG_2231.HEIC", "Each year's selection is optimal",
		"Risk", "Components by risk", "almost certain", "Repair plan", "Funded", "Not funded, with the risk they still carry", "Budget curve", "knee:",
		"Probability of reaching the required thickness", "CMLs below 0.1 % by 2029-11-18", "single-visit estimates: no probability",
		"Year 1 (from 2026-11-18): budget 60 000 EUR, spent 59 120.",
		// electro data: coupons, probes, CP, anodes, coating, metal pair, methods
		"Governing rate: wall, coupons and probes", "Mass-loss coupons", "Linear-polarisation probes", "Cathodic protection test points",
		"Potentials by visit", "Sacrificial anodes", "ASTM D610 grade 5", "metal pairs: findings", "(anode replacement)", "(recoating)",
		"Coupons, probes, cathodic protection, anodes and coatings",
	} {
		if !strings.Contains(txt, want) {
			t.Errorf("PDF text lacks %q", want)
		}
	}
	// T1-04: remaining life (10.41 − 9.1424)/0.14894 = 8.5 y, next inspection at
	// half of it (API 653 shell UT interval RCA/(2N)) on 2031-02-19.
	if !regexp.MustCompile(`T1-04\s+10\.41\s+0\.147\s+0\.149\s+0\.149\s+8\.5\s+2035-05-23\s+2031-02-19`).MatchString(txt) {
		t.Error("results row of T1-04 not found with its computed values")
	}
	info, _ := exec.Command("pdfinfo", pdf).Output()
	pages := regexp.MustCompile(`Pages:\s+(\d+)`).FindStringSubmatch(string(info))
	if pages == nil {
		t.Fatalf("pdfinfo: %s", info)
	}
	if !strings.Contains(txt, "page 1 of "+pages[1]) || !strings.Contains(txt, "page "+pages[1]+" of "+pages[1]) {
		t.Errorf("page numbers 'page N of %s' not found", pages[1])
	}
	list, err := exec.Command("pdfimages", "-list", pdf).Output()
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(list)), "\n")
	// Two header lines, then one line per image drawn: 6 photos named by CMLs, 3 placed by
	// position (B-02, two component areas), 1 unplaced in the appendix, and 2 before/after
	// pairs (each an earlier photo and a current one shown again).
	if n := len(lines) - 2; n != 14 {
		t.Errorf("%d images drawn in the PDF, want 14\n%s", n, list)
	}
	var res struct {
		Items []struct {
			CML            string   `json:"cml"`
			RemainingLifeY *float64 `json:"remaining_life_y"`
		} `json:"items"`
	}
	b, _ := os.ReadFile(filepath.Join(out, "results.json"))
	if err := json.Unmarshal(b, &res); err != nil || len(res.Items) != 35 || res.Items[0].CML != "A-03" {
		t.Errorf("results.json: %v, %d items", err, len(res.Items))
	}
	// Outline: one bookmark per section (pdfinfo -dests is not an outline reader; count /Title entries).
	raw, _ := os.ReadFile(pdf)
	if n := bytes.Count(raw, []byte("/Title ")); n < 8 {
		t.Errorf("%d outline titles, want a bookmark per section", n)
	}
}
