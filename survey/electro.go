package survey

import (
	"github.com/lossline/lossline/survey/electrochem"
	"github.com/lossline/lossline/survey/wallloss"
)

// Electro is a component's electrochemical data: coupons, probes, cathodic
// protection test points, sacrificial anodes, coating observations and the
// metal pair it forms. Read by electro_read.go, computed by ComputeElectro.
type Electro struct {
	Coupons    []*CouponRow
	ERProbes   []*ERProbe
	LPRProbes  []*LPRProbe
	TestPoints []*TestPoint // in order of first appearance; each with its visits
	Anodes     []*AnodeRow
	Coating    Coating

	RateSource    wallloss.RateSource // "" for max
	Material      string              // of the component, as written
	InContactWith string              // the metal it touches, as written
	Galvanic      *electrochem.GalvanicPair

	Anaerobic        bool     // cp soil: anaerobic (−950 mV CSE)
	OverLimitMV      *float64 // over-protection limit, mV CSE
	AnodeCost        *Money   // cost of replacing one anode
	RecoatCostPerM2  *Money   // recoating price per m²
	AnodeReplacement *VisitDate
}

// CouponRow is one mass-loss coupon of a coupon table.
type CouponRow struct {
	ID, Metal          string
	Installed, Removed VisitDate
	Coupon             electrochem.Coupon
	Line               int
	Rate               *electrochem.CouponRate
}

// ERProbe is one electrical-resistance probe with its readings by date
// (divisions, 0–1000 across the span).
type ERProbe struct {
	ID       string
	SpanMM   float64
	Dates    []VisitDate
	Readings []float64
	Line     int
	Rate     *electrochem.ERRate
}

// LPRProbe is one linear-polarisation probe with R_p (Ω·cm²) by date.
type LPRProbe struct {
	ID           string
	Metal        string
	BetaA, BetaC float64 // mV/decade; 0 for the default B
	BmV          float64 // a B written directly; 0 when not
	Dates        []VisitDate
	RpOhmCM2     []float64
	Line         int
	Rates        []electrochem.LPRRate // one per date
}

// TestPoint is a cathodic-protection test point and its visits.
type TestPoint struct {
	ID     string
	Visits []CPVisit // in date order
	Trend  *electrochem.CPTrend
}

// CPVisit is one row of a test-point table: the potentials on one date.
type CPVisit struct {
	Date       VisitDate
	Potentials electrochem.Potentials
	Line       int
	Judgement  electrochem.CPJudgement
}

// AnodeRow is one sacrificial anode of an anode table.
type AnodeRow struct {
	ID       string
	Material string
	Anode    electrochem.Anode
	UseNote  string // the utilisation as written (a number or a shape)
	Line     int
	Life     *electrochem.AnodeLife
	// Replace is when the anode is spent: the survey date plus its life.
	Replace *VisitDate
}

// Coating is what a component's design list says about its coating.
type Coating struct {
	RustedPct      *float64 // % of the area rusted
	BreakdownM2    *float64 // area to recoat, m²
	DFTNominalUM   *float64
	DFTMaxUM       *float64
	DFTReadingsUM  []float64
	ZincUM         *float64 // measured zinc (galvanizing) thickness, µm
	D610, ISORi    int
	DFT            *electrochem.DFTJudgement
	Galvanizing    *electrochem.GalvanizingLife
	GalvanizingEnd *VisitDate // survey date + shortest life
}

// Empty reports whether the component has no electrochemical data.
func (e *Electro) Empty() bool {
	return e == nil || len(e.Coupons)+len(e.ERProbes)+len(e.LPRProbes)+len(e.TestPoints)+len(e.Anodes) == 0 &&
		e.Coating.RustedPct == nil && e.Coating.DFTNominalUM == nil && e.Coating.ZincUM == nil && e.Material == ""
}
