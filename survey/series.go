package survey

import (
	"slices"
	"strings"
)

// seriesFrontMatter reads the front matter keys that tie this survey to
// others: the site's line, previous-other-site: and scope:.
func (r *checklistReader) seriesFrontMatter(m map[string]any) {
	s := r.survey
	if _, ok := m["site"]; ok {
		s.SiteLine = r.keyLine("site")
	}
	if v, ok := m["previous-other-site"]; ok && v != nil {
		s.OtherSiteLine = r.keyLine("previous-other-site")
		switch v := v.(type) {
		case string:
			s.OtherSite = []string{v}
		case []any:
			for _, x := range v {
				if str, ok := x.(string); ok && str != "" {
					s.OtherSite = append(s.OtherSite, str)
				} else {
					r.problems.Errorf(r.file, s.OtherSiteLine, "previous-other-site: %v is not a folder name", x)
				}
			}
		default:
			r.problems.Errorf(r.file, s.OtherSiteLine, "previous-other-site: give a folder or a list of folders")
		}
	}
	r.scopeKey(m)
}

// sameSite checks that an earlier survey e, named by survey from, is of the
// same site: the same site name (case and spacing aside; not judged when
// either has none) and at least one asset of the same name (not judged when
// either has no `#` heading, its one asset then being named by its title).
// line is where from names e (0 when a flag does).
func sameSite(from, e *Survey, line int) ProblemList {
	var problems ProblemList
	const fix = "; if it is the same site, name that folder under previous-other-site: in this survey's front matter"
	if a, b := siteName(from.Site), siteName(e.Site); a != "" && b != "" && a != b {
		problems.Errorf(from.File, from.SiteLine, "site %q differs from site %q of the previous survey %s at %s:%d%s",
			from.Site, e.Site, e.Dir, e.File, e.SiteLine, fix)
		return problems
	}
	if !namedAssets(from) || !namedAssets(e) {
		return nil
	}
	names := make(map[string]bool, len(e.Assets))
	for _, b := range e.Assets {
		names[siteName(b.Name)] = true
	}
	for _, a := range from.Assets {
		if names[siteName(a.Name)] {
			return nil
		}
	}
	problems.Errorf(from.File, line, "the previous survey %s shares no asset with this survey (here: %s; there: %s)%s",
		e.Dir, assetNames(from), assetNames(e), fix)
	return problems
}

func siteName(s string) string { return strings.ToLower(strings.Join(strings.Fields(s), " ")) }

// namedAssets reports whether the survey's assets come from `#` headings.
func namedAssets(s *Survey) bool {
	return len(s.Assets) > 0 && !slices.ContainsFunc(s.Assets, func(a *Asset) bool { return a.Line == 0 })
}

func assetNames(s *Survey) string {
	var names []string
	for _, a := range s.Assets {
		names = append(names, a.Name)
	}
	return strings.Join(names, ", ")
}
