package report

import (
	"math"
	"time"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// trendChart is a component's thickness-against-time chart, in data units
// (mm and dates); drawing maps it onto the page.
type trendChart struct {
	Series     []trendSeries
	RequiredMM *float64
	NominalMM  *float64
	From, To   time.Time // the time axis
	LowMM      float64   // the thickness axis
	HighMM     float64
}

// trendSeries is one CML: its governing readings and the projection of its
// governing rate from the current reading to the retirement date.
type trendSeries struct {
	ID       string
	Points   []trendPoint
	Proj     *[2]trendPoint // current reading → (retirement date, required)
	Window   wallloss.Window
	Estimate bool
}

type trendPoint struct {
	T  time.Time
	MM float64
}

// chartHorizonYears is how far past the latest reading the time axis runs at
// most; projections beyond it are drawn to the edge and labelled with their date.
const chartHorizonYears = 25

// buildTrendChart gathers a component's readings and projections.
func buildTrendChart(c *survey.Component, results func(*survey.CML) *survey.Assessed) trendChart {
	ch := trendChart{RequiredMM: c.Design.RequiredMM, NominalMM: c.Design.NominalMM, LowMM: math.Inf(1), HighMM: math.Inf(-1)}
	var latest time.Time
	for _, m := range c.CMLs {
		s := trendSeries{ID: m.ID}
		for _, v := range m.Visits {
			p := trendPoint{v.Date.Time, v.Governing()}
			s.Points = append(s.Points, p)
			ch.extend(p)
			if p.T.After(latest) {
				latest = p.T
			}
		}
		if it := results(m); it != nil {
			r := it.Result
			s.Window, s.Estimate = wallloss.WindowOf(r), r.HasFlag(wallloss.FlagEstimate)
			if r.Retirement != nil && r.RequiredMM() != nil && r.Class == wallloss.FiniteLife {
				s.Proj = &[2]trendPoint{{*r.CurrentDate, *r.ThicknessMM}, {*r.Retirement, *r.RequiredMM()}}
			}
		}
		if len(s.Points) > 0 {
			ch.Series = append(ch.Series, s)
		}
	}
	if len(ch.Series) == 0 {
		return ch
	}
	for _, v := range []*float64{ch.RequiredMM, ch.NominalMM} {
		if v != nil {
			ch.extend(trendPoint{MM: *v})
		}
	}
	horizon := wallloss.AddYears(latest, chartHorizonYears)
	ch.To = latest
	for _, s := range ch.Series {
		if s.Proj != nil && s.Proj[1].T.After(ch.To) {
			ch.To = s.Proj[1].T
		}
	}
	if ch.To.After(horizon) {
		ch.To = horizon
	}
	if !ch.To.After(ch.From) {
		ch.To = ch.From.AddDate(1, 0, 0)
	}
	pad := (ch.HighMM - ch.LowMM) * 0.08
	if pad == 0 {
		pad = 0.5
	}
	ch.LowMM, ch.HighMM = ch.LowMM-pad, ch.HighMM+pad
	return ch
}

func (ch *trendChart) extend(p trendPoint) {
	if !p.T.IsZero() && (ch.From.IsZero() || p.T.Before(ch.From)) {
		ch.From = p.T
	}
	ch.LowMM = math.Min(ch.LowMM, p.MM)
	ch.HighMM = math.Max(ch.HighMM, p.MM)
}

// repeated reports whether some CML of the chart has two or more readings:
// only then does a trend chart show a trend.
func (ch trendChart) repeated() bool {
	for _, s := range ch.Series {
		if len(s.Points) >= 2 {
			return true
		}
	}
	return false
}
