package survey

import (
	"fmt"
	"slices"
	"strings"

	"github.com/lossline/lossline/survey/localdamage"
	"github.com/lossline/lossline/survey/required"
)

// Sources printed with each local-damage method.
const (
	SourcePits   = "Gumbel (1958) Statistics of Extremes; extreme-value analysis of pit depths, Kowaka et al. (1994); ASTM G46 (pitting evaluation)"
	SourceBottom = "API 653 §4.4.7 and Table 4.4"
	SourceB31G   = "ASME B31G-2012 Level 1, original and modified (0.85·d·L) criteria; Kiefner and Vieth (1989)"
	SourceMember = "elastic section properties by the parallel-axis theorem; loss limit set by the responsible engineer"
)

// ComputeLocal adds each grid's readings to its CML's visit and works out
// its statistics, then runs every local-damage assessment of the survey's
// components. Load runs it after ComputeRequired; problems point at the
// line of the grid, the key or the input.
func ComputeLocal(s *Survey) ProblemList {
	var problems ProblemList
	for _, a := range s.Assets {
		for _, c := range a.Components {
			if c.Design.Local == nil {
				continue
			}
			c.Design.Local.Date = s.Date
			for _, g := range c.Design.Local.Grids {
				attachGrid(c, g, &problems)
			}
			for _, w := range c.Design.Local.Written {
				lr := &localReader{comp: c, w: w, units: s.Units, date: s.Date, used: map[string]bool{}, problems: &problems}
				var la *LocalAssessment
				switch w.Key {
				case KeyPits:
					la = lr.pits()
				case KeyBottom:
					la = lr.bottom()
				case KeyCorrodedArea:
					la = lr.corrodedArea()
				case KeyMember:
					la = lr.member()
				}
				lr.unused()
				if la != nil && !lr.failed {
					la.Key, la.Line, la.Inputs = w.Key, w.Line, lr.inputs
					c.Design.Local.Assessments = append(c.Design.Local.Assessments, la)
				}
			}
		}
	}
	return problems
}

// attachGrid checks a grid against its CML's row and computes its
// statistics against the component's required thickness. The row's
// readings stay the ones rates use: the grid's minimum must be among them
// (or above their minimum), so the governing reading is the least of grid
// and row; a row with no reading that day is warned of (a field sheet not
// yet filled in).
func attachGrid(c *Component, g *GridReadings, problems *ProblemList) {
	i := slices.IndexFunc(c.CMLs, func(m *CML) bool { return m.ID == g.CML })
	if i < 0 {
		problems.Errorf(c.File, g.Line, "grid %s: no CML %s in the reading table of %q", g.CML, g.CML, c.Name)
		return
	}
	if c.Design.RequiredMM != nil {
		g.RequiredMM = *c.Design.RequiredMM
	}
	st, err := localdamage.Grid(g.CellsMM, g.RequiredMM)
	if err != nil {
		problems.Errorf(c.File, g.Line, "grid %s: %v", g.CML, err)
		return
	}
	m := c.CMLs[i]
	k := slices.IndexFunc(m.Visits, func(v Visit) bool { return v.Date.Time.Equal(g.Date.Time) })
	if k < 0 {
		problems.Warnf(c.File, g.Line, "grid %s: the CML's row has no reading on %s, so no rate uses the grid: write the grid's minimum (%.4g mm) in that column", g.CML, g.Date, st.MinMM)
		g.Stats = st
		return
	}
	if gov := m.Visits[k].Governing(); gov > st.MinMM {
		problems.Errorf(c.File, g.Line, "grid %s: its minimum %.4g mm (row %s, column %s) is below the row's governing reading %.4g mm on %s: add the grid's minimum to the row's cell, whose readings are the ones the rates use",
			g.CML, st.MinMM, g.Rows[st.MinRow], g.Cols[st.MinCol], gov, g.Date)
		return
	}
	g.Stats = st
}

// pits is the Gumbel extrapolation of pit depths over the whole area.
func (lr *localReader) pits() *LocalAssessment {
	la := &LocalAssessment{Method: "deepest pit over the area, Gumbel extreme values", Source: SourcePits}
	var depths []float64
	if in, ok := lr.find("depths"); !ok {
		lr.errorf(lr.w.Line, "give depths: the deepest pit of each sample area")
	} else if v, err := ParseThicknesses(in.Value, lr.units); err != nil {
		lr.errorf(in.Line, "depths: %v", err)
	} else {
		depths = v
		lr.inputs = append(lr.inputs, required.Input{Name: "depths", Written: in.Value, Used: fmt.Sprintf("%d depths in mm", len(v))})
	}
	sample, _ := lr.area("sample area", true)
	total, _ := lr.area("total area", true)
	wall, hasWall := lr.length("wall", false)
	growth, hasGrowth := lr.rate("growth rate", false)
	var earlier []float64
	var earlierDate VisitDate
	if in, ok := lr.find("earlier depths"); ok {
		if v, err := ParseThicknesses(in.Value, lr.units); err != nil {
			lr.errorf(in.Line, "earlier depths: %v", err)
		} else {
			earlier = v
			lr.inputs = append(lr.inputs, required.Input{Name: "earlier depths", Written: in.Value, Used: fmt.Sprintf("%d depths in mm", len(v))})
		}
		d, line, ok := lr.word("earlier date")
		if dt, good := ParseVisitDate(d); !ok || !good {
			lr.errorf(line, "earlier depths need earlier date: the date they were taken, e.g. 2014-09-10")
		} else {
			earlierDate = dt
		}
	}
	if hasGrowth && earlier != nil {
		lr.errorf(lr.w.Line, "give growth rate or earlier depths, not both")
	}
	wall = lr.wallOrNominal(wall, hasWall)
	if in, ok := lr.find("depths"); ok {
		lr.pitsInInches(in, depths, wall)
	}
	if lr.failed {
		return nil
	}
	e, err := localdamage.EstimateDeepestPit(depths, sample, total)
	if err != nil {
		lr.errorf(lr.w.Line, "%v", err)
		return nil
	}
	detail := &PitDetail{DepthsMM: depths, Estimate: e, WallMM: wall, GrowthMMPerY: growth}
	la.Steps = append(la.Steps, e.Steps...)
	switch {
	case hasGrowth:
		detail.GrowthBasis = "stated"
	case earlier != nil:
		prev, err := localdamage.EstimateDeepestPit(earlier, sample, total)
		if err != nil {
			lr.errorf(lr.w.Line, "earlier depths: %v", err)
			return nil
		}
		years := float64(lr.date.Sub(earlierDate.Time).Hours()) / 24 / 365.25
		detail.GrowthMMPerY, err = localdamage.PitGrowthRate(prev, e, years)
		if err != nil {
			lr.errorf(lr.w.Line, "%v", err)
			return nil
		}
		detail.GrowthBasis = fmt.Sprintf("from %s", earlierDate)
		la.Steps = append(la.Steps, fmt.Sprintf("growth rate = (x_T now − x_T on %s)/Δt = (%.3f − %.3f)/%.2f y = %.4f mm/y", earlierDate, e.DepthMM, prev.DepthMM, years, detail.GrowthMMPerY))
	}
	reqMM := 0.0
	if lr.comp.Design.RequiredMM != nil {
		reqMM = *lr.comp.Design.RequiredMM
	}
	life, err := localdamage.PitRemaining(e, wall, reqMM, detail.GrowthMMPerY)
	if err != nil {
		lr.errorf(lr.w.Line, "%v", err)
		return nil
	}
	detail.Life, detail.RequiredMM = life, reqMM
	la.Pits = detail
	la.Steps = append(la.Steps, life.Steps...)
	la.Limit = "the deepest pit estimate reaches the required thickness"
	switch {
	case life.LigamentMM <= reqMM: // reqMM is 0 when none is known: a pit through the wall
		zero := 0.0
		la.LifeY = &zero
	case life.TimeToRequiredY != nil:
		la.LifeY = life.TimeToRequiredY
	}
	la.Result = fmt.Sprintf("deepest pit over %.4g m² ≈ %.2f mm (ML 95 %% band %.2f–%.2f mm); ligament %.2f mm", total, e.DepthMM, e.LowerMLMM, e.UpperMLMM, life.LigamentMM)
	if reqMM > 0 {
		la.Result += fmt.Sprintf(" against required %.2f mm", reqMM)
	}
	if life.TimeToPerforateY != nil {
		la.Result += fmt.Sprintf("; penetration in %.1f y at %.3g mm/y", *life.TimeToPerforateY, detail.GrowthMMPerY)
	}
	return la
}

// bottom is API 653 §4.4.7's minimum remaining thickness at the next inspection.
func (lr *localReader) bottom() *LocalAssessment {
	la := &LocalAssessment{Method: "API 653 tank bottom, minimum remaining thickness at the next inspection", Source: SourceBottom}
	rtbc, _ := lr.length("bottom side remaining", true)
	var rtip float64
	if in, ok := lr.find("product side remaining"); ok && strings.EqualFold(strings.TrimSpace(in.Value), "pits") {
		p := lr.pitsDone()
		if p == nil {
			lr.errorf(in.Line, "product side remaining: pits needs a pits: Gumbel assessment above it on the component")
		} else {
			rtip = p.Life.LigamentMM
			lr.inputs = append(lr.inputs, required.Input{Name: "product side remaining", Written: in.Value, Used: fmt.Sprintf("%.3f mm (ligament under the deepest pit estimate)", rtip)})
		}
	} else {
		delete(lr.used, "product side remaining")
		rtip, _ = lr.length("product side remaining", true)
	}
	stp, _ := lr.rate("product side rate", true)
	up, _ := lr.rate("underside rate", true)
	or, _ := lr.number("interval", "y", true)
	barrierText, line, ok := lr.word("release prevention barrier")
	if !ok {
		for _, in := range lr.comp.Design.RequiredInputs {
			if in.Name == "release prevention barrier" {
				barrierText, line, ok = strings.ToLower(strings.TrimSpace(in.Value)), in.Line, true
				lr.inputs = append(lr.inputs, required.Input{Name: "release prevention barrier", Written: in.Value + " (from required)", Used: in.Value})
			}
		}
	}
	barrier, err := yesNo(barrierText)
	if !ok {
		lr.errorf(lr.w.Line, "give release prevention barrier: yes or no")
	} else if err != nil {
		lr.errorf(line, "release prevention barrier: %v", err)
	}
	if lr.failed {
		return nil
	}
	r, err := localdamage.TankBottom(localdamage.BottomInput{BottomSideMM: rtbc, ProductSideMM: rtip, ProductSideRate: stp, UndersideRate: up,
		IntervalY: or, LeakBarrier: barrier, MinRemainingLimMM: required.BottomMinRemainingIn(barrier) * MMPerInch})
	if err != nil {
		lr.errorf(lr.w.Line, "%v", err)
		return nil
	}
	la.Bottom, la.Steps = &r, r.Steps
	la.Limit = "the minimum remaining thickness reaches MRT_min"
	if r.MaxIntervalY != nil {
		la.LifeY = r.MaxIntervalY
	} else if !r.Pass {
		zero := 0.0
		la.LifeY = &zero
	}
	la.Result = fmt.Sprintf("MRT %.2f mm after %.4g y against %.2f mm: %s", r.MRTMM, or, r.LimitMM, map[bool]string{true: "acceptable", false: "NOT acceptable"}[r.Pass])
	if r.MaxIntervalY != nil {
		la.Result += fmt.Sprintf("; longest interval %.1f y", *r.MaxIntervalY)
	}
	return la
}

// pitsDone is the component's pit assessment computed so far, if any.
func (lr *localReader) pitsDone() *PitDetail {
	for _, a := range lr.comp.Design.Local.Assessments {
		if a.Pits != nil {
			return a.Pits
		}
	}
	return nil
}

// corrodedArea is ASME B31G-2012 for a corroded area of a pipe.
func (lr *localReader) corrodedArea() *LocalAssessment {
	la := &LocalAssessment{Method: "remaining strength of a corroded area, ASME B31G", Source: SourceB31G}
	var c localdamage.CorrodedArea
	c.OutsideDiameterMM, _ = lr.length("outside diameter", true)
	wall, hasWall := lr.length("wall", false)
	c.DepthMM, _ = lr.length("depth", true)
	c.LengthMM, _ = lr.length("length", true)
	c.SMYSMPa, _ = lr.pressure("smys", true)
	c.MAOPMPa, _ = lr.pressure("maop", true)
	c.SafetyFactor, _ = lr.number("safety factor", "", true)
	c.DepthRateMMPerY, _ = lr.rate("depth growth rate", false)
	wall = lr.wallOrNominal(wall, hasWall)
	c.WallMM = wall
	if lr.failed {
		return nil
	}
	s, err := localdamage.AssessCorrodedArea(c)
	if err != nil {
		lr.errorf(lr.w.Line, "%v", err)
		return nil
	}
	la.Pipe = &s
	if !s.Repair {
		la.Steps = append(la.Steps, "original: ")
		la.Steps[len(la.Steps)-1] += strings.Join(s.Original.Steps, "; ")
		la.Steps = append(la.Steps, "modified: "+strings.Join(s.Modified.Steps, "; "))
	}
	la.Steps = append(la.Steps, s.Steps...)
	la.Limit = "the safe pressure falls to MAOP, or the depth reaches 80 % of the wall"
	zero := 0.0
	switch {
	case s.Repair:
		la.LifeY = &zero
		la.Result = fmt.Sprintf("depth %.0f %% of the wall, over 80 %%: repair", 100*s.DepthRatio)
		return la
	case !s.Governing.Pass:
		la.LifeY = &zero
	default:
		la.LifeY = s.RemainingY
	}
	la.Result = fmt.Sprintf("safe pressure %.3f MPa (%s) against MAOP %.3f MPa: ERF %.2f, %s", s.Governing.SafePress, s.Governing.Method, c.MAOPMPa, s.Governing.ERF,
		map[bool]string{true: "passes", false: "does NOT pass"}[s.Governing.Pass])
	if s.RemainingY != nil && s.Governing.Pass {
		la.Result += fmt.Sprintf("; passes for %.1f y at %.3g mm/y", *s.RemainingY, c.DepthRateMMPerY)
	}
	return la
}

// pitShallowMM is the deepest pit depth (mm) under which a whole set of pit
// samples in a mm survey is taken for inches: pit gauges read to about
// 0.1 mm and a pit survey is not made of pits a few gauge steps deep (common
// practice; the limit is this tool's).
const pitShallowMM = 0.25

// pitsInInches warns when every pit depth of a mm survey is under
// pitShallowMM and the depths read as inches would still fit in the wall.
func (lr *localReader) pitsInInches(in MethodInput, depths []float64, wallMM float64) {
	if lr.units != MM || len(depths) == 0 || wallMM <= 0 {
		return
	}
	deepest := slices.Max(depths)
	if deepest >= pitShallowMM || deepest*MMPerInch >= wallMM {
		return
	}
	lr.problems.Warnf(lr.comp.File, in.Line, "%s: depths: every pit is under %g mm deep (deepest %g mm): inches in a mm survey? Write the depths in mm (the deepest would be %.4g mm)", lr.w.Key, pitShallowMM, deepest, deepest*MMPerInch)
}
