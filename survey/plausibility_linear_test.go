package survey

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"
	"time"

	"github.com/lossline/lossline/survey/wallloss"
)

// The plausibility passes judge each value against medians of the others
// found in lists sorted once; they must warn exactly as the checks'
// definitions do, written out here directly (each value against a median of
// a list of the others built and sorted anew): same warnings, same order.
// Sources: 3,000 seeded random components and assets with repeated values,
// slips of every kind, far positions and steps.
func TestPlausibilityAsDefined(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 5))
	warned := 0
	for i := range 3000 {
		s := randomPlausibilitySurvey(rng, 1+rng.IntN(12))
		got := plausibility(s)
		want := plausibilityDirect(s)
		if !slices.Equal(got, want) {
			t.Fatalf("survey %d:\ngot  %s\nwant %s", i, problemText(got), problemText(want))
		}
		warned += len(want)
	}
	if warned < 1000 {
		t.Fatalf("only %d warnings over all surveys: the sources do not exercise the checks", warned)
	}
}

// randomPlausibilitySurvey is an asset of two components of n CMLs each,
// with readings drawn from few values (ties), slips and steps, and gps
// positions some of which are slipped.
func randomPlausibilitySurvey(rng *rand.Rand, n int) *Survey {
	dates := []time.Time{
		time.Date(2011, 5, 1, 0, 0, 0, 0, time.UTC), time.Date(2016, 5, 1, 0, 0, 0, 0, time.UTC),
		time.Date(2021, 5, 1, 0, 0, 0, 0, time.UTC), time.Date(2026, 5, 1, 0, 0, 0, 0, time.UTC),
	}
	values := []float64{9.9, 9.5, 9.5, 8.0, 7.1, 5.0, 0.95, 99, 0.374}
	a := &Asset{Name: "A"}
	for k := range 2 {
		c := &Component{Name: fmt.Sprintf("C%d", k)}
		if rng.IntN(2) == 0 {
			nominal := 10.0
			c.Design.NominalMM = &nominal
		}
		for j := range n {
			m := &CML{ID: fmt.Sprintf("M%d-%d", k, j), File: "survey.md", Line: 10 + j}
			for d := range dates {
				if rng.IntN(4) == 0 {
					continue
				}
				var r []float64
				for range 1 + rng.IntN(3) {
					r = append(r, values[rng.IntN(len(values))])
				}
				m.Visits = append(m.Visits, Visit{Date: VisitDate{Time: dates[d]}, ReadingsMM: r, File: "survey.md", Line: 10 + j})
			}
			if rng.IntN(3) > 0 {
				p := LatLon{45.6 + 0.001*float64(rng.IntN(4)), -61.35 + 0.001*float64(rng.IntN(4))}
				switch rng.IntN(8) {
				case 0:
					p.Lon = -p.Lon
				case 1:
					p.Lat, p.Lon = p.Lon, p.Lat
				case 2:
					p.Lat += 0.3
				}
				m.GPS = &p
			}
			c.CMLs = append(c.CMLs, m)
		}
		a.Components = append(a.Components, c)
	}
	return &Survey{File: "survey.md", Units: MM, Assets: []*Asset{a}}
}

// plausibilityDirect is plausibility as defined, each median from a list of
// the other values made and sorted for it.
func plausibilityDirect(s *Survey) ProblemList {
	var problems ProblemList
	for _, a := range s.Assets {
		for _, c := range a.Components {
			slipped := map[*Visit]bool{}
			for _, m := range c.CMLs {
				for i := range m.Visits {
					v := &m.Visits[i]
					for j, r := range v.ReadingsMM {
						var refs []reference
						var others []float64
						lone := true
						for k, o := range m.Visits {
							if k != i {
								others = append(others, o.Governing())
								lone = lone && k > i
							}
						}
						for k, o := range v.ReadingsMM {
							if k != j {
								others = append(others, o)
							}
						}
						if len(others) > 1 || len(others) == 1 && !lone {
							refs = append(refs, reference{median(others), "other readings", len(others)})
						}
						if c.Design.NominalMM != nil {
							refs = append(refs, reference{*c.Design.NominalMM, "nominal", 1})
						}
						if msg := slip(s.Units, r, refs); msg != "" {
							slipped[v] = true
							problems.Warnf(v.File, v.Line, "CML %s, visit %s: reading %s %s", m.ID, v.Date, written(s.Units, r), msg)
						}
					}
				}
				problems = append(problems, growth(s, c, m, slipped)...)
			}
			problems = append(problems, stepsDirect(s, c, slipped)...)
			problems = append(problems, nominalOff(s, c, &plausibilityWork{}, slipped)...)
		}
		problems = append(problems, farPositionsDirect(a)...)
	}
	return problems
}

func stepsDirect(s *Survey, c *Component, slipped map[*Visit]bool) ProblemList {
	type interval struct {
		m          *CML
		from, to   *Visit
		lossMM, mm float64
	}
	var all []interval
	for _, m := range c.CMLs {
		for i := 1; i < len(m.Visits); i++ {
			a, b := &m.Visits[i-1], &m.Visits[i]
			y := wallloss.YearsBetween(a.Date.Time, b.Date.Time)
			if y <= 0 {
				continue
			}
			loss := a.Governing() - b.Governing()
			all = append(all, interval{m, a, b, loss, loss / y})
		}
	}
	var problems ProblemList
	for _, x := range all {
		if x.lossMM <= stepMinLossMM || slipped[x.from] || slipped[x.to] {
			continue
		}
		var others, own []float64
		for _, o := range all {
			switch {
			case o.m != x.m:
				others = append(others, o.mm)
			case o.to != x.to:
				own = append(own, o.mm)
			}
		}
		if len(others) < stepMinOthers {
			continue
		}
		med := median(others)
		if x.mm <= stepRatio*max(med, stepRateFloorMMPerY) || len(own) > 0 && x.mm <= stepRatio*median(own) {
			continue
		}
		problems.Warnf(x.to.File, x.to.Line, "CML %s, visit %s: %s %s lost since %s (%s), over %g times the median interval rate of the other CMLs of %q (%s): re-measure, or confirm the reading",
			x.m.ID, x.to.Date, s.Units.Format(x.lossMM), s.Units, x.from.Date, rateText(s.Units, x.mm), stepRatio, c.Name, rateText(s.Units, med))
	}
	return problems
}

func farPositionsDirect(a *Asset) ProblemList {
	var placed []*CML
	for _, c := range a.Components {
		for _, m := range c.CMLs {
			if m.GPS != nil {
				placed = append(placed, m)
			}
		}
	}
	var problems ProblemList
	for _, m := range placed {
		var others []LatLon
		for _, o := range placed {
			if o != m {
				others = append(others, *o.GPS)
			}
		}
		if len(others) < gpsMinOthers {
			continue
		}
		lat, lon := make([]float64, len(others)), make([]float64, len(others))
		for i, p := range others {
			lat[i], lon[i] = p.Lat, p.Lon
		}
		center := LatLon{median(lat), median(lon)}
		spread := make([]float64, len(others))
		for i, o := range others {
			spread[i] = DistanceM(o, center)
		}
		limit := max(gpsFarM, gpsSpreadFactor*median(spread))
		d := DistanceM(*m.GPS, center)
		if d <= limit {
			continue
		}
		var hint string
		best := math.Inf(1)
		for _, v := range positionSlips(*m.GPS) {
			if dv := DistanceM(v.p, center); dv <= limit && dv < best {
				best = dv
				hint = fmt.Sprintf("; with %s (%s) it would be %s from them", v.what, positionText(v.p), distanceText(dv))
			}
		}
		problems.Warnf(m.File, m.Line, "CML %s: gps %s is %s from the other CMLs of %q%s",
			m.ID, positionText(*m.GPS), distanceText(d), a.Name, hint)
	}
	return problems
}
