package survey

import (
	"cmp"
	"math"
	"slices"
	"sort"
	"time"
)

// Placement bases: why a photo is where it is (stable codes for results).
const (
	PlacedNamed       = "named"
	PlacedNearestCML  = "nearest-cml"
	PlacedComponent   = "component-area"
	PlacedAsset       = "asset-area"
	UnplacedNoGPS     = "no-position"
	UnplacedTooFar    = "too-far"
	UnplacedAutoOff   = "auto-placement-off"
	UnplacedNoTargets = "no-cml-positions"
)

var basisWords = map[string]string{
	PlacedNamed:       "named in the checklist",
	PlacedNearestCML:  "nearest CML within the placement radius",
	PlacedComponent:   "within the area of the component's CMLs",
	PlacedAsset:       "within the area of the asset's CMLs",
	UnplacedNoGPS:     "not placed: no position in the photo",
	UnplacedTooFar:    "not placed: no CML, component or asset near it",
	UnplacedAutoOff:   "not placed: automatic placement is off",
	UnplacedNoTargets: "not placed: no CML of the survey has a position",
}

// Words says the basis in words.
func (p Placement) Words() string { return basisWords[p.Basis] }

// Placement is where a photo belongs and why.
type Placement struct {
	Asset, Component, CML string   // empty when not placed at that level
	DistanceM             *float64 // to the CML, or to the area's nearest position
	Basis                 string
}

// Placed reports whether the photo belongs to anything.
func (p Placement) Placed() bool { return p.Asset != "" }

// PlaceOptions are the settings of automatic placement.
type PlaceOptions struct {
	Auto        bool
	RadiusM     float64 // a photo within this distance of a CML goes to it
	AreaRadiusM float64 // margin around a component's or asset's CMLs
}

// DefaultPlaceOptions: 15 m covers the few metres of a phone's GPS error
// (common practice) without reaching the next CML on most assets; an area
// extends 50 m beyond a component's or asset's outermost CML.
var DefaultPlaceOptions = PlaceOptions{Auto: true, RadiusM: 15, AreaRadiusM: 50}

// positions are the CMLs with a gps position, in checklist order, indexed
// for placing photos: by latitude, so the nearest CML is found among those
// near the photo's latitude, and by component and asset for their areas,
// each worked out once.
type positions struct {
	pts    []positioned
	byLat  []int     // indexes into pts, by latitude
	lats   []float64 // their latitudes
	comps  map[*Component]*area
	assets map[*Asset]*area
}

type positioned struct {
	loc Located
	at  LatLon
}

// area is the circle about the centroid of some CML positions that holds
// them all; its points are kept until it is first used.
type area struct {
	points []LatLon
	center LatLon
	extent float64
}

func newPositions(s *Survey) *positions {
	ps := &positions{comps: map[*Component]*area{}, assets: map[*Asset]*area{}}
	for loc := range s.CMLs() {
		if loc.CML.GPS == nil {
			continue
		}
		p := *loc.CML.GPS
		ps.pts = append(ps.pts, positioned{loc, p})
		c, a := ps.comps[loc.Component], ps.assets[loc.Asset]
		if c == nil {
			c = &area{}
			ps.comps[loc.Component] = c
		}
		if a == nil {
			a = &area{}
			ps.assets[loc.Asset] = a
		}
		c.points, a.points = append(c.points, p), append(a.points, p)
	}
	ps.byLat = make([]int, len(ps.pts))
	for i := range ps.byLat {
		ps.byLat[i] = i
	}
	slices.SortFunc(ps.byLat, func(i, j int) int { return cmp.Compare(ps.pts[i].at.Lat, ps.pts[j].at.Lat) })
	ps.lats = make([]float64, len(ps.pts))
	for k, i := range ps.byLat {
		ps.lats[k] = ps.pts[i].at.Lat
	}
	return ps
}

// nearest returns the index in pts of the CML nearest to at, the first in
// checklist order of equally near ones, and its distance. It tries CMLs
// from at's latitude outwards and stops where the difference in latitude
// alone puts a CML further than the nearest found.
func (ps *positions) nearest(at LatLon) (int, float64) {
	best, bestD := -1, math.Inf(1)
	hi := sort.SearchFloat64s(ps.lats, at.Lat)
	lo := hi - 1
	for lo >= 0 || hi < len(ps.lats) {
		var k int
		if hi == len(ps.lats) || lo >= 0 && at.Lat-ps.lats[lo] <= ps.lats[hi]-at.Lat {
			k, lo = lo, lo-1
		} else {
			k, hi = hi, hi+1
		}
		if meridianM(ps.lats[k]-at.Lat) > bestD {
			break
		}
		i := ps.byLat[k]
		if d := DistanceM(at, ps.pts[i].at); d < bestD || d == bestD && i < best {
			best, bestD = i, d
		}
	}
	return best, bestD
}

// meridianM is a lower bound of the distance between two positions whose
// latitudes differ by dLat degrees: the length of that arc of a meridian,
// less a margin for rounding.
func meridianM(dLat float64) float64 {
	return EarthRadiusM*math.Abs(dLat)*math.Pi/180*(1-1e-9) - 1e-6
}

// distance is how far a position lies outside the area (0 inside).
func (a *area) distance(at LatLon) float64 {
	if a.points != nil {
		a.center = Centroid(a.points)
		for _, p := range a.points {
			a.extent = math.Max(a.extent, DistanceM(a.center, p))
		}
		a.points = nil
	}
	return math.Max(DistanceM(a.center, at)-a.extent, 0)
}

// PlacePhotos places every photo of s: a photo a CML names goes to that CML;
// another one goes by its GPS position to the nearest CML with a position
// within RadiusM, else to the nearest component, then asset, whose CMLs it is
// within AreaRadiusM of the area they span, else nowhere. It returns warnings
// for photos taken outside the survey days (front matter date and days).
func PlacePhotos(s *Survey, opt PlaceOptions) ProblemList {
	var problems ProblemList
	var ps *positions // made when the first photo is placed by position
	named := map[string]Located{}
	for loc := range s.CMLs() {
		for _, ref := range loc.CML.PhotoRefs {
			if _, ok := named[ref]; !ok {
				named[ref] = loc
			}
		}
	}
	first := s.Date
	last := s.Date.AddDate(0, 0, max(s.Days, 1))
	for _, ph := range s.Photos {
		if ph.Taken != nil && !s.Date.IsZero() {
			day := time.Date(ph.Taken.Year(), ph.Taken.Month(), ph.Taken.Day(), 0, 0, 0, 0, time.UTC)
			if day.Before(first) || !day.Before(last) {
				problems.Warnf(ph.Path, 0, "taken %s, outside the survey day(s) from %s: check the camera clock, or whether the photo belongs to this survey",
					ph.Taken.Format("2006-01-02 15:04"), s.Date.Format("2006-01-02"))
			}
		}
		if loc, ok := named[ph.Name]; ok {
			ph.Placement = Placement{Asset: loc.Asset.Name, Component: loc.Component.Name, CML: loc.CML.ID, Basis: PlacedNamed}
			if ph.GPS != nil && loc.CML.GPS != nil {
				d := DistanceM(*ph.GPS, *loc.CML.GPS)
				ph.Placement.DistanceM = &d
			}
			continue
		}
		switch {
		case !opt.Auto:
			ph.Placement = Placement{Basis: UnplacedAutoOff}
		case ph.GPS == nil:
			ph.Placement = Placement{Basis: UnplacedNoGPS}
		default:
			if ps == nil {
				ps = newPositions(s)
			}
			if len(ps.pts) == 0 {
				ph.Placement = Placement{Basis: UnplacedNoTargets}
				break
			}
			ph.Placement = ps.place(*ph.GPS, opt)
		}
	}
	return problems
}

// place places a photo at a position: on the nearest CML within RadiusM,
// else on the area of that CML's component, then of its asset, within
// AreaRadiusM.
func (ps *positions) place(at LatLon, opt PlaceOptions) Placement {
	best, bestD := ps.nearest(at)
	loc := ps.pts[best].loc
	if bestD <= opt.RadiusM {
		return Placement{Asset: loc.Asset.Name, Component: loc.Component.Name, CML: loc.CML.ID, DistanceM: &bestD, Basis: PlacedNearestCML}
	}
	// Areas: a component's (then an asset's) CML positions, grown by AreaRadiusM.
	if d := ps.comps[loc.Component].distance(at); d <= opt.AreaRadiusM {
		return Placement{Asset: loc.Asset.Name, Component: loc.Component.Name, DistanceM: &d, Basis: PlacedComponent}
	}
	if d := ps.assets[loc.Asset].distance(at); d <= opt.AreaRadiusM {
		return Placement{Asset: loc.Asset.Name, DistanceM: &d, Basis: PlacedAsset}
	}
	return Placement{Basis: UnplacedTooFar, DistanceM: &bestD}
}
