package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"strconv"
	"strings"
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
// rates in the display units, named in each header.
func CSV(r Results, disp Display) ([]byte, error) {
	u := units{disp.Thickness, disp.Rate}
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	_ = w.Write(csvHeader(u))
	for _, it := range r.Items {
		_ = w.Write(csvRow(u, it))
	}
	w.Flush()
	return b.Bytes(), w.Error()
}

// csvHeader is the header row of results.csv.
func csvHeader(u units) []string {
	tu := string(u.u)
	ru := map[string]string{"mm/y": "mm_per_y", "in/y": "in_per_y", "mpy": "mpy"}[u.rateUnit]
	return []string{"rank", "asset", "component", "cml", "location", "latitude", "longitude", "thickness_date",
		"thickness_" + tu, "required_" + tu, "nominal_" + tu,
		"rate_long_" + ru, "rate_short_" + ru, "rate_" + ru, "rate_model",
		"previous_date", "previous_thickness_" + tu, "previous_rate_" + ru, "change",
		"remaining_life_y", "remaining_life_low_y", "repair_window", "retirement_date", "next_inspection", "next_inspection_basis",
		"next_external_inspection", "interval_rule", "required_method", "consequence", "flags", "photos",
		"local_damage_life_y", "local_damage"}
}

// csvRow is one CML's row of results.csv.
func csvRow(u units, it Item) []string {
	thick := func(v *float64) string {
		if v == nil {
			return ""
		}
		return strconv.FormatFloat(u.u.FromMM(*v), 'f', u.u.Decimals()+1, 64)
	}
	rate := func(v *float64) string {
		if v == nil {
			return ""
		}
		return u.rate(v)
	}
	return []string{
		strconv.Itoa(it.Rank), it.Asset, it.Component, it.CML, it.Location,
		num(it.Latitude, 6), num(it.Longitude, 6), str(it.ThicknessDate),
		thick(it.ThicknessMM), thick(it.RequiredMM), thick(it.NominalMM),
		rate(it.RateLongMMPerY), rate(it.RateShortMMPerY), rate(it.RateMMPerY), it.RateModel,
		str(it.PreviousDate), thick(it.PreviousMM), rate(it.PreviousRate), strings.Join(it.Change, " "),
		num(it.RemainingLifeY, 2), num(it.RemainingLifeLowY, 2), it.RepairWindow, str(it.RetirementDate), str(it.NextInspection), str(it.NextInspectionWhy),
		str(it.NextExternal), it.IntervalRule, it.RequiredMethod,
		str(it.Consequence), strings.Join(it.Flags, " "), strings.Join(it.Photos, " "),
		num(it.LocalDamageLifeY, 2), it.LocalDamage,
	}
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
