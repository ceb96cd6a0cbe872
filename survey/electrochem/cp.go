package electrochem

import (
	"errors"
	"fmt"
)

// Potentials are the structure-to-electrolyte potentials at one test point on
// one visit, in mV against Electrode; nil where not measured.
type Potentials struct {
	On, Off, Native *float64
	Electrode       Electrode
}

// Criteria are the cathodic-protection criteria a survey applies.
type Criteria struct {
	// Anaerobic moves the polarised-potential criterion to −950 mV CSE, for
	// soils where sulphate-reducing bacteria are active.
	Anaerobic bool
	// OverLimitMV is the most negative instant-off potential allowed, mV CSE
	// (−1200 by default; a lower magnitude such as −1100 for high-strength
	// steels or coatings prone to disbonding, as the owner sets).
	OverLimitMV float64
}

// DefaultCriteria are −850 mV CSE polarised, 100 mV polarisation and an
// over-protection limit of −1200 mV CSE instant-off.
var DefaultCriteria = Criteria{OverLimitMV: -1200}

// Criterion potentials, mV against CSE (NACE SP0169-2013 §6.2.2.1;
// ISO 15589-1:2015 §7.2, Table 1).
const (
	PolarisedLimitMV    = -850.0
	AnaerobicLimitMV    = -950.0
	MinPolarisationMV   = 100.0
	TrendWorseningMV    = 50.0 // a move this far positive between first and last visit is flagged (common practice)
	CPSource            = "NACE SP0169-2013 §6.2.2.1 (−850 mV CSE polarised; 100 mV polarisation); ISO 15589-1:2015 §7.2 (−950 mV in anaerobic soil; limit potentials) — from memory"
	IRDropCaution       = "only the \"on\" potential was measured: it includes the IR drop in the electrolyte, which NACE SP0169 requires to be considered before it is judged against −850 mV"
	overProtectionNoted = "more negative than the over-protection limit"
)

// CPStatus is the judgement of one test point.
type CPStatus int

// Statuses, worst first after Protected.
const (
	Protected CPStatus = iota
	NotProtected
	OverProtected
	Undetermined
)

func (s CPStatus) String() string {
	return [...]string{"protected", "not protected", "over-protected", "not determined"}[s]
}

// CPJudgement is one test point judged against the criteria, all potentials
// converted to CSE.
type CPJudgement struct {
	Status                   CPStatus
	OnCSE, OffCSE, NativeCSE *float64
	PolarisationMV           *float64 // native − instant-off
	Met                      string   // the criterion met, when protected
	Reasons                  []string // why it is not protected, or over-protected
	Caution                  string   // the IR-drop caution where only "on" exists
	Working
}

func toCSE(v *float64, e Electrode) *float64 {
	if v == nil {
		return nil
	}
	c := Convert(*v, e, CSE)
	return &c
}

// JudgeCP judges one test point's potentials against c.
func JudgeCP(p Potentials, c Criteria) (CPJudgement, error) {
	if p.On == nil && p.Off == nil {
		return CPJudgement{}, errors.New("a test point needs an on or an instant-off potential")
	}
	if c.OverLimitMV == 0 {
		c.OverLimitMV = DefaultCriteria.OverLimitMV
	}
	j := CPJudgement{OnCSE: toCSE(p.On, p.Electrode), OffCSE: toCSE(p.Off, p.Electrode), NativeCSE: toCSE(p.Native, p.Electrode)}
	j.Source = CPSource
	limit := PolarisedLimitMV
	if c.Anaerobic {
		limit = AnaerobicLimitMV
	}
	if p.Electrode != CSE {
		for _, x := range []struct {
			name    string
			raw, to *float64
		}{{"on", p.On, j.OnCSE}, {"instant-off", p.Off, j.OffCSE}, {"native", p.Native, j.NativeCSE}} {
			if x.raw != nil {
				j.step("%s %.0f mV %s → %.0f mV CSE", x.name, *x.raw, p.Electrode, *x.to)
			}
		}
	}
	if j.OffCSE != nil {
		off := *j.OffCSE
		if j.NativeCSE != nil {
			pol := *j.NativeCSE - off
			j.PolarisationMV = &pol
			j.step("polarisation = native − instant-off = %.0f − (%.0f) = %.0f mV", *j.NativeCSE, off, pol)
		}
		switch {
		case off < c.OverLimitMV:
			j.Status = OverProtected
			j.Reasons = append(j.Reasons, fmt.Sprintf("instant-off %.0f mV CSE is %s %.0f mV CSE", off, overProtectionNoted, c.OverLimitMV))
		case off <= limit:
			j.Status, j.Met = Protected, fmt.Sprintf("instant-off %.0f mV CSE ≤ %.0f mV", off, limit)
		case j.PolarisationMV != nil && *j.PolarisationMV >= MinPolarisationMV:
			j.Status, j.Met = Protected, fmt.Sprintf("polarisation %.0f mV ≥ 100 mV", *j.PolarisationMV)
		default:
			j.Status = NotProtected
			j.Reasons = append(j.Reasons, fmt.Sprintf("instant-off %.0f mV CSE is more positive than %.0f mV", off, limit))
			if j.PolarisationMV != nil {
				j.Reasons = append(j.Reasons, fmt.Sprintf("polarisation %.0f mV is less than 100 mV", *j.PolarisationMV))
			} else {
				j.Reasons = append(j.Reasons, "no native potential: the 100 mV criterion cannot be checked")
			}
		}
		j.step("criterion: instant-off ≤ %.0f mV CSE or polarisation ≥ 100 mV; over-protection limit %.0f mV CSE → %s", limit, c.OverLimitMV, j.Status)
		return j, nil
	}
	on := *j.OnCSE
	j.Caution = IRDropCaution
	if on > limit {
		// With protective current flowing the instant-off potential is less
		// negative than the on potential, so it cannot meet the limit either.
		j.Status = NotProtected
		j.Reasons = append(j.Reasons, fmt.Sprintf("on %.0f mV CSE is more positive than %.0f mV even with the IR drop included", on, limit))
	} else {
		j.Status = Undetermined
		j.Reasons = append(j.Reasons, fmt.Sprintf("on %.0f mV CSE meets %.0f mV only before the IR drop is removed", on, limit))
	}
	j.step("on potential only, %.0f mV CSE against %.0f mV → %s", on, limit, j.Status)
	return j, nil
}

// CPTrend is how a test point's judged potential moved across visits.
type CPTrend struct {
	ChangeMV  float64 // last − first, mV (positive: less protection)
	Worsening bool    // moved positive by more than TrendWorseningMV
}

// TrendOf compares the first and last of a test point's potentials (mV CSE,
// in visit order).
func TrendOf(mV []float64) (CPTrend, bool) {
	if len(mV) < 2 {
		return CPTrend{}, false
	}
	d := mV[len(mV)-1] - mV[0]
	return CPTrend{ChangeMV: d, Worsening: d > TrendWorseningMV}, true
}
