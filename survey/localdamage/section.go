package localdamage

import (
	"errors"
	"fmt"
	"math"
)

// Plate is a rectangular plate of a member's cross-section: its name, width
// along its own length and thickness (mm), and the position of its centre.
// Horizontal plates (flanges) have Width along x, Thickness along y; vertical
// plates (webs, angle legs) the reverse.
type Plate struct {
	Name        string
	WidthMM     float64
	ThicknessMM float64
	Vertical    bool
	XMM, YMM    float64 // centre of the plate
}

func (p Plate) dims() (bx, hy float64) {
	if p.Vertical {
		return p.ThicknessMM, p.WidthMM
	}
	return p.WidthMM, p.ThicknessMM
}

// Section is the elastic properties of a cross-section made of plates, with
// x horizontal and y vertical through the centroid.
type Section struct {
	AreaMM2   float64
	CentroidX float64 // mm, from the shape's origin
	CentroidY float64
	IxMM4     float64 // about the horizontal centroidal axis
	IyMM4     float64 // about the vertical centroidal axis
	SxMM3     float64 // Ix / largest distance to an extreme fibre in y
	SyMM3     float64 // Iy / largest distance to an extreme fibre in x
}

// SectionOf sums plates as rectangles: A = Σ b·h, centroid Σ Aᵢ·cᵢ / A, and
// I = Σ (b·h³/12 + Aᵢ·dᵢ²) by the parallel-axis theorem (any text on
// mechanics of materials, e.g. Gere and Goodno, Mechanics of Materials,
// ch. 10, from memory). Overlapping plates are not detected: give plates that
// meet edge to edge.
func SectionOf(plates []Plate) (Section, error) {
	var s Section
	if len(plates) == 0 {
		return s, errors.New("no plates")
	}
	for _, p := range plates {
		if !(p.WidthMM > 0) || !(p.ThicknessMM > 0) || math.IsInf(p.WidthMM+p.ThicknessMM, 0) {
			return s, fmt.Errorf("plate %q: width and thickness must be positive", p.Name)
		}
		bx, hy := p.dims()
		a := bx * hy
		s.AreaMM2 += a
		s.CentroidX += a * p.XMM
		s.CentroidY += a * p.YMM
	}
	s.CentroidX /= s.AreaMM2
	s.CentroidY /= s.AreaMM2
	var top, bottom, left, right float64
	for i, p := range plates {
		bx, hy := p.dims()
		a := bx * hy
		dx, dy := p.XMM-s.CentroidX, p.YMM-s.CentroidY
		s.IxMM4 += bx*hy*hy*hy/12 + a*dy*dy
		s.IyMM4 += hy*bx*bx*bx/12 + a*dx*dx
		t, b, l, r := dy+hy/2, dy-hy/2, dx-bx/2, dx+bx/2
		if i == 0 {
			top, bottom, left, right = t, b, l, r
		}
		top, bottom, left, right = max(top, t), min(bottom, b), min(left, l), max(right, r)
	}
	s.SxMM3 = s.IxMM4 / max(top, -bottom)
	s.SyMM3 = s.IyMM4 / max(right, -left)
	return s, nil
}

// Shape names a cross-section built from dimensions.
type Shape string

// Shapes a member can be given as.
const (
	ShapeI       Shape = "I"       // top flange, web, bottom flange (flanges may differ)
	ShapeChannel Shape = "channel" // web at the left, flanges to the right
	ShapeAngle   Shape = "angle"   // vertical leg at the left, horizontal leg at the bottom
	ShapePlate   Shape = "plate"   // one horizontal plate
)

// ShapeDims are the nominal dimensions of a shape (mm). For an I and a
// channel, Depth is the overall depth; for an angle, Depth is the vertical
// leg's length and the bottom flange's width the horizontal leg's.
type ShapeDims struct {
	DepthMM                      float64
	TopFlangeWidth, TopFlangeT   float64
	WebT                         float64
	BottomFlangeWidth, BottomFlT float64
}

// Plate names used by the shapes, as the checklist writes them.
const (
	PlateTopFlange    = "top flange"
	PlateWeb          = "web"
	PlateBottomFlange = "bottom flange"
)

// ShapePlates lays out a shape's plates with measured thicknesses: measured
// maps a plate name to its thickness (mm); a plate not in it keeps its
// nominal thickness. A thinned plate keeps its mid-plane (loss taken equally
// from both faces), so the overall geometry and the plates' centres stay.
func ShapePlates(shape Shape, d ShapeDims, measured map[string]float64) ([]Plate, error) {
	th := func(name string, nominal float64) float64 {
		if v, ok := measured[name]; ok {
			return v
		}
		return nominal
	}
	var ps []Plate
	switch shape {
	case ShapeI, ShapeChannel:
		hw := d.DepthMM - d.TopFlangeT - d.BottomFlT
		if !(hw > 0) || !(d.WebT > 0) || !(d.TopFlangeWidth >= d.WebT) || !(d.BottomFlangeWidth >= d.WebT) {
			return nil, errors.New("the depth must exceed both flange thicknesses and each flange must be at least as wide as the web")
		}
		xt, xb, xw := 0.0, 0.0, 0.0 // I: everything centred on x = 0
		if shape == ShapeChannel {
			xw = d.WebT / 2
			xt, xb = d.TopFlangeWidth/2, d.BottomFlangeWidth/2
			// The flanges run from the back of the web: their width includes it.
		}
		ps = []Plate{
			{Name: PlateBottomFlange, WidthMM: d.BottomFlangeWidth, ThicknessMM: th(PlateBottomFlange, d.BottomFlT), XMM: xb, YMM: d.BottomFlT / 2},
			{Name: PlateWeb, WidthMM: hw, ThicknessMM: th(PlateWeb, d.WebT), Vertical: true, XMM: xw, YMM: d.BottomFlT + hw/2},
			{Name: PlateTopFlange, WidthMM: d.TopFlangeWidth, ThicknessMM: th(PlateTopFlange, d.TopFlangeT), XMM: xt, YMM: d.DepthMM - d.TopFlangeT/2},
		}
		if shape == ShapeChannel {
			// The web's full depth belongs to the web; the flanges start at its face.
			ps[0].WidthMM, ps[0].XMM = d.BottomFlangeWidth-d.WebT, d.WebT+(d.BottomFlangeWidth-d.WebT)/2
			ps[2].WidthMM, ps[2].XMM = d.TopFlangeWidth-d.WebT, d.WebT+(d.TopFlangeWidth-d.WebT)/2
			ps[1].WidthMM, ps[1].YMM = d.DepthMM, d.DepthMM/2
			if ps[0].WidthMM <= 0 || ps[2].WidthMM <= 0 {
				return nil, errors.New("a channel's flanges must be wider than its web")
			}
		}
	case ShapeAngle:
		leg := d.DepthMM - d.BottomFlT
		if !(leg > 0) || !(d.WebT > 0) || !(d.BottomFlangeWidth > 0) {
			return nil, errors.New("the vertical leg must be longer than the horizontal leg's thickness")
		}
		ps = []Plate{
			{Name: PlateBottomFlange, WidthMM: d.BottomFlangeWidth, ThicknessMM: th(PlateBottomFlange, d.BottomFlT), XMM: d.BottomFlangeWidth / 2, YMM: d.BottomFlT / 2},
			{Name: PlateWeb, WidthMM: leg, ThicknessMM: th(PlateWeb, d.WebT), Vertical: true, XMM: d.WebT / 2, YMM: d.BottomFlT + leg/2},
		}
	case ShapePlate:
		ps = []Plate{{Name: "plate", WidthMM: d.BottomFlangeWidth, ThicknessMM: th("plate", d.BottomFlT), XMM: 0, YMM: d.BottomFlT / 2}}
	default:
		return nil, fmt.Errorf("unknown shape %q (I, channel, angle or plate)", shape)
	}
	for name, v := range measured {
		found := false
		for _, p := range ps {
			found = found || p.Name == name
		}
		if !found {
			return nil, fmt.Errorf("a %s has no plate %q", shape, name)
		}
		if !(v > 0) {
			return nil, fmt.Errorf("measured %s thickness must be positive", name)
		}
	}
	return ps, nil
}

// SectionLoss is a member's section as measured against nominal, with the
// loss of each property in per cent of nominal (positive = lost).
type SectionLoss struct {
	Nominal, Measured Section
	LossPct           map[string]float64 // by Quantities
}

// Quantities are the properties whose loss is reported, as the checklist names them.
var Quantities = []string{"area", "Ix", "Iy", "Sx", "Sy"}

// LossOf compares the measured section with the nominal one.
func LossOf(nominal, measured Section) SectionLoss {
	pct := func(n, m float64) float64 { return 100 * (n - m) / n }
	return SectionLoss{Nominal: nominal, Measured: measured, LossPct: map[string]float64{
		"area": pct(nominal.AreaMM2, measured.AreaMM2),
		"Ix":   pct(nominal.IxMM4, measured.IxMM4),
		"Iy":   pct(nominal.IyMM4, measured.IyMM4),
		"Sx":   pct(nominal.SxMM3, measured.SxMM3),
		"Sy":   pct(nominal.SyMM3, measured.SyMM3),
	}}
}
