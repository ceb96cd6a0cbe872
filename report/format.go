package report

import (
	"fmt"
	"strconv"
	"strings"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// none is printed where a value cannot be computed.
const none = "—"

// Display says which units the report shows; results.json is always in mm.
type Display struct {
	Thickness survey.Unit // mm or in; "" for the survey's units
	Rate      string      // mm/y, mpy or in/y; "" for mm/y with mm, mpy with in
}

// RateUnits are the rate units the report can show.
var RateUnits = []string{"mm/y", "mpy", "in/y"}

// resolve fills the defaults from the survey's units.
func (d Display) resolve(survey survey.Unit) Display {
	if d.Thickness == "" {
		d.Thickness = survey
	}
	if d.Rate == "" {
		d.Rate = map[bool]string{true: "mpy", false: "mm/y"}[d.Thickness == "in"]
	}
	return d
}

// units formats values for the page in the display units.
type units struct {
	u        survey.Unit
	rateUnit string
}

func (f units) thick(mm *float64) string {
	if mm == nil {
		return none
	}
	return f.u.Format(*mm)
}

// rate converts mm/y exactly: 1 in = 25.4 mm, 1 mil = 0.001 in.
func (f units) rate(mmPerY *float64) string {
	if mmPerY == nil {
		return none
	}
	switch f.rateUnit {
	case "mpy":
		return strconv.FormatFloat(*mmPerY/0.0254, 'f', 2, 64)
	case "in/y":
		return strconv.FormatFloat(*mmPerY/25.4, 'f', 4, 64)
	}
	return strconv.FormatFloat(*mmPerY, 'f', 3, 64)
}

func years(y *float64) string {
	if y == nil {
		return none
	}
	return strconv.FormatFloat(*y, 'f', 1, 64)
}

func day(t *time.Time) string {
	if t == nil {
		return none
	}
	return t.Format(dateLayout)
}

// status says in words how urgent a CML is.
func status(r wallloss.Result) string {
	if w := wallloss.WindowOf(r); w != wallloss.WindowUnknown {
		return w.String()
	}
	switch {
	case r.HasFlag(wallloss.FlagNoReadings):
		return "no readings"
	case r.HasFlag(wallloss.FlagNoRequired):
		return "no required thickness"
	}
	return "no rate yet"
}

// urgent reports whether a status is printed in bold and shaded.
func urgent(r wallloss.Result) bool {
	w := wallloss.WindowOf(r)
	return w == wallloss.WindowNow || w == wallloss.WindowUnder2 || w == wallloss.Window2To5
}

// flagMeanings explains each flag code in the methods appendix.
var flagMeanings = []struct{ Code, Meaning string }{
	{wallloss.FlagBelowRequired, "the current thickness is at or below the required thickness; remaining life 0."},
	{wallloss.FlagThicknessIncrease, "a later reading is thicker than an earlier one; that rate is taken as zero. Re-measure."},
	{wallloss.FlagSingleVisit, "the CML has readings from one visit only."},
	{wallloss.FlagNominalBased, "the long-term rate starts from nominal thickness at the installed date, not from a measured reading."},
	{wallloss.FlagNoRate, "no corrosion rate can be computed (one visit and no nominal thickness or installed date)."},
	{wallloss.FlagNoRequired, "the component has no required thickness, so no remaining life."},
	{wallloss.FlagNoReadings, "the CML row holds no readings."},
	{wallloss.FlagNotMeasuredLatest, "the CML was not measured at the survey's latest visit; its results date from an earlier one."},
	{wallloss.FlagNoMeasurableLoss, "the loss over the interval is within the gauge tolerance: no measurable loss, no retirement date."},
	{wallloss.FlagAboveNominal, "a reading is more than the gauge tolerance above nominal: suspect (coating, calibration, location)."},
	{wallloss.FlagEstimate, "the rate is a single-visit estimate (nominal-based, assumed or ISO 9224), not a measured rate."},
	{wallloss.FlagFitNeedsThree, "the fit model needs three or more visits; the larger of long- and short-term rate was used."},
}

func flagsText(flags []string) string {
	if len(flags) == 0 {
		return ""
	}
	return strings.Join(flags, ", ")
}

func latLon(p *survey.LatLon) string {
	if p == nil {
		return "no position"
	}
	ns, ew := "N", "E"
	lat, lon := p.Lat, p.Lon
	if lat < 0 {
		ns, lat = "S", -lat
	}
	if lon < 0 {
		ew, lon = "W", -lon
	}
	return fmt.Sprintf("%.5f° %s, %.5f° %s", lat, ns, lon, ew)
}
