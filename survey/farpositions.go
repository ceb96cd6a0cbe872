package survey

import (
	"fmt"
	"math"
	"slices"
	"strconv"
)

// farPositions warns of CMLs whose gps position lies far from the median
// position of the asset's other CMLs (see gpsFarM), saying which slip —
// a changed sign, latitude and longitude swapped — would bring it near.
// Leaving one CML out moves the median position to one of a few places, so
// the distances to each such place are sorted once: n log n in the CMLs.
func farPositions(a *Asset) ProblemList {
	var placed []*CML
	for _, c := range a.Components {
		for _, m := range c.CMLs {
			if m.GPS != nil {
				placed = append(placed, m)
			}
		}
	}
	if len(placed)-1 < gpsMinOthers {
		return nil
	}
	lat, lon := make([]float64, len(placed)), make([]float64, len(placed))
	for i, m := range placed {
		lat[i], lon[i] = m.GPS.Lat, m.GPS.Lon
	}
	lats, lons := newSortedValues(lat), newSortedValues(lon)
	// spreads holds, per median position of the others, the distance of
	// every placed CML from it, and the same sorted.
	type spread struct {
		of     []float64 // of placed[i]
		sorted sortedValues
	}
	spreads := map[[2]uint64]spread{}
	var problems ProblemList
	for i, m := range placed {
		center := LatLon{lats.medianWithout(m.GPS.Lat), lons.medianWithout(m.GPS.Lon)}
		key := [2]uint64{math.Float64bits(center.Lat), math.Float64bits(center.Lon)}
		sp, ok := spreads[key]
		if !ok {
			sp.of = make([]float64, len(placed))
			for j, o := range placed {
				sp.of[j] = DistanceM(*o.GPS, center)
			}
			sp.sorted = newSortedValues(slices.Clone(sp.of))
			spreads[key] = sp
		}
		d := sp.of[i]
		limit := max(gpsFarM, gpsSpreadFactor*sp.sorted.medianWithout(d))
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

// positionSlip is a position as it would read had a typing slip not happened.
type positionSlip struct {
	what string
	p    LatLon
}

// positionSlips lists the positions p stands for under each slip: a sign
// changed, both signs changed, latitude and longitude swapped (with or
// without a sign changed). Swaps that give no valid latitude are left out.
func positionSlips(p LatLon) []positionSlip {
	out := []positionSlip{
		{"the longitude's sign changed", LatLon{p.Lat, -p.Lon}},
		{"the latitude's sign changed", LatLon{-p.Lat, p.Lon}},
		{"both signs changed", LatLon{-p.Lat, -p.Lon}},
	}
	if math.Abs(p.Lon) <= 90 {
		out = append(out,
			positionSlip{"latitude and longitude swapped", LatLon{p.Lon, p.Lat}},
			positionSlip{"latitude and longitude swapped and the longitude's sign changed", LatLon{p.Lon, -p.Lat}},
			positionSlip{"latitude and longitude swapped and the latitude's sign changed", LatLon{-p.Lon, p.Lat}},
			positionSlip{"latitude and longitude swapped and both signs changed", LatLon{-p.Lon, -p.Lat}},
		)
	}
	return out
}

func positionText(p LatLon) string {
	return strconv.FormatFloat(p.Lat, 'f', -1, 64) + ", " + strconv.FormatFloat(p.Lon, 'f', -1, 64)
}

func distanceText(m float64) string {
	switch {
	case m < 1000:
		return fmt.Sprintf("%.0f m", m)
	case m < 10000:
		return fmt.Sprintf("%.1f km", m/1000)
	}
	return fmt.Sprintf("%.0f km", m/1000)
}
