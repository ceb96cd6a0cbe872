package wallloss

import "testing"

// A coupon or probe rate against the wall rate (rate source, our rule):
// 10.0 mm (2016-06-01) → 9.0 mm (2026-06-01) is 0.1 mm/y over 9.99863 y
// (API 570 §7.1.1 long-term rate); required 5.0 mm. A coupon at 0.5 mm/y
// governs under max, RL = 4.0 / 0.5 = 8 y, and the two disagree (factor 5 >
// 3, common practice).
func TestOtherRates(t *testing.T) {
	in := Input{
		Readings:    []Reading{{day("2016-06-01"), 10}, {day("2026-06-01"), 9}},
		RequiredMM:  ptr(5.0),
		LatestVisit: day("2026-06-01"),
		OtherRates:  []OtherRate{{"coupon", "C-1", 0.5}, {"coupon", "C-2", 0.2}},
	}
	res := Assess(in, DefaultPolicy)
	near(t, "max: coupon governs", res.RateMMPerY, 0.5, 1e-9)
	near(t, "wall rate kept", res.WallRateMMPerY, 0.100014, 1e-4)
	near(t, "remaining life", res.RemainingLifeY, 8, 1e-9)
	if res.RateModel != ModelCoupon || res.RateFrom != "coupon C-1" || !res.HasFlag(FlagRatesDisagree) {
		t.Errorf("model %v from %q flags %v", res.RateModel, res.RateFrom, res.Flags)
	}
	in.RateSource = SourceWall
	res = Assess(in, DefaultPolicy)
	near(t, "wall governs", res.RateMMPerY, 0.100014, 1e-4)
	if res.RateFrom != "" || !res.HasFlag(FlagRatesDisagree) {
		t.Errorf("wall: from %q flags %v", res.RateFrom, res.Flags)
	}
	in.RateSource = SourceProbe // no probe: the wall governs, said so
	res = Assess(in, DefaultPolicy)
	near(t, "no probe", res.RateMMPerY, 0.100014, 1e-4)
	if res.RateWhy == "" {
		t.Error("no reason given")
	}
	// Agreeing rates: 0.12 vs 0.100 is no disagreement; max keeps the coupon.
	in.RateSource, in.OtherRates = SourceMax, []OtherRate{{"probe", "ER-1", 0.12}}
	res = Assess(in, DefaultPolicy)
	near(t, "probe governs", res.RateMMPerY, 0.12, 1e-9)
	if res.HasFlag(FlagRatesDisagree) {
		t.Error("0.12 and 0.10 mm/y flagged as disagreeing")
	}
	// One visit, no estimate: the probe gives the only rate.
	in.Readings = in.Readings[1:]
	res = Assess(in, DefaultPolicy)
	near(t, "single visit, probe", res.RateMMPerY, 0.12, 1e-9)
	near(t, "single visit life", res.RemainingLifeY, 4/0.12, 1e-9)
}
