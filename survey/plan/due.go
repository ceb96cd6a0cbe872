package plan

import (
	"cmp"
	"fmt"
	"slices"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// DueKind is what falls due.
type DueKind string

// Kinds of due items.
const (
	DueBelowRequired DueKind = "below-required"  // at or below required: due since the reading
	DueRetirement    DueKind = "retirement"      // the retirement date
	DueInspection    DueKind = "next-inspection" // the next thickness inspection
	DueExternal      DueKind = "next-external"   // the next external inspection (API 653 shell)
	DueScopeItem     DueKind = "open-scope-item" // a scope checklist item not done at the survey
)

// Due is one thing overdue or due within the window, with where it comes from.
type Due struct {
	Date      time.Time
	Kind      DueKind
	Overdue   bool // before today
	Folder    string
	Asset     string
	Component string
	CML       string // "" for a component's item
	Detail    string
	File      string
	Line      int
}

// DueOf lists what of a survey is overdue on today or falls due by until:
// CMLs at or below required, retirement dates, next inspections (thickness
// and external) and scope checklist items not done (due since the survey's
// date). items are the survey's assessed CMLs; folder names it.
func DueOf(folder string, s *survey.Survey, items []*survey.Assessed, today, until time.Time) []Due {
	var out []Due
	add := func(d Due) {
		if d.Date.After(until) {
			return
		}
		d.Overdue = d.Date.Before(today)
		d.Folder = folder
		out = append(out, d)
	}
	for _, it := range items {
		r := it.Result
		base := Due{Asset: it.Asset.Name, Component: it.Component.Name, CML: it.CML.ID, File: it.CML.File, Line: it.CML.Line}
		if r.Class == wallloss.AtOrBelowRequired {
			d := base
			d.Date, d.Kind = *r.CurrentDate, DueBelowRequired
			d.Detail = fmt.Sprintf("%.2f mm at or below required %.2f mm since %s", *r.ThicknessMM, *r.RequiredMM(), r.CurrentDate.Format("2006-01-02"))
			add(d)
			continue
		}
		if r.Retirement != nil {
			d := base
			d.Date, d.Kind = *r.Retirement, DueRetirement
			d.Detail = fmt.Sprintf("reaches required %.2f mm (now %.2f mm)", *r.RequiredMM(), *r.ThicknessMM)
			add(d)
		}
		if r.NextInspection != nil {
			d := base
			d.Date, d.Kind, d.Detail = *r.NextInspection, DueInspection, "thickness inspection, set by: "+r.NextBasis.String()
			add(d)
		}
		if r.NextExternal != nil {
			d := base
			d.Date, d.Kind, d.Detail = *r.NextExternal, DueExternal, "external inspection ("+r.Rule.Code()+")"
			add(d)
		}
	}
	for _, a := range s.Assets {
		for _, c := range a.Components {
			for _, sc := range c.Scope {
				if !sc.Done {
					add(Due{Date: s.Date, Kind: DueScopeItem, Asset: a.Name, Component: c.Name, Detail: sc.Text, File: c.File, Line: sc.Line})
				}
			}
		}
	}
	return out
}

// SortDue orders due items by date, then folder, asset, component, CML and kind.
func SortDue(ds []Due) {
	slices.SortStableFunc(ds, func(a, b Due) int {
		return cmp.Or(a.Date.Compare(b.Date), cmp.Compare(a.Folder, b.Folder), cmp.Compare(a.Asset, b.Asset),
			cmp.Compare(a.Component, b.Component), cmp.Compare(a.CML, b.CML), cmp.Compare(a.Kind, b.Kind))
	})
}
