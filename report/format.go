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

// repairWindow says in words how soon a CML needs repair: its repair window.
func repairWindow(r wallloss.Result) string {
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
func flagMeanings() []struct{ Code, Meaning string } {
	out := make([]struct{ Code, Meaning string }, len(wallloss.AllFlags))
	for i, f := range wallloss.AllFlags {
		out[i].Code, out[i].Meaning = string(f), f.Describe()
	}
	return out
}

func flagsText(flags []wallloss.Flag) string {
	names := make([]string, len(flags))
	for i, f := range flags {
		names[i] = string(f)
	}
	return strings.Join(names, ", ")
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
