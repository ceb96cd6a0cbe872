package main

import (
	"fmt"
	"slices"
	"strings"

	"go.yaml.in/yaml/v3"

	"github.com/lossline/lossline/intake"
)

// columnMap is the value of an import: setting: column headers by key.
type columnMap = map[string]string

// readColumns reads the key: header lines of a column map (import:): each
// key one of intake.MapKeys, each header a single text; points may be a
// list. Values are texts by key, points joined by commas.
func readColumns(path string, k settingKey, n *yaml.Node) (map[string]any, map[string]string, settingProblems) {
	columns, places := map[string]any{}, map[string]string{}
	if n.Kind != yaml.MappingNode {
		msg := k.Name + " must be key: column header lines under it (reading: Thk)"
		if n.Tag == "!!null" {
			msg = k.Name + " " + scalarProblem(n)
		}
		return columns, places, settingProblems{{Where: path, Line: n.Line, Msg: msg}}
	}
	var problems settingProblems
	add := func(n *yaml.Node, format string, args ...any) {
		problems = append(problems, settingProblem{Where: path, Line: n.Line, Msg: fmt.Sprintf(format, args...)})
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		kn, vn := n.Content[i], resolveAlias(n.Content[i+1])
		key := strings.ToLower(kn.Value)
		switch {
		case !slices.Contains(intake.MapKeys, key):
			add(kn, "%s: unknown key %q (known: %s)", k.Name, kn.Value, strings.Join(intake.MapKeys, ", "))
			continue
		case places[key] != "":
			add(kn, "%s: %s is set twice", k.Name, key)
			continue
		}
		text, why := "", scalarProblem(vn)
		if key == "points" && vn.Kind == yaml.SequenceNode {
			var names []string
			why = ""
			for _, p := range vn.Content {
				p = resolveAlias(p)
				if w := scalarProblem(p); w != "" {
					why = "items " + w
					break
				}
				names = append(names, p.Value)
			}
			text = strings.Join(names, ", ")
		} else if why == "" {
			text = vn.Value
		}
		if why == "" && strings.TrimSpace(text) == "" {
			why = "is empty"
		}
		if why != "" {
			add(vn, "%s: %s %s", k.Name, key, why)
			continue
		}
		columns[key], places[key] = text, place(path, vn.Line)
	}
	return columns, places, problems
}
