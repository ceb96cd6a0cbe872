package survey

import (
	"fmt"
	"math"
	"math/rand/v2"
	"reflect"
	"testing"
)

// Photos are placed through an index of the CML positions by latitude and
// areas worked out once; the placement must be the one the rule defines,
// written out here directly (every CML tried, every area made anew): the
// same CML, component or asset, the same distance, the first CML in
// checklist order of equally near ones. Sources: 2,000 seeded random sites
// with repeated positions, and photos on, near and far from them.
func TestPlacementAsDefined(t *testing.T) {
	rng := rand.New(rand.NewPCG(29, 3))
	opt := DefaultPlaceOptions
	bases := map[string]int{}
	for i := range 2000 {
		s := &Survey{}
		for a := range 1 + rng.IntN(3) {
			asset := &Asset{Name: fmt.Sprintf("A%d", a)}
			for c := range 1 + rng.IntN(3) {
				comp := &Component{Name: fmt.Sprintf("C%d", c)}
				for m := range rng.IntN(8) {
					cml := &CML{ID: fmt.Sprintf("M%d-%d-%d", a, c, m)}
					if rng.IntN(5) > 0 {
						p := LatLon{45.6 + 0.0002*float64(rng.IntN(20)) + 0.001*float64(a), -61.35 + 0.0002*float64(rng.IntN(20))}
						cml.GPS = &p
					}
					comp.CMLs = append(comp.CMLs, cml)
				}
				asset.Components = append(asset.Components, comp)
			}
			s.Assets = append(s.Assets, asset)
		}
		ps := newPositions(s)
		if len(ps.pts) == 0 {
			continue
		}
		for range 5 {
			at := ps.pts[rng.IntN(len(ps.pts))].at
			at.Lat += (rng.Float64() - 0.5) * 0.001 * float64(rng.IntN(8))
			at.Lon += (rng.Float64() - 0.5) * 0.001 * float64(rng.IntN(8))
			got, want := ps.place(at, opt), placeDirect(at, ps.pts, opt)
			if !reflect.DeepEqual(got, want) {
				t.Fatalf("site %d, photo at %v: placed %+v, want %+v", i, at, got, want)
			}
			bases[want.Basis]++
		}
	}
	for _, b := range []string{PlacedNearestCML, PlacedComponent, PlacedAsset, UnplacedTooFar} {
		if bases[b] < 50 {
			t.Errorf("only %d photos placed %s: %v", bases[b], b, bases)
		}
	}
}

// placeDirect is the placement rule as defined.
func placeDirect(at LatLon, pts []positioned, opt PlaceOptions) Placement {
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
	if d, ok := areaDistanceDirect(at, pts, func(p positioned) bool { return p.loc.Component == loc.Component }); ok && d <= opt.AreaRadiusM {
		return Placement{Asset: loc.Asset.Name, Component: loc.Component.Name, DistanceM: &d, Basis: PlacedComponent}
	}
	if d, ok := areaDistanceDirect(at, pts, func(p positioned) bool { return p.loc.Asset == loc.Asset }); ok && d <= opt.AreaRadiusM {
		return Placement{Asset: loc.Asset.Name, DistanceM: &d, Basis: PlacedAsset}
	}
	return Placement{Basis: UnplacedTooFar, DistanceM: &bestD}
}

func areaDistanceDirect(at LatLon, pts []positioned, in func(positioned) bool) (float64, bool) {
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
