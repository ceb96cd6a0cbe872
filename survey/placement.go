package survey

import (
	"math"
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

type positioned struct {
	loc Located
	at  LatLon
}

// PlacePhotos places every photo of s: a photo a CML names goes to that CML;
// another one goes by its GPS position to the nearest CML with a position
// within RadiusM, else to the nearest component, then asset, whose CMLs it is
// within AreaRadiusM of the area they span, else nowhere. It returns warnings
// for photos taken outside the survey days (front matter date and days).
func PlacePhotos(s *Survey, opt PlaceOptions) ProblemList {
	var problems ProblemList
	var pts []positioned
	for loc := range s.CMLs() {
		if loc.CML.GPS != nil {
			pts = append(pts, positioned{loc, *loc.CML.GPS})
		}
	}
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
		case len(pts) == 0:
			ph.Placement = Placement{Basis: UnplacedNoTargets}
		default:
			ph.Placement = placeByPosition(*ph.GPS, pts, opt)
		}
	}
	return problems
}

func placeByPosition(at LatLon, pts []positioned, opt PlaceOptions) Placement {
	best, bestD := -1, math.Inf(1)
	for i, p := range pts {
		if d := DistanceM(at, p.at); d < bestD {
			best, bestD = i, d
		}
	}
	loc := pts[best].loc
	if bestD <= opt.RadiusM {
		return Placement{Asset: loc.Asset.Name, Component: loc.Component.Name, CML: loc.CML.ID, DistanceM: &bestD, Basis: PlacedNearestCML}
	}
	// Areas: a component's (then an asset's) CML positions, grown by AreaRadiusM.
	if d, ok := areaDistance(at, pts, func(p positioned) bool { return p.loc.Component == loc.Component }); ok && d <= opt.AreaRadiusM {
		return Placement{Asset: loc.Asset.Name, Component: loc.Component.Name, DistanceM: &d, Basis: PlacedComponent}
	}
	if d, ok := areaDistance(at, pts, func(p positioned) bool { return p.loc.Asset == loc.Asset }); ok && d <= opt.AreaRadiusM {
		return Placement{Asset: loc.Asset.Name, DistanceM: &d, Basis: PlacedAsset}
	}
	return Placement{Basis: UnplacedTooFar, DistanceM: &bestD}
}

// areaDistance is how far a position lies outside the circle about the
// centroid of the selected CML positions that holds them all (0 inside).
func areaDistance(at LatLon, pts []positioned, in func(positioned) bool) (float64, bool) {
	var sel []LatLon
	for _, p := range pts {
		if in(p) {
			sel = append(sel, p.at)
		}
	}
	if len(sel) == 0 {
		return 0, false
	}
	c := Centroid(sel)
	var extent float64
	for _, p := range sel {
		extent = math.Max(extent, DistanceM(c, p))
	}
	return math.Max(DistanceM(c, at)-extent, 0), true
}
