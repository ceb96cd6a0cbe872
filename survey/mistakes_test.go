package survey

import (
	"strings"
	"testing"
)

// mistakeHead is a checklist up to its first component's design list; line 8
// is the first line after it.
const mistakeHead = "---\ntitle: x\ndate: 2025-07-01\nunits: mm\n---\n## C\n\n"

// Each typing slip that would change a finding is an error at its line.
func TestFieldMistakesAreErrors(t *testing.T) {
	for _, c := range []struct{ name, body, want string }{
		// Table shape: goldmark pads and cuts rows; the source line is counted.
		{"row one cell short", "| CML | location | 2025-06-01 |\n|---|---|---|\n| A | 12.5 |\n",
			"survey.md:10: row has 2 cells, the header has 3: write one cell per column"},
		{"row one cell long", "| CML | 2025-06-01 |\n|---|---|\n| A | 12.5 | 12.4 |\n",
			"survey.md:10: row has 3 cells, the header has 2"},
		{"text run into the table", "| CML | 2025-06-01 |\n|---|---|\n| A | 12.5 |\nPitting at A.\n",
			"survey.md:11: row has 1 cell, the header has 2"},
		{"no separator row", "| CML | 2025-06-01 |\n| A | 12.5 |\n",
			"survey.md:8: these | rows are not a table: under the header row write a separator row"},
		{"separator with a cell too few", "| CML | location | 2025-06-01 |\n|---|---|\n| A | x | 12.5 |\n",
			"survey.md:8: these | rows are not a table"},
		{"rows after a blank line", "| CML | 2025-06-01 |\n|---|---|\n| A | 12.5 |\n\n| B | 12.4 |\n",
			"survey.md:12: these | rows are not part of the table above: a blank line ends a table"},
		{"indented table", "Text.\n\n    | CML | 2025-06-01 |\n    |---|---|\n    | A | 12.5 |\n",
			"survey.md:10: these | rows are indented by four spaces or a tab, which makes them a code block"},
		{"row cut short in a blockquote", "> | CML | location | 2025-06-01 |\n> |---|---|---|\n> | A | 12.5 |\n",
			"survey.md:10: row has 2 cells, the header has 3"},
		// Dates.
		{"front matter date June 31", "", `survey.md:3: date "2025-06-31" is not an ISO 8601 date: June has 30 days`},
		{"month 60", "| CML | 2025-60-03 |\n|---|---|\n| A | 12.5 |\n", `survey.md:8: column "2025-60-03" is not a visit date: month 60`},
		{"June 31", "| CML | 2025-06-31 |\n|---|---|\n| A | 12.5 |\n", `survey.md:8: column "2025-06-31" is not a visit date: June has 30 days`},
		{"February 29 of a common year", "| CML | 2025-02-29 |\n|---|---|\n| A | 12.5 |\n", "survey.md:8: column \"2025-02-29\" is not a visit date: February 2025 has 28 days"},
		{"one-digit day", "| CML | 2025-06-3 |\n|---|---|\n| A | 12.5 |\n", `survey.md:8: column "2025-06-3" is not a visit date: one-digit day, write 2025-06-03`},
		{"one-digit month", "| CML | 2025-6 |\n|---|---|\n| A | 12.5 |\n", `survey.md:8: column "2025-6" is not a visit date: one-digit month, write 2025-06`},
		{"slashes", "| CML | 2025/06/03 |\n|---|---|\n| A | 12.5 |\n", `survey.md:8: column "2025/06/03" is not a visit date: write 2025-06-03`},
		{"day first", "| CML | 03.06.2025 |\n|---|---|\n| A | 12.5 |\n", `survey.md:8: column "03.06.2025" is not a visit date: write the date as YYYY-MM-DD`},
		{"two-digit year", "| CML | 25-06-03 |\n|---|---|\n| A | 12.5 |\n", `survey.md:8: column "25-06-03" is not a visit date: the year 25 needs four digits`},
		{"year alone", "| CML | 2024 |\n|---|---|\n| A | 12.5 |\n", `survey.md:8: column "2024" is not a visit date: a year alone`},
		{"date with a word", "| CML | 2025-06-01 (UT) |\n|---|---|\n| A | 12.5 |\n", `survey.md:8: column "2025-06-01 (UT)" is not a visit date: write the date alone (2025-06-01) and anything else in a note`},
		{"word with a bad date", "| CML | visit 2025-06-31 |\n|---|---|\n| A | 12.5 |\n", `survey.md:8: column "visit 2025-06-31" is not a visit date: June has 30 days`},
		{"year 1025", "| CML | 1025-06-03 |\n|---|---|\n| A | 12.5 |\n", "survey.md:8: visit column 1025-06-03: year 1025 is before 1900"},
		{"second gps column", "| CML | gps | GPS | 2025-06-01 |\n|---|---|---|---|\n| A | 45, 3 | 46, 3 | 12.5 |\n", `survey.md:8: column "GPS" appears twice`},
		// Design keys.
		{"misspelt key", "- requried: 9.1\n", "survey.md:8: unknown design key `requried`: did you mean `required`?"},
		{"key without its space", "- repaircost: 6000\n", "survey.md:8: unknown design key `repaircost`: did you mean `repair cost`?"},
		{"key another name", "- nominal thickness: 12.7\n", "survey.md:8: unknown design key `nominal thickness`: did you mean `nominal`?"},
		{"short key one edit", "- metl: zinc\n", "survey.md:8: unknown design key `metl`: did you mean `metal`?"},
		{"replaced for repaired", "- replaced: 2024-01-01; new 12.7\n", "survey.md:8: unknown design key `replaced`: did you mean `repaired`?"},
		{"galvanizing for zinc", "- galvanizing thickness: 85 um\n", "survey.md:8: unknown design key `galvanizing thickness`: did you mean `zinc thickness`?"},
		{"corroded aera", "- corroded aera: ASME B31G\n", "survey.md:8: unknown design key `corroded aera`: did you mean `corroded area`?"},
		{"installed one-digit month", "- installed: 2005-6\n", `survey.md:8: installed: "2005-6" is not a date: one-digit month, write 2005-06`},
		// Numbers.
		{"decimal comma in nominal", "- nominal: 12,7\n", `survey.md:8: nominal: "12,7" is not a number: write 12.7, not 12,7`},
		{"letter O in required", "- required: 9.O\n", `survey.md:8: required: "9.O" is not a number: letter O in 9.O: did you mean 9.0?`},
		{"NaN nominal", "- nominal: NaN\n", `survey.md:8: nominal: "NaN" is not a number: NaN is not a value`},
		{"nominal in metres of steel", "- nominal: 1270\n", `survey.md:8: nominal: "1270" is not a wall thickness: more than 1000 mm`},
		{"assumed rate decimal comma", "- assumed rate: 0,12 mm/y\n", `survey.md:8: assumed rate: "0,12" is not a number: write 0.12, not 0,12`},
		{"assumed rate absurd", "- assumed rate: 250 mm/y\n", `survey.md:8: assumed rate: "250 mm/y" is more than 100 mm/y`},
		{"repair cost NaN", "- repair cost: NaN\n", `survey.md:8: repair cost: "NaN" is not an amount: NaN is not a value`},
		{"repair cost thousands comma", "- repair cost: 38,000\n", `survey.md:8: repair cost: "38,000" is not an amount: write 38000 or 38 000`},
		{"repair quantity letter O", "- repair: 4O pipe-m\n", `survey.md:8: repair: "4O" is not an amount: letter O in 4O: did you mean 40?`},
		{"method input decimal comma", "- nominal: 10\n- required: ASME B31.3 pipe\n  - pressure: 1,9 MPa\n  - outside diameter: 219.1 mm\n  - allowable stress: 137.9 MPa\n  - joint factor: 1.0\n  - coefficient Y: 0.4\n",
			`survey.md:9: required: pressure: "1,9" is not a number: write 1.9, not 1,9`},
		{"reading decimal comma", "| CML | 2025-06-01 |\n|---|---|\n| A | 12,5 |\n", `survey.md:10: reading "12,5" is not a number: write 12.5, not 12,5`},
		{"readings separated by a comma", "| CML | 2025-06-01 |\n|---|---|\n| A | 12.5,12.4 |\n", `survey.md:10: reading "12.5,12.4": separate readings with spaces`},
		{"reading letter O", "| CML | 2025-06-01 |\n|---|---|\n| A | 1O.2 |\n", `survey.md:10: reading "1O.2" is not a number: letter O in 1O.2: did you mean 10.2?`},
		{"reading trailing O", "| CML | 2025-06-01 |\n|---|---|\n| A | 10.2O |\n", `survey.md:10: reading "10.2O" is not a number: letter O in 10.2O: did you mean 10.20?`},
		{"reading NaN", "| CML | 2025-06-01 |\n|---|---|\n| A | NaN |\n", `survey.md:10: reading "NaN" is not a number: NaN is not a value`},
		{"reading Inf", "| CML | 2025-06-01 |\n|---|---|\n| A | +Inf |\n", `survey.md:10: reading "+Inf" is not a number: infinity is not a value`},
		{"reading 1e308", "| CML | 2025-06-01 |\n|---|---|\n| A | 1e308 |\n", `survey.md:10: reading "1e308" is not a number: it is too large`},
		{"reading beyond any wall", "| CML | 2025-06-01 |\n|---|---|\n| A | 1878 |\n", `survey.md:10: reading "1878" is not a wall thickness: more than 1000 mm`},
		{"reading in inches beyond any wall", "| CML | 2025-06-01 |\n|---|---|\n| A | 40 in |\n", `survey.md:10: reading "40" is not a wall thickness: more than 39.37 in`},
		{"reading unknown unit", "| CML | 2025-06-01 |\n|---|---|\n| A | 9.5cm |\n", `survey.md:10: reading "9.5cm": unknown unit "cm"`},
		{"reading LOS", "| CML | 2025-06-01 |\n|---|---|\n| A | LOS |\n", `survey.md:10: reading "LOS" on 2025-06-01: write - for a reading not taken and say why in a note`},
		{"reading n/a", "| CML | 2025-06-01 |\n|---|---|\n| A | n/a |\n", `survey.md:10: reading "n/a" on 2025-06-01: write -`},
		{"reading no access", "| CML | 2025-06-01 |\n|---|---|\n| A | No access |\n", `survey.md:10: reading "No access" on 2025-06-01: write -`},
		{"gps latitude beyond 90", "| CML | gps | 2025-06-01 |\n|---|---|---|\n| A | 95.1, 3 | 12.5 |\n", `survey.md:10: gps "95.1, 3" is not a position: latitude 95.1 is beyond ±90°`},
		{"gps longitude beyond 180", "| CML | gps | 2025-06-01 |\n|---|---|---|\n| A | 45.6, -261.3 | 12.5 |\n", `survey.md:10: gps "45.6, -261.3" is not a position: longitude -261.3 is beyond ±180°`},
		{"gps NaN", "| CML | gps | 2025-06-01 |\n|---|---|---|\n| A | NaN, 3 | 12.5 |\n", `survey.md:10: gps "NaN, 3" is not a position: latitude "NaN" is not a number`},
		{"gps decimal commas", "| CML | gps | 2025-06-01 |\n|---|---|---|\n| A | 45,6 -61,3 | 12.5 |\n", "survey.md:10: gps \"45,6 -61,3\" is not `latitude, longitude` in decimal degrees (decimals take a point"},
	} {
		src := mistakeHead + c.body
		if c.body == "" {
			src = strings.Replace(mistakeHead, "2025-07-01", "2025-06-31", 1)
		}
		_, problems := readChecklist("survey.md", []byte(src))
		wantError(t, c.name, problems, c.want)
	}
}

// Slips that are not mistakes read as meant, with no problem.
func TestFieldVariantsRead(t *testing.T) {
	src := "---\ntitle: x\nsite: y\ninspector: z\ndate: 2025-07-01\nunits: mm\n---\n## C\n\n- Nominal: 12.7\n- Repair  Cost: 38 000\n- required: 9.1\n- Metal loss: up to 1 mm at the weld\n\n" +
		"| CML | location | Remarks | 2025-06-01 |\n|:---|---|---|--:|\n| A | north \\| top | probe changed | 12.5 |\n| B | | | - |\n"
	s, problems := readChecklist("survey.md", []byte(src))
	if len(problems) != 0 {
		t.Fatalf("problems: %v", problems)
	}
	c := s.Assets[0].Components[0]
	if *c.Design.NominalMM != 12.7 || *c.Design.RepairCost != Money(3800000) || len(c.Notes) != 1 {
		t.Errorf("design %+v, notes %v", c.Design, c.Notes)
	}
	a := c.CMLs[0]
	if a.Location != `north \| top` || a.Remarks != "probe changed" || len(a.Visits) != 1 || a.Visits[0].ReadingsMM[0] != 12.5 {
		t.Errorf("CML A: %+v", a)
	}
}

// wantError fails unless an error (not a warning) starts with want.
func wantError(t *testing.T, name string, problems ProblemList, want string) {
	t.Helper()
	for _, p := range problems {
		if p.Severity == Error && strings.HasPrefix(p.String(), want) {
			return
		}
	}
	t.Errorf("%s: problems %v lack error %q", name, problems, want)
}
