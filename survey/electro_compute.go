package survey

import (
	"math"
	"time"

	"github.com/lossline/lossline/survey/electrochem"
	"github.com/lossline/lossline/survey/wallloss"
)

// ComputeElectro works out every component's coupon and probe rates, judges
// its cathodic-protection test points, anode lives, coating and metal pair,
// after reading; each refusal points at the row or key it comes from.
func ComputeElectro(s *Survey) ProblemList {
	var problems ProblemList
	for _, a := range s.Assets {
		for _, c := range a.Components {
			if e := c.Design.Electro; e != nil {
				e.compute(c, s.Date, &problems)
			}
		}
	}
	return problems
}

func (e *Electro) compute(c *Component, today time.Time, problems *ProblemList) {
	d := &c.Design
	file := c.File
	e.checkPlausible(file, today, problems)
	for _, row := range e.Coupons {
		r, err := electrochem.CouponRateOf(row.Coupon)
		if err != nil {
			problems.Errorf(file, row.Line, "coupon %s: %v", row.ID, err)
			continue
		}
		row.Rate = &r
	}
	for _, p := range e.ERProbes {
		pts := make([]electrochem.ERPoint, len(p.Dates))
		for i, dt := range p.Dates {
			pts[i] = electrochem.ERPoint{Years: wallloss.YearsBetween(p.Dates[0].Time, dt.Time), Reading: p.Readings[i]}
		}
		r, err := electrochem.ERRateOf(p.SpanMM, pts)
		if err != nil {
			problems.Errorf(file, p.Line, "ER probe %s: %v", p.ID, err)
			continue
		}
		p.Rate = &r
		if r.MMPerY < 0 {
			problems.Warnf(file, p.Line, "ER probe %s: the readings fall over time (%.4g mm/y): was the element replaced? Its rate is taken as 0", p.ID, r.MMPerY)
		}
	}
	for _, p := range e.LPRProbes {
		alloy, _ := electrochem.FindAlloy(p.Metal) // checked when read
		for i, rp := range p.RpOhmCM2 {
			m := electrochem.LPR{RpOhmCM2: rp, BetaA: p.BetaA, BetaC: p.BetaC, BmV: p.BmV}
			r, err := electrochem.LPRRateOf(m, alloy)
			if err != nil {
				problems.Errorf(file, p.Line, "LPR probe %s on %s: %v", p.ID, p.Dates[i], err)
				p.Rates = nil
				break
			}
			p.Rates = append(p.Rates, r)
		}
	}
	crit := electrochem.Criteria{Anaerobic: e.Anaerobic, OverLimitMV: electrochem.DefaultCriteria.OverLimitMV}
	if e.OverLimitMV != nil {
		crit.OverLimitMV = *e.OverLimitMV
	}
	for _, tp := range e.TestPoints {
		var trend []float64
		for i := range tp.Visits {
			v := &tp.Visits[i]
			j, err := electrochem.JudgeCP(v.Potentials, crit)
			if err != nil {
				problems.Errorf(file, v.Line, "test point %s: %v", tp.ID, err)
				continue
			}
			v.Judgement = j
			switch {
			case j.OffCSE != nil:
				trend = append(trend, *j.OffCSE)
			case j.OnCSE != nil:
				trend = append(trend, *j.OnCSE)
			}
		}
		if t, ok := electrochem.TrendOf(trend); ok {
			tp.Trend = &t
		}
	}
	for _, an := range e.Anodes {
		l, err := electrochem.AnodeLifeOf(an.Anode)
		if err != nil {
			problems.Errorf(file, an.Line, "anode %s: %v", an.ID, err)
			continue
		}
		an.Life = &l
		rep := VisitDate{Time: wallloss.AddYears(today, l.Years)}
		an.Replace = &rep
		if e.AnodeReplacement == nil || rep.Time.Before(e.AnodeReplacement.Time) {
			e.AnodeReplacement = &rep
		}
	}
	e.computeCoating(c, today, problems)
	switch {
	case e.Material != "" && e.InContactWith != "":
		a, _ := electrochem.FindInSeries(e.Material) // both checked when read
		b, _ := electrochem.FindInSeries(e.InContactWith)
		p := electrochem.PairOf(a, b)
		e.Galvanic = &p
	case e.Material != "" || e.InContactWith != "":
		problems.Warnf(file, max(d.Lines["material"], d.Lines["in contact with"]), "give both material and in contact with to check the metal pair in %q", c.Name)
	}
	if e.RateSource != "" && e.RateSource != wallloss.SourceWall && e.RateSource != wallloss.SourceMax && len(e.OtherRates()) == 0 {
		problems.Errorf(file, d.Lines["rate source"], "rate source %s, but %q has no %s table with a rate", e.RateSource, c.Name, e.RateSource)
	}
	if e.AnodeCost != nil && len(e.Anodes) == 0 {
		problems.Warnf(file, d.Lines["anode cost"], "anode cost given, but %q has no anode table", c.Name)
	}
	if e.RecoatCostPerM2 != nil && e.Coating.BreakdownM2 == nil {
		problems.Errorf(file, d.Lines["recoat cost"], "recoat cost given, but %q has no breakdown area (m²) to price", c.Name)
	}
}

func (e *Electro) computeCoating(c *Component, today time.Time, problems *ProblemList) {
	d := &c.Design
	co := &e.Coating
	if co.RustedPct != nil {
		co.D610, _ = electrochem.D610Grade(*co.RustedPct) // range checked when read
		co.ISORi, _ = electrochem.ISO4628Ri(*co.RustedPct)
	}
	switch {
	case co.DFTNominalUM != nil && co.DFTReadingsUM != nil:
		maxUM := 0.0
		if co.DFTMaxUM != nil {
			maxUM = *co.DFTMaxUM
			if maxUM <= *co.DFTNominalUM {
				problems.Errorf(c.File, d.Lines["dft maximum"], "dft maximum %g µm is not above the dft nominal %g µm: write the largest thickness the coating system allows", maxUM, *co.DFTNominalUM)
				break
			}
		}
		j, err := electrochem.JudgeDFT(co.DFTReadingsUM, *co.DFTNominalUM, maxUM)
		if err != nil {
			problems.Errorf(c.File, d.Lines["dft readings"], "dft readings: %v", err)
		} else {
			co.DFT = &j
		}
	case co.DFTNominalUM != nil || co.DFTReadingsUM != nil:
		problems.Errorf(c.File, max(d.Lines["dft nominal"], d.Lines["dft readings"]), "give both dft nominal and dft readings in %q", c.Name)
	}
	if co.ZincUM != nil {
		if d.Corrosivity == "" {
			problems.Errorf(c.File, d.Lines["zinc thickness"], "zinc thickness: give the site's corrosivity (C1 … CX) to work out the zinc's life in %q", c.Name)
			return
		}
		g, err := electrochem.GalvanizingLifeOf(*co.ZincUM, string(d.Corrosivity))
		if err != nil {
			problems.Errorf(c.File, d.Lines["zinc thickness"], "zinc thickness: %v", err)
			return
		}
		co.Galvanizing = &g
		end := VisitDate{Time: wallloss.AddYears(today, g.ShortestY)}
		co.GalvanizingEnd = &end
	}
}

// OtherRates are the component's coupon and probe rates for the wall-loss
// computation: each coupon's rate, each ER probe's fitted rate and each LPR
// probe's latest rate.
func (e *Electro) OtherRates() []wallloss.OtherRate {
	if e == nil {
		return nil
	}
	var out []wallloss.OtherRate
	for _, c := range e.Coupons {
		if c.Rate != nil {
			out = append(out, wallloss.OtherRate{Kind: "coupon", Label: c.ID, MMPerY: c.Rate.MMPerY})
		}
	}
	for _, p := range e.ERProbes {
		if p.Rate != nil {
			out = append(out, wallloss.OtherRate{Kind: "probe", Label: p.ID, MMPerY: math.Max(p.Rate.MMPerY, 0)})
		}
	}
	for _, p := range e.LPRProbes {
		if n := len(p.Rates); n > 0 {
			out = append(out, wallloss.OtherRate{Kind: "probe", Label: p.ID, MMPerY: p.Rates[n-1].MMPerY})
		}
	}
	return out
}

// FailingPoint is a cathodic-protection test point whose latest visit is not
// protected, over-protected or cannot be judged, with why.
type FailingPoint struct {
	Asset, Component, Point string
	File                    string
	Line                    int
	Date                    VisitDate
	Status                  electrochem.CPStatus
	Reasons                 []string
}

// FailingTestPoints lists every test point of the survey whose latest visit
// does not meet the criteria, in checklist order, for an actions list.
func (s *Survey) FailingTestPoints() []FailingPoint {
	var out []FailingPoint
	for _, a := range s.Assets {
		for _, c := range a.Components {
			e := c.Design.Electro
			if e == nil {
				continue
			}
			for _, tp := range e.TestPoints {
				if len(tp.Visits) == 0 {
					continue
				}
				v := tp.Visits[len(tp.Visits)-1]
				if v.Judgement.Status == electrochem.Protected {
					continue
				}
				reasons := append([]string(nil), v.Judgement.Reasons...)
				if tp.Trend != nil && tp.Trend.Worsening {
					reasons = append(reasons, "moving positive across visits")
				}
				out = append(out, FailingPoint{a.Name, c.Name, tp.ID, c.File, v.Line, v.Date, v.Judgement.Status, reasons})
			}
		}
	}
	return out
}

// earlierElectroWarnings warns, once per earlier survey folder, at the first
// coupon, probe, test-point or anode row it holds: those tables are read
// from this survey's checklist only, so an earlier folder's rows would
// otherwise be left out without a word.
func earlierElectroWarnings(s *Survey) ProblemList {
	var problems ProblemList
	if s.History == nil {
		return nil
	}
	for _, e := range s.History.Earlier {
		if line := firstElectroRow(e); line > 0 {
			problems.Warnf(e.File, line, "the coupon, probe, test-point and anode tables of an earlier survey folder are not read into this report "+
				"(only the newest survey's own are): write the earlier rows into its tables to trend them")
		}
	}
	return problems
}

// firstElectroRow is the line of the first coupon, probe, test-point or
// anode row of s, or 0.
func firstElectroRow(s *Survey) int {
	for loc := range componentsOfSurvey(s) {
		e := loc.Component.Design.Electro
		if e == nil {
			continue
		}
		switch {
		case len(e.Coupons) > 0:
			return e.Coupons[0].Line
		case len(e.ERProbes) > 0:
			return e.ERProbes[0].Line
		case len(e.LPRProbes) > 0:
			return e.LPRProbes[0].Line
		case len(e.TestPoints) > 0 && len(e.TestPoints[0].Visits) > 0:
			return e.TestPoints[0].Visits[0].Line
		case len(e.Anodes) > 0:
			return e.Anodes[0].Line
		}
	}
	return 0
}
