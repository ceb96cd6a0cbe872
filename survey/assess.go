package survey

import (
	"cmp"
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
// (see wallloss.CompareUrgency); CMLs of equal urgency keep checklist order.
func Assess(s *Survey, p wallloss.Policy) []*Assessed {
	latest := s.LatestVisit()
	if s.InDays(latest) {
		latest = s.Date // a reading on any of the survey's days belongs to this visit
	}
	block := make([]Assessed, 0, s.CMLCount())
	for loc := range s.CMLs() {
		in := inputFor(loc, loc.CML.Visits, latest)
		r := wallloss.Assess(in, p)
		nextByLocalDamage(loc.Component, &r)
		block = append(block, Assessed{Asset: loc.Asset, Component: loc.Component, CML: loc.CML, Result: r})
	}
	// Sort compact keys, not the results: checklist positions break ties.
	type entry struct {
		key wallloss.Ranked
		pos int
	}
	order := make([]entry, len(block))
	for i := range block {
		order[i] = entry{block[i].ranked(), i}
	}
	slices.SortFunc(order, func(a, b entry) int {
		if c := wallloss.CompareUrgency(a.key, b.key); c != 0 {
			return c
		}
		return cmp.Compare(a.pos, b.pos)
	})
	items := make([]*Assessed, len(order))
	for rank, e := range order {
		items[rank] = &block[e.pos]
		items[rank].Rank = rank + 1
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
	if d.Electro != nil {
		in.OtherRates, in.RateSource = d.Electro.OtherRates(), d.Electro.RateSource
	}
	in.Readings = make([]wallloss.Reading, len(visits))
	for i, v := range visits {
		in.Readings[i] = wallloss.Reading{Date: v.Date.Time, ThicknessMM: v.Governing()}
	}
	if e := RepairOf(loc.Component, loc.CML, latest); e != nil {
		in.Readings, in.Installed = afterRepair(in.Readings, e), &e.Date.Time
	}
	return in
}

func (a *Assessed) ranked() wallloss.Ranked {
	return withLocalDamage(a.Component, wallloss.RankedOf(&a.Result, int(a.Component.Design.Consequence), a.CML.ID))
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
