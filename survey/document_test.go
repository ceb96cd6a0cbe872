package survey

import (
	"strings"
	"testing"
	"time"
)

// documentHead is a front matter with document control; lines are numbered
// in the comments of the tests that point at them.
const documentHead = `---
title: Document control
site: Yard
date: 2026-11-18
inspector: Test
units: mm
document number: YD-001
revision: C
client: Yard owner
contract: order 12
sign-off:
  - role: prepared
    name: A. Author
    qualification: cert 1
    date: 2026-11-20
  - role: approved
    name: B. Boss
    date: 2026-11-25
revisions:
  - revision: C
    date: 2026-11-25
    description: first issue
instruments:
  - type: ultrasonic thickness gauge
    serial: G-1
    probe: dual 5 MHz
    calibration block: step block
    calibrated: 2026-06-01
    velocity: 5920 m/s
---
## C

- nominal: 10
- required: 5
- instrument: G-1

| CML | 2026-11-18 |
|---|---|
| C1 | 9.5 |
`

func TestDocumentControlRead(t *testing.T) {
	s, problems := ParseChecklist("survey.md", []byte(documentHead))
	if len(problems) != 0 {
		t.Fatal(problems)
	}
	d := s.Document
	if d.Number != "YD-001" || d.Revision != "C" || d.Client != "Yard owner" || d.Contract != "order 12" {
		t.Errorf("document: %+v", d)
	}
	if len(d.SignOff) != 2 || d.SignOff[0].Role != "prepared" || d.SignOff[0].Line != 12 || d.SignOff[1].Name != "B. Boss" {
		t.Errorf("sign-off: %+v", d.SignOff)
	}
	if !d.Approved() {
		t.Error("a dated approval should make the report approved")
	}
	if len(d.Instruments) != 1 || d.Instruments[0].Velocity != "5920 m/s" || s.Assets[0].Components[0].Design.Instrument != "G-1" {
		t.Errorf("instruments: %+v", d.Instruments)
	}
}

// Each problem of the document control points at the line that holds it.
func TestDocumentControlProblems(t *testing.T) {
	for _, c := range []struct{ name, old, new, want string }{
		{"unknown role", "  - role: prepared", "  - role: checked", `survey.md:12: sign-off: role "checked" is not one of prepared, reviewed, approved`},
		{"wrong date", "    date: 2026-11-20", "    date: 20.11.2026", `survey.md:15: sign-off: date "20.11.2026" is not a date`},
		{"signed before the survey", "    date: 2026-11-20", "    date: 2026-11-01", "survey.md:15: sign-off: prepared on 2026-11-01, before the survey date 2026-11-18"},
		{"approved without a date", "    date: 2026-11-25\nrevisions", "revisions",
			"survey.md:16: warning: sign-off: approved by B. Boss has no date: the report is marked DRAFT"},
		{"revision without a date", "    date: 2026-11-25\n    description", "    description", "survey.md:20: revisions: revision C has no date"},
		{"unknown key", "    qualification: cert 1", "    licence: cert 1", `survey.md:14: sign-off: unknown key "licence"`},
		{"calibrated after the survey", "calibrated: 2026-06-01", "calibrated: 2026-12-01", "survey.md:28: instruments: G-1 calibrated on 2026-12-01, after the survey date 2026-11-18"},
		// 12 months: a common-practice calibration interval.
		{"calibration over 12 months old", "calibrated: 2026-06-01", "calibrated: 2025-11-17", "survey.md:28: warning: instruments: G-1 calibrated on 2025-11-17, more than 12 months"},
		// Dates a tired hand slips on (common practice: a report is reviewed
		// and approved after it is prepared, and revised after the survey).
		{"approved before prepared", "    date: 2026-11-25\nrevisions", "    date: 2026-11-19\nrevisions", "survey.md:18: warning: sign-off: approved on 2026-11-19, before it was prepared on 2026-11-20"},
		{"revision before the survey", "  - revision: C\n    date: 2026-11-25", "  - revision: C\n    date: 2026-11-10", "survey.md:21: revisions: revision C on 2026-11-10, before the survey date 2026-11-18"},
		{"revisions out of order", "  - revision: C\n    date: 2026-11-25", "  - revision: B\n    date: 2026-11-26\n    description: draft\n  - revision: C\n    date: 2026-11-25",
			"survey.md:24: warning: revisions: revision C on 2026-11-25, before revision B above it (2026-11-26)"},
		{"revision twice", "  - revision: C\n    date: 2026-11-25", "  - revision: C\n    date: 2026-11-24\n    description: draft\n  - revision: C\n    date: 2026-11-25",
			"survey.md:23: revisions: revision C is listed twice (first at line 20)"},
		{"unknown instrument", "- instrument: G-1", "- instrument: G-9", "survey.md:35: instrument: G-9 is not a serial of the instruments list"},
		{"sign-off not a list", "sign-off:\n  - role: prepared\n    name: A. Author\n    qualification: cert 1\n    date: 2026-11-20\n  - role: approved\n    name: B. Boss\n    date: 2026-11-25\n",
			"sign-off: A. Author\n", "survey.md:11: sign-off: write a list"},
	} {
		src := strings.Replace(documentHead, c.old, c.new, 1)
		if src == documentHead {
			t.Fatalf("%s: %q not found", c.name, c.old)
		}
		_, problems := ParseChecklist("survey.md", []byte(src))
		found := false
		for _, p := range problems {
			found = found || strings.HasPrefix(p.String(), c.want)
		}
		if !found {
			t.Errorf("%s: want %q, got %v", c.name, c.want, problems)
		}
	}
}

// A calibration exactly 12 months before the survey is not warned about.
func TestCalibrationTwelveMonthsIsNoWarning(t *testing.T) {
	src := strings.Replace(documentHead, "calibrated: 2026-06-01", "calibrated: 2025-11-18", 1)
	if _, problems := ParseChecklist("survey.md", []byte(src)); len(problems) != 0 {
		t.Error(problems)
	}
}

func TestDraftUntilApprovedAndDated(t *testing.T) {
	for _, c := range []struct {
		name string
		sign []Signature
		want bool
	}{
		{"none", nil, false},
		{"prepared only", []Signature{{Role: "prepared", Name: "A", Date: &fixedDate}}, false},
		{"approver without date", []Signature{{Role: "approved", Name: "B"}}, false},
		{"approver with date", []Signature{{Role: "approved", Name: "B", Date: &fixedDate}}, true},
	} {
		if got := (Document{SignOff: c.sign}).Approved(); got != c.want {
			t.Errorf("%s: approved %v, want %v", c.name, got, c.want)
		}
	}
}

var fixedDate = mustDate("2026-11-25")

func mustDate(s string) time.Time {
	t, err := time.Parse(time.DateOnly, s)
	if err != nil {
		panic(err)
	}
	return t
}
