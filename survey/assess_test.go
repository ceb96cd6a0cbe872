package survey

import (
	"math"
	"path/filepath"
	"slices"
	"testing"

	"gonum.org/v1/gonum/stat"

	"github.com/lossline/lossline/survey/wallloss"
)

// Demo CMLs recomputed by hand from the API 570 §7.1.1 formulas, with day
// counts taken from a calendar (python3 datetime) and years = days/365.25.
func TestAssessDemoByHand(t *testing.T) {
	s, problems := LoadSeries(filepath.Join("..", "testdata", "demo"), nil, DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	items := Assess(s, wallloss.DefaultPolicy)
	byID := map[string]*Assessed{}
	for _, it := range items {
		byID[it.CML.ID] = it
	}
	check := func(id, what string, got *float64, want float64) {
		t.Helper()
		if got == nil || math.Abs(*got-want) > 1e-6*math.Max(1, math.Abs(want)) {
			t.Errorf("%s %s = %v, want %.9g", id, what, got, want)
		}
	}
	// T1-04: 12.20 (2014-09-10), 11.48 (2019-09-12), 10.41 (2026-11-18); required
	// 9.1424 mm (API 653, see TestParseDemo). 4452 and 2624 days.
	lt, st := (12.20-10.41)/(4452/365.25), (11.48-10.41)/(2624/365.25)
	req := *byID["T1-04"].Component.Design.RequiredMM
	check("T1-04", "long-term rate", byID["T1-04"].Result.RateLongMMPerY, lt)
	check("T1-04", "short-term rate", byID["T1-04"].Result.RateShortMMPerY, st)
	check("T1-04", "remaining life", byID["T1-04"].Result.RemainingLifeY, (10.41-req)/st)
	// month 2012-04 taken as 2012-04-15 (5330 days to 2026-11-18); rate model
	// fit: the least-squares slope, here from gonum as the independent reference.
	lt = (8.05 - 5.71) / (5330 / 365.25)
	check("A-01", "long-term rate", byID["A-01"].Result.RateLongMMPerY, lt)
	xs := []float64{0, 1843.0 / 365.25, 3677.0 / 365.25, 5330.0 / 365.25} // days from 2012-04-15
	_, slope := stat.LinearRegression(xs, []float64{8.05, 7.40, 6.62, 5.71}, nil, false)
	check("A-01", "fitted rate", byID["A-01"].Result.RateMMPerY, -slope)
	check("A-01", "remaining life", byID["A-01"].Result.RemainingLifeY, (5.71-3.8)/-slope)
	// N5-01: one visit; nominal 8.56 at installed 2021-05 (2021-05-15, 2013 days).
	lt = (8.56 - 8.12) / (2013 / 365.25)
	check("N5-01", "nominal-based long-term rate", byID["N5-01"].Result.RateMMPerY, lt)
	check("N5-01", "remaining life", byID["N5-01"].Result.RemainingLifeY, (8.12-3.9)/lt)
	if !byID["N5-01"].Result.HasFlag(wallloss.FlagNominalBased) {
		t.Error("N5-01 not flagged nominal-based")
	}
	// A-03 (governing 3.62 of 3.62 3.70) is below required 3.8: rank 1.
	if items[0].CML.ID != "A-03" || !items[0].Result.HasFlag(wallloss.FlagBelowRequired) {
		t.Errorf("rank 1 is %s %v, want A-03 below-required", items[0].CML.ID, items[0].Result.Flags)
	}
	if !byID["T2-02"].Result.HasFlag(wallloss.FlagThicknessIncrease) {
		t.Error("T2-02 not flagged thickness-increase")
	}
	if !slices.Contains(byID["G2-03"].Result.Flags, wallloss.FlagNotMeasuredLatest) {
		t.Errorf("G2-03 flags %v lack %s", byID["G2-03"].Result.Flags, wallloss.FlagNotMeasuredLatest)
	}
	for i, it := range items {
		if it.Rank != i+1 {
			t.Fatalf("rank %d at position %d", it.Rank, i)
		}
	}
}
