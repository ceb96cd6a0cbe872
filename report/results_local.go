package report

import (
	"math"
	"strings"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/localdamage"
)

// GridResult is one grid of readings in results.json (mm); a cell not read is null.
type GridResult struct {
	Asset         string       `json:"asset"`
	Component     string       `json:"component"`
	CML           string       `json:"cml"`
	Date          string       `json:"date"`
	Line          int          `json:"line"`
	Rows          []string     `json:"rows"`
	Columns       []string     `json:"columns"`
	CellsMM       [][]*float64 `json:"cells_mm"`
	Count         int          `json:"count"`
	MinMM         float64      `json:"min_mm"`
	MeanMM        float64      `json:"mean_mm"`
	StdDevMM      float64      `json:"std_dev_mm"`
	RequiredMM    *float64     `json:"required_mm"`
	BelowRequired int          `json:"below_required"`
	MinRow        string       `json:"min_row"`
	MinColumn     string       `json:"min_column"`
}

// LocalResult is one local-damage assessment of a component in results.json.
type LocalResult struct {
	Asset     string        `json:"asset"`
	Component string        `json:"component"`
	Kind      string        `json:"kind"` // the design key: pits, bottom pitting, corroded area, member
	Method    string        `json:"method"`
	Source    string        `json:"source"`
	Line      int           `json:"line"`
	Inputs    []LocalInput  `json:"inputs"`
	Steps     []string      `json:"steps"`
	Result    string        `json:"result"`
	LifeY     *float64      `json:"life_y"` // years from the survey date to the limit; 0 reached; null none
	Limit     string        `json:"limit"`
	Pits      *PitsResult   `json:"pits,omitempty"`
	Bottom    *BottomResult `json:"tank_bottom,omitempty"`
	Pipe      *PipeResult   `json:"corroded_area,omitempty"`
	Member    *MemberResult `json:"member,omitempty"`
}

// LocalInput is an input as written and as used.
type LocalInput struct {
	Name    string `json:"name"`
	Written string `json:"written"`
	Used    string `json:"used"`
}

// PitsResult is the Gumbel extrapolation of pit depths (mm, mm/y).
type PitsResult struct {
	DepthsMM         []float64 `json:"depths_mm"`
	ReturnPeriod     float64   `json:"return_period"`
	ReducedVariate   float64   `json:"reduced_variate"`
	LSLocationMM     float64   `json:"ls_location_mm"`
	LSScaleMM        float64   `json:"ls_scale_mm"`
	MLLocationMM     float64   `json:"ml_location_mm"`
	MLScaleMM        float64   `json:"ml_scale_mm"`
	DepthLSMM        float64   `json:"depth_ls_mm"`
	DepthMLMM        float64   `json:"depth_ml_mm"`
	MLStdErrMM       float64   `json:"ml_std_err_mm"`
	MLLowerMM        float64   `json:"ml_lower_95_mm"`
	MLUpperMM        float64   `json:"ml_upper_95_mm"`
	DepthMM          float64   `json:"depth_mm"`
	WallMM           float64   `json:"wall_mm"`
	LigamentMM       float64   `json:"ligament_mm"`
	GrowthMMPerY     *float64  `json:"growth_mm_per_y"`
	GrowthBasis      string    `json:"growth_basis"`
	TimeToRequiredY  *float64  `json:"time_to_required_y"`
	TimeToPenetrateY *float64  `json:"time_to_penetration_y"`
}

// BottomResult is API 653 §4.4.7's minimum remaining thickness (mm, years).
type BottomResult struct {
	MRTMM        float64  `json:"mrt_mm"`
	LimitMM      float64  `json:"mrt_min_mm"`
	Pass         bool     `json:"acceptable"`
	MaxIntervalY *float64 `json:"longest_interval_y"`
}

// PipeResult is ASME B31G for a corroded area (MPa, years).
type PipeResult struct {
	DepthRatio float64       `json:"depth_ratio"`
	Repair     bool          `json:"repair"`
	Original   *StrengthJSON `json:"original"`
	Modified   *StrengthJSON `json:"modified"`
	Governing  string        `json:"governing"`
	RemainingY *float64      `json:"remaining_life_y"`
}

// StrengthJSON is one B31G method's numbers; folias_m is null where the
// method uses none (original, z > 20).
type StrengthJSON struct {
	Z               float64  `json:"z"`
	FoliasM         *float64 `json:"folias_m"`
	FlowStressMPa   float64  `json:"flow_stress_mpa"`
	FailureStressMP float64  `json:"failure_stress_mpa"`
	FailureMPa      float64  `json:"failure_pressure_mpa"`
	SafeMPa         float64  `json:"safe_pressure_mpa"`
	ERF             float64  `json:"erf"`
	Pass            bool     `json:"passes"`
}

// MemberResult is a member's section, nominal and measured (mm², mm⁴, mm³, %).
type MemberResult struct {
	Shape         string             `json:"shape"`
	Nominal       SectionJSON        `json:"nominal"`
	Measured      SectionJSON        `json:"measured"`
	LossPct       map[string]float64 `json:"loss_pct"`
	LimitQuantity string             `json:"limit_quantity"`
	LimitPct      *float64           `json:"limit_pct"`
	SetBy         string             `json:"set_by"`
	Exceeded      bool               `json:"exceeded"`
}

// SectionJSON is a section's elastic properties.
type SectionJSON struct {
	AreaMM2   float64 `json:"area_mm2"`
	CentroidY float64 `json:"centroid_y_mm"`
	IxMM4     float64 `json:"ix_mm4"`
	IyMM4     float64 `json:"iy_mm4"`
	SxMM3     float64 `json:"sx_mm3"`
	SyMM3     float64 `json:"sy_mm3"`
}

// localResults gathers every grid and local-damage assessment of the survey.
func localResults(s *survey.Survey) ([]GridResult, []LocalResult) {
	grids, out := []GridResult{}, []LocalResult{}
	for _, a := range s.Assets {
		for _, c := range a.Components {
			ld := c.Design.Local
			if ld == nil {
				continue
			}
			for _, g := range ld.Grids {
				if g.Stats.Count == 0 {
					continue
				}
				gr := GridResult{Asset: a.Name, Component: c.Name, CML: g.CML, Date: g.Date.String(), Line: g.Line, Rows: g.Rows, Columns: g.Cols,
					Count: g.Stats.Count, MinMM: r4(g.Stats.MinMM), MeanMM: r4(g.Stats.MeanMM), StdDevMM: r4(g.Stats.StdDevMM),
					BelowRequired: g.Stats.BelowCount, MinRow: g.Rows[g.Stats.MinRow], MinColumn: g.Cols[g.Stats.MinCol]}
				if g.RequiredMM > 0 {
					gr.RequiredMM = round(&g.RequiredMM, 4)
				}
				for _, row := range g.CellsMM {
					cells := make([]*float64, len(row))
					for j, v := range row {
						if !math.IsNaN(v) {
							cells[j] = round(&v, 4)
						}
					}
					gr.CellsMM = append(gr.CellsMM, cells)
				}
				grids = append(grids, gr)
			}
			for _, la := range ld.Assessments {
				out = append(out, localResult(a, c, la))
			}
		}
	}
	return grids, out
}

func r4(v float64) float64 { return *round(&v, 4) }

func localResult(a *survey.Asset, c *survey.Component, la *survey.LocalAssessment) LocalResult {
	lr := LocalResult{Asset: a.Name, Component: c.Name, Kind: la.Key, Method: la.Method, Source: la.Source, Line: la.Line,
		Steps: la.Steps, Result: la.Result, LifeY: round(la.LifeY, 3), Limit: la.Limit, Inputs: []LocalInput{}}
	for _, in := range la.Inputs {
		lr.Inputs = append(lr.Inputs, LocalInput{in.Name, in.Written, in.Used})
	}
	if p := la.Pits; p != nil {
		e := p.Estimate
		pr := &PitsResult{DepthsMM: p.DepthsMM, ReturnPeriod: r4(e.ReturnPeriod), ReducedVariate: r4(e.ReducedVariate),
			LSLocationMM: r4(e.LeastSquares.Location), LSScaleMM: r4(e.LeastSquares.Scale), MLLocationMM: r4(e.MaxLikelihood.Location), MLScaleMM: r4(e.MaxLikelihood.Scale),
			DepthLSMM: r4(e.DepthLSMM), DepthMLMM: r4(e.DepthMLMM), MLStdErrMM: r4(e.StdErrMLMM), MLLowerMM: r4(e.LowerMLMM), MLUpperMM: r4(e.UpperMLMM),
			DepthMM: r4(e.DepthMM), WallMM: r4(p.WallMM), LigamentMM: r4(p.Life.LigamentMM), GrowthBasis: p.GrowthBasis,
			TimeToRequiredY: round(p.Life.TimeToRequiredY, 3), TimeToPenetrateY: round(p.Life.TimeToPerforateY, 3)}
		if p.GrowthBasis != "" {
			pr.GrowthMMPerY = round(&p.GrowthMMPerY, 6)
		}
		lr.Pits = pr
	}
	if b := la.Bottom; b != nil {
		lr.Bottom = &BottomResult{MRTMM: r4(b.MRTMM), LimitMM: r4(b.LimitMM), Pass: b.Pass, MaxIntervalY: round(b.MaxIntervalY, 3)}
	}
	if p := la.Pipe; p != nil {
		pr := &PipeResult{DepthRatio: r4(p.DepthRatio), Repair: p.Repair, RemainingY: round(p.RemainingY, 3)}
		if !p.Repair {
			pr.Original, pr.Modified = strengthJSON(p.Original), strengthJSON(p.Modified)
			pr.Governing = p.Governing.Method
		}
		lr.Pipe = pr
	}
	if m := la.Member; m != nil {
		mr := &MemberResult{Shape: string(m.Shape), Nominal: sectionJSON(m.Loss.Nominal), Measured: sectionJSON(m.Loss.Measured),
			LossPct: map[string]float64{}, LimitQuantity: m.LimitQuantity, SetBy: m.SetBy, Exceeded: m.Exceeded}
		for _, q := range localdamage.Quantities {
			mr.LossPct[q] = *round(ptrTo(m.Loss.LossPct[q]), 3)
		}
		if m.LimitQuantity != "" {
			mr.LimitPct = ptrTo(m.LimitPct)
		}
		lr.Member = mr
	}
	return lr
}

func strengthJSON(r localdamage.StrengthResult) *StrengthJSON {
	s := &StrengthJSON{Z: r4(r.Z), FlowStressMPa: r4(r.FlowMPa), FailureStressMP: r4(r.FailureMPa), FailureMPa: r4(r.FailurePress),
		SafeMPa: r4(r.SafePress), ERF: r4(r.ERF), Pass: r.Pass}
	if !math.IsInf(r.M, 0) {
		s.FoliasM = round(&r.M, 6)
	}
	return s
}

func sectionJSON(s localdamage.Section) SectionJSON {
	return SectionJSON{AreaMM2: r4(s.AreaMM2), CentroidY: r4(s.CentroidY), IxMM4: math.Round(s.IxMM4), IyMM4: math.Round(s.IyMM4), SxMM3: math.Round(s.SxMM3), SyMM3: math.Round(s.SyMM3)}
}

// localOfItem is the life and one-line results of a CML's component's
// local-damage assessments, for the CML's row.
func localOfItem(c *survey.Component) (*float64, string) {
	if c.Design.Local == nil {
		return nil, ""
	}
	var parts []string
	for _, la := range c.Design.Local.Assessments {
		parts = append(parts, la.Key+": "+la.Result)
	}
	life, ok := c.LocalLifeY()
	if !ok {
		return nil, strings.Join(parts, " | ")
	}
	return round(&life, 3), strings.Join(parts, " | ")
}
