package report

import (
	"encoding/json"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
)

// GeoJSONFile is the name of the locations export.
const GeoJSONFile = "locations.geojson"

type featureCollection struct {
	Type     string    `json:"type"`
	Features []feature `json:"features"`
}

type feature struct {
	Type       string         `json:"type"`
	Geometry   point          `json:"geometry"`
	Properties map[string]any `json:"properties"`
}

type point struct {
	Type        string     `json:"type"`
	Coordinates [2]float64 `json:"coordinates"` // longitude, latitude (RFC 7946 §3.1.1)
}

func pointAt(p survey.LatLon) point {
	return point{Type: "Point", Coordinates: [2]float64{p.Lon, p.Lat}}
}

// GeoJSON renders locations.geojson (RFC 7946, WGS 84, longitude first): a
// point per CML with a position, with its results, and a point per photo
// with a position, with its file, time and placement.
func GeoJSON(f *findings.Findings) ([]byte, error) {
	s := f.Survey
	fc := featureCollection{Type: "FeatureCollection", Features: []feature{}}
	for _, it := range f.Items {
		if it.CML.GPS == nil {
			continue
		}
		r := it.Result
		risk := f.Risk(it)
		props := map[string]any{
			"kind": "cml", "cml": it.CML.ID, "asset": it.Asset.Name, "component": it.Component.Name, "location": it.CML.Location,
			"rank": it.Rank, "repair_window": repairWindow(r), "thickness_mm": round(r.ThicknessMM, 4), "required_mm": round(it.Component.Design.RequiredMM, 4),
			"rate_mm_per_y": round(r.RateMMPerY, 6), "remaining_life_y": round(r.RemainingLifeY, 3),
			"retirement_date": dateOf(r.Retirement), "next_inspection": dateOf(r.NextInspection),
			"risk_level": risk.Level(), "risk_score": risk.Score(), "flags": codes(r.Flags),
		}
		fc.Features = append(fc.Features, feature{Type: "Feature", Geometry: pointAt(*it.CML.GPS), Properties: props})
	}
	for _, ph := range s.Photos {
		if ph.GPS == nil {
			continue
		}
		pl := ph.Placement
		props := map[string]any{"kind": "photo", "file": ph.Name, "taken": nil, "placed_on": placedOn(pl),
			"asset": pl.Asset, "component": pl.Component, "cml": pl.CML, "basis": pl.Basis, "distance_m": round(pl.DistanceM, 1)}
		if ph.Taken != nil {
			props["taken"] = ph.Taken.Format("2006-01-02T15:04:05")
		}
		fc.Features = append(fc.Features, feature{Type: "Feature", Geometry: pointAt(*ph.GPS), Properties: props})
	}
	b, err := json.MarshalIndent(fc, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}
