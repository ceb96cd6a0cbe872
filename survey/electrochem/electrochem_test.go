package electrochem

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/stat"
)

func near(t *testing.T, what string, got, want, relTol float64) {
	t.Helper()
	if math.Abs(got-want) > relTol*math.Abs(want) {
		t.Errorf("%s = %.7g, want %.7g", what, got, want)
	}
}

func ptr(v float64) *float64 { return &v }

// CODATA 2018 (NIST SP 961, 2019): F = 96 485.332 12 C/mol, exact as e·N_A.
func TestFaradayConstant(t *testing.T) {
	near(t, "F", Faraday, 96485.33212, 1e-10)
}

// Faraday's law, m = Q·M/(n·F). One ampere-year (365.25 d) removes about
// 9.1 kg of iron and 10.7 kg of zinc (Peabody, Control of Pipeline Corrosion,
// 2nd ed., Table of consumption rates; from memory).
func TestMassFromCharge(t *testing.T) {
	for _, c := range []struct {
		sym string
		kg  float64
		tol float64
	}{{"Fe", 9.1, 0.01}, {"Zn", 10.7, 0.01}} {
		e := Elements[c.sym]
		g, err := MassFromCharge(SecondsPerYear, e.MolarG, e.Valence)
		if err != nil {
			t.Fatal(err)
		}
		near(t, c.sym+" kg per A·y", g/1000, c.kg, c.tol)
	}
	if _, err := MassFromCharge(1, 55.845, 0); err == nil {
		t.Error("valence 0 accepted")
	}
}

// Theoretical capacities n·F/M of anode metals: Zn 820, Al 2980, Mg 2200
// A·h/kg (DNV-RP-B401 (2017) and ISO 15589-2:2012 quote these as the
// Faraday limits; from memory). Each design capacity is below its limit.
func TestTheoreticalCapacities(t *testing.T) {
	for _, c := range []struct {
		sym  string
		want float64
	}{{"Zn", 820}, {"Al", 2980}, {"Mg", 2200}} {
		near(t, c.sym+" A·h/kg", TheoreticalCapacity(Elements[c.sym]), c.want, 0.005)
	}
	for name, m := range AnodeMetals {
		if lim := TheoreticalCapacity(Elements[m.Element]); m.CapacityAhK >= lim {
			t.Errorf("%s design capacity %g is not below Faraday's %g A·h/kg", name, m.CapacityAhK, lim)
		}
	}
}

// ASTM G102-89 (R2015) §5: K1 = 3.27×10⁻³ mm·g/(µA·cm·y), which follows from
// F and the year: 10⁻⁶ × 31 557 600 × 10 / F = 3.2707×10⁻³.
func TestG102K1FromFaraday(t *testing.T) {
	near(t, "K1 derived", DerivedK1(), G102K1, 1e-3)
	// mpy form: K1 / 0.0254 mm per mil = 0.1288 (ASTM G102 §5).
	near(t, "K1 mpy derived", DerivedK1()/0.0254, G102K1MPY, 1e-3)
}

// Equivalent weights, ASTM G102-89 (R2015) §6 and its table of alloys (from
// memory): Fe 27.92, Zn 32.69, Al 8.99, Cu 31.77, S30400 25.12 g/eq.
func TestEquivalentWeights(t *testing.T) {
	for _, c := range []struct {
		name string
		ew   float64
		tol  float64
	}{{"carbon steel", 27.92, 1e-4}, {"zinc", 32.69, 1e-4}, {"aluminium", 8.99, 5e-4}, {"copper", 31.77, 1e-4}, {"304 stainless", 25.12, 2e-3}} {
		a, err := FindAlloy(c.name)
		if err != nil {
			t.Fatal(err)
		}
		near(t, c.name+" EW", a.EquivalentWeight(), c.ew, c.tol)
	}
	if _, err := FindAlloy("unobtainium"); err == nil {
		t.Error("unknown alloy accepted")
	}
}

// ASTM G102 §5 applied to iron: 1 µA/cm² ≈ 0.0116 mm/y (G102 appendix
// example; K1·27.92/7.87 = 0.011601).
func TestG102Rate(t *testing.T) {
	a, _ := FindAlloy("steel")
	g, err := G102Rate(10, a)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "iron at 10 µA/cm²", g.MMPerY, 0.11601, 2e-4)
	near(t, "iron at 10 µA/cm², mpy", g.MPY, 4.5694, 2e-4)
	if _, err := G102Rate(-1, a); err == nil {
		t.Error("negative current accepted")
	}
}

// Stern and Geary, J. Electrochem. Soc. 104 (1957) 56: B = βa·βc/(2.303(βa+βc));
// 120/120 mV/decade gives 26.05 mV. With R_p = 2605 Ω·cm², i_corr = 10 µA/cm²,
// and iron by ASTM G102 §5 corrodes at 0.1160 mm/y.
func TestLPR(t *testing.T) {
	b, err := SternGearyB(120, 120)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "B(120,120)", b, 26.05, 2e-4)
	a, _ := FindAlloy("carbon steel")
	r, err := LPRRateOf(LPR{RpOhmCM2: 2605.3, BetaA: 120, BetaC: 120}, a)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "i_corr", r.ICorr, 10, 1e-3)
	near(t, "rate", r.MMPerY, 0.11601, 1e-3)
	r, _ = LPRRateOf(LPR{RpOhmCM2: 2600}, a)
	near(t, "default B", r.BmV, 26, 0)
	near(t, "i_corr default B", r.ICorr, 10, 1e-9)
	if _, err := LPRRateOf(LPR{RpOhmCM2: 0}, a); err == nil {
		t.Error("zero R_p accepted")
	}
}

// ASTM G1-03 (R2017) §8.1.2 equation worked by hand: W 0.650 g, A 28.5 cm²,
// T 168 h, D 7.86 g/cm³ → 1.51301 mm/y, 59.586 mpy (K = 3.45×10⁶). The same
// coupon by NACE SP0775's form (A 2850 mm², 7 d) gives 1.51301 mm/y.
// Pitting 0.42 mm in 90 d = 1.7033 mm/y; bands by NACE SP0775's
// qualitative categories for carbon steel (from memory).
func TestCouponRate(t *testing.T) {
	r, err := CouponRateOf(Coupon{MassBeforeG: 12.400, MassAfterG: 11.750, AreaCM2: 28.5, Hours: 168, DensityG: 7.86})
	if err != nil {
		t.Fatal(err)
	}
	near(t, "mm/y", r.MMPerY, 1.51301, 1e-4)
	near(t, "mpy", r.MPY, 59.586, 1e-4)
	near(t, "SP0775 form", 0.650*365*1000/(2850*7*7.86), r.MMPerY, 1e-9)
	if r.Band != Severe || r.PitMMPerY != 0 {
		t.Errorf("band %v pit %v, want severe and no pit", r.Band, r.PitMMPerY)
	}
	r, _ = CouponRateOf(Coupon{MassBeforeG: 10, MassAfterG: 10, AreaCM2: 28.5, Hours: 2160, DensityG: 7.86, PitDepthMM: 0.42})
	near(t, "pitting mm/y", r.PitMMPerY, 1.7033, 1e-4)
	if r.PitBand != Severe || r.Band != Low {
		t.Errorf("pit band %v band %v", r.PitBand, r.Band)
	}
	for _, c := range []struct {
		rate float64
		gen  Band
		pit  Band
	}{{0.024, Low, Low}, {0.025, Moderate, Low}, {0.12, Moderate, Low}, {0.125, High, Low}, {0.13, High, Moderate},
		{0.20, High, Moderate}, {0.21, High, High}, {0.25, High, High}, {0.26, Severe, High}, {0.38, Severe, High}, {0.39, Severe, Severe}} {
		if g, p := GeneralBand(c.rate), PittingBand(c.rate); g != c.gen || p != c.pit {
			t.Errorf("%g mm/y: general %v pitting %v, want %v %v", c.rate, g, p, c.gen, c.pit)
		}
	}
	if _, err := CouponRateOf(Coupon{MassBeforeG: 10, MassAfterG: 10.1, AreaCM2: 1, Hours: 1, DensityG: 7.86}); err == nil {
		t.Error("mass gain accepted")
	}
}

// Generic ER formula, loss = span × Δreading / 1000 (common practice): a
// 10-mil (0.254 mm) element read 100, 180, 310, 400 at 0, 0.25, 0.6, 1.0 y.
// Losses 0, 0.02032, 0.05334, 0.0762 mm; least-squares slope worked by hand:
// x̄ = 0.4625, ȳ = 0.037465; Sxy = 0.04397375, Sxx = 0.566875 → 0.077572 mm/y (python3).
func TestERRate(t *testing.T) {
	r, err := ERRateOf(0.254, []ERPoint{{0, 100}, {0.25, 180}, {0.6, 310}, {1.0, 400}})
	if err != nil {
		t.Fatal(err)
	}
	near(t, "total loss", r.TotalMM, 0.0762, 1e-9)
	near(t, "rate", r.MMPerY, 0.077572, 1e-4)
	// gonum's stat.LinearRegression on the same points.
	_, beta := stat.LinearRegression([]float64{0, 0.25, 0.6, 1.0}, r.LossMM, nil, false)
	near(t, "rate against gonum", r.MMPerY, beta, 1e-12)
	if _, err := ERRateOf(0.254, []ERPoint{{0, 100}}); err == nil {
		t.Error("one reading accepted")
	}
	if _, err := ERRateOf(0.254, []ERPoint{{0, 100}, {0, 200}}); err == nil {
		t.Error("two readings at one time accepted")
	}
}

// Reference electrodes: −850 mV CSE = −775 mV SCE (SHE: CSE +0.316 V, SCE
// +0.241 V; Bard & Faulkner, Electrochemical Methods, 2nd ed., from memory);
// = −800 mV Ag/AgCl seawater (DNV-RP-B401 (2017) §5 protective potential,
// from memory) = +250 mV Zn (ISO 15589-2, from memory); −650 mV SCE =
// −409 mV SHE.
func TestConvert(t *testing.T) {
	for _, c := range []struct {
		mV       float64
		from, to Electrode
		want     float64
	}{
		{-850, CSE, SCE, -775}, {-850, CSE, AgClSeawater, -800}, {-850, CSE, ZincSeawater, 250},
		{-775, SCE, CSE, -850}, {250, ZincSeawater, AgClSeawater, -800}, {-650, SCE, SHE, -409},
		{-850, CSE, AgClKCl, -731},
	} {
		if got := Convert(c.mV, c.from, c.to); math.Abs(got-c.want) > 1e-9 {
			t.Errorf("%g mV %v → %v = %g, want %g", c.mV, c.from, c.to, got, c.want)
		}
	}
	for _, s := range []string{"CSE", "Cu/CuSO4", "Ag/AgCl seawater", "SCE", "Zn", "Ag/AgCl KCl"} {
		if _, err := ParseElectrode(s); err != nil {
			t.Error(err)
		}
	}
	if _, err := ParseElectrode("platinum"); err == nil {
		t.Error("unknown electrode accepted")
	}
}

// NACE SP0169-2013 §6.2.2.1 (−850 mV CSE instant-off; 100 mV polarisation)
// and ISO 15589-1:2015 (−950 mV in anaerobic soil; over-protection limit),
// from memory.
func TestJudgeCP(t *testing.T) {
	for _, c := range []struct {
		name string
		p    Potentials
		c    Criteria
		want CPStatus
	}{
		{"off −900", Potentials{Off: ptr(-900)}, DefaultCriteria, Protected},
		{"off −850 exactly", Potentials{Off: ptr(-850)}, DefaultCriteria, Protected},
		{"off −820, native −700: 120 mV", Potentials{Off: ptr(-820), Native: ptr(-700)}, DefaultCriteria, Protected},
		{"off −820, native −760: 60 mV", Potentials{Off: ptr(-820), Native: ptr(-760)}, DefaultCriteria, NotProtected},
		{"off −820, no native", Potentials{Off: ptr(-820)}, DefaultCriteria, NotProtected},
		{"off −1250", Potentials{Off: ptr(-1250)}, DefaultCriteria, OverProtected},
		{"off −1150, limit −1100", Potentials{Off: ptr(-1150)}, Criteria{OverLimitMV: -1100}, OverProtected},
		{"anaerobic off −900", Potentials{Off: ptr(-900)}, Criteria{Anaerobic: true}, NotProtected},
		{"anaerobic off −960", Potentials{Off: ptr(-960)}, Criteria{Anaerobic: true}, Protected},
		{"Ag/AgCl sw off −790 = −840 CSE", Potentials{Off: ptr(-790), Electrode: AgClSeawater}, DefaultCriteria, NotProtected},
		{"Ag/AgCl sw off −810 = −860 CSE", Potentials{Off: ptr(-810), Electrode: AgClSeawater}, DefaultCriteria, Protected},
		{"on −800 only", Potentials{On: ptr(-800)}, DefaultCriteria, NotProtected},
		{"on −900 only", Potentials{On: ptr(-900)}, DefaultCriteria, Undetermined},
	} {
		j, err := JudgeCP(c.p, c.c)
		if err != nil {
			t.Fatal(err)
		}
		if j.Status != c.want {
			t.Errorf("%s: %v %v, want %v", c.name, j.Status, j.Reasons, c.want)
		}
		if (c.p.Off == nil) != (j.Caution != "") {
			t.Errorf("%s: IR-drop caution %q", c.name, j.Caution)
		}
	}
	if _, err := JudgeCP(Potentials{Native: ptr(-600)}, DefaultCriteria); err == nil {
		t.Error("native alone accepted")
	}
	tr, ok := TrendOf([]float64{-950, -900, -880})
	if !ok || tr.ChangeMV != 70 || !tr.Worsening {
		t.Errorf("trend %+v", tr)
	}
}

// DNV-RP-B401 (2017) §7 life formula worked by hand: 10 kg Al-Zn-In,
// u 0.9, ε 2000 A·h/kg, I 0.2 A → 18 000 / 1752 = 10.274 y. Installed 20 kg,
// 10 kg left, u 0.9: usable 8 kg → 9.1324 y.
func TestAnodeLife(t *testing.T) {
	al, _ := FindAnodeMetal("Al-Zn-In")
	l, err := AnodeLifeOf(Anode{Metal: al, RemainingKG: 10, Utilisation: 0.9, CurrentA: 0.2})
	if err != nil {
		t.Fatal(err)
	}
	near(t, "life", l.Years, 10.274, 1e-4)
	l, _ = AnodeLifeOf(Anode{Metal: al, RemainingKG: 10, InitialKG: 20, Utilisation: 0.9, CurrentA: 0.2})
	near(t, "life from installed mass", l.Years, 9.1324, 1e-4)
	l, _ = AnodeLifeOf(Anode{Metal: al, RemainingKG: 1, InitialKG: 20, Utilisation: 0.9, CurrentA: 0.2})
	if l.Years != 0 {
		t.Errorf("spent anode life %g, want 0", l.Years)
	}
	for _, bad := range []Anode{{Metal: al, RemainingKG: 10, Utilisation: 1.2, CurrentA: 0.2}, {Metal: al, RemainingKG: 10, Utilisation: 0.9}} {
		if _, err := AnodeLifeOf(bad); err == nil {
			t.Errorf("%+v accepted", bad)
		}
	}
}

// ASTM D610-08 (R2019) Table 1 and ISO 4628-3:2016 Annex B; 0.5 % → grade 6,
// Ri 2; 2.0 % → grade 5, Ri 3 by our log-nearest convention.
func TestRustGrades(t *testing.T) {
	for _, c := range []struct {
		pct     float64
		d610, r int
	}{{0, 10, 0}, {0.01, 10, 0}, {0.02, 9, 1}, {0.05, 8, 1}, {0.5, 6, 2}, {1, 6, 3}, {2, 5, 3}, {8, 4, 4}, {16, 3, 4}, {40, 1, 5}, {50, 1, 5}, {51, 0, 5}} {
		d, err := D610Grade(c.pct)
		if err != nil {
			t.Fatal(err)
		}
		r, _ := ISO4628Ri(c.pct)
		if d != c.d610 || r != c.r {
			t.Errorf("%g %%: D610 %d Ri %d, want %d Ri %d", c.pct, d, r, c.d610, c.r)
		}
	}
	if _, err := D610Grade(120); err == nil {
		t.Error("120 % accepted")
	}
}

// ISO 19840:2012 acceptance (from memory): mean ≥ nominal, none below 80 %,
// at most 20 % between 80 % and nominal.
func TestJudgeDFT(t *testing.T) {
	for _, c := range []struct {
		name string
		r    []float64
		ok   bool
	}{
		{"all above", []float64{210, 220, 205, 230, 215}, true},
		{"2 of 10 at 90 %", []float64{180, 185, 220, 230, 210, 215, 225, 205, 210, 220}, true},
		{"3 of 10 at 90 %", []float64{180, 185, 190, 240, 240, 230, 225, 235, 230, 240}, false},
		{"one below 80 %", []float64{150, 240, 240, 240, 240}, false},
		{"mean below", []float64{195, 200, 200, 200, 200}, false},
	} {
		j, err := JudgeDFT(c.r, 200, 600)
		if err != nil {
			t.Fatal(err)
		}
		if j.Accepted != c.ok {
			t.Errorf("%s: accepted %v %v", c.name, j.Accepted, j.Reasons)
		}
	}
	if j, _ := JudgeDFT([]float64{650, 200}, 200, 600); j.Accepted {
		t.Error("reading above the maximum accepted")
	}
}

// ISO 14713-1:2017 Table 2 (from memory): 85 µm hot-dip galvanizing lasts
// 20–40 y in C4, 10–20 y in C5, 40 to more than 100 y in C3.
func TestGalvanizingLife(t *testing.T) {
	for _, c := range []struct {
		cat        string
		short, lng float64
	}{{"C4", 20, 40}, {"C5", 10, 20}, {"C3", 40, 121}} {
		g, err := GalvanizingLifeOf(85, c.cat)
		if err != nil {
			t.Fatal(err)
		}
		if math.Floor(g.ShortestY) != c.short || math.Floor(g.LongestY) < c.lng || (c.cat != "C3" && math.Floor(g.LongestY) != c.lng) {
			t.Errorf("%s: %g–%g y", c.cat, g.ShortestY, g.LongestY)
		}
	}
	if _, err := GalvanizingLifeOf(85, "C7"); err == nil {
		t.Error("C7 accepted")
	}
}

// Galvanic series in flowing seawater (ASTM G82 guide; Australasian
// Corrosion Association table): mild steel −0.66 V SCE and passive 316 −0.05 V
// differ by 0.61 V, over 0.25 V (common practice) — the steel is the anode;
// copper and 90-10 copper-nickel differ by 0.085 V.
func TestGalvanicPairs(t *testing.T) {
	for _, c := range []struct {
		a, b  string
		anode string
		dv    float64
		warn  bool
	}{{"316 stainless", "carbon steel", "mild steel", 0.61, true}, {"copper", "90-10 copper-nickel", "copper", 0.085, false}, {"zinc", "steel", "zinc", 0.345, true}} {
		a, err := FindInSeries(c.a)
		if err != nil {
			t.Fatal(err)
		}
		b, err := FindInSeries(c.b)
		if err != nil {
			t.Fatal(err)
		}
		p := PairOf(a, b)
		near(t, c.a+"/"+c.b, p.DifferenceV, c.dv, 1e-9)
		if p.Anode.Name != c.anode || p.Warn != c.warn {
			t.Errorf("%s/%s: anode %s warn %v", c.a, c.b, p.Anode.Name, p.Warn)
		}
	}
	if _, err := FindInSeries("kryptonite"); err == nil {
		t.Error("unknown metal accepted")
	}
}
