package localdamage

import (
	"errors"
	"fmt"
	"math"
)

// CorrodedArea is a corroded area on a pipe, for ASME B31G-2012 (mm, MPa).
type CorrodedArea struct {
	OutsideDiameterMM float64 // D
	WallMM            float64 // t, nominal wall
	DepthMM           float64 // d, deepest point of the area
	LengthMM          float64 // L, axial length of the area
	SMYSMPa           float64 // specified minimum yield strength
	MAOPMPa           float64 // maximum allowable operating pressure
	SafetyFactor      float64 // SF, e.g. the hydrotest ratio or 1/F (1.39 for F = 0.72)
	DepthRateMMPerY   float64 // depth growth rate; 0 when none is known
}

// FlowStressModifiedAddMPa is the modified criterion's flow stress margin over
// SMYS, 69 MPa (10 ksi) (ASME B31G-2012, modified criterion, from memory; Kiefner and Vieth 1989).
const FlowStressModifiedAddMPa = 69

// StrengthResult is one B31G method's result for a corroded area.
type StrengthResult struct {
	Method       string
	Z            float64 // L²/(D·t)
	M            float64 // Folias factor; +Inf for the original method's long flaws
	FlowMPa      float64
	FailureMPa   float64 // hoop stress at failure, S_F
	FailurePress float64 // P_F = 2·S_F·t/D, MPa
	SafePress    float64 // P_S = P_F/SF, MPa
	ERF          float64 // MAOP / P_S; above 1 the area does not pass
	Pass         bool
	Steps        []string
}

// Strength is both methods' results and the life until the area fails to pass.
type Strength struct {
	DepthRatio float64 // d/t
	Repair     bool    // d/t > 0.80: beyond both methods, repair or a higher-level assessment
	Original   StrengthResult
	Modified   StrengthResult
	Governing  *StrengthResult // the lower safe pressure of the two
	RemainingY *float64        // years until P_S < MAOP or d/t > 0.80 at the depth rate; nil without a rate
	Steps      []string
}

// FoliasOriginal is the original B31G bulging factor √(1 + 0.8·z), used for
// z ≤ 20 (ASME B31G-2012, Level 1).
func FoliasOriginal(z float64) float64 { return math.Sqrt(1 + 0.8*z) }

// FoliasModified is the modified criterion's factor: √(1 + 0.6275·z −
// 0.003375·z²) for z ≤ 50, 0.032·z + 3.3 above (ASME B31G-2012, Level 1;
// Kiefner and Vieth 1989).
func FoliasModified(z float64) float64 {
	if z <= 50 {
		return math.Sqrt(1 + 0.6275*z - 0.003375*z*z)
	}
	return 0.032*z + 3.3
}

func (c CorrodedArea) check() error {
	switch {
	case !(c.OutsideDiameterMM > 0) || !(c.WallMM > 0) || math.IsInf(c.OutsideDiameterMM+c.WallMM, 0):
		return errors.New("outside diameter and wall must be positive")
	case c.WallMM >= c.OutsideDiameterMM/2:
		return errors.New("the wall is not less than the radius")
	case !(c.DepthMM >= 0) || c.DepthMM >= c.WallMM:
		return errors.New("the depth must be at least 0 and less than the wall")
	case !(c.LengthMM >= 0) || math.IsInf(c.LengthMM, 0):
		return errors.New("the length must not be negative")
	case !(c.SMYSMPa > 0) || !(c.MAOPMPa > 0):
		return errors.New("SMYS and MAOP must be positive")
	case !(c.SafetyFactor >= 1):
		return errors.New("the safety factor must be at least 1")
	case !(c.DepthRateMMPerY >= 0):
		return errors.New("the depth growth rate must not be negative")
	}
	return nil
}

// Original is the original B31G Level 1 assessment: flow stress 1.1·SMYS,
// metal loss taken as the parabolic area ⅔·d·L; for z ≤ 20 S_F = S_flow·(1 −
// ⅔·d/t)/(1 − ⅔·(d/t)/M), above S_F = S_flow·(1 − d/t) (ASME B31G-2012, Level 1).
func Original(c CorrodedArea) (StrengthResult, error) {
	if err := c.check(); err != nil {
		return StrengthResult{}, err
	}
	r := StrengthResult{Method: "ASME B31G original ((2/3)·d·L)", FlowMPa: 1.1 * c.SMYSMPa}
	r.Z = c.LengthMM * c.LengthMM / (c.OutsideDiameterMM * c.WallMM)
	dt := c.DepthMM / c.WallMM
	r.Steps = append(r.Steps, fmt.Sprintf("z = L²/(D·t) = %.4g²/(%.4g × %.4g) = %.4f; S_flow = 1.1 × SMYS = %.1f MPa", c.LengthMM, c.OutsideDiameterMM, c.WallMM, r.Z, r.FlowMPa))
	if r.Z <= 20 {
		r.M = FoliasOriginal(r.Z)
		r.FailureMPa = r.FlowMPa * (1 - 2.0/3*dt) / (1 - 2.0/3*dt/r.M)
		r.Steps = append(r.Steps, fmt.Sprintf("z ≤ 20: M = √(1 + 0.8·z) = %.4f; S_F = S_flow·(1 − (2/3)·d/t)/(1 − (2/3)·(d/t)/M) = %.1f MPa (d/t = %.4f)", r.M, r.FailureMPa, dt))
	} else {
		r.M = math.Inf(1)
		r.FailureMPa = r.FlowMPa * (1 - dt)
		r.Steps = append(r.Steps, fmt.Sprintf("z > 20: S_F = S_flow·(1 − d/t) = %.1f MPa (d/t = %.4f)", r.FailureMPa, dt))
	}
	r.pressures(c)
	return r, nil
}

// Modified is the modified B31G ("0.85 dL") Level 1 assessment with flow
// stress SMYS + 69 MPa: S_F = S_flow·(1 − 0.85·d/t)/(1 − 0.85·(d/t)/M)
// (ASME B31G-2012, Level 1; Kiefner and Vieth 1989).
func Modified(c CorrodedArea) (StrengthResult, error) {
	if err := c.check(); err != nil {
		return StrengthResult{}, err
	}
	r := StrengthResult{Method: "ASME B31G modified (0.85·d·L)", FlowMPa: c.SMYSMPa + FlowStressModifiedAddMPa}
	r.Z = c.LengthMM * c.LengthMM / (c.OutsideDiameterMM * c.WallMM)
	dt := c.DepthMM / c.WallMM
	r.M = FoliasModified(r.Z)
	r.FailureMPa = r.FlowMPa * (1 - 0.85*dt) / (1 - 0.85*dt/r.M)
	mForm := "√(1 + 0.6275·z − 0.003375·z²)"
	if r.Z > 50 {
		mForm = "0.032·z + 3.3"
	}
	r.Steps = append(r.Steps,
		fmt.Sprintf("z = %.4f; S_flow = SMYS + 69 MPa = %.1f MPa; M = %s = %.4f", r.Z, r.FlowMPa, mForm, r.M),
		fmt.Sprintf("S_F = S_flow·(1 − 0.85·d/t)/(1 − 0.85·(d/t)/M) = %.1f MPa (d/t = %.4f)", r.FailureMPa, dt))
	r.pressures(c)
	return r, nil
}

func (r *StrengthResult) pressures(c CorrodedArea) {
	r.FailurePress = 2 * r.FailureMPa * c.WallMM / c.OutsideDiameterMM
	r.SafePress = r.FailurePress / c.SafetyFactor
	r.ERF = c.MAOPMPa / r.SafePress
	r.Pass = r.ERF <= 1
	r.Steps = append(r.Steps, fmt.Sprintf("P_F = 2·S_F·t/D = %.3f MPa; P_S = P_F/SF = %.3f / %.3g = %.3f MPa; ERF = MAOP/P_S = %.3f / %.3f = %.3f (%s)",
		r.FailurePress, r.FailurePress, c.SafetyFactor, r.SafePress, c.MAOPMPa, r.SafePress, r.ERF,
		map[bool]string{true: "passes", false: "does NOT pass"}[r.Pass]))
}

// MaxDepthRatio is the deepest metal loss B31G Level 1 assesses, 80 % of the
// wall (ASME B31G-2012 scope; from memory).
const MaxDepthRatio = 0.80

// AssessCorrodedArea runs both methods. Deeper than 80 % of the wall it
// returns Repair and no pressures. With a depth rate it finds, by bisection,
// the years until the governing safe pressure falls below MAOP or the depth
// passes 80 % (length held as measured).
func AssessCorrodedArea(c CorrodedArea) (Strength, error) {
	var s Strength
	if err := c.check(); err != nil {
		return s, err
	}
	s.DepthRatio = c.DepthMM / c.WallMM
	if s.DepthRatio > MaxDepthRatio {
		s.Repair = true
		zero := 0.0
		s.RemainingY = &zero
		s.Steps = append(s.Steps, fmt.Sprintf("d/t = %.3f > 0.80: beyond ASME B31G Level 1; repair or a higher-level assessment", s.DepthRatio))
		return s, nil
	}
	var err error
	if s.Original, err = Original(c); err != nil {
		return s, err
	}
	if s.Modified, err = Modified(c); err != nil {
		return s, err
	}
	s.Governing = &s.Original
	if s.Modified.SafePress < s.Original.SafePress {
		s.Governing = &s.Modified
	}
	s.Steps = append(s.Steps, fmt.Sprintf("governing: the lower safe pressure, %s, %.3f MPa", s.Governing.Method, s.Governing.SafePress))
	if c.DepthRateMMPerY == 0 {
		return s, nil
	}
	safeAt := func(y float64) float64 {
		cc := c
		cc.DepthMM = c.DepthMM + c.DepthRateMMPerY*y
		o, _ := Original(cc)
		m, _ := Modified(cc)
		return min(o.SafePress, m.SafePress)
	}
	limit := (MaxDepthRatio*c.WallMM - c.DepthMM) / c.DepthRateMMPerY
	life := limit
	switch {
	case safeAt(0) < c.MAOPMPa:
		life = 0
	case safeAt(limit) < c.MAOPMPa:
		lo, hi := 0.0, limit
		for range 100 {
			mid := (lo + hi) / 2
			if safeAt(mid) >= c.MAOPMPa {
				lo = mid
			} else {
				hi = mid
			}
		}
		life = lo
	}
	s.RemainingY = &life
	s.Steps = append(s.Steps, fmt.Sprintf("remaining life at %.3g mm/y of depth growth (length as measured): %.1f y, when %s",
		c.DepthRateMMPerY, life, map[bool]string{true: "the depth reaches 80 % of the wall", false: "P_S falls to MAOP"}[life == limit]))
	return s, nil
}
