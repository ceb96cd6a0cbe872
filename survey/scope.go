package survey

import (
	"fmt"
	"maps"
	"regexp"
	"strings"
)

// ScopeEntry is one entry of the front matter's scope: an asset, or
// `asset / component`, as written.
type ScopeEntry struct {
	Text string
	Line int
}

// scopeKey reads the front matter's scope: a name or a list of names.
func (r *checklistReader) scopeKey(m map[string]any) {
	v, ok := m["scope"]
	if !ok || v == nil {
		return
	}
	line := r.keyLine("scope")
	var texts []string
	switch v := v.(type) {
	case string:
		texts = []string{v}
	case []any:
		for _, x := range v {
			str, ok := x.(string)
			if !ok || strings.TrimSpace(str) == "" {
				r.problems.Errorf(r.file, line, "scope: %v is not an asset or `asset / component`", x)
				continue
			}
			texts = append(texts, str)
		}
	default:
		r.problems.Errorf(r.file, line, "scope: give an asset, `asset / component`, or a list of them")
		return
	}
	for _, t := range texts {
		r.survey.VisitScope = append(r.survey.VisitScope, ScopeEntry{Text: strings.TrimSpace(t), Line: r.entryLine(line, t)})
	}
}

// entryLine finds the line of a list entry under the front matter key at
// line key, or returns key.
func (r *checklistReader) entryLine(key int, entry string) int {
	i := 0
	for l := range strings.Lines(r.text) {
		if i++; i <= key { // line i is the key's or one before it
			continue
		}
		l = strings.TrimSpace(l)
		if l == "---" {
			break
		}
		if !strings.HasPrefix(l, "-") {
			break
		}
		l = strings.Trim(strings.TrimSpace(strings.TrimPrefix(l, "-")), `"'`)
		if l == strings.TrimSpace(entry) {
			return i
		}
	}
	return key
}

var aroundSlash = regexp.MustCompile(`\s*/\s*`)

// scopeName is a name as scope entries are compared: case ignored, spaces
// collapsed, none around the slash between asset and component.
func scopeName(s string) string {
	return aroundSlash.ReplaceAllString(strings.ToLower(strings.Join(strings.Fields(s), " ")), "/")
}

// covers reports whether the visit's scope covers a component of an asset.
func (s *Survey) covers(asset, component string) bool {
	if len(s.VisitScope) == 0 {
		return true
	}
	a, c := scopeName(asset), scopeName(asset+" / "+component)
	for _, e := range s.VisitScope {
		if k := scopeName(e.Text); k == a || k == c {
			return true
		}
	}
	return false
}

// applyScope checks that every scope entry names an asset or component of
// the survey, marks the components it leaves out, and warns of CMLs outside
// it that hold readings of this visit.
func applyScope(s *Survey) ProblemList {
	var problems ProblemList
	if len(s.VisitScope) == 0 {
		return nil
	}
	var names []string
	known := map[string]bool{}
	for _, a := range s.Assets {
		names = append(names, a.Name)
		known[scopeName(a.Name)] = true
		for _, c := range a.Components {
			names = append(names, a.Name+" / "+c.Name)
			known[scopeName(a.Name+" / "+c.Name)] = true
		}
	}
	for _, e := range s.VisitScope {
		if !known[scopeName(e.Text)] {
			problems.Errorf(s.File, e.Line, "scope: %q is not an asset or `asset / component` of this survey%s",
				e.Text, didYouMean(quoted(closeNames(e.Text, names, 3))))
		}
	}
	for _, a := range s.Assets {
		for _, c := range a.Components {
			c.OutOfScope = !s.covers(a.Name, c.Name)
			if !c.OutOfScope {
				continue
			}
			for _, m := range c.CMLs {
				for _, v := range m.Visits {
					if s.InDays(v.Date.Time) {
						problems.Warnf(m.File, m.Line, "CML %s has readings of this visit, but %q is outside the front matter's scope: add it there",
							m.ID, a.Name+" / "+c.Name)
						break
					}
				}
			}
		}
	}
	return problems
}

func quoted(names []string) []string {
	out := make([]string, len(names))
	for i, n := range names {
		out[i] = fmt.Sprintf("%q", n)
	}
	return out
}

// carryIn adds to s a CML of an earlier survey that s does not list because
// its scope leaves the CML's asset or component out of this visit: under the
// asset and component of the same names, made (out of scope, with the earlier
// survey's design data) when s has none. The CML comes without readings;
// Merge adds them.
func carryIn(s *Survey, old Located) Located {
	var a *Asset
	for _, x := range s.Assets {
		if scopeName(x.Name) == scopeName(old.Asset.Name) {
			a = x
			break
		}
	}
	if a == nil {
		a = &Asset{Name: old.Asset.Name, Line: old.Asset.Line}
		s.Assets = append(s.Assets, a)
	}
	var c *Component
	for _, x := range a.Components {
		if scopeName(x.Name) == scopeName(old.Component.Name) {
			c = x
			break
		}
	}
	if c == nil {
		d := old.Component.Design
		d.Lines = maps.Clone(d.Lines)
		c = &Component{Name: old.Component.Name, File: old.Component.File, Line: old.Component.Line, Asset: a.Name, Design: d, OutOfScope: true}
		a.Components = append(a.Components, c)
	}
	m := &CML{ID: old.CML.ID, File: old.CML.File, Line: old.CML.Line, Location: old.CML.Location, GPS: old.CML.GPS}
	c.CMLs = append(c.CMLs, m)
	return Located{Asset: a, Component: c, CML: m}
}
