package localdamage

import (
	"math"
	"testing"
)

// A symmetric I, flanges 300 × 20 mm, web 560 × 12 mm, depth 600 mm, by hand
// with the parallel-axis theorem (mechanics of materials, common practice):
// A = 18 720 mm², Ix = 2·(300·20³/12 + 6000·290²) + 12·560³/12 = 1 185 216 000 mm⁴,
// Sx = Ix/300, Iy = 2·20·300³/12 + 560·12³/12 = 90 080 640 mm⁴, Sy = Iy/150.
var girder = ShapeDims{DepthMM: 600, TopFlangeWidth: 300, TopFlangeT: 20, WebT: 12, BottomFlangeWidth: 300, BottomFlT: 20}

func sectionOf(t *testing.T, shape Shape, d ShapeDims, measured map[string]float64) Section {
	t.Helper()
	ps, err := ShapePlates(shape, d, measured)
	if err != nil {
		t.Fatal(err)
	}
	s, err := SectionOf(ps)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func TestSectionHand(t *testing.T) {
	s := sectionOf(t, ShapeI, girder, nil)
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"A", s.AreaMM2, 18720},
		{"ȳ", s.CentroidY, 300},
		{"Ix", s.IxMM4, 1185216000},
		{"Sx", s.SxMM3, 1185216000.0 / 300},
		{"Iy", s.IyMM4, 90080640},
		{"Sy", s.SyMM3, 90080640.0 / 150},
	} {
		if !near(c.got, c.want, 1e-12) {
			t.Errorf("I %s = %v, want %v (hand calculation)", c.name, c.got, c.want)
		}
	}
	// Bottom flange 20 → 16 mm (mid-plane kept): A = 18 720 − 300·4 = 17 520 mm²,
	// a 6.41 % loss; the centroid rises: ȳ = (6000·590 + 6720·300 + 4800·10)/17 520.
	m := sectionOf(t, ShapeI, girder, map[string]float64{PlateBottomFlange: 16})
	loss := LossOf(s, m)
	if !near(m.AreaMM2, 17520, 1e-12) || !near(loss.LossPct["area"], 100*1200.0/18720, 1e-12) {
		t.Errorf("area %v, loss %v %%", m.AreaMM2, loss.LossPct["area"])
	}
	ybar := (6000*590 + 6720*300 + 4800*10) / 17520.0
	if !near(m.CentroidY, ybar, 1e-12) {
		t.Errorf("ȳ = %v, want %v", m.CentroidY, ybar)
	}
	ix := 300*20*20*20/12.0 + 6000*(590-ybar)*(590-ybar) + 12*560*560*560/12.0 + 6720*(300-ybar)*(300-ybar) + 300*16*16*16/12.0 + 4800*(10-ybar)*(10-ybar)
	// The thinned flange keeps its mid-plane: its outer face is at y = 10 − 8 = 2 mm,
	// farther from the centroid than the top face (600 − ȳ).
	if !near(m.IxMM4, ix, 1e-12) || !near(m.SxMM3, ix/(ybar-2), 1e-12) {
		t.Errorf("Ix %v want %v; Sx %v want %v (extreme fibre at the bottom)", m.IxMM4, ix, m.SxMM3, ix/(ybar-2))
	}
	for _, q := range Quantities {
		if !(loss.LossPct[q] > 0) {
			t.Errorf("%s loss %v with a thinner flange", q, loss.LossPct[q])
		}
	}
}

// Symmetry: a channel has the Ix of the I with the same plates (Ix does not
// depend on x); an equal-leg angle has Ix = Iy and x̄ = ȳ; a plate is b·t³/12.
func TestSectionSymmetry(t *testing.T) {
	i := sectionOf(t, ShapeI, girder, nil)
	c := sectionOf(t, ShapeChannel, girder, nil)
	// The channel's x̄ by hand: flanges 288 × 20 centred at 12 + 144 = 156 mm, web 12 × 600 centred at 6 mm.
	xbar := (2*288*20*156 + 12*600*6) / 18720.0
	if !near(c.IxMM4, i.IxMM4, 1e-12) || !near(c.AreaMM2, i.AreaMM2, 1e-12) || !near(c.CentroidX, xbar, 1e-12) {
		t.Errorf("channel Ix %v A %v x̄ %v; I Ix %v A %v; want x̄ %v", c.IxMM4, c.AreaMM2, c.CentroidX, i.IxMM4, i.AreaMM2, xbar)
	}
	a := sectionOf(t, ShapeAngle, ShapeDims{DepthMM: 100, WebT: 10, BottomFlangeWidth: 100, BottomFlT: 10}, nil)
	if !near(a.IxMM4, a.IyMM4, 1e-12) || !near(a.CentroidX, a.CentroidY, 1e-12) {
		t.Errorf("equal angle: Ix %v Iy %v, x̄ %v ȳ %v", a.IxMM4, a.IyMM4, a.CentroidX, a.CentroidY)
	}
	// L 100 × 100 × 10 (EN 10056-1, from memory): A 19.2 cm², centroid 28.2 mm,
	// I 177 cm⁴; plates without the root radius come within 3 %.
	if !near(a.AreaMM2, 1920, 0.03) || !near(a.CentroidY, 28.2, 0.03) || !near(a.IxMM4, 177e4, 0.03) {
		t.Errorf("L100x100x10: A %v ȳ %v I %v", a.AreaMM2, a.CentroidY, a.IxMM4)
	}
	p := sectionOf(t, ShapePlate, ShapeDims{BottomFlangeWidth: 200, BottomFlT: 10}, nil)
	if !near(p.IxMM4, 200*1000/12.0, 1e-12) || !near(p.IyMM4, 10*200*200*200/12.0, 1e-12) || !near(p.SxMM3, 200*100/6.0, 1e-12) {
		t.Errorf("plate %+v", p)
	}
	// Thinning the top and bottom flange alike keeps the centroid at mid-depth.
	m := sectionOf(t, ShapeI, girder, map[string]float64{PlateTopFlange: 17, PlateBottomFlange: 17})
	if !near(m.CentroidY, 300, 1e-12) {
		t.Errorf("ȳ %v", m.CentroidY)
	}
}

// W14×90 (AISC Steel Construction Manual, from memory): d 14.0 in, bf 14.5 in,
// tf 0.710 in, tw 0.440 in; A 26.5 in², Ix 999 in⁴, Sx 143 in³. Plates
// without the fillets come within 3 %.
func TestSectionHandbookW14x90(t *testing.T) {
	in := 25.4
	s := sectionOf(t, ShapeI, ShapeDims{DepthMM: 14 * in, TopFlangeWidth: 14.5 * in, TopFlangeT: 0.71 * in, WebT: 0.44 * in, BottomFlangeWidth: 14.5 * in, BottomFlT: 0.71 * in}, nil)
	if !near(s.AreaMM2/(in*in), 26.5, 0.03) || !near(s.IxMM4/math.Pow(in, 4), 999, 0.03) || !near(s.SxMM3/math.Pow(in, 3), 143, 0.03) {
		t.Errorf("W14x90: A %.2f in², Ix %.0f in⁴, Sx %.1f in³", s.AreaMM2/(in*in), s.IxMM4/math.Pow(in, 4), s.SxMM3/math.Pow(in, 3))
	}
}

func TestSectionRefusals(t *testing.T) {
	if _, err := ShapePlates(ShapeI, girder, map[string]float64{"flange": 10}); err == nil {
		t.Error("unknown plate accepted")
	}
	if _, err := ShapePlates(ShapeI, girder, map[string]float64{PlateWeb: 0}); err == nil {
		t.Error("zero web accepted")
	}
	if _, err := ShapePlates(ShapeI, ShapeDims{DepthMM: 30, TopFlangeWidth: 300, TopFlangeT: 20, WebT: 12, BottomFlangeWidth: 300, BottomFlT: 20}, nil); err == nil {
		t.Error("flanges deeper than the member accepted")
	}
	if _, err := ShapePlates("tee", girder, nil); err == nil {
		t.Error("unknown shape accepted")
	}
	if _, err := SectionOf([]Plate{{Name: "x", WidthMM: -1, ThicknessMM: 2}}); err == nil {
		t.Error("negative width accepted")
	}
}
