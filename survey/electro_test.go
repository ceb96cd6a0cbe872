package survey

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey/electrochem"
	"github.com/lossline/lossline/survey/wallloss"
)

const electroChecklist = `---
title: x
date: 2026-11-18
units: mm
---
# Jetty

## Pile P-3

- nominal: 10
- required: 5
- material: carbon steel
- in contact with: 316 stainless
- cp soil: aerobic
- overprotection limit: -1100 mV CSE

| CML | 2016-11-18 | 2026-11-18 |
|-----|------------|------------|
| P3-1 | 10.0 | 9.9 |

| coupon | metal | installed | removed | mass before (g) | mass after (g) | area (cm²) | deepest pit (mm) |
|---|---|---|---|---|---|---|---|
| C-1 | carbon steel | 2026-05-21 | 2026-11-18 | 12.400 | 12.050 | 28.5 | - |

| ER probe | span (mm) | 2025-11-20 | 2026-05-20 | 2026-11-18 |
|---|---|---|---|---|
| ER-1 | 0.254 | 120 | 190 | 265 |

| LPR probe | metal | B (mV) | 2026-11-18 |
|---|---|---|---|
| LPR-1 | carbon steel | 26 | 2600 |

| test point | date | electrode | on (mV) | off (mV) | native (mV) |
|---|---|---|---|---|---|
| TP-1 | 2025-11-20 | CSE | -1010 | -905 | -640 |
| TP-1 | 2026-11-18 | CSE | -960 | -830 | -760 |
| TP-2 | 2026-11-18 | Ag/AgCl seawater | -1000 | -880 | - |

| anode | material | installed (kg) | remaining (kg) | current (A) | utilisation |
|---|---|---|---|---|---|
| A-1 | aluminium | - | 10 | 0.2 | 0.9 |

## Girder G-2

- rusted area: 0.5 %
- breakdown area: 6 m2
- dft nominal: 200 µm
- dft readings: 180 185 220 230 210 215 225 205 210 220
- zinc thickness: 85 µm
- corrosivity: C4
- recoat cost: 140 per m2
`

func readElectro(t *testing.T, src string) (*Survey, ProblemList) {
	t.Helper()
	s, problems := readChecklist("survey.md", []byte(src))
	return s, append(problems, ComputeElectro(s)...)
}

// The electro tables and keys read and computed, each value checked against
// its published method worked by hand (python3).
func TestElectroChecklist(t *testing.T) {
	s, problems := readElectro(t, electroChecklist)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	e := s.Assets[0].Components[0].Design.Electro
	// ASTM G1-03 §8.1.2: 0.350 g, 28.5 cm², 181 d = 4344 h, 7.87 g/cm³ →
	// 87 600 × 0.35 / (28.5 × 4344 × 7.87) = 0.031467 mm/y.
	if got := e.Coupons[0].Rate.MMPerY; math.Abs(got-0.031467) > 1e-5 {
		t.Errorf("coupon rate %v", got)
	}
	// Generic ER formula, least squares over 0, 0.49555, 0.99384 y: 0.037059 mm/y.
	if got := e.ERProbes[0].Rate.MMPerY; math.Abs(got-0.037059) > 1e-5 {
		t.Errorf("ER rate %v", got)
	}
	// Stern–Geary with B 26 mV, R_p 2600 Ω·cm² → 10 µA/cm²; ASTM G102 §5
	// for iron: 0.11601 mm/y.
	if got := e.LPRProbes[0].Rates[0].MMPerY; math.Abs(got-0.11601) > 2e-5 {
		t.Errorf("LPR rate %v", got)
	}
	// NACE SP0169-2013 §6.2.2.1: TP-1 2026 off −830 mV CSE and 70 mV of
	// polarisation fails; −880 mV Ag/AgCl seawater = −930 mV CSE passes.
	tp1, tp2 := e.TestPoints[0], e.TestPoints[1]
	if st := tp1.Visits[1].Judgement.Status; st != electrochem.NotProtected {
		t.Errorf("TP-1 2026: %v", st)
	}
	if tp1.Trend == nil || tp1.Trend.ChangeMV != 75 || !tp1.Trend.Worsening {
		t.Errorf("TP-1 trend %+v", tp1.Trend)
	}
	if e.OverLimitMV == nil || *e.OverLimitMV != -1100 {
		t.Errorf("overprotection limit %v", e.OverLimitMV)
	}
	if st := tp2.Visits[0].Judgement.Status; st != electrochem.Protected {
		t.Errorf("TP-2: %v", st)
	}
	fails := s.FailingTestPoints()
	if len(fails) != 1 || fails[0].Point != "TP-1" || fails[0].Line != 36 {
		t.Errorf("failing points %+v", fails)
	}
	// DNV-RP-B401 (2017) §7: 10 kg × 0.9 × 2000 / (0.2 × 8760) = 10.274 y →
	// replaced 2037-02.
	if l := e.Anodes[0].Life.Years; math.Abs(l-10.274) > 1e-3 || e.AnodeReplacement.Time.Year() != 2037 {
		t.Errorf("anode life %v replace %v", l, e.AnodeReplacement)
	}
	// ASTM G82 guide series: steel / passive 316 differ by 0.61 V > 0.25 V.
	if e.Galvanic == nil || !e.Galvanic.Warn {
		t.Errorf("galvanic %+v", e.Galvanic)
	}
	// Wall 10.0 → 9.9 mm is within the 0.28 mm gauge tolerance (no measurable
	// loss); the rate source max lets the LPR probe's 0.116 mm/y govern:
	// RL = (9.9 − 5) / 0.11601 = 42.24 y.
	items := Assess(s, wallloss.DefaultPolicy)
	r := items[0].Result
	if r.RateFrom != "probe LPR-1" || r.RemainingLifeY == nil || math.Abs(*r.RemainingLifeY-42.24) > 0.01 || !r.HasFlag(wallloss.FlagRatesDisagree) {
		t.Errorf("governing %q life %v flags %v (%s)", r.RateFrom, r.RemainingLifeY, r.Flags, r.RateWhy)
	}
	// ASTM D610 Table 1 and ISO 4628-3 Annex B: 0.5 % → 6 and Ri 2; ISO 19840
	// with 2 of 10 at 90 %: accepted; ISO 9223 C4 zinc 2.1–4.2 µm/a: 85 µm
	// lasts 20.2–40.5 y (ISO 14713-1).
	co := s.Assets[0].Components[1].Design.Electro.Coating
	if co.D610 != 6 || co.ISORi != 2 || co.DFT == nil || !co.DFT.Accepted || co.Galvanizing == nil || math.Abs(co.Galvanizing.ShortestY-20.238) > 1e-3 {
		t.Errorf("coating %+v", co)
	}
}

// Electro problems point at their line.
func TestElectroProblems(t *testing.T) {
	head := "---\ntitle: x\ndate: 2026-11-18\nunits: mm\n---\n## C\n\n- nominal: 10\n"
	tail := "\n| CML | 2026-01-01 |\n|---|---|\n| A | 9 |\n"
	tp := "\n| test point | date | electrode | on mV | off mV | native mV |\n|-|-|-|-|-|-|\n"
	coupon := "\n| coupon | metal | installed | removed | mass before g | mass after g | area cm2 | deepest pit mm |\n|-|-|-|-|-|-|-|-|\n"
	anode := "\n| anode | material | installed kg | remaining kg | current A | utilisation |\n|-|-|-|-|-|-|\n"
	for _, c := range []struct{ name, body, want string }{
		{"coupon header", "\n| coupon | metal | in | out |\n|---|---|---|---|\n| C | steel | 2026-01-01 | 2026-02-01 |\n", "survey.md:10: a coupon table's header is | coupon | metal | installed"},
		{"mass gain", "\n| coupon | metal | installed | removed | mass before g | mass after g | area cm2 | deepest pit mm |\n|-|-|-|-|-|-|-|-|\n| C | steel | 2026-01-01 | 2026-02-01 | 10 | 10.5 | 20 | - |\n", "survey.md:12: coupon C: mass after cleaning 10.5 g is more than before 10 g"},
		{"electrode", "\n| test point | date | electrode | on mV | off mV | native mV |\n|-|-|-|-|-|-|\n| T | 2026-01-01 | platinum | -900 | - | - |\n", `survey.md:12: test point T: reference electrode "platinum"`},
		{"two rows", "\n| test point | date | electrode | on mV | off mV | native mV |\n|-|-|-|-|-|-|\n| T | 2026-01-01 | CSE | -900 | - | - |\n| T | 2026-01-01 | CSE | -910 | - | - |\n", "survey.md:13: test point T: T has two rows on 2026-01-01 (first at line 12)"},
		{"zinc without category", "- zinc thickness: 85 um\n", "survey.md:9: zinc thickness: give the site's corrosivity"},
		{"material", "- material: unobtainium\n", `survey.md:9: material: material "unobtainium" is not in the galvanic series`},
		{"utilisation", "\n| anode | material | installed kg | remaining kg | current A | utilisation |\n|-|-|-|-|-|-|\n| A1 | zinc | - | 5 | 0.1 | most |\n", "survey.md:12: anode A1: utilisation:"},
		{"rate source without coupon", "- rate source: coupon\n", "survey.md:9: rate source coupon, but \"C\" has no coupon table"},
		{"overprotection limit", "- overprotection limit: -500 mV CSE\n", "survey.md:9: overprotection limit: -500 mV CSE is not between"},
		{"ER falling", "\n| ER probe | span mm | 2025-01-01 | 2026-01-01 |\n|-|-|-|-|\n| ER-1 | 0.254 | 400 | 100 |\n", "survey.md:12: warning: ER probe ER-1: the readings fall over time"},
		{"dft half", "- dft nominal: 200 um\n", "survey.md:9: give both dft nominal and dft readings"},
		// Typing slips that would change a finding, refused or warned at
		// the line (limits: common practice; the thresholds are this tool's).
		{"positive CSE potential", tp + "| T | 2026-01-01 | CSE | 930 | 815 | - |\n", "survey.md:12: test point T: on potential 930 mV Cu/CuSO4 is +930 mV against CSE"},
		{"zinc electrode reads positive", tp + "| T | 2026-01-01 | Zn | 200 | 250 | - |\n", ""},
		{"zinc electrode beyond CSE zero", tp + "| T | 2026-01-01 | Zn | 1300 | 1250 | - |\n", "survey.md:12: test point T: on potential 1300 mV Zn is +200 mV against CSE"},
		{"potential in volts", tp + "| T | 2026-01-01 | CSE | -0.93 | -0.815 | - |\n", "survey.md:12: test point T: on potential -0.93 mV Cu/CuSO4 looks like volts: write millivolts (-930)"},
		{"potential in volts without its sign", tp + "| T | 2026-01-01 | CSE | 0.93 | - | - |\n", "survey.md:12: test point T: on potential 0.93 mV Cu/CuSO4 looks like volts without the minus sign: write millivolts (-930)"},
		{"on and off swapped", tp + "| T | 2026-01-01 | CSE | -815 | -930 | - |\n", "survey.md:12: warning: test point T: off -930 mV is more negative than on -815 mV"},
		{"test point after the survey", tp + "| T | 2027-01-01 | CSE | -1000 | -900 | - |\n", "survey.md:12: test point T: date 2027-01-01 is after the survey date 2026-11-18"},
		{"coupon removed after the survey", coupon + "| C | steel | 2026-01-01 | 2026-12-01 | 10 | 9.5 | 20 | - |\n", "survey.md:12: coupon C: removed 2026-12-01 is after the survey date"},
		{"coupon mass in kg", coupon + "| C | steel | 2026-01-01 | 2026-02-01 | 0.010 | 0.0095 | 20 | - |\n", "survey.md:12: warning: coupon C: mass 0.01 g is under 1 g: looks like kilograms, write grams (10)"},
		{"coupon area in m2", coupon + "| C | steel | 2026-01-01 | 2026-02-01 | 10 | 9.5 | 0.002 | - |\n", "survey.md:12: warning: coupon C: area 0.002 cm² is under 1 cm²: looks like m², write cm² (20)"},
		{"coupon area in mm2", coupon + "| C | steel | 2026-01-01 | 2026-02-01 | 10 | 9.5 | 2000 | - |\n", "survey.md:12: warning: coupon C: area 2000 cm² is over 1000 cm²: looks like mm², write cm² (20)"},
		{"coupon pit in µm", coupon + "| C | steel | 2026-01-01 | 2026-02-01 | 10 | 9.5 | 20 | 120 |\n", "survey.md:12: warning: coupon C: deepest pit 120 mm is over 5 mm, deeper than a coupon is thick: looks like µm, write mm (0.12)"},
		{"coupon id twice", coupon + "| C | steel | 2026-01-01 | 2026-02-01 | 10 | 9.5 | 20 | - |\n| C | steel | 2026-01-01 | 2026-02-01 | 10 | 9.6 | 20 | - |\n", "survey.md:13: coupon C: already in the table at line 12"},
		{"ER span in mils", "\n| ER probe | span mm | 2025-01-01 | 2026-01-01 |\n|-|-|-|-|\n| ER-1 | 10 | 100 | 200 |\n", "survey.md:12: warning: ER probe ER-1: span 10 mm is over 2.5 mm: looks like mils, write mm (0.254)"},
		{"ER probe twice", "\n| ER probe | span mm | 2025-01-01 | 2026-01-01 |\n|-|-|-|-|\n| ER-1 | 0.254 | 100 | 200 |\n| ER-1 | 0.254 | 100 | 200 |\n", "survey.md:13: er probe ER-1: already in the table at line 12"},
		{"LPR in kilohm", "\n| LPR probe | metal | B mV | 2026-01-01 |\n|-|-|-|-|\n| L | carbon steel | 26 | 2.6 |\n", "survey.md:12: warning: LPR probe L: a polarisation resistance under 10 Ω·cm² looks like kΩ·cm²"},
		{"Tafel slopes in volts", "\n| LPR probe | metal | B mV | 2026-01-01 |\n|-|-|-|-|\n| L | carbon steel | 0.12/0.12 | 2600 |\n", `survey.md:12: lpr probe L: the B column "0.12/0.12": 0.12 mV is under 1 mV: looks like volts`},
		{"B in volts", "\n| LPR probe | metal | B mV | 2026-01-01 |\n|-|-|-|-|\n| L | carbon steel | 0.026 | 2600 |\n", `survey.md:12: lpr probe L: the B column "0.026": 0.026 mV is under 1 mV: looks like volts`},
		{"anode current in mA", anode + "| A1 | zinc | - | 5 | 55 | 0.8 |\n", "survey.md:12: warning: anode A1: current 55 A is over 10 A for one anode: looks like mA, write amperes (0.055)"},
		{"anode mass in g", anode + "| A1 | zinc | 14500 | 3400 | 0.05 | 0.8 |\n", "survey.md:12: warning: anode A1: mass 14500 kg is over 1000 kg for one anode: looks like grams, write kg (14.5)"},
		{"anode id twice", anode + "| A1 | zinc | - | 5 | 0.1 | 0.8 |\n| A1 | zinc | - | 4 | 0.1 | 0.8 |\n", "survey.md:13: anode A1: already in the table at line 12"},
		{"empty table", anode, "survey.md:10: warning: the anode table has no rows"},
		{"dft readings in mm", "- dft nominal: 250 um\n- dft readings: 0.265 0.240 0.232\n", "survey.md:10: dft readings: 0.265 µm is under 1 µm: looks like mm, write micrometres (265 µm)"},
		{"zinc in mm", "- corrosivity: C4\n- zinc thickness: 0.085\n", "survey.md:10: zinc thickness: 0.085 µm is under 1 µm: looks like mm, write micrometres (85 µm)"},
		{"dft maximum below nominal", "- dft nominal: 250 um\n- dft maximum: 25 um\n- dft readings: 250 260 270\n", "survey.md:10: dft maximum 25 µm is not above the dft nominal 250 µm"},
		{"rusted area as a fraction", "- rusted area: 0.02\n", "survey.md:9: rusted area: \"0.02\" has no % sign: write `0.02 %` for a percentage (or `2 %` if it is a fraction of the area)"},
		{"dft in mm with its unit", "- dft nominal: 0.25 mm\n", `survey.md:9: dft nominal: the unit "mm" is not µm or um: write the value in µm`},
		{"breakdown area in cm2", "- breakdown area: 140000 cm2\n", `survey.md:9: breakdown area: the unit "cm2" is not m² or m2: write the value in m²`},
		{"no breakdown area", "- breakdown area: 0 m2\n", "survey.md:9: breakdown area: the area to recoat must be more than 0 m²"},
	} {
		_, problems := readElectro(t, head+c.body+tail)
		if c.want == "" {
			if problems.HasErrors() {
				t.Errorf("%s: want no error, got %v", c.name, problems)
			}
			continue
		}
		wantProblem(t, c.name, problems, c.want)
	}
}

// The README's electro example parses and computes without a problem.
func TestReadmeElectroExample(t *testing.T) {
	readme := readmeText(t)
	_, rest, ok := strings.Cut(readme, "<!-- electro example -->\n````markdown\n")
	example, _, ok2 := strings.Cut(rest, "````")
	if !ok || !ok2 {
		t.Fatal("README has no electro example")
	}
	_, problems := readElectro(t, example)
	if len(problems) != 0 {
		t.Errorf("README electro example: %v", problems)
	}
}

func readmeText(t *testing.T) string {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// A test-point table in an earlier survey folder is not merged: the reader
// says so at its first row instead of leaving it out without a word.
func TestEarlierElectroTablesWarned(t *testing.T) {
	root := t.TempDir()
	front := func(date, prev string) string {
		return "---\ntitle: CP\nsite: Yard\ndate: " + date + "\ninspector: Test\nunits: mm\n" + prev + "---\n# Tank farm CP\n\n## Bed\n\n"
	}
	writeChecklist(t, root, "2025", front("2025-11-14", "")+
		"| test point | date | electrode | on (mV) | off (mV) | native (mV) |\n|---|---|---|---|---|---|\n| TP-1 | 2025-11-14 | CSE | -1105 | -948 | - |\n\n"+
		"| CML | 2025-11-14 |\n|---|---|\n| C1 | 9.5 |\n")
	dir := writeChecklist(t, root, "2026", front("2026-11-18", "previous: ../2025\n")+
		"| test point | date | electrode | on (mV) | off (mV) | native (mV) |\n|---|---|---|---|---|---|\n| TP-1 | 2026-11-18 | CSE | -1090 | -935 | - |\n\n"+
		"| CML | 2026-11-18 |\n|---|---|\n| C1 | 9.4 |\n")
	_, problems := LoadSeries(dir, nil, DefaultOptions)
	want := filepath.Join(root, "2025", ChecklistFile) + ":14: warning: the coupon, probe, test-point and anode tables of an earlier survey folder are not read"
	found := false
	for _, p := range problems {
		found = found || strings.HasPrefix(p.String(), want)
	}
	if !found {
		t.Errorf("want %q, got %v", want, problems)
	}
}
