package wallloss

import (
	"fmt"
	"strings"
)

// OtherRate is a corrosion rate measured on a component other than by its
// wall: a mass-loss coupon or a probe, in mm/y.
type OtherRate struct {
	Kind   string // "coupon" or "probe"
	Label  string // the coupon's or probe's id
	MMPerY float64
}

// RateSource says which rate governs a component's CMLs.
type RateSource string

// Rate sources a checklist may name.
const (
	SourceWall   RateSource = "wall"   // the wall readings only; coupons and probes are reported
	SourceCoupon RateSource = "coupon" // the largest coupon rate
	SourceProbe  RateSource = "probe"  // the largest probe rate
	SourceMax    RateSource = "max"    // the largest of wall, coupon and probe (default)
)

// RateSources lists the sources in the order README gives them.
var RateSources = []RateSource{SourceWall, SourceCoupon, SourceProbe, SourceMax}

// ParseRateSource reads wall, coupon, probe or max.
func ParseRateSource(s string) (RateSource, error) {
	k := RateSource(strings.ToLower(strings.TrimSpace(s)))
	for _, x := range RateSources {
		if k == x {
			return k, nil
		}
	}
	return "", fmt.Errorf("rate source %q is not wall, coupon, probe or max", s)
}

// DisagreeFactor and DisagreeMinMMPerY set when a coupon or probe rate and
// the wall rate are said to disagree: the larger is more than 3 times the
// smaller and they differ by more than 0.025 mm/y, the lowest band of NACE
// SP0775 (the factor is common practice).
const (
	DisagreeFactor    = 3.0
	DisagreeMinMMPerY = 0.025
)

// Models of a rate taken from a coupon or a probe.
const (
	ModelCoupon RateModel = "coupon"
	ModelProbe  RateModel = "probe"
)

// otherRates lets a coupon or probe rate govern as in.RateSource says, keeps
// the wall rate in WallRateMMPerY and says why in RateWhy. It reports whether
// the governing rate is a measurable loss.
func (r *Result) otherRates(in Input, measurable bool) bool {
	if len(in.OtherRates) == 0 {
		return measurable
	}
	src := in.RateSource
	if src == "" {
		src = SourceMax
	}
	var best *OtherRate
	for i, o := range in.OtherRates {
		if (src == SourceMax || src == SourceWall || RateSource(o.Kind) == src) && (best == nil || o.MMPerY > best.MMPerY) {
			best = &in.OtherRates[i]
		}
	}
	if r.RateMMPerY != nil {
		w := *r.RateMMPerY
		if !measurable {
			w = 0
		}
		r.WallRateMMPerY = ptr(w)
		if best != nil {
			hi, lo := max(w, best.MMPerY), min(w, best.MMPerY)
			if hi > DisagreeFactor*lo && hi-lo > DisagreeMinMMPerY {
				r.flag(FlagRatesDisagree)
			}
		}
	}
	wall := "wall"
	if r.WallRateMMPerY != nil {
		wall = fmt.Sprintf("wall %.3g mm/y", *r.WallRateMMPerY)
	}
	switch {
	case best == nil:
		r.RateWhy = fmt.Sprintf("rate source %s: no %s rate on the component, the wall rate governs", src, src)
		return measurable
	case src == SourceWall:
		r.RateWhy = fmt.Sprintf("rate source wall: %s governs; %s %s %.3g mm/y reported only", wall, best.Kind, best.Label, best.MMPerY)
		return measurable
	case src == SourceMax && r.WallRateMMPerY != nil && *r.WallRateMMPerY >= best.MMPerY:
		r.RateWhy = fmt.Sprintf("rate source max: %s ≥ %s %s %.3g mm/y", wall, best.Kind, best.Label, best.MMPerY)
		return measurable
	}
	if src == SourceMax {
		r.RateWhy = fmt.Sprintf("rate source max: %s %s %.3g mm/y > %s", best.Kind, best.Label, best.MMPerY, wall)
	} else {
		r.RateWhy = fmt.Sprintf("rate source %s: %s %s %.3g mm/y governs (%s)", src, best.Kind, best.Label, best.MMPerY, wall)
	}
	r.RateModel, r.RateMMPerY, r.RateUpperMMPerY = RateModel(best.Kind), ptr(best.MMPerY), nil
	r.RateFrom = best.Kind + " " + best.Label
	return best.MMPerY > 0
}
