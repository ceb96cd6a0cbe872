package main

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"

	"go.yaml.in/yaml/v3"
)

// fileSettings are the values a settings file gives, each read as its
// setting's kind, by key ("unit-costs" holds a map[string]any of float64), and the
// place of each as file:line (unit-costs items as "unit-costs.ITEM").
type fileSettings struct {
	Values map[string]any
	Places map[string]string
}

// readSettingsFile reads a YAML settings file. Every key must be known and
// every value of its setting's kind and range; the problems name file:line.
func readSettingsFile(path string) (fileSettings, settingProblems) {
	out := fileSettings{Values: map[string]any{}, Places: map[string]string{}}
	data, why := readSmallFile(path)
	if why != "" {
		return out, settingProblems{{Where: path, Msg: why}}
	}
	var doc yaml.Node
	if err := yaml.Unmarshal(data, &doc); err != nil {
		line, msg := yamlFailure(err)
		return out, settingProblems{{Where: path, Line: line, Msg: "not valid YAML: " + msg}}
	}
	if len(doc.Content) == 0 { // empty, or comments only
		return out, nil
	}
	top := resolveAlias(doc.Content[0])
	if top.Kind != yaml.MappingNode {
		// An empty document after --- is placed on the line after the file's last.
		line := min(top.Line, yamlLines(data))
		return out, settingProblems{{Where: path, Line: line, Msg: "settings must be key: value lines"}}
	}
	var problems settingProblems
	add := func(n *yaml.Node, format string, args ...any) {
		problems = append(problems, settingProblem{Where: path, Line: n.Line, Msg: fmt.Sprintf(format, args...)})
	}
	seen := map[string]int{}
	for i := 0; i+1 < len(top.Content); i += 2 {
		kn, vn := top.Content[i], resolveAlias(top.Content[i+1])
		name := strings.ToLower(kn.Value)
		k, ok := lookupSetting(name)
		if !ok {
			add(kn, "unknown setting %q (known: %s)", kn.Value, strings.Join(settingNames(), ", "))
			continue
		}
		if first, twice := seen[name]; twice {
			add(kn, "%s is set twice (first on line %d)", name, first)
			continue
		}
		seen[name] = kn.Line
		if k.Kind == kindColMap {
			columns, places, ps := readColumns(path, k, vn)
			problems = append(problems, ps...)
			out.Values[name] = columns
			for key, place := range places {
				out.Places[name+"."+key] = place
			}
			continue
		}
		if k.Kind == kindPrices {
			prices, places, ps := readPrices(path, k, vn)
			problems = append(problems, ps...)
			out.Values[name] = prices
			for item, place := range places {
				out.Places[name+"."+item] = place
			}
			continue
		}
		if why := scalarProblem(vn); why != "" {
			add(vn, "%s %s", name, why)
			continue
		}
		v, why := k.read(vn.Value, filepath.Dir(path))
		if why != "" {
			add(vn, "%s %s", name, why)
			continue
		}
		out.Values[name] = v
		out.Places[name] = place(path, vn.Line)
	}
	return out, problems
}

// readPrices reads the item: amount lines of a prices setting.
func readPrices(path string, k settingKey, n *yaml.Node) (map[string]any, map[string]string, settingProblems) {
	prices, places := map[string]any{}, map[string]string{}
	if n.Kind != yaml.MappingNode {
		msg := k.Name + " must be item: price lines under it (pipe-m: 950)"
		if n.Tag == "!!null" {
			msg = k.Name + " " + scalarProblem(n)
		}
		return prices, places, settingProblems{{Where: path, Line: n.Line,
			Msg: msg}}
	}
	var problems settingProblems
	price := k // each item is an amount in the currency
	price.Kind = kindMoney
	for i := 0; i+1 < len(n.Content); i += 2 {
		kn, vn := n.Content[i], resolveAlias(n.Content[i+1])
		item := strings.ToLower(kn.Value)
		if _, twice := places[item]; twice {
			problems = append(problems, settingProblem{Where: path, Line: kn.Line, Msg: fmt.Sprintf("%s: %s is priced twice", k.Name, item)})
			continue
		}
		why := scalarProblem(vn)
		var v any
		if why == "" {
			v, why = price.read(vn.Value, "")
		}
		if why != "" {
			problems = append(problems, settingProblem{Where: path, Line: vn.Line, Msg: fmt.Sprintf("%s: %s %s", k.Name, item, why)})
			continue
		}
		prices[item] = v
		places[item] = place(path, vn.Line)
	}
	return prices, places, problems
}

// scalarProblem says why a node is not a single value, or "".
func scalarProblem(n *yaml.Node) string {
	switch {
	case n.Kind == yaml.MappingNode:
		return "must be a single value, not key: value lines"
	case n.Kind == yaml.SequenceNode:
		return "must be a single value, not a list"
	case n.Tag == "!!null":
		return "has no value (leave the key out for the default)"
	}
	return ""
}

func resolveAlias(n *yaml.Node) *yaml.Node {
	for n.Kind == yaml.AliasNode && n.Alias != nil {
		n = n.Alias
	}
	return n
}

// yamlLines is the number of lines of data as YAML counts them: lines end at
// CR LF, CR, LF, NEL, LS or PS (YAML 1.1 §5.4, line break characters).
func yamlLines(data []byte) int {
	s := strings.NewReplacer("\r\n", "\n", "\r", "\n", "\u0085", "\n", "\u2028", "\n", "\u2029", "\n").Replace(string(data))
	return strings.Count(s, "\n") + 1
}

// place is file:line.
func place(path string, line int) string { return path + ":" + strconv.Itoa(line) }

// yamlLine finds the line in the YAML library's error text, which has no
// structured form: "yaml: line 3: mapping values are not allowed ...".
var yamlLine = regexp.MustCompile(`^yaml: line (\d+): (.*)$`)

// yamlFailure is the line and message of a YAML syntax error.
func yamlFailure(err error) (int, string) {
	msg := err.Error()
	if m := yamlLine.FindStringSubmatch(msg); m != nil {
		line, _ := strconv.Atoi(m[1])
		return line, m[2]
	}
	return 0, strings.TrimPrefix(msg, "yaml: ")
}

// maxSettingsBytes is the largest settings file read; a real one is a few
// hundred bytes.
const maxSettingsBytes = 1 << 20

// readSmallFile reads a settings file after checking from its size and type
// that reading ends (a pipe or a device would block or never end), or says
// in words why it cannot.
func readSmallFile(path string) ([]byte, string) {
	st, err := os.Stat(path)
	switch {
	case err != nil:
		return nil, readFailure(err)
	case !st.Mode().IsRegular():
		return nil, "settings file cannot be read: not a regular file"
	case st.Size() > maxSettingsBytes:
		return nil, fmt.Sprintf("settings file is %d bytes, more than the %d MiB lossline reads", st.Size(), maxSettingsBytes>>20)
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, readFailure(err)
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, maxSettingsBytes+1))
	switch {
	case err != nil:
		return nil, readFailure(err)
	case len(data) > maxSettingsBytes:
		return nil, fmt.Sprintf("settings file grew past the %d MiB lossline reads while being read", maxSettingsBytes>>20)
	}
	return data, ""
}

// readFailure says in words why a file could not be read.
func readFailure(err error) string {
	var pe *fs.PathError
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return "settings file not found"
	case errors.Is(err, fs.ErrPermission):
		return "settings file cannot be read: permission denied"
	case errors.As(err, &pe):
		return "settings file cannot be read: " + pe.Err.Error()
	}
	return "settings file cannot be read"
}
