package survey

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey/wallloss"
)

// writeChecklist writes src as root/name/survey.md and returns the folder.
func writeChecklist(t *testing.T, root, name, src string) string {
	t.Helper()
	dir := filepath.Join(root, name)
	if err := os.MkdirAll(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "survey.md"), []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	return dir
}

// twoTanks is an earlier survey of two tanks, one component each.
const twoTanks = `---
title: y2021
site: Test yard
date: 2021-05-01
inspector: i
units: mm
---
# Tank A

## Course 1

- nominal: 10
- required: 5

| CML | 2016-05-01 | 2021-05-01 |
|---|---|---|
| A-1 | 9.8 | 9.5 |
| A-2 | 9.7 | 9.4 |

# Tank B

## Shell

- nominal: 8
- required: 4

| CML | 2016-05-01 | 2021-05-01 |
|---|---|---|
| B-1 | 7.9 | 7.6 |
`

// A visit that covers only Tank A: Tank B's CML is carried in out of scope,
// neither dropped nor not re-measured; a Tank A CML no longer listed is dropped.
func TestScopeCarriesOtherAssetsOutOfScope(t *testing.T) {
	root := t.TempDir()
	writeChecklist(t, root, "y2021", twoTanks)
	dir := writeChecklist(t, root, "y2026", `---
title: y2026
site: Test yard
date: 2026-05-01
inspector: i
units: mm
previous: ../y2021
scope: Tank A
---
# Tank A

## Course 1

| CML | 2026-05-01 |
|---|---|
| A-1 | 9.2 |
`)
	s, problems := LoadSeries(dir, nil, DefaultOptions)
	if len(problems) != 0 {
		t.Fatalf("problems:\n%s", problemText(problems))
	}
	if len(s.History.Dropped) != 1 || s.History.Dropped[0].ID != "A-2" {
		t.Errorf("dropped %+v, want A-2 only", s.History.Dropped)
	}
	var b *Located
	for _, loc := range s.AllCMLs() {
		if loc.CML.ID == "B-1" {
			b = &loc
		}
	}
	if b == nil || !b.Component.OutOfScope || b.Asset.Name != "Tank B" || len(b.CML.Visits) != 2 || b.Component.Design.RequiredMM == nil {
		t.Fatalf("B-1 not carried in out of scope with its visits and design: %+v", b)
	}
	if b.CML.File != filepath.Join(root, "y2021", "survey.md") || b.CML.Line != 29 {
		t.Errorf("B-1 comes from %s:%d", b.CML.File, b.CML.Line)
	}
	items := Assess(s, wallloss.DefaultPolicy)
	changes := Changes(s, items, IndexPhotos(s), wallloss.DefaultPolicy, 25)
	for i, it := range items {
		r, codes := it.Result, changes[i].Codes
		switch it.CML.ID {
		case "B-1":
			if !r.HasFlag(wallloss.FlagOutOfScope) || r.HasFlag(wallloss.FlagNotMeasuredLatest) || !Has(codes, ChangeOutOfScope) || Has(codes, ChangeNotRemeasured) {
				t.Errorf("B-1 flags %v changes %v: want out-of-scope, not not-remeasured", r.Flags, codes)
			}
			if r.RateMMPerY == nil || r.RemainingLifeY == nil {
				t.Errorf("B-1 is not assessed from its earlier readings: %+v", r)
			}
		case "A-1":
			if r.FromEarlierVisit() || Has(codes, ChangeOutOfScope) {
				t.Errorf("A-1 flags %v changes %v", r.Flags, codes)
			}
		}
	}
}

// A component the survey lists but its scope leaves out: out of scope, not
// re-measured neither; a reading of this visit there is warned about.
func TestScopeOfComponents(t *testing.T) {
	root := t.TempDir()
	dir := writeChecklist(t, root, "y2026", `---
title: y2026
site: Test yard
date: 2026-05-01
inspector: i
units: mm
scope:
  - tank a /  course 1
---
# Tank A

## Course 1

- nominal: 10
- required: 5

| CML | 2021-05-01 | 2026-05-01 |
|---|---|---|
| A-1 | 9.5 | 9.2 |

## Course 2

- nominal: 10
- required: 5

| CML | 2021-05-01 | 2026-05-01 |
|---|---|---|
| A-5 | 9.5 |  |
| A-6 | 9.5 | 9.3 |
`)
	s, problems := LoadSeries(dir, nil, DefaultOptions)
	want := filepath.Join(dir, "survey.md") + `:29: warning: CML A-6 has readings of this visit, but "Tank A / Course 2" is outside the front matter's scope`
	if len(problems) != 1 || !strings.HasPrefix(problems[0].String(), want) {
		t.Fatalf("problems:\n%swant one starting %q", problemText(problems), want)
	}
	comps := s.Assets[0].Components
	if comps[0].OutOfScope || !comps[1].OutOfScope {
		t.Errorf("out of scope: course 1 %v, course 2 %v", comps[0].OutOfScope, comps[1].OutOfScope)
	}
	for _, it := range Assess(s, wallloss.DefaultPolicy) {
		if got := it.Result.HasFlag(wallloss.FlagOutOfScope); got != (it.CML.ID == "A-5") || it.Result.HasFlag(wallloss.FlagNotMeasuredLatest) {
			t.Errorf("%s flags %v", it.CML.ID, it.Result.Flags)
		}
	}
}

// A scope entry that names nothing of the survey is an error at its line.
func TestScopeEntryMustNameAnAssetOrComponent(t *testing.T) {
	root := t.TempDir()
	dir := writeChecklist(t, root, "bad", `---
title: bad
site: Test yard
date: 2026-05-01
inspector: i
units: mm
scope:
  - Tank A
  - Tank  B / Shel
---
# Tank A

## Course 1

| CML | 2026-05-01 |
|---|---|
| A-1 | 9.2 |

# Tank B

## Shell

| CML | 2026-05-01 |
|---|---|
| B-1 | 7.2 |
`)
	_, problems := Load(dir)
	want := filepath.Join(dir, "survey.md") + `:9: scope: "Tank  B / Shel" is not an asset or ` + "`asset / component`" + ` of this survey (did you mean "Tank B / Shell"?)`
	var errs []string
	for _, p := range problems {
		if p.Severity == Error {
			errs = append(errs, p.String())
		}
	}
	if !slices.Equal(errs, []string{want}) {
		t.Errorf("errors %q\nwant %q", errs, want)
	}
}
