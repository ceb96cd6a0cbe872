package electrochem

import (
	"errors"
	"fmt"
)

// Mass-loss constants K of ASTM G1-03 (R2017) §8.1.2 (also ASTM G31-21) for
// W in g, A in cm², T in h, D in g/cm³.
const (
	KMMPerY = 8.76e4 // mm/y
	KMPY    = 3.45e6 // mils/y
)

// CouponSource names the coupon method and its bands.
const CouponSource = "ASTM G1-03 (R2017) §8.1.2, ASTM G31-21; bands: NACE SP0775 qualitative categories for carbon steel (table from memory)"

// Coupon is one mass-loss coupon as weighed and exposed.
type Coupon struct {
	MassBeforeG float64 // before exposure, g
	MassAfterG  float64 // after cleaning, g
	AreaCM2     float64 // exposed area, cm²
	Hours       float64 // exposure time, h
	DensityG    float64 // g/cm³
	PitDepthMM  float64 // deepest pit on the coupon, mm; 0 when none was seen
}

// CouponRate is a coupon's uniform rate and pitting rate with their bands.
type CouponRate struct {
	MassLossG   float64
	MMPerY, MPY float64
	PitMMPerY   float64 // 0 when no pit was recorded
	Band        Band    // general rate band, carbon steel
	PitBand     Band    // pitting rate band; Low when no pit
	Working
}

// CouponRateOf is ASTM G1 §8.1.2's CR = K·W / (A·T·D); the pitting rate is the
// deepest pit over the exposure (NACE SP0775: depth × 365 / days).
func CouponRateOf(c Coupon) (CouponRate, error) {
	w := c.MassBeforeG - c.MassAfterG
	switch {
	case c.AreaCM2 <= 0 || c.Hours <= 0 || c.DensityG <= 0:
		return CouponRate{}, errors.New("area, exposure time and density must be positive")
	case w < 0:
		return CouponRate{}, fmt.Errorf("mass after cleaning %g g is more than before %g g", c.MassAfterG, c.MassBeforeG)
	case c.PitDepthMM < 0:
		return CouponRate{}, fmt.Errorf("pit depth %g mm is negative", c.PitDepthMM)
	}
	r := CouponRate{MassLossG: w}
	r.Source = CouponSource
	atd := c.AreaCM2 * c.Hours * c.DensityG
	r.MMPerY = KMMPerY * w / atd
	r.MPY = KMPY * w / atd
	r.step("W = %.4g − %.4g = %.4g g", c.MassBeforeG, c.MassAfterG, w)
	r.step("CR = K·W/(A·T·D) = 8.76×10⁴ × %.4g / (%.4g cm² × %.4g h × %.4g g/cm³) = %.4g mm/y (%.4g mpy with K = 3.45×10⁶)",
		w, c.AreaCM2, c.Hours, c.DensityG, r.MMPerY, r.MPY)
	r.Band = GeneralBand(r.MMPerY)
	r.step("general rate %.4g mm/y: %s", r.MMPerY, r.Band)
	if c.PitDepthMM > 0 {
		r.PitMMPerY = c.PitDepthMM * HoursPerYear / c.Hours
		r.PitBand = PittingBand(r.PitMMPerY)
		r.step("pitting rate = %.4g mm × 8760 / %.4g h = %.4g mm/y: %s", c.PitDepthMM, c.Hours, r.PitMMPerY, r.PitBand)
	}
	return r, nil
}

// Band is a qualitative corrosion-rate category.
type Band int

// Bands of NACE SP0775 for carbon steel, least severe first.
const (
	Low Band = iota
	Moderate
	High
	Severe
)

func (b Band) String() string { return [...]string{"low", "moderate", "high", "severe"}[b] }

// GeneralBand classifies a uniform rate in mm/y by NACE SP0775's qualitative
// categories for carbon steel: < 0.025 low, 0.025–0.12 moderate, 0.13–0.25
// high, > 0.25 severe. A rate in the table's gap (0.12–0.13) is put in the
// higher band.
func GeneralBand(mmPerY float64) Band {
	switch {
	case mmPerY < 0.025:
		return Low
	case mmPerY <= 0.12:
		return Moderate
	case mmPerY <= 0.25:
		return High
	}
	return Severe
}

// PittingBand classifies a pitting rate in mm/y by NACE SP0775: < 0.13 low,
// 0.13–0.20 moderate, 0.21–0.38 high, > 0.38 severe (gaps to the higher band).
func PittingBand(mmPerY float64) Band {
	switch {
	case mmPerY < 0.13:
		return Low
	case mmPerY <= 0.20:
		return Moderate
	case mmPerY <= 0.38:
		return High
	}
	return Severe
}
