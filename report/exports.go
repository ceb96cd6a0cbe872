package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"strconv"
	"strings"

	"github.com/lossline/lossline/survey"
)

// JSON renders results.json, indented, ending in a newline.
func JSON(r Results) ([]byte, error) {
	b, err := json.MarshalIndent(r, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// CSV renders results.csv: one row per CML in rank order, thicknesses and
// rates in the survey's display units, named in each header.
func CSV(r Results, units survey.Unit) ([]byte, error) {
	u := string(units)
	header := []string{"rank", "asset", "component", "cml", "location", "latitude", "longitude", "thickness_date",
		"thickness_" + u, "required_" + u, "nominal_" + u,
		"rate_long_" + u + "_per_y", "rate_short_" + u + "_per_y", "rate_" + u + "_per_y",
		"remaining_life_y", "retirement_date", "next_inspection", "next_inspection_basis", "consequence", "flags", "photos"}
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	_ = w.Write(header)
	thick := func(v *float64) string {
		if v == nil {
			return ""
		}
		return strconv.FormatFloat(units.FromMM(*v), 'f', units.Decimals()+1, 64)
	}
	rate := func(v *float64) string {
		if v == nil {
			return ""
		}
		return strconv.FormatFloat(units.FromMM(*v), 'f', units.Decimals()+3, 64)
	}
	for _, it := range r.Items {
		_ = w.Write([]string{
			strconv.Itoa(it.Rank), it.Asset, it.Component, it.CML, it.Location,
			num(it.Latitude, 6), num(it.Longitude, 6), str(it.ThicknessDate),
			thick(it.ThicknessMM), thick(it.RequiredMM), thick(it.NominalMM),
			rate(it.RateLongMMPerY), rate(it.RateShortMMPerY), rate(it.RateMMPerY),
			num(it.RemainingLifeY, 2), str(it.RetirementDate), str(it.NextInspection), str(it.NextInspectionWhy),
			str(it.Consequence), strings.Join(it.Flags, " "), strings.Join(it.Photos, " "),
		})
	}
	w.Flush()
	return b.Bytes(), w.Error()
}

func num(v *float64, d int) string {
	if v == nil {
		return ""
	}
	return strconv.FormatFloat(*v, 'f', d, 64)
}

func str(s *string) string {
	if s == nil {
		return ""
	}
	return *s
}
