package survey

import (
	"math"
	"strings"
	"testing"
	"time"

	"github.com/golang/geo/s2"
)

// DistanceM against the S2 geometry library's great-circle angle (an
// independent implementation) times the same mean Earth radius, and against
// the nautical mile: 1' of latitude ≈ 1852 m (within 0.1 % on the mean sphere).
func TestDistanceAgainstS2(t *testing.T) {
	pairs := [][2]LatLon{
		{{45.60238, -61.35078}, {45.60231, -61.35102}},
		{{45.6, -61.35}, {45.61, -61.33}},
		{{-33.8688, 151.2093}, {-33.8700, 151.2100}},
		{{60.0, 10.0}, {60.02, 10.05}},
	}
	for _, p := range pairs {
		want := s2.LatLngFromDegrees(p[0].Lat, p[0].Lon).Distance(s2.LatLngFromDegrees(p[1].Lat, p[1].Lon)).Radians() * EarthRadiusM
		if got := DistanceM(p[0], p[1]); math.Abs(got-want) > 1e-6*want+1e-6 {
			t.Errorf("%v: %.4f m, S2 %.4f m", p, got, want)
		}
	}
	if d := DistanceM(LatLon{45, -61}, LatLon{45 + 1.0/60, -61}); math.Abs(d-1852)/1852 > 1e-3 {
		t.Errorf("one minute of latitude = %.2f m, want about 1852 m", d)
	}
}

// The site plan's local plane keeps distances within 0.5 % over a few km,
// checked against the great-circle distance at 60° N (worse than most sites).
func TestLocalPlaneAccuracy(t *testing.T) {
	o := LatLon{60, 10}
	plane := LocalPlane{Origin: o}
	for _, q := range []LatLon{{60.02, 10}, {60, 10.05}, {60.015, 10.04}, {59.98, 9.96}} {
		x, y := plane.XY(q)
		flat, sphere := math.Hypot(x, y), DistanceM(o, q)
		if math.Abs(flat-sphere)/sphere > 0.005 {
			t.Errorf("%v: plane %.1f m, sphere %.1f m", q, flat, sphere)
		}
	}
}

// north moves a position d metres north.
func north(p LatLon, d float64) LatLon {
	return LatLon{p.Lat + d/EarthRadiusM*180/math.Pi, p.Lon}
}

func TestPlacePhotos(t *testing.T) {
	a1, a2, b1 := LatLon{45.60238, -61.35078}, LatLon{45.60218, -61.35096}, LatLon{45.60000, -61.34000}
	day := time.Date(2026, 11, 18, 10, 0, 0, 0, time.UTC)
	comp := &Component{Name: "Course 1", CMLs: []*CML{
		{ID: "A1", GPS: &a1, PhotoRefs: []string{"named.jpg"}}, {ID: "A2", GPS: &a2},
	}}
	other := &Component{Name: "Line", CMLs: []*CML{{ID: "B1", GPS: &b1}}}
	s := &Survey{Date: day.Truncate(24 * time.Hour), Days: 1, Assets: []*Asset{
		{Name: "Tank", Components: []*Component{comp}}, {Name: "Pipe", Components: []*Component{other}},
	}}
	late := day.AddDate(0, 0, 2)
	photo := func(name string, at *LatLon, taken time.Time) *Photo {
		return &Photo{Name: name, Path: "photos/" + name, GPS: at, Taken: &taken}
	}
	near := north(a1, 10)
	mid := LatLon{(a1.Lat + a2.Lat) / 2, (a1.Lon+a2.Lon)/2 + 0.0004} // about 30 m from both CMLs
	far := north(b1, 3000)
	s.Photos = []*Photo{
		photo("named.jpg", &far, day), photo("near.jpg", &near, day), photo("area.jpg", &mid, day),
		photo("far.jpg", &far, day), photo("nogps.jpg", nil, late),
	}
	problems := PlacePhotos(s, PlaceOptions{Auto: true, RadiusM: 15, AreaRadiusM: 50})
	got := map[string]Placement{}
	for _, p := range s.Photos {
		got[p.Name] = p.Placement
	}
	if p := got["named.jpg"]; p.Basis != PlacedNamed || p.CML != "A1" {
		t.Errorf("named: %+v", p)
	}
	if p := got["near.jpg"]; p.Basis != PlacedNearestCML || p.CML != "A1" || math.Abs(*p.DistanceM-10) > 0.01 {
		t.Errorf("10 m north of A1: %+v (distance %v)", p, *p.DistanceM)
	}
	if p := got["area.jpg"]; p.Basis != PlacedComponent || p.Component != "Course 1" || p.CML != "" {
		d := DistanceM(mid, a1)
		t.Errorf("between the course's CMLs, %.1f m from A1: %+v", d, p)
	}
	if p := got["far.jpg"]; p.Placed() || p.Basis != UnplacedTooFar {
		t.Errorf("3 km away: %+v", p)
	}
	if p := got["nogps.jpg"]; p.Basis != UnplacedNoGPS {
		t.Errorf("no GPS: %+v", p)
	}
	if len(problems) != 1 || !strings.Contains(problems[0].String(), "nogps.jpg") || !strings.Contains(problems[0].Message, "outside the survey day") {
		t.Errorf("time warnings: %v", problems)
	}
	// Automatic placement off: only the named photo is placed.
	PlacePhotos(s, PlaceOptions{Auto: false})
	if s.Photos[1].Placement.Basis != UnplacedAutoOff || s.Photos[0].Placement.Basis != PlacedNamed {
		t.Errorf("auto off: %+v / %+v", s.Photos[1].Placement, s.Photos[0].Placement)
	}
}
