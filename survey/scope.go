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

// visitScope is the front matter's scope as names compared by scopeName;
// nil when the visit covers everything its tables list.
type visitScope map[string]bool

// scope returns the visit's scope, made once per pass over the survey.
func (s *Survey) scope() visitScope {
	if len(s.VisitScope) == 0 {
		return nil
	}
	v := make(visitScope, len(s.VisitScope))
	for _, e := range s.VisitScope {
		v[scopeName(e.Text)] = true
	}
	return v
}

// covers reports whether the visit's scope covers a component of an asset.
func (v visitScope) covers(asset, component string) bool {
	return v == nil || v[scopeName(asset)] || v[scopeName(asset+" / "+component)]
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
	scope := s.scope()
	for _, a := range s.Assets {
		for _, c := range a.Components {
			c.OutOfScope = !scope.covers(a.Name, c.Name)
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

// carrier carries CMLs of earlier surveys into s that s does not list
// because its scope leaves their asset or component out of this visit. It
// finds assets and components by name through indexes made once, so that
// carrying n CMLs costs n, not n times the components.
type carrier struct {
	s      *Survey
	assets map[string]*Asset                // by scopeName; the first of a name
	comps  map[*Asset]map[string]*Component // likewise, per asset
	placed map[*Component]Located           // an earlier component -> where its CMLs go
}

func newCarrier(s *Survey) *carrier {
	c := &carrier{s: s, assets: map[string]*Asset{}, comps: map[*Asset]map[string]*Component{}, placed: map[*Component]Located{}}
	for _, a := range s.Assets {
		if k := scopeName(a.Name); c.assets[k] == nil {
			c.assets[k] = a
		}
	}
	return c
}

// carryIn adds a CML of an earlier survey to s, under the asset and
// component of the same names, made (out of scope, with the earlier survey's
// design data) when s has none. The CML comes without readings; Merge adds
// them.
func (cr *carrier) carryIn(old Located) Located {
	at, ok := cr.placed[old.Component]
	if !ok {
		at = cr.place(old)
		cr.placed[old.Component] = at
	}
	at.CML = &CML{ID: old.CML.ID, File: old.CML.File, Line: old.CML.Line, Location: old.CML.Location, GPS: old.CML.GPS}
	at.Component.CMLs = append(at.Component.CMLs, at.CML)
	return at
}

// place finds or makes the asset and component of s an earlier CML goes under.
func (cr *carrier) place(old Located) Located {
	ak := scopeName(old.Asset.Name)
	a := cr.assets[ak]
	if a == nil {
		a = &Asset{Name: old.Asset.Name, Line: old.Asset.Line}
		cr.s.Assets = append(cr.s.Assets, a)
		cr.assets[ak] = a
	}
	comps := cr.comps[a]
	if comps == nil {
		comps = map[string]*Component{}
		for _, x := range a.Components {
			if k := scopeName(x.Name); comps[k] == nil {
				comps[k] = x
			}
		}
		cr.comps[a] = comps
	}
	ck := scopeName(old.Component.Name)
	c := comps[ck]
	if c == nil {
		d := old.Component.Design
		d.Lines = maps.Clone(d.Lines)
		c = &Component{Name: old.Component.Name, File: old.Component.File, Line: old.Component.Line, Asset: a.Name, Design: d, OutOfScope: true}
		a.Components = append(a.Components, c)
		comps[ck] = c
	}
	return Located{Asset: a, Component: c}
}
