package survey

import (
	"slices"
	"time"

	"github.com/lossline/lossline/survey/wallloss"
)

// Assessed is one CML with its computed result and its place in the ranking.
type Assessed struct {
	Rank      int // 1 = most urgent
	Asset     *Asset
	Component *Component
	CML       *CML
	Result    wallloss.Result
}

// Assess computes every CML of the survey and ranks them, most urgent first
// (see wallloss.CompareUrgency).
func Assess(s *Survey, p wallloss.Policy) []*Assessed {
	latest := s.LatestVisit()
	if s.InDays(latest) {
		latest = s.Date // a reading on any of the survey's days belongs to this visit
	}
	var items []*Assessed
	for loc := range s.CMLs() {
		in := inputFor(loc, loc.CML.Visits, latest)
		items = append(items, &Assessed{Asset: loc.Asset, Component: loc.Component, CML: loc.CML, Result: wallloss.Assess(in, p)})
	}
	slices.SortStableFunc(items, func(a, b *Assessed) int { return wallloss.CompareUrgency(a.ranked(), b.ranked()) })
	for i, it := range items {
		it.Rank = i + 1
	}
	return items
}

// inputFor builds the computation's input for a CML from the given visits.
func inputFor(loc Located, visits []Visit, latest time.Time) wallloss.Input {
	d := loc.Component.Design
	in := wallloss.Input{
		NominalMM: d.NominalMM, RequiredMM: d.RequiredMM, LatestVisit: latest, OutOfScope: loc.Component.OutOfScope,
		RateModel: d.RateModel, Rule: d.Rule, AssumedRateMMPerY: d.AssumedRateMMPerY, Corrosivity: d.Corrosivity, Metal: d.Metal,
	}
	if d.Installed != nil {
		in.Installed = &d.Installed.Time
	}
	for _, v := range visits {
		in.Readings = append(in.Readings, wallloss.Reading{Date: v.Date.Time, ThicknessMM: v.Governing()})
	}
	return in
}

func (a *Assessed) ranked() wallloss.Ranked {
	return wallloss.Ranked{Result: a.Result, Consequence: int(a.Component.Design.Consequence), ID: a.CML.ID}
}

// LatestVisit is the newest visit date found in any reading table.
func (s *Survey) LatestVisit() time.Time {
	var t time.Time
	for loc := range s.CMLs() {
		for _, v := range loc.CML.Visits {
			if v.Date.Time.After(t) {
				t = v.Date.Time
			}
		}
	}
	return t
}
