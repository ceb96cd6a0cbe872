package report

import (
	"bytes"
	"encoding/csv"
	"strconv"
	"strings"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey/wallloss"
)

// ElectroCSVFile holds one row per electrochemical quantity.
const ElectroCSVFile = "electro.csv"

// ElectroComponent is a component's coupons, probes, cathodic-protection
// test points, anodes, coating and metal pair in results.json. Rates in mm/y,
// potentials in mV against CSE, masses in kg (anodes) or g (coupons),
// thicknesses of coatings in µm.
type ElectroComponent struct {
	Asset      string            `json:"asset"`
	Component  string            `json:"component"`
	RateSource string            `json:"rate_source"`
	Coupons    []CouponResult    `json:"coupons"`
	ERProbes   []ERProbeResult   `json:"er_probes"`
	LPRProbes  []LPRProbeResult  `json:"lpr_probes"`
	TestPoints []TestPointResult `json:"test_points"`
	Anodes     []AnodeResult     `json:"anodes"`
	Coating    *CoatingResult    `json:"coating"`
	Galvanic   *GalvanicResult   `json:"galvanic_pair"`
}

// CouponResult is one mass-loss coupon.
type CouponResult struct {
	ID         string   `json:"id"`
	Metal      string   `json:"metal"`
	Installed  string   `json:"installed"`
	Removed    string   `json:"removed"`
	Hours      float64  `json:"exposure_h"`
	MassLossG  float64  `json:"mass_loss_g"`
	RateMMPerY float64  `json:"rate_mm_per_y"`
	RateMPY    float64  `json:"rate_mpy"`
	Band       string   `json:"band"`
	PitMMPerY  *float64 `json:"pitting_rate_mm_per_y"`
	PitBand    *string  `json:"pitting_band"`
	Source     string   `json:"source"`
}

// ERProbeResult is one electrical-resistance probe.
type ERProbeResult struct {
	ID         string    `json:"id"`
	SpanMM     float64   `json:"span_mm"`
	Dates      []string  `json:"dates"`
	Readings   []float64 `json:"readings"`
	LossMM     []float64 `json:"metal_loss_mm"`
	RateMMPerY float64   `json:"rate_mm_per_y"`
}

// LPRProbeResult is one linear-polarisation probe, a rate per date.
type LPRProbeResult struct {
	ID      string    `json:"id"`
	Metal   string    `json:"metal"`
	BmV     float64   `json:"b_mv"`
	Dates   []string  `json:"dates"`
	Rp      []float64 `json:"rp_ohm_cm2"`
	ICorr   []float64 `json:"icorr_ua_per_cm2"`
	RatesMM []float64 `json:"rates_mm_per_y"`
}

// TestPointResult is one cathodic-protection test point.
type TestPointResult struct {
	ID            string      `json:"id"`
	Visits        []CPVisitJS `json:"visits"`
	TrendChangeMV *float64    `json:"trend_change_mv"`
	Worsening     bool        `json:"worsening"`
}

// CPVisitJS is one visit of a test point, potentials converted to CSE.
type CPVisitJS struct {
	Date      string   `json:"date"`
	Electrode string   `json:"electrode"`
	OnMV      *float64 `json:"on_mv_cse"`
	OffMV     *float64 `json:"off_mv_cse"`
	NativeMV  *float64 `json:"native_mv_cse"`
	PolMV     *float64 `json:"polarisation_mv"`
	Status    string   `json:"status"`
	Met       string   `json:"criterion_met"`
	Reasons   []string `json:"reasons"`
	Caution   string   `json:"caution"`
}

// AnodeResult is one sacrificial anode.
type AnodeResult struct {
	ID          string   `json:"id"`
	Material    string   `json:"material"`
	RemainingKG float64  `json:"remaining_kg"`
	InstalledKG *float64 `json:"installed_kg"`
	CurrentA    float64  `json:"current_a"`
	Utilisation float64  `json:"utilisation"`
	CapacityAhK float64  `json:"capacity_ah_per_kg"`
	LifeY       *float64 `json:"life_y"`
	Replace     *string  `json:"replace_by"`
}

// CoatingResult is a component's coating grades and judgements.
type CoatingResult struct {
	RustedPct      *float64 `json:"rusted_pct"`
	D610           *int     `json:"astm_d610_grade"`
	ISORi          *int     `json:"iso_4628_3_ri"`
	BreakdownM2    *float64 `json:"breakdown_m2"`
	DFTMeanUM      *float64 `json:"dft_mean_um"`
	DFTAccepted    *bool    `json:"dft_accepted"`
	DFTReasons     []string `json:"dft_reasons"`
	ZincUM         *float64 `json:"zinc_um"`
	ZincLifeShortY *float64 `json:"zinc_life_shortest_y"`
	ZincLifeLongY  *float64 `json:"zinc_life_longest_y"`
}

// GalvanicResult is a component's metal pair on the galvanic series.
type GalvanicResult struct {
	Anode       string  `json:"anode"`
	Cathode     string  `json:"cathode"`
	DifferenceV float64 `json:"difference_v"`
	Warn        bool    `json:"warn"`
}

// FailingPointJS is a test point whose latest visit fails, for an actions list.
type FailingPointJS struct {
	Asset     string   `json:"asset"`
	Component string   `json:"component"`
	Point     string   `json:"test_point"`
	Date      string   `json:"date"`
	Status    string   `json:"status"`
	Reasons   []string `json:"reasons"`
	File      string   `json:"file"`
	Line      int      `json:"line"`
}

func r6(v float64) float64 { return *round(&v, 6) }

// electroResults gathers every component's electro data, in checklist order.
func electroResults(f *findings.Findings) ([]ElectroComponent, []FailingPointJS) {
	out, fails := []ElectroComponent{}, []FailingPointJS{}
	for _, a := range f.Survey.Assets {
		for _, c := range a.Components {
			e := c.Design.Electro
			if e == nil {
				continue
			}
			ec := ElectroComponent{Asset: a.Name, Component: c.Name, RateSource: string(e.RateSource), Coupons: []CouponResult{},
				ERProbes: []ERProbeResult{}, LPRProbes: []LPRProbeResult{}, TestPoints: []TestPointResult{}, Anodes: []AnodeResult{}}
			if ec.RateSource == "" {
				ec.RateSource = "max"
			}
			for _, cp := range e.Coupons {
				if cp.Rate == nil {
					continue
				}
				r := cp.Rate
				cr := CouponResult{ID: cp.ID, Metal: cp.Metal, Installed: cp.Installed.String(), Removed: cp.Removed.String(), Hours: cp.Coupon.Hours,
					MassLossG: r6(r.MassLossG), RateMMPerY: r6(r.MMPerY), RateMPY: *round(&r.MPY, 4), Band: r.Band.String(), Source: r.Source}
				if r.PitMMPerY > 0 {
					b := r.PitBand.String()
					cr.PitMMPerY, cr.PitBand = round(&r.PitMMPerY, 6), &b
				}
				ec.Coupons = append(ec.Coupons, cr)
			}
			for _, p := range e.ERProbes {
				if p.Rate == nil {
					continue
				}
				er := ERProbeResult{ID: p.ID, SpanMM: p.SpanMM, Readings: p.Readings, RateMMPerY: r6(p.Rate.MMPerY)}
				for i, d := range p.Dates {
					er.Dates = append(er.Dates, d.String())
					er.LossMM = append(er.LossMM, r6(p.Rate.LossMM[i]))
				}
				ec.ERProbes = append(ec.ERProbes, er)
			}
			for _, p := range e.LPRProbes {
				if len(p.Rates) == 0 {
					continue
				}
				lr := LPRProbeResult{ID: p.ID, Metal: p.Metal, BmV: *round(&p.Rates[0].BmV, 4), Rp: p.RpOhmCM2}
				for i, d := range p.Dates {
					lr.Dates = append(lr.Dates, d.String())
					lr.ICorr = append(lr.ICorr, r6(p.Rates[i].ICorr))
					lr.RatesMM = append(lr.RatesMM, r6(p.Rates[i].MMPerY))
				}
				ec.LPRProbes = append(ec.LPRProbes, lr)
			}
			for _, tp := range e.TestPoints {
				tr := TestPointResult{ID: tp.ID}
				if tp.Trend != nil {
					tr.TrendChangeMV, tr.Worsening = round(&tp.Trend.ChangeMV, 1), tp.Trend.Worsening
				}
				for _, v := range tp.Visits {
					j := v.Judgement
					tr.Visits = append(tr.Visits, CPVisitJS{Date: v.Date.String(), Electrode: v.Potentials.Electrode.String(),
						OnMV: round(j.OnCSE, 1), OffMV: round(j.OffCSE, 1), NativeMV: round(j.NativeCSE, 1), PolMV: round(j.PolarisationMV, 1),
						Status: j.Status.String(), Met: j.Met, Reasons: nonNil(j.Reasons), Caution: j.Caution})
				}
				ec.TestPoints = append(ec.TestPoints, tr)
			}
			for _, an := range e.Anodes {
				ar := AnodeResult{ID: an.ID, Material: an.Anode.Metal.Name, RemainingKG: an.Anode.RemainingKG, CurrentA: an.Anode.CurrentA,
					Utilisation: an.Anode.Utilisation, CapacityAhK: an.Anode.Metal.CapacityAhK}
				if an.Anode.InitialKG > 0 {
					ar.InstalledKG = &an.Anode.InitialKG
				}
				if an.Life != nil {
					ar.LifeY = round(&an.Life.Years, 3)
					s := an.Replace.String()
					ar.Replace = &s
				}
				ec.Anodes = append(ec.Anodes, ar)
			}
			if co := e.Coating; co.RustedPct != nil || co.DFT != nil || co.Galvanizing != nil || co.BreakdownM2 != nil {
				cr := &CoatingResult{RustedPct: co.RustedPct, BreakdownM2: co.BreakdownM2, ZincUM: co.ZincUM}
				if co.RustedPct != nil {
					d, ri := co.D610, co.ISORi
					cr.D610, cr.ISORi = &d, &ri
				}
				if j := co.DFT; j != nil {
					cr.DFTMeanUM, cr.DFTAccepted, cr.DFTReasons = round(&j.MeanUM, 2), &j.Accepted, nonNil(j.Reasons)
				}
				if g := co.Galvanizing; g != nil {
					cr.ZincLifeShortY = round(&g.ShortestY, 2)
					if g.LongestY < 1e308 {
						cr.ZincLifeLongY = round(&g.LongestY, 2)
					}
				}
				ec.Coating = cr
			}
			if g := e.Galvanic; g != nil {
				ec.Galvanic = &GalvanicResult{Anode: g.Anode.Name, Cathode: g.Cathode.Name, DifferenceV: *round(&g.DifferenceV, 4), Warn: g.Warn}
			}
			out = append(out, ec)
		}
	}
	for _, p := range f.Survey.FailingTestPoints() {
		fails = append(fails, FailingPointJS{Asset: p.Asset, Component: p.Component, Point: p.Point, Date: p.Date.String(),
			Status: p.Status.String(), Reasons: nonNil(p.Reasons), File: p.File, Line: p.Line})
	}
	return out, fails
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}

// ElectroCSV renders electro.csv: one row per quantity (a coupon's rate, a
// probe's rate, a test point's potentials on a date, an anode's life, a
// coating grade), with its unit and judgement. Header only when the survey
// has none.
func ElectroCSV(r Results) ([]byte, error) {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	_ = w.Write([]string{"asset", "component", "kind", "id", "date", "quantity", "value", "unit", "judgement"})
	f := func(v float64, d int) string { return strconv.FormatFloat(v, 'f', d, 64) }
	for _, e := range r.Electro {
		row := func(kind, id, date, q, v, unit, j string) {
			_ = w.Write([]string{e.Asset, e.Component, kind, id, date, q, v, unit, j})
		}
		for _, c := range e.Coupons {
			row("coupon", c.ID, c.Removed, "corrosion rate", f(c.RateMMPerY, 4), "mm/y", c.Band)
			if c.PitMMPerY != nil {
				row("coupon", c.ID, c.Removed, "pitting rate", f(*c.PitMMPerY, 4), "mm/y", *c.PitBand)
			}
		}
		for _, p := range e.ERProbes {
			row("ER probe", p.ID, p.Dates[len(p.Dates)-1], "corrosion rate", f(p.RateMMPerY, 4), "mm/y", "")
		}
		for _, p := range e.LPRProbes {
			for i, d := range p.Dates {
				row("LPR probe", p.ID, d, "corrosion rate", f(p.RatesMM[i], 4), "mm/y", "")
			}
		}
		for _, tp := range e.TestPoints {
			for _, v := range tp.Visits {
				q, val := "instant-off potential", v.OffMV
				if val == nil {
					q, val = "on potential", v.OnMV
				}
				if val == nil {
					continue
				}
				row("test point", tp.ID, v.Date, q, f(*val, 0), "mV CSE", v.Status)
			}
		}
		for _, a := range e.Anodes {
			if a.LifeY != nil {
				row("anode", a.ID, *a.Replace, "remaining life", f(*a.LifeY, 2), "y", "replace by "+*a.Replace)
			}
		}
		if c := e.Coating; c != nil {
			if c.D610 != nil {
				row("coating", "", r.Survey.Date, "ASTM D610 rust grade", strconv.Itoa(*c.D610), "", "ISO 4628-3 Ri "+strconv.Itoa(*c.ISORi))
			}
			if c.DFTMeanUM != nil {
				row("coating", "", r.Survey.Date, "dry-film thickness mean", f(*c.DFTMeanUM, 1), "µm", map[bool]string{true: "accepted", false: "rejected: " + strings.Join(c.DFTReasons, "; ")}[*c.DFTAccepted])
			}
			if c.ZincLifeShortY != nil {
				row("coating", "", r.Survey.Date, "galvanizing life (shortest)", f(*c.ZincLifeShortY, 1), "y", "")
			}
		}
		if g := e.Galvanic; g != nil {
			row("metal pair", g.Anode+" / "+g.Cathode, r.Survey.Date, "potential difference", f(g.DifferenceV, 3), "V", map[bool]string{true: "warn: " + g.Anode + " corrodes", false: "within 0.25 V"}[g.Warn])
		}
	}
	w.Flush()
	return b.Bytes(), w.Error()
}

// RateGoverning says, for a CML of a component with coupons or probes,
// which rate governs and why, and the wall's own rate.
type RateGoverning struct {
	From           string   `json:"from"` // "wall", or "coupon C-1", "probe ER-1"
	WallRateMMPerY *float64 `json:"wall_rate_mm_per_y"`
	Why            string   `json:"why"`
}

func rateGoverning(res wallloss.Result) *RateGoverning {
	if res.RateWhy == "" {
		return nil
	}
	from := res.RateFrom
	if from == "" {
		from = "wall"
	}
	return &RateGoverning{From: from, WallRateMMPerY: round(res.WallRateMMPerY, 6), Why: res.RateWhy}
}
