package report

import (
	"fmt"

	"github.com/lossline/lossline/survey"
)

// PhotoList renders every file of the photos folder: time, position,
// orientation, where it was placed and how far, or why it was skipped.
func PhotoList(s *survey.Survey, asCSV bool) ([]byte, error) {
	header := []string{"file", "taken", "latitude", "longitude", "orientation", "placed_on", "distance_m", "basis"}
	var rows [][]string
	for _, ph := range s.Photos {
		taken, lat, lon, dist := "", "", "", ""
		if ph.Taken != nil {
			taken = ph.Taken.Format("2006-01-02 15:04:05")
		}
		if ph.GPS != nil {
			lat, lon = fmt.Sprintf("%.6f", ph.GPS.Lat), fmt.Sprintf("%.6f", ph.GPS.Lon)
		}
		pl := ph.Placement
		if pl.DistanceM != nil {
			dist = fmt.Sprintf("%.1f", *pl.DistanceM)
		}
		basis := pl.Basis
		if ph.Problem != "" {
			basis += " (" + ph.Problem + ")"
		}
		rows = append(rows, []string{ph.Name, taken, lat, lon, fmt.Sprint(ph.Orientation), placedOn(pl), dist, basis})
	}
	for _, sk := range s.Skipped {
		rows = append(rows, []string{sk.Name, "", "", "", "", "", "", "skipped: " + sk.Reason})
	}
	return textTable(header, rows, asCSV)
}

// placedOn names what a photo was placed on: "CML A-03", "Tank T-101 / Shell course 1", "Tank T-101".
func placedOn(pl survey.Placement) string {
	switch {
	case pl.CML != "":
		return "CML " + pl.CML
	case pl.Component != "":
		return pl.Asset + " / " + pl.Component
	}
	return pl.Asset
}
