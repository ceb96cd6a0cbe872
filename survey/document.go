package survey

import (
	"fmt"
	"slices"
	"strings"
	"time"
)

// Document is the report's document control, read from the front matter:
// its number and revision, whom it is for, who signed it and the
// instruments the readings were taken with. Every field is optional.
type Document struct {
	Number    string // document number:
	Revision  string // revision:
	Client    string // client:
	Contract  string // contract: (a contract or order number)
	SignOff   []Signature
	Revisions []Revision
	// Instruments are the gauges used, listed under instruments:.
	Instruments []Instrument
}

// Signature is one entry of the sign-off list.
type Signature struct {
	Role          string // prepared, reviewed or approved
	Name          string
	Qualification string // qualification or certificate number
	Date          *time.Time
	Line          int
}

// Revision is one entry of the revision history.
type Revision struct {
	Revision    string
	Date        time.Time
	Description string
	Line        int
}

// Instrument is one gauge of the instruments list.
type Instrument struct {
	Type       string // e.g. ultrasonic thickness gauge
	Serial     string // how components name it (instrument: SERIAL)
	Probe      string
	Block      string // calibration block
	Calibrated time.Time
	Velocity   string // sound velocity or measuring mode, as written
	Line       int
}

// SignOffRoles are the roles a sign-off entry may take, in signing order.
var SignOffRoles = []string{"prepared", "reviewed", "approved"}

// Approved reports whether an approver's name and date are given: until they
// are, the report is a draft.
func (d Document) Approved() bool {
	return slices.ContainsFunc(d.SignOff, func(s Signature) bool {
		return s.Role == "approved" && s.Name != "" && s.Date != nil
	})
}

// InstrumentBySerial returns the instrument of that serial number, or nil.
func (d Document) InstrumentBySerial(serial string) *Instrument {
	for i := range d.Instruments {
		if strings.EqualFold(d.Instruments[i].Serial, serial) {
			return &d.Instruments[i]
		}
	}
	return nil
}

// documentKeys are the front matter keys of the document control.
var documentKeys = []string{"document number", "revision", "client", "contract", "sign-off", "revisions", "instruments"}

// calibrationMaxAge is the age of a calibration beyond which a warning is
// raised: a gauge's calibration is commonly renewed every 12 months (common
// practice; the owner's procedure governs).
const calibrationMaxAge = 12 // months

// documentFrontMatter reads the document control keys of the front matter m.
// It runs after the survey date is read, which the dates are checked against.
func (r *checklistReader) documentFrontMatter(m map[string]any) {
	d := &r.survey.Document
	text := func(key string) string {
		v, ok := m[key]
		if !ok || v == nil {
			return ""
		}
		if _, scalar := v.(string); !scalar && !isNumber(v) {
			r.problems.Errorf(r.file, r.keyLine(key), "%s: write one line of text", key)
			return ""
		}
		return strings.TrimSpace(fmt.Sprint(v))
	}
	d.Number, d.Revision = text("document number"), text("revision")
	d.Client, d.Contract = text("client"), text("contract")
	for _, e := range r.entries(m, "sign-off", []string{"role", "name", "qualification", "date"}) {
		sig := Signature{Name: e.text("name"), Qualification: e.text("qualification"), Line: e.line}
		sig.Role = strings.ToLower(e.text("role"))
		switch {
		case sig.Role == "":
			r.problems.Errorf(r.file, e.line, "sign-off: give a role (%s)", strings.Join(SignOffRoles, ", "))
		case !slices.Contains(SignOffRoles, sig.Role):
			r.problems.Errorf(r.file, e.keyLine("role"), "sign-off: role %q is not one of %s", e.text("role"), strings.Join(SignOffRoles, ", "))
		}
		if sig.Name == "" {
			r.problems.Errorf(r.file, e.line, "sign-off: the %s entry has no name", sig.Role)
		}
		if t, ok := e.date("date"); ok {
			sig.Date = &t
			if !r.survey.Date.IsZero() && t.Before(r.survey.Date) {
				r.problems.Errorf(r.file, e.keyLine("date"), "sign-off: %s on %s, before the survey date %s", sig.Role, t.Format(time.DateOnly), r.survey.Date.Format(time.DateOnly))
			}
		} else if sig.Role == "approved" && e.text("date") == "" {
			r.problems.Warnf(r.file, e.line, "sign-off: approved by %s has no date: the report is marked DRAFT until the approval is dated", sig.Name)
		}
		checkSignOrder(r, d.SignOff, sig, e.keyLine("date"))
		d.SignOff = append(d.SignOff, sig)
	}
	for _, e := range r.entries(m, "revisions", []string{"revision", "date", "description"}) {
		rev := Revision{Revision: e.text("revision"), Description: e.text("description"), Line: e.line}
		if rev.Revision == "" {
			r.problems.Errorf(r.file, e.line, "revisions: the entry has no revision")
		}
		if i := slices.IndexFunc(d.Revisions, func(v Revision) bool { return v.Revision == rev.Revision }); rev.Revision != "" && i >= 0 {
			r.problems.Errorf(r.file, e.line, "revisions: revision %s is listed twice (first at line %d): give each issue its own revision", rev.Revision, d.Revisions[i].Line)
		}
		if t, ok := e.date("date"); ok {
			rev.Date = t
			checkRevisionDate(r, d.Revisions, rev, e.keyLine("date"))
		} else if e.text("date") == "" {
			r.problems.Errorf(r.file, e.line, "revisions: revision %s has no date", rev.Revision)
		}
		d.Revisions = append(d.Revisions, rev)
	}
	if len(d.Revisions) > 0 && d.Revision != "" && !slices.ContainsFunc(d.Revisions, func(v Revision) bool { return v.Revision == d.Revision }) {
		r.problems.Warnf(r.file, r.keyLine("revisions"), "revisions: the current revision %s is not in the list", d.Revision)
	}
	for _, e := range r.entries(m, "instruments", []string{"type", "serial", "probe", "calibration block", "calibrated", "velocity", "mode"}) {
		in := Instrument{Type: e.text("type"), Serial: e.text("serial"), Probe: e.text("probe"), Block: e.text("calibration block"), Line: e.line}
		in.Velocity = e.text("velocity")
		if mode := e.text("mode"); mode != "" {
			in.Velocity = strings.TrimPrefix(strings.Join([]string{in.Velocity, mode}, ", "), ", ")
		}
		if in.Serial == "" {
			r.problems.Errorf(r.file, e.line, "instruments: the entry has no serial")
		} else if d.InstrumentBySerial(in.Serial) != nil {
			r.problems.Errorf(r.file, e.keyLine("serial"), "instruments: serial %s listed twice", in.Serial)
		}
		if t, ok := e.date("calibrated"); ok {
			in.Calibrated = t
			s := r.survey
			switch {
			case s.Date.IsZero():
			case t.After(s.Date):
				r.problems.Errorf(r.file, e.keyLine("calibrated"), "instruments: %s calibrated on %s, after the survey date %s", in.Serial, t.Format(time.DateOnly), s.Date.Format(time.DateOnly))
			case t.Before(s.Date.AddDate(0, -calibrationMaxAge, 0)):
				r.problems.Warnf(r.file, e.keyLine("calibrated"), "instruments: %s calibrated on %s, more than %d months before the survey", in.Serial, t.Format(time.DateOnly), calibrationMaxAge)
			}
		} else if e.text("calibrated") == "" {
			r.problems.Warnf(r.file, e.line, "instruments: %s has no calibration date (calibrated:)", in.Serial)
		}
		d.Instruments = append(d.Instruments, in)
	}
}

// checkInstrumentNames checks that every component's instrument: names a
// serial of the front matter's instruments list.
func (r *checklistReader) checkInstrumentNames() {
	for _, a := range r.survey.Assets {
		for _, c := range a.Components {
			if c.Design.Instrument == "" {
				continue
			}
			if r.survey.Document.InstrumentBySerial(c.Design.Instrument) == nil {
				r.problems.Errorf(r.file, c.Design.Lines["instrument"], "instrument: %s is not a serial of the instruments list in the front matter", c.Design.Instrument)
			}
		}
	}
}

func isNumber(v any) bool {
	switch v.(type) {
	case int, int64, uint64, float64:
		return true
	}
	return false
}

// frontEntry is one item of a front matter list of `key: value` maps, with
// the lines it spans.
type frontEntry struct {
	r         *checklistReader
	list      string
	values    map[string]string
	line, end int // first line of the item and the line after it
}

// entries reads the list under key: each item a map of the given keys. An
// item that is not a map, or a key not in keys, is an error at its line.
func (r *checklistReader) entries(m map[string]any, key string, keys []string) []frontEntry {
	v, ok := m[key]
	if !ok || v == nil {
		return nil
	}
	keyLine := r.keyLine(key)
	items, ok := v.([]any)
	if !ok {
		r.problems.Errorf(r.file, keyLine, "%s: write a list, one `- %s: …` item per entry", key, keys[0])
		return nil
	}
	starts := r.itemLines(keyLine)
	var out []frontEntry
	for i, it := range items {
		e := frontEntry{r: r, list: key, values: map[string]string{}, line: keyLine, end: keyLine + 1}
		if i < len(starts) {
			e.line = starts[i]
			e.end = r.frontMatterEnd()
			if i+1 < len(starts) {
				e.end = starts[i+1]
			}
		}
		fields, ok := asMap(it)
		if !ok {
			r.problems.Errorf(r.file, e.line, "%s: each item is a list of `key: value` lines (%s)", key, strings.Join(keys, ", "))
			continue
		}
		var names []string
		for k := range fields {
			names = append(names, k)
		}
		slices.Sort(names)
		for _, k := range names {
			lk := strings.ToLower(strings.Join(strings.Fields(k), " "))
			if !slices.Contains(keys, lk) {
				r.problems.Errorf(r.file, e.keyLine(k), "%s: unknown key %q (use %s)", key, k, strings.Join(keys, ", "))
				continue
			}
			if fields[k] != nil {
				e.values[lk] = strings.TrimSpace(fmt.Sprint(fields[k]))
			}
		}
		out = append(out, e)
	}
	return out
}

func asMap(v any) (map[string]any, bool) {
	switch v := v.(type) {
	case map[string]any:
		return v, true
	case map[any]any:
		out := make(map[string]any, len(v))
		for k, x := range v {
			out[fmt.Sprint(k)] = x
		}
		return out, true
	}
	return nil, false
}

func (e frontEntry) text(key string) string { return e.values[key] }

// date reads a date value; a value that is not a date is an error at its
// line (ok false), an absent one is not (ok false, no problem).
func (e frontEntry) date(key string) (time.Time, bool) {
	v := e.values[key]
	if v == "" {
		return time.Time{}, false
	}
	t, err := parseFrontMatterDate(v)
	if err != nil {
		e.r.problems.Errorf(e.r.file, e.keyLine(key), "%s: %s %q is not a date such as 2026-11-30", e.list, key, v)
		return time.Time{}, false
	}
	return t, true
}

// keyLine is the line of `key:` within the item, or the item's first line.
func (e frontEntry) keyLine(key string) int {
	for n := e.line; n < e.end && n <= len(e.r.lines); n++ {
		l := strings.TrimSpace(strings.TrimPrefix(strings.TrimSpace(e.r.lineOfNumber(n)), "-"))
		if len(l) > len(key) && strings.EqualFold(l[:len(key)], key) && l[len(key)] == ':' {
			return n
		}
	}
	return e.line
}

// itemLines are the lines of the `- ` items of the front matter list whose
// key is on line keyLine: the items indented least under it.
func (r *checklistReader) itemLines(keyLine int) []int {
	var out []int
	indent := -1
	for n := keyLine + 1; n < r.frontMatterEnd(); n++ {
		l := r.lineOfNumber(n)
		t := strings.TrimLeft(l, " ")
		if t == "" || strings.HasPrefix(t, "#") {
			continue
		}
		in := len(l) - len(t)
		if in == 0 && !strings.HasPrefix(t, "-") {
			break // the next key
		}
		if strings.HasPrefix(t, "- ") || t == "-" {
			if indent < 0 {
				indent = in
			}
			if in == indent {
				out = append(out, n)
			}
		}
	}
	return out
}

// frontMatterEnd is the line of the closing `---` of the front matter.
func (r *checklistReader) frontMatterEnd() int {
	for n := 2; n <= len(r.lines); n++ {
		if strings.TrimSpace(r.lineOfNumber(n)) == "---" {
			return n
		}
	}
	return len(r.lines) + 1
}

// lineOfNumber is the text of line n (1-based) without its line break.
func (r *checklistReader) lineOfNumber(n int) string {
	if n < 1 || n > len(r.lines) {
		return ""
	}
	return strings.TrimRight(r.lineText(r.lines[n-1]), "\r")
}
