package survey

import (
	"fmt"
	"math"
	"path/filepath"
	"runtime"
	"slices"
	"strings"
)

// History is what earlier surveys of the same site add to the newest one.
type History struct {
	Earlier        []*Survey // earlier surveys, newest first
	Dropped        []DroppedCML
	DesignChanges  []DesignChange
	PreviousPhotos map[*CML][]*Photo // photos of a CML in the newest earlier survey that has any
}

// DroppedCML is a CML of an earlier survey that the newest one no longer lists.
type DroppedCML struct {
	ID, Asset, Component string
	Last                 Visit // its latest reading
}

// DesignChange is a nominal or required thickness that differs between surveys.
type DesignChange struct {
	Asset, Component, Field string
	OldMM, NewMM            float64
	OldFile                 string
	OldLine, NewLine        int
}

// LoadSeries reads a survey folder and the earlier surveys it names in its
// front matter (`previous:`, relative to the folder, followed recursively) and
// in extra (relative to the working directory), and merges their readings into
// the newest survey by CML id. Folders may be given in any order.
func LoadSeries(dir string, extra []string, opt Options) (*Survey, ProblemList) {
	return sorted(loadSeries(dir, extra, opt))
}

// loadSeries is LoadSeries before its problems are sorted.
func loadSeries(dir string, extra []string, opt Options) (*Survey, ProblemList) {
	s, problems := loadFolder(dir, opt)
	if s == nil || problems.HasErrors() {
		return s, problems
	}
	seen := map[string]bool{absPath(dir): true}
	var earlier []*Survey
	folder := func(base, d string) string {
		if base != "" && !filepath.IsAbs(d) {
			d = filepath.Join(base, d)
		}
		return FolderOf(d)
	}
	// Folders named together are read at the same time, a few at once, and
	// taken up in the order named, as if read one after the other.
	type read struct {
		s        *Survey
		problems ProblemList
	}
	pending := map[string]chan read{}
	defer func() {
		for _, ch := range pending { // named but not taken up: seen by another name
			<-ch
		}
	}()
	prefetch := func(base string, dirs ...[]string) {
		for _, list := range dirs {
			for _, d := range list {
				d = folder(base, d)
				if seen[absPath(d)] || pending[d] != nil || len(pending) >= runtime.GOMAXPROCS(0) {
					continue
				}
				ch := make(chan read, 1)
				pending[d] = ch
				go func() {
					e, p := loadFolder(d, opt)
					ch <- read{e, p}
				}()
			}
		}
	}
	load := func(d string) (*Survey, ProblemList) {
		if ch := pending[d]; ch != nil {
			delete(pending, d)
			r := <-ch
			return r.s, r.problems
		}
		return loadFolder(d, opt)
	}
	// visit loads the earlier surveys from names in dirs (relative to base) at
	// line; otherSite when they are named under previous-other-site:.
	var visit func(from *Survey, dirs []string, line int, base string, otherSite bool)
	visit = func(from *Survey, dirs []string, line int, base string, otherSite bool) {
		prefetch(base, dirs)
		for _, d := range dirs {
			d = folder(base, d)
			if seen[absPath(d)] {
				continue
			}
			seen[absPath(d)] = true
			e, p := load(d)
			if e == nil {
				problems.Errorf(from.File, line, "previous survey %s cannot be read", d)
				problems = append(problems, p...)
				continue
			}
			problems = append(problems, p...)
			if p.HasErrors() {
				continue
			}
			if !otherSite {
				problems = append(problems, sameSite(from, e, line)...)
			}
			earlier = append(earlier, e)
			visit(e, e.OtherSite, e.OtherSiteLine, e.Dir, true)
			visit(e, e.Previous, e.PrevLine, e.Dir, false)
		}
	}
	prefetch(dir, s.OtherSite, s.Previous)
	prefetch("", extra)
	visit(s, s.OtherSite, s.OtherSiteLine, dir, true)
	visit(s, s.Previous, s.PrevLine, dir, false)
	visit(s, extra, 0, "", false)
	if len(earlier) == 0 || !problems.HasErrors() {
		if len(earlier) > 0 {
			problems = append(problems, Merge(s, earlier)...)
		}
		problems = append(problems, requiredWarnings(s)...)
		problems = append(problems, plausibility(s)...)
		problems = append(problems, carryActions(s)...)
		problems = append(problems, earlierElectroWarnings(s)...)
		problems = append(problems, repairBeforeReadings(s)...)
	}
	problems = append(problems, readingChecks(s)...)
	if !problems.HasErrors() {
		problems = append(problems, PlacePhotos(s, opt.Place)...)
	}
	return s, problems
}

// readingChecks warns of CMLs without readings, or with readings older than
// the component, once every earlier survey is merged in.
func readingChecks(s *Survey) ProblemList {
	var problems ProblemList
	for loc := range s.CMLs() {
		m, d := loc.CML, loc.Component.Design
		if len(m.Visits) == 0 {
			problems.Warnf(m.File, m.Line, "CML %s has no readings", m.ID)
		} else if d.Installed != nil && m.Visits[0].Date.Time.Before(d.Installed.Time) {
			problems.Warnf(m.File, m.Line, "CML %s has a reading dated before the installed date %s", m.ID, d.Installed)
		}
	}
	return problems
}

func absPath(d string) string {
	a, err := filepath.Abs(d)
	if err != nil {
		return filepath.Clean(d)
	}
	return a
}

// Merge adds the readings of earlier surveys to s, matching CMLs by id or by
// an id listed in s's `was` column. The same visit in two files must hold the
// same readings. Design data missing from s is taken from the newest earlier
// survey that gives it; changed nominal or required thicknesses are recorded.
// A CML s does not list is dropped, unless s's scope leaves its asset or
// component out of this visit: then it is carried into s, out of scope.
func Merge(s *Survey, earlier []*Survey) ProblemList {
	var problems ProblemList
	slices.SortStableFunc(earlier, func(a, b *Survey) int { return b.Date.Compare(a.Date) })
	h := &History{Earlier: earlier, PreviousPhotos: map[*CML][]*Photo{}}
	s.History = h

	byID := make(map[string]Located, s.CMLCount())
	for loc := range s.CMLs() {
		byID[loc.CML.ID] = loc
	}
	for loc := range s.CMLs() {
		for _, old := range loc.CML.Was {
			if other, taken := byID[old]; taken && other.CML != loc.CML {
				problems.Errorf(s.File, loc.CML.Line, "CML %s was %s, but %s is still a CML of this survey (line %d)", loc.CML.ID, old, old, other.CML.Line)
				continue
			}
			byID[old] = loc
		}
	}
	for _, e := range earlier {
		if e.Date.After(s.Date) {
			problems.Errorf(s.File, s.PrevLine, "previous survey %s is dated %s, after this survey", e.File, e.Date.Format("2006-01-02"))
			continue
		}
	}
	predecessors := map[*Component][]*Component{}
	var last [2]*Component // the pair of components last recorded as predecessors
	dropped := map[string]bool{}
	scope := s.scope()
	covered := map[*Component]bool{} // earlier components the scope covers
	carry := newCarrier(s)
	for _, e := range earlier {
		var photos map[string]*Photo // e's photos by name, made when a CML names one
		for old := range e.CMLs() {
			cur, ok := byID[old.CML.ID]
			if !ok && len(old.CML.Visits) > 0 {
				in, known := covered[old.Component]
				if !known {
					in = scope.covers(old.Asset.Name, old.Component.Name)
					covered[old.Component] = in
				}
				if !in {
					cur, ok = carry.carryIn(old), true
					byID[old.CML.ID] = cur
				}
			}
			if !ok {
				if !dropped[old.CML.ID] && len(old.CML.Visits) > 0 {
					dropped[old.CML.ID] = true
					h.Dropped = append(h.Dropped, DroppedCML{ID: old.CML.ID, Asset: old.Asset.Name, Component: old.Component.Name,
						Last: old.CML.Visits[len(old.CML.Visits)-1]})
				}
				continue
			}
			if pair := [2]*Component{cur.Component, old.Component}; pair != last {
				if !slices.Contains(predecessors[cur.Component], old.Component) {
					predecessors[cur.Component] = append(predecessors[cur.Component], old.Component)
				}
				last = pair
			}
			problems = append(problems, mergeVisits(cur, old.CML)...)
			if _, have := h.PreviousPhotos[cur.CML]; !have && len(old.CML.PhotoRefs) > 0 {
				if photos == nil {
					photos = make(map[string]*Photo, len(e.Photos))
					for _, p := range e.Photos {
						photos[p.Name] = p
					}
				}
				h.PreviousPhotos[cur.CML] = photosNamed(photos, old.CML.PhotoRefs)
			}
		}
	}
	for loc := range s.CMLs() {
		if !slices.IsSortedFunc(loc.CML.Visits, compareVisitDates) {
			slices.SortStableFunc(loc.CML.Visits, compareVisitDates)
		}
		for _, v := range loc.CML.Visits {
			addVisitDate(loc.Component, v.Date)
		}
	}
	for _, a := range s.Assets {
		for _, c := range a.Components {
			h.DesignChanges = append(h.DesignChanges, inheritDesign(a, c, predecessors[c])...)
		}
	}
	return problems
}

// mergeVisits adds the visits of an earlier CML row to the current CML.
func mergeVisits(cur Located, old *CML) ProblemList {
	var problems ProblemList
	visitOn := func(v Visit) int {
		return slices.IndexFunc(cur.CML.Visits, func(x Visit) bool { return x.Date.Time.Equal(v.Date.Time) })
	}
	// Room for exactly the visits added: a CML of a long series grows once
	// per earlier survey, not by doubling.
	added := 0
	for _, v := range old.Visits {
		if visitOn(v) < 0 {
			added++
		}
	}
	if n := len(cur.CML.Visits); added > 0 && cap(cur.CML.Visits)-n < added {
		cur.CML.Visits = append(make([]Visit, 0, n+added), cur.CML.Visits...)
	}
	for _, v := range old.Visits {
		i := visitOn(v)
		if i < 0 {
			cur.CML.Visits = append(cur.CML.Visits, v)
			continue
		}
		have := cur.CML.Visits[i]
		if !sameReadings(have.ReadingsMM, v.ReadingsMM) {
			problems.Errorf(v.File, v.Line, "CML %s, visit %s: readings %s differ from %s at %s:%d",
				cur.CML.ID, v.Date, formatReadings(v.ReadingsMM), formatReadings(have.ReadingsMM), have.File, have.Line)
		}
	}
	return problems
}

func sameReadings(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	if len(a) == 1 {
		return !(math.Abs(a[0]-b[0]) > 1e-9)
	}
	a, b = slices.Clone(a), slices.Clone(b)
	slices.Sort(a)
	slices.Sort(b)
	for i := range a {
		if math.Abs(a[i]-b[i]) > 1e-9 {
			return false
		}
	}
	return true
}

func formatReadings(mm []float64) string {
	parts := make([]string, len(mm))
	for i, v := range mm {
		parts[i] = fmt.Sprintf("%.2f", v)
	}
	return strings.Join(parts, " ") + " mm"
}

func addVisitDate(c *Component, d VisitDate) {
	for _, v := range c.VisitDates {
		if v.Time.Equal(d.Time) {
			return
		}
	}
	c.VisitDates = append(c.VisitDates, d)
	slices.SortFunc(c.VisitDates, func(a, b VisitDate) int { return a.Time.Compare(b.Time) })
}

// photosNamed returns the photos of a survey, by name, that names name.
func photosNamed(byName map[string]*Photo, names []string) []*Photo {
	var out []*Photo
	for _, n := range names {
		if p := byName[n]; p != nil {
			out = append(out, p)
		}
	}
	return out
}

// inheritDesign fills c's missing design data from its predecessors (newest
// first) and reports nominal or required thicknesses that changed.
func inheritDesign(a *Asset, c *Component, preds []*Component) []DesignChange {
	var changes []DesignChange
	d := &c.Design
	for _, p := range preds {
		pd := p.Design
		if d.NominalMM == nil && pd.NominalMM != nil {
			d.NominalMM = pd.NominalMM
		}
		if d.Installed == nil && pd.Installed != nil {
			d.Installed = pd.Installed
		}
		if d.Consequence == ConsequenceUnknown {
			d.Consequence = pd.Consequence
		}
		if d.RequiredMM == nil && pd.RequiredMM != nil {
			d.RequiredMM, d.RequiredCalc = pd.RequiredMM, pd.RequiredCalc
		}
	}
	for _, field := range []string{"nominal", "required"} {
		cur := map[string]*float64{"nominal": d.NominalMM, "required": d.RequiredMM}[field]
		for _, p := range preds {
			old := map[string]*float64{"nominal": p.Design.NominalMM, "required": p.Design.RequiredMM}[field]
			if old == nil {
				continue
			}
			if cur != nil && math.Abs(*old-*cur) > designChangeMM {
				changes = append(changes, DesignChange{Asset: a.Name, Component: c.Name, Field: field, OldMM: *old, NewMM: *cur,
					OldFile: p.File, OldLine: p.Design.Lines[field], NewLine: d.Lines[field]})
			}
			break // compare with the newest earlier survey that gives it
		}
	}
	return changes
}

// designChangeMM is the smallest difference in nominal or required thickness
// reported as a change: half the 0.01 mm resolution thicknesses are shown
// with, so a value written in inches in one survey and millimetres in the
// next does not count as a change.
const designChangeMM = 0.005
