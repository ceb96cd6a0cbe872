package survey

import (
	"bytes"
	"errors"
	"fmt"
	"regexp"
	"slices"
	"sort"
	"strconv"
	"strings"
	"time"

	"github.com/yuin/goldmark"
	meta "github.com/yuin/goldmark-meta"
	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/extension"
	east "github.com/yuin/goldmark/extension/ast"
	"github.com/yuin/goldmark/parser"
	"github.com/yuin/goldmark/text"
	"github.com/yuin/goldmark/util"

	"github.com/lossline/lossline/internal/textfile"
	"github.com/lossline/lossline/survey/number"
	"github.com/lossline/lossline/survey/required"
	"github.com/lossline/lossline/survey/wallloss"
)

// markdown parses checklists: front matter, GFM tables (tableFinder) and task
// lists only (full GFM would also turn bare addresses in cells into links).
// The reader takes all text from the source, so of inline Markdown only the
// task list's check box is parsed.
var markdown = goldmark.New(
	goldmark.WithParser(parser.NewParser(
		parser.WithBlockParsers(parser.DefaultBlockParsers()...),
		parser.WithParagraphTransformers(append(parser.DefaultParagraphTransformers(), util.Prioritized(tableFinder{}, 200))...),
	)),
	goldmark.WithExtensions(meta.Meta, extension.TaskList),
)

// checklistReader holds the state of one ParseChecklist call.
type checklistReader struct {
	file     string
	src      []byte
	text     string // src as a string: cells, ids and names are parts of it
	lines    lineIndex
	survey   *Survey
	problems ProblemList
	asset    *Asset
	comp     *Component
	cmlLines map[string]int // CML id -> line of first use

	blocks       rowBlocks
	readings     []float64 // a cell's readings while it is read
	visitColumns int       // of the table being read
}

// ParseChecklist reads a survey.md, in UTF-8 (with or without a byte-order
// mark) or UTF-16 with a byte-order mark. It returns the survey and every
// problem found, in the order found; when the list holds an error the survey
// is incomplete. It computes nothing: a `required:` method is recorded with
// its inputs for ComputeRequired.
func ParseChecklist(file string, src []byte) (*Survey, ProblemList) {
	r := &checklistReader{
		file:   file,
		survey: &Survey{File: file, Units: MM},
	}
	src, _, line, problem := textfile.Decode(src)
	if problem != "" {
		r.problems.Errorf(file, line, "%s", problem)
		if src == nil {
			return r.survey, r.problems
		}
	}
	if p := checkLimits(file, src); p != nil {
		r.problems = append(r.problems, *p)
		return r.survey, r.problems
	}
	r.src = r.placeholders(src)
	r.text = string(r.src)
	r.lines = newLineIndex(r.src)
	ctx := parser.NewContext()
	doc := markdown.Parser().Parse(text.NewReader(r.src), parser.WithContext(ctx))
	r.frontMatter(ctx)
	rows := 0 // of the tables at the margin, to size the index of CML ids
	for n := doc.FirstChild(); n != nil; n = n.NextSibling() {
		if t, ok := n.(*tableBlock); ok {
			rows += len(t.rows) - 1
		}
	}
	r.cmlLines = make(map[string]int, rows)
	for n := doc.FirstChild(); n != nil; n = n.NextSibling() {
		r.block(n)
	}
	r.finish()
	r.checkInstrumentNames()
	r.checkRepairs()
	r.checkActionCMLs()
	return r.survey, r.problems
}

func (r *checklistReader) lineOf(n ast.Node) int {
	if n.Type() == ast.TypeBlock && n.Lines().Len() > 0 {
		return r.lines.line(n.Lines().At(0).Start)
	}
	return r.lines.line(min(n.Pos(), len(r.src)))
}

// frontMatterKeys are the keys the front matter may hold.
var frontMatterKeys = []string{"title", "site", "date", "inspector", "units", "previous", "days", "previous-other-site", "scope"}

func (r *checklistReader) frontMatter(ctx parser.Context) {
	s := r.survey
	if !bytes.HasPrefix(r.src, []byte("---")) {
		r.problems.Errorf(r.file, 1, "no front matter: the checklist must open with a line `---`, then title, site, date, inspector and units, then `---`")
		return
	}
	m, err := meta.TryGet(ctx)
	if err != nil {
		line, msg := 1, err.Error()
		if sub := yamlLine.FindStringSubmatch(msg); sub != nil {
			n, _ := strconv.Atoi(sub[1])
			line = min(n+1, len(r.lines)) // yaml counts from the line after the opening ---
			msg = strings.Replace(msg, sub[0], "", 1)
		}
		r.problems.Errorf(r.file, line, "front matter: %s", strings.TrimPrefix(msg, "yaml: "))
		return
	}
	get := func(key string) (string, int, bool) {
		v, ok := m[key]
		if !ok || v == nil {
			return "", r.keyLine(key), false
		}
		return strings.TrimSpace(fmt.Sprint(v)), r.keyLine(key), true
	}
	var ok bool
	var line int
	if s.Title, line, ok = get("title"); !ok || s.Title == "" {
		r.problems.Errorf(r.file, line, "front matter has no title")
	}
	if s.Site, line, ok = get("site"); !ok || s.Site == "" {
		r.problems.Warnf(r.file, line, "front matter has no site")
	}
	if s.Inspector, line, ok = get("inspector"); !ok || s.Inspector == "" {
		r.problems.Warnf(r.file, line, "front matter has no inspector")
	}
	date, line, ok := get("date")
	if !ok {
		r.problems.Errorf(r.file, line, "front matter has no date (this visit, e.g. 2026-11-30)")
	} else if t, err := parseFrontMatterDate(date); err != nil {
		if why := visitDateMistake(date); why != "" {
			r.problems.Errorf(r.file, line, "date %q is not an ISO 8601 date: %s", date, why)
		} else {
			r.problems.Errorf(r.file, line, "date %q is not an ISO 8601 date such as 2026-11-30", date)
		}
	} else {
		s.Date = t
	}
	units, line, ok := get("units")
	if !ok {
		r.problems.Errorf(r.file, line, "front matter has no units (mm or in)")
	} else if u, known := ParseUnit(units); !known {
		r.problems.Errorf(r.file, line, "unknown units %q (use mm or in)", units)
	} else {
		s.Units = u
	}
	s.Days = 1
	if days, line, ok := get("days"); ok {
		n, err := strconv.Atoi(days)
		if err != nil || n < 1 || n > 60 {
			r.problems.Errorf(r.file, line, "days: %q is not a number of survey days from 1 to 60", days)
		} else {
			s.Days = n
		}
	}
	if prev, ok := m["previous"]; ok && prev != nil {
		s.PrevLine = r.keyLine("previous")
		switch p := prev.(type) {
		case string:
			s.Previous = []string{p}
		case []any:
			for _, x := range p {
				if str, ok := x.(string); ok && str != "" {
					s.Previous = append(s.Previous, str)
				} else {
					r.problems.Errorf(r.file, s.PrevLine, "previous: %v is not a folder name", x)
				}
			}
		default:
			r.problems.Errorf(r.file, s.PrevLine, "previous: give a folder or a list of folders")
		}
	}
	r.seriesFrontMatter(m)
	r.documentFrontMatter(m)
	var unknown []string
	for k := range m {
		if !slices.Contains(frontMatterKeys, k) && !slices.Contains(documentKeys, k) {
			unknown = append(unknown, k)
		}
	}
	sort.Strings(unknown)
	for _, k := range unknown {
		r.problems.Warnf(r.file, r.keyLine(k), "front matter key %q is not used", k)
	}
}

var yamlLine = regexp.MustCompile(`line (\d+): `)

// keyLine finds the line of `key:` in the front matter, or 1.
func (r *checklistReader) keyLine(key string) int {
	i := 0
	for l := range strings.Lines(r.text) {
		top := !strings.HasPrefix(l, " ") && !strings.HasPrefix(l, "\t") // not a key of a nested entry
		l = strings.TrimSpace(l)
		if i > 0 && l == "---" {
			break
		}
		if top && strings.HasPrefix(l, key) && strings.HasPrefix(l[len(key):], ":") {
			return i + 1
		}
		i++
	}
	return 1
}

func parseFrontMatterDate(s string) (time.Time, error) {
	if len(s) >= 10 {
		if t, err := time.Parse("2006-01-02", s[:10]); err == nil && (len(s) == 10 || s[10] == 'T' || s[10] == ' ') {
			return t, nil
		}
	}
	return time.Time{}, fmt.Errorf("bad date")
}

func (r *checklistReader) block(n ast.Node) {
	switch n := n.(type) {
	case *ast.Heading:
		r.heading(n)
	case *ast.List:
		r.list(n)
	case *tableBlock:
		r.table(n)
	case *ast.Paragraph:
		if r.pipeRows(n) {
			return
		}
		r.note(Note{Markdown: r.inlineSource(n), Line: r.lineOf(n)})
	case *ast.Blockquote:
		for c := n.FirstChild(); c != nil; c = c.NextSibling() {
			r.block(c)
		}
	case *ast.CodeBlock:
		if n.Lines().Len() > 0 {
			if first := n.Lines().At(0); strings.HasPrefix(strings.TrimSpace(string(first.Value(r.src))), "|") {
				r.problems.Errorf(r.file, r.lineOf(n), "these | rows are indented by four spaces or a tab, which makes them a code block, not a table: start them at the margin")
				return
			}
		}
		r.note(Note{Markdown: "`" + strings.TrimSpace(r.inlineSource(n)) + "`", Line: r.lineOf(n)})
	case *ast.FencedCodeBlock, *ast.HTMLBlock:
		r.note(Note{Markdown: "`" + strings.TrimSpace(r.inlineSource(n)) + "`", Line: r.lineOf(n)})
	}
}

// pipeRows reports a paragraph that opens with a `|` line: rows that did not
// become a table, so their CMLs would be lost as a note.
func (r *checklistReader) pipeRows(p *ast.Paragraph) bool {
	if p.Lines().Len() == 0 {
		return false
	}
	first := p.Lines().At(0)
	if !strings.HasPrefix(strings.TrimSpace(string(first.Value(r.src))), "|") {
		return false
	}
	line := r.lineOf(p)
	cells := splitRow(nil, string(first.Value(r.src)))
	header := len(cells) > 0 && strings.EqualFold(cells[0], "cml")
	if _, after := p.PreviousSibling().(*tableBlock); after && !header {
		r.problems.Errorf(r.file, line, "these | rows are not part of the table above: a blank line ends a table")
	} else {
		r.problems.Errorf(r.file, line, "these | rows are not a table: under the header row write a separator row with one cell per column, such as |---|---|")
	}
	return true
}

func (r *checklistReader) heading(h *ast.Heading) {
	name := strings.TrimSpace(r.inlineSource(h))
	line := r.lineOf(h)
	switch h.Level {
	case 1:
		r.asset = &Asset{Name: name, Line: line}
		r.survey.Assets = append(r.survey.Assets, r.asset)
		r.comp = nil
	case 2:
		a := r.currentAsset()
		r.comp = &Component{Name: name, File: r.file, Line: line, Asset: a.Name, Design: Design{Lines: map[string]int{}}}
		a.Components = append(a.Components, r.comp)
	default:
		r.note(Note{Markdown: "**" + name + "**", Line: line})
	}
}

// currentAsset returns the asset being read, creating the one named by the
// title when the checklist has no `#` heading.
func (r *checklistReader) currentAsset() *Asset {
	if r.asset == nil {
		r.asset = &Asset{Name: r.survey.Title}
		r.survey.Assets = append(r.survey.Assets, r.asset)
	}
	return r.asset
}

func (r *checklistReader) note(n Note) {
	switch {
	case r.comp != nil:
		r.comp.Notes = append(r.comp.Notes, n)
	case r.asset != nil:
		r.asset.Notes = append(r.asset.Notes, n)
	default:
		r.survey.Notes = append(r.survey.Notes, n)
	}
}

// inlineSource returns the Markdown source of a block's lines, joined by spaces.
func (r *checklistReader) inlineSource(n ast.Node) string {
	var parts []string
	lines := n.Lines()
	for i := 0; i < lines.Len(); i++ {
		seg := lines.At(i)
		parts = append(parts, strings.TrimSpace(string(seg.Value(r.src))))
	}
	return strings.Join(parts, " ")
}

var designItem = regexp.MustCompile(`^\s*([A-Za-z][A-Za-z ]*?)\s*:\s*(.*?)\s*$`)

func (r *checklistReader) list(l *ast.List) {
	for item := l.FirstChild(); item != nil; item = item.NextSibling() {
		for c := item.FirstChild(); c != nil; c = c.NextSibling() {
			switch c := c.(type) {
			case *ast.List:
				if r.localInputs(c) {
					continue
				}
				if r.comp != nil && r.comp.Design.RequiredMethod != "" && c.PreviousSibling() != nil &&
					r.lineOf(c.PreviousSibling()) == r.comp.Design.Lines["required"] {
					r.methodInputs(c)
					continue
				}
				r.list(c)
			case *ast.TextBlock, *ast.Paragraph:
				r.listText(c)
			default:
				r.block(c)
			}
		}
	}
}

func (r *checklistReader) listText(block ast.Node) {
	line := r.lineOf(block)
	src := r.inlineSource(block)
	if box, ok := block.FirstChild().(*east.TaskCheckBox); ok {
		text := strings.TrimSpace(src[strings.Index(src, "]")+1:])
		if r.comp == nil {
			r.problems.Warnf(r.file, line, "scope item outside a ## component: shown as a note")
			r.note(Note{Markdown: src, Bullet: true, Line: line})
			return
		}
		r.comp.Scope = append(r.comp.Scope, ScopeItem{Text: text, Done: box.IsChecked, Line: line})
		return
	}
	if r.actionLine(src, line) {
		return
	}
	if r.comp != nil {
		if m := designItem.FindStringSubmatch(src); m != nil {
			key := strings.ToLower(strings.Join(strings.Fields(m[1]), " "))
			if _, known := designKeys[key]; known {
				r.design(key, m[2], line)
				return
			}
			if near := nearDesignKey(key); near != "" {
				r.problems.Errorf(r.file, line, "unknown design key `%s`: did you mean `%s`? (to keep the line as a note, write it without the colon)", strings.TrimSpace(m[1]), near)
				return
			}
		}
	}
	r.note(Note{Markdown: src, Bullet: true, Line: line})
}

// methodInputs reads the nested `name: value` list under `required: METHOD`.
func (r *checklistReader) methodInputs(l *ast.List) {
	d := &r.comp.Design
	for item := l.FirstChild(); item != nil; item = item.NextSibling() {
		block := item.FirstChild()
		if block == nil {
			continue
		}
		line := r.lineOf(block)
		m := designItem.FindStringSubmatch(r.inlineSource(block))
		if m == nil {
			r.problems.Errorf(r.file, line, "input of %s: write it as `name: value`", d.RequiredMethod)
			continue
		}
		key := strings.ToLower(strings.Join(strings.Fields(m[1]), " "))
		if slices.ContainsFunc(d.RequiredInputs, func(in MethodInput) bool { return in.Name == key }) {
			r.problems.Errorf(r.file, line, "input %q given twice", key)
			continue
		}
		d.RequiredInputs = append(d.RequiredInputs, MethodInput{Name: key, Value: m[2], Line: line})
	}
}

// design reads one `key: value` item of the component's design list.
func (r *checklistReader) design(key, value string, line int) {
	d := &r.comp.Design
	if first, dup := d.Lines[key]; dup && key != "repaired" {
		r.problems.Errorf(r.file, line, "%s given twice in %q (first at line %d)", key, r.comp.Name, first)
		return
	}
	d.Lines[key] = line
	if err := designKeys[key](d, value, r.survey.Units); err != nil {
		r.problems.Errorf(r.file, line, "%v", err)
	}
}

// designKeys maps each key of a component's design list to the function that
// reads its value into the design; units is the unit of a bare number.
var designKeys = map[string]func(d *Design, value string, units Unit) error{
	"nominal": func(d *Design, value string, units Unit) error {
		v, err := ParseThickness(value, units)
		if err != nil {
			return thicknessError("nominal", value, err, "")
		}
		d.NominalMM = &v
		return nil
	},
	"required": func(d *Design, value string, units Unit) error {
		v, err := ParseThickness(value, units)
		if err == nil {
			d.RequiredMM = &v
			return nil
		}
		if first, _, _ := strings.Cut(strings.TrimSpace(value), " "); first == "" || strings.ContainsAny(first, "0123456789") {
			return thicknessError("required", value, err, " or a method ("+strings.Join(required.Methods, ", ")+")")
		}
		d.RequiredMethod = value
		return nil
	},
	"installed": func(d *Design, value string, _ Unit) error {
		dt, ok := ParseVisitDate(value)
		if !ok {
			if why := visitDateMistake(value); why != "" {
				return fmt.Errorf("installed: %q is not a date: %s", value, why)
			}
			return fmt.Errorf("installed: %q is not a date such as 2009-06-30 or 2009-06", value)
		}
		if y := dt.Time.Year(); y < minVisitYear {
			return fmt.Errorf("installed: year %d is before %d", y, minVisitYear)
		}
		d.Installed = &dt
		return nil
	},
	"consequence": func(d *Design, value string, _ Unit) error {
		c, ok := ParseConsequence(value)
		if !ok {
			return fmt.Errorf("consequence: %q is not very low, low, medium, high or very high", value)
		}
		d.Consequence = c
		return nil
	},
	"rate model": func(d *Design, value string, _ Unit) error {
		m, err := wallloss.ParseRateModel(value)
		d.RateModel = m
		return err
	},
	"assumed rate": func(d *Design, value string, units Unit) error {
		v, err := ParseRate(value, units)
		if err != nil {
			return fmt.Errorf("assumed rate: %w", err)
		}
		d.AssumedRateMMPerY = &v
		return nil
	},
	"corrosivity": func(d *Design, value string, _ Unit) error {
		c, err := wallloss.ParseCorrosivity(value)
		if err != nil {
			return err
		}
		d.Corrosivity = c
		return nil
	},
	"metal": func(d *Design, value string, _ Unit) error {
		m := strings.ToLower(strings.Join(strings.Fields(value), " "))
		if !slices.Contains(wallloss.Metals, m) {
			return fmt.Errorf("metal %q: the atmospheric model covers %s", value, strings.Join(wallloss.Metals, " and "))
		}
		d.Metal = m
		return nil
	},
	"interval rule": func(d *Design, value string, _ Unit) error {
		rule, err := wallloss.ParseIntervalRule(value)
		if err != nil {
			return err
		}
		d.Rule = &rule
		return nil
	},
	"repair cost": func(d *Design, value string, _ Unit) error {
		// The number reader names the usual slips (decimal comma, NaN, a
		// letter for a digit); the exact reading to the cent follows.
		if _, err := number.ParseMoney(value); err != nil {
			return fmt.Errorf("repair cost: %w", err)
		}
		v, err := ParseCost(value)
		if err != nil {
			return fmt.Errorf("repair cost: %q is %w", value, err)
		}
		d.RepairCost = &v
		return nil
	},
	"repair": func(d *Design, value string, _ Unit) error {
		f := strings.Fields(value)
		if len(f) != 2 {
			return errors.New("repair: write a quantity and a priced item of the settings, e.g. `40 recoat-m2`")
		}
		q, err := ParseAmount(f[0])
		if err != nil {
			return fmt.Errorf("repair: %w", err)
		}
		d.RepairQuantity, d.RepairItem = q, strings.ToLower(f[1])
		return nil
	},
	"instrument": readInstrumentKey,
	"repaired":   readRepairKey,
	"repair thickness": func(d *Design, value string, units Unit) error {
		v, err := ParseThickness(value, units)
		if err != nil {
			return thicknessError("repair thickness", value, err, "")
		}
		d.RepairThicknessMM = &v
		return nil
	},
}

// thicknessError explains why the value of a design key is not a thickness:
// the reason the number reader gives, or what a thickness looks like (and
// what else the key takes, in alternatives).
func thicknessError(key, value string, err error, alternatives string) error {
	if ne := (*number.Error)(nil); !errors.As(err, &ne) || ne.Why != "" {
		return fmt.Errorf("%s: %v", key, err)
	}
	return fmt.Errorf("%s: %q is not a thickness (a number, optionally followed by mm or in)%s", key, value, alternatives)
}

// ParseConsequence reads very low, low, medium, high or very high.
func ParseConsequence(s string) (Consequence, bool) {
	s = strings.Join(strings.Fields(strings.ToLower(s)), " ")
	for i, name := range consequenceNames {
		if i > 0 && s == name {
			return Consequence(i), true
		}
	}
	return ConsequenceUnknown, false
}
