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
	"replaced":                   "repaired",
	"replaced on":                "repaired",
	"repaired on":                "repaired",
	"repair date":                "repaired",
	"date repaired":              "repaired",
	"galvanizing thickness":      "zinc thickness",
	"galvanising thickness":      "zinc thickness",
	"dft":                        "dft readings",
	"dry film thickness":         "dft readings",
	"gauge":                      "instrument",
	"instrument serial":          "instrument",
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
