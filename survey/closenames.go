package survey

import (
	"path"
	"slices"
	"strings"
	"unicode/utf8"
)

// closeNames returns up to n names of have that want was probably meant to
// be: the nearest of those within a few edits of it (case ignored; at most
// one edit per six characters, and at least 2), or with the same last path
// element in another folder, which counts as the most edits allowed.
func closeNames(want string, have []string, n int) []string {
	w := strings.ToLower(want)
	limit := max(2, utf8.RuneCountInString(w)/6)
	type near struct {
		name string
		d    int
	}
	var found []near
	for _, h := range have {
		l := strings.ToLower(h)
		d := editDistance(w, l)
		if d > limit && path.Base(l) == path.Base(w) {
			d = limit
		}
		if d <= limit {
			found = append(found, near{h, d})
		}
	}
	slices.SortStableFunc(found, func(a, b near) int {
		if a.d != b.d {
			return a.d - b.d
		}
		return strings.Compare(a.name, b.name)
	})
	var out []string
	for _, f := range found[:min(n, len(found))] {
		if f.d == found[0].d {
			out = append(out, f.name)
		}
	}
	return out
}

// CloseNames returns up to n names of have that want was probably meant to
// be, nearest first, by the rule of closeNames.
func CloseNames(want string, have []string, n int) []string { return closeNames(want, have, n) }

// didYouMean is " (did you mean a, b?)" for the names given, or "".
func didYouMean(names []string) string {
	if len(names) == 0 {
		return ""
	}
	return " (did you mean " + strings.Join(names, " or ") + "?)"
}

// editDistance is the Levenshtein distance between a and b in runes.
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}
