package localdamage

import (
	"errors"
	"fmt"
	"math"
)

// mmPerIn is the exact inch.
const mmPerIn = 25.4

// BottomInput is API 653 §4.4.7's data for a tank bottom (mm, mm/y, years).
type BottomInput struct {
	BottomSideMM      float64 // RT_bc: least remaining thickness from bottom-side corrosion, after repairs
	ProductSideMM     float64 // RT_ip: least remaining thickness from internal (product-side) corrosion, after repairs
	ProductSideRate   float64 // StP_r: greatest product-side pitting rate; 0 under an internal lining
	UndersideRate     float64 // UP_r: greatest underside rate; 0 under effective cathodic protection
	IntervalY         float64 // Or: years to the next internal inspection
	LeakBarrier       bool    // a release prevention barrier (leak detection and containment)
	MinRemainingLimMM float64 // MRT_min of API 653 Table 4.4 (see required.BottomMinRemainingIn)
}

// BottomResult is the minimum remaining thickness at the next inspection.
type BottomResult struct {
	MRTMM        float64  // at the end of the interval
	LimitMM      float64  // MRT_min
	Pass         bool     // MRT ≥ MRT_min
	MaxIntervalY *float64 // Or at which MRT reaches MRT_min; nil when both rates are 0
	Steps        []string
}

// TankBottom is API 653 §4.4.7 (5th ed.): MRT = min(RT_bc, RT_ip) −
// Or·(StP_r + UP_r), to be at least MRT_min of Table 4.4; the interval that
// reaches MRT_min is (min(RT_bc, RT_ip) − MRT_min)/(StP_r + UP_r).
func TankBottom(in BottomInput) (BottomResult, error) {
	var r BottomResult
	for _, v := range []float64{in.BottomSideMM, in.ProductSideMM, in.MinRemainingLimMM} {
		if !(v > 0) || math.IsInf(v, 0) {
			return r, errors.New("remaining thicknesses and the limit must be positive")
		}
	}
	if in.ProductSideRate < 0 || in.UndersideRate < 0 || in.IntervalY < 0 || math.IsNaN(in.ProductSideRate+in.UndersideRate+in.IntervalY) {
		return r, errors.New("rates and the interval must not be negative")
	}
	least := min(in.BottomSideMM, in.ProductSideMM)
	rate := in.ProductSideRate + in.UndersideRate
	r.MRTMM = least - in.IntervalY*rate
	r.LimitMM = in.MinRemainingLimMM
	r.Pass = r.MRTMM >= r.LimitMM-1e-9
	r.Steps = append(r.Steps,
		fmt.Sprintf("MRT = min(RT_bc, RT_ip) − Or·(StP_r + UP_r) = min(%.3f, %.3f) − %.4g × (%.4g + %.4g) = %.3f mm (%.4f in)",
			in.BottomSideMM, in.ProductSideMM, in.IntervalY, in.ProductSideRate, in.UndersideRate, r.MRTMM, r.MRTMM/mmPerIn),
		fmt.Sprintf("MRT_min = %.3f mm (%.2f in, %s; Table 4.4): %s", r.LimitMM, r.LimitMM/mmPerIn,
			map[bool]string{true: "with a release prevention barrier", false: "no means to detect and contain a leak"}[in.LeakBarrier],
			map[bool]string{true: "acceptable for the interval", false: "NOT acceptable for the interval"}[r.Pass]))
	if rate > 0 {
		or := max(least-r.LimitMM, 0) / rate
		r.MaxIntervalY = &or
		r.Steps = append(r.Steps, fmt.Sprintf("longest interval = (min − MRT_min)/(StP_r + UP_r) = (%.3f − %.3f)/%.4g = %.1f y", least, r.LimitMM, rate, or))
	}
	return r, nil
}
