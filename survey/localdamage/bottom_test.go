package localdamage

import "testing"

// API 653 §4.4.7 with the Table 4.4 limits (0.10 in without, 0.05 in with a
// release prevention barrier), hand calculation in inches converted exactly.
func TestTankBottom(t *testing.T) {
	in := func(v float64) float64 { return v * 25.4 }
	tests := []struct {
		name       string
		input      BottomInput
		wantMRTIn  float64
		wantPass   bool
		wantMaxOrY float64
	}{
		// RT_bc 0.180, RT_ip 0.200, StP_r 0.004, UP_r 0.006 in/y, Or 8 y:
		// MRT = 0.180 − 8 × 0.010 = 0.100 in, exactly at 0.10 in (API 653 §4.4.7).
		{"at the limit, no barrier", BottomInput{in(0.180), in(0.200), in(0.004), in(0.006), 8, false, in(0.10)}, 0.100, true, 8},
		// With a barrier the limit is 0.05 in: longest interval 13 y.
		{"with a barrier", BottomInput{in(0.180), in(0.200), in(0.004), in(0.006), 8, true, in(0.05)}, 0.100, true, 13},
		// Nine years: 0.090 in < 0.10 in, not acceptable.
		{"too long an interval", BottomInput{in(0.180), in(0.200), in(0.004), in(0.006), 9, false, in(0.10)}, 0.090, false, 8},
		// Product side governs when thinner: 0.150 − 5 × 0.004 = 0.130 in (UP_r 0 under cathodic protection).
		{"product side governs", BottomInput{in(0.200), in(0.150), in(0.004), 0, 5, false, in(0.10)}, 0.130, true, 12.5},
	}
	for _, tc := range tests {
		r, err := TankBottom(tc.input)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if !near(r.MRTMM, in(tc.wantMRTIn), 1e-9) || r.Pass != tc.wantPass || r.MaxIntervalY == nil || !near(*r.MaxIntervalY, tc.wantMaxOrY, 1e-9) {
			t.Errorf("%s: MRT %.4f in, pass %v, Or_max %v", tc.name, r.MRTMM/25.4, r.Pass, r.MaxIntervalY)
		}
	}
	// No rates (lining and cathodic protection): no interval limit.
	r, _ := TankBottom(BottomInput{5, 5, 0, 0, 10, false, 2.54})
	if r.MaxIntervalY != nil || r.MRTMM != 5 {
		t.Errorf("no rates: %+v", r)
	}
	for _, bad := range []BottomInput{{0, 5, 0, 0, 1, false, 2.54}, {5, 5, -0.1, 0, 1, false, 2.54}, {5, 5, 0, 0, -1, false, 2.54}, {5, 5, 0, 0, 1, false, 0}} {
		if _, err := TankBottom(bad); err == nil {
			t.Errorf("%+v accepted", bad)
		}
	}
}
