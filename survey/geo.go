package survey

import "math"

// EarthRadiusM is the mean Earth radius (IUGG, R1 = 6 371 008.8 m).
const EarthRadiusM = 6371008.8

// DistanceM is the great-circle distance between two positions by the
// haversine formula on a sphere of the mean radius; over the few hundred
// metres of a site its difference from the WGS 84 ellipsoid is under 0.5 %.
func DistanceM(a, b LatLon) float64 {
	φ1, φ2 := a.Lat*math.Pi/180, b.Lat*math.Pi/180
	dφ, dλ := φ2-φ1, (b.Lon-a.Lon)*math.Pi/180
	h := math.Sin(dφ/2)*math.Sin(dφ/2) + math.Cos(φ1)*math.Cos(φ2)*math.Sin(dλ/2)*math.Sin(dλ/2)
	return 2 * EarthRadiusM * math.Asin(math.Min(1, math.Sqrt(h)))
}

// LocalPlane is an equirectangular projection about an origin: x east and y
// north in metres. Over a few kilometres its scale error is of the order of
// the latitude span times tan(latitude), well under 0.5 % for a site.
type LocalPlane struct{ Origin LatLon }

// XY projects a position onto the plane.
func (p LocalPlane) XY(q LatLon) (x, y float64) {
	φ0 := p.Origin.Lat * math.Pi / 180
	x = EarthRadiusM * (q.Lon - p.Origin.Lon) * math.Pi / 180 * math.Cos(φ0)
	y = EarthRadiusM * (q.Lat - p.Origin.Lat) * math.Pi / 180
	return x, y
}

// Centroid is the mean of positions (fine over a site, not across the antimeridian).
func Centroid(ps []LatLon) LatLon {
	var c LatLon
	for _, p := range ps {
		c.Lat += p.Lat
		c.Lon += p.Lon
	}
	n := float64(len(ps))
	return LatLon{c.Lat / n, c.Lon / n}
}
