package survey

import (
	"sort"
	"strings"
)

// designKeyAliases are other names inspectors give the design keys.
var designKeyAliases = map[string]string{
	"nominal thickness":          "nominal",
	"nominal wall":               "nominal",
	"nominal wall thickness":     "nominal",
	"t nom":                      "nominal",
	"required thickness":         "required",
	"minimum thickness":          "required",
	"min thickness":              "required",
	"minimum required thickness": "required",
	"minimum required":           "required",
	"t min":                      "required",
	"retirement thickness":       "required",
	"installation date":          "installed",
	"install date":               "installed",
	"date installed":             "installed",
	"installed date":             "installed",
	"consequence of failure":     "consequence",
	"cof":                        "consequence",
	"corrosion rate":             "assumed rate",
	"repair costs":               "repair cost",
	"cost":                       "repair cost",
}

// nearDesignKey returns the design key that key (lower case, single spaces) is
// most likely a slip for, or "" when it is far from every one: a known other
// name, or within two edits (one for keys of five letters or fewer), spaces
// left out or not.
func nearDesignKey(key string) string {
	squashed := strings.ReplaceAll(key, " ", "")
	for alias, k := range designKeyAliases {
		if squashed == strings.ReplaceAll(alias, " ", "") {
			return k
		}
	}
	known := make([]string, 0, len(designKeys))
	for k := range designKeys {
		known = append(known, k)
	}
	sort.Strings(known)
	best, bestD := "", 3
	for _, k := range known {
		limit := 2
		if len(k) <= 5 {
			limit = 1
		}
		d := min(editDistance(key, k), editDistance(squashed, strings.ReplaceAll(k, " ", "")))
		if d <= limit && d < bestD {
			best, bestD = k, d
		}
	}
	return best
}

// editDistance is the Levenshtein distance between a and b, in runes.
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
