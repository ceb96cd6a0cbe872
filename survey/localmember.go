package survey

import (
	"fmt"
	"slices"
	"strings"

	"github.com/lossline/lossline/survey/localdamage"
	"github.com/lossline/lossline/survey/required"
)

// memberPlates maps the plate names a checklist writes for each shape to the
// plates of localdamage.ShapePlates.
var memberPlates = map[localdamage.Shape]map[string]string{
	localdamage.ShapeI:       {"top flange": localdamage.PlateTopFlange, "web": localdamage.PlateWeb, "bottom flange": localdamage.PlateBottomFlange},
	localdamage.ShapeChannel: {"top flange": localdamage.PlateTopFlange, "web": localdamage.PlateWeb, "bottom flange": localdamage.PlateBottomFlange},
	localdamage.ShapeAngle:   {"vertical leg": localdamage.PlateWeb, "horizontal leg": localdamage.PlateBottomFlange},
	localdamage.ShapePlate:   {"plate": "plate"},
}

// widthByThickness reads "300 x 20" or "300 × 20 mm" (width × thickness).
func (lr *localReader) widthByThickness(name string) (w, t float64, ok bool) {
	in, found := lr.find(name)
	if !found {
		lr.errorf(lr.w.Line, "give %s: width x thickness, e.g. 300 x 20", name)
		return 0, 0, false
	}
	s := strings.ReplaceAll(strings.ToLower(in.Value), "×", "x")
	unit := ""
	for _, u := range []string{"mm", "in"} {
		if strings.HasSuffix(strings.TrimSpace(s), u) {
			unit, s = " "+u, strings.TrimSuffix(strings.TrimSpace(s), u)
		}
	}
	a, b, cut := strings.Cut(s, "x")
	if !cut {
		lr.errorf(in.Line, "%s: %q is not width x thickness, e.g. 300 x 20", name, in.Value)
		return 0, 0, false
	}
	var err error
	if w, err = lr.lengthOf(strings.TrimSpace(a) + unit); err == nil {
		t, err = lr.lengthOf(strings.TrimSpace(b) + unit)
	}
	if err != nil {
		lr.errorf(in.Line, "%s: %v", name, err)
		return 0, 0, false
	}
	lr.inputs = append(lr.inputs, required.Input{Name: name, Written: in.Value, Used: fmt.Sprintf("%.4g × %.4g mm", w, t)})
	return w, t, true
}

// member is a member's section from its plates, nominal and measured.
func (lr *localReader) member() *LocalAssessment {
	shape := localdamage.Shape(lr.w.Method)
	if lr.w.Method == "i" {
		shape = localdamage.ShapeI
	}
	la := &LocalAssessment{Method: fmt.Sprintf("section loss of a member (%s shape)", shape), Source: SourceMember}
	var d localdamage.ShapeDims
	switch shape {
	case localdamage.ShapeI, localdamage.ShapeChannel:
		d.DepthMM, _ = lr.length("depth", true)
		d.TopFlangeWidth, d.TopFlangeT, _ = lr.widthByThickness("top flange")
		d.BottomFlangeWidth, d.BottomFlT, _ = lr.widthByThickness("bottom flange")
		d.WebT, _ = lr.length("web", true)
	case localdamage.ShapeAngle:
		d.DepthMM, d.WebT, _ = lr.widthByThickness("vertical leg")
		d.BottomFlangeWidth, d.BottomFlT, _ = lr.widthByThickness("horizontal leg")
	case localdamage.ShapePlate:
		d.BottomFlangeWidth, d.BottomFlT, _ = lr.widthByThickness("plate")
	}
	measured := map[string]float64{}
	names := memberPlates[shape]
	written := make([]string, 0, len(names))
	for n := range names {
		written = append(written, n)
	}
	slices.Sort(written)
	for _, n := range written {
		if v, ok := lr.length("measured "+n, false); ok {
			measured[names[n]] = v
		}
	}
	detail := &MemberDetail{Shape: shape}
	if in, ok := lr.find("allowed loss"); ok {
		q, pct, err := parseLossLimit(in.Value)
		if err != nil {
			lr.errorf(in.Line, "allowed loss: %v", err)
		}
		detail.LimitQuantity, detail.LimitPct = q, pct
		lr.inputs = append(lr.inputs, required.Input{Name: "allowed loss", Written: in.Value, Used: fmt.Sprintf("%.4g %% of %s", pct, q)})
		if by, found := lr.find("set by"); !found || strings.TrimSpace(by.Value) == "" {
			lr.errorf(in.Line, "allowed loss: name the engineer who set it (set by: name, role)")
		} else {
			detail.SetBy = strings.TrimSpace(by.Value)
			lr.inputs = append(lr.inputs, required.Input{Name: "set by", Written: by.Value, Used: detail.SetBy})
		}
	}
	if lr.failed {
		return nil
	}
	nomPlates, err := localdamage.ShapePlates(shape, d, nil)
	if err != nil {
		lr.errorf(lr.w.Line, "%v", err)
		return nil
	}
	measPlates, err := localdamage.ShapePlates(shape, d, measured)
	if err != nil {
		lr.errorf(lr.w.Line, "%v", err)
		return nil
	}
	if !lr.measuredNearNominal(written, names, nomPlates, measured) {
		return nil
	}
	nom, err := localdamage.SectionOf(nomPlates)
	if err != nil {
		lr.errorf(lr.w.Line, "%v", err)
		return nil
	}
	meas, err := localdamage.SectionOf(measPlates)
	if err != nil {
		lr.errorf(lr.w.Line, "%v", err)
		return nil
	}
	detail.Plates = measPlates
	detail.Loss = localdamage.LossOf(nom, meas)
	la.Member = detail
	for _, p := range measPlates {
		la.Steps = append(la.Steps, fmt.Sprintf("%s: %.4g × %.4g mm", p.Name, p.WidthMM, p.ThicknessMM))
	}
	la.Steps = append(la.Steps,
		"A = Σ b·t; y_c = Σ A_i·y_i / A; I = Σ (b·t³/12 + A_i·d_i²); S = I / distance to the extreme fibre; thinned plates keep their mid-plane",
		fmt.Sprintf("nominal: A %.0f mm², Ix %.4g mm⁴, Iy %.4g mm⁴, Sx %.4g mm³, Sy %.4g mm³", nom.AreaMM2, nom.IxMM4, nom.IyMM4, nom.SxMM3, nom.SyMM3),
		fmt.Sprintf("measured: A %.0f mm², Ix %.4g mm⁴, Iy %.4g mm⁴, Sx %.4g mm³, Sy %.4g mm³ (y_c %.1f mm)", meas.AreaMM2, meas.IxMM4, meas.IyMM4, meas.SxMM3, meas.SyMM3, meas.CentroidY))
	var parts []string
	for _, q := range localdamage.Quantities {
		parts = append(parts, fmt.Sprintf("%s %.1f %%", q, detail.Loss.LossPct[q]))
	}
	la.Steps = append(la.Steps, "loss against nominal: "+strings.Join(parts, ", "))
	la.Result = "loss " + strings.Join(parts, ", ")
	if detail.LimitQuantity != "" {
		got := detail.Loss.LossPct[detail.LimitQuantity]
		detail.Exceeded = got > detail.LimitPct
		la.Limit = fmt.Sprintf("the loss of %s reaches %.4g %% (set by %s)", detail.LimitQuantity, detail.LimitPct, detail.SetBy)
		la.Steps = append(la.Steps, fmt.Sprintf("%s loss %.1f %% against the allowed %.4g %% set by %s: %s", detail.LimitQuantity, got, detail.LimitPct, detail.SetBy,
			map[bool]string{true: "EXCEEDED", false: "within the limit"}[detail.Exceeded]))
		la.Result += fmt.Sprintf("; allowed %s loss %.4g %%: %s", detail.LimitQuantity, detail.LimitPct, map[bool]string{true: "EXCEEDED", false: "within"}[detail.Exceeded])
		if detail.Exceeded {
			zero := 0.0
			la.LifeY = &zero
		}
	}
	return la
}

// parseLossLimit reads "15 % of Sx" (quantity one of localdamage.Quantities).
func parseLossLimit(s string) (quantity string, pct float64, err error) {
	num, q, ok := strings.Cut(s, " of ")
	if !ok {
		return "", 0, fmt.Errorf("%q: write a percentage of a quantity, e.g. 15 %% of Sx (%s)", s, strings.Join(localdamage.Quantities, ", "))
	}
	q = strings.TrimSpace(q)
	i := slices.IndexFunc(localdamage.Quantities, func(x string) bool { return strings.EqualFold(x, q) })
	if i < 0 {
		return "", 0, fmt.Errorf("%q is not one of %s", q, strings.Join(localdamage.Quantities, ", "))
	}
	v, err := required.ParseQuantity(num)
	if err != nil {
		return "", 0, err
	}
	if v.Kind != required.Number || !strings.Contains(num, "%") || !(v.Value > 0) || v.Value >= 1 {
		return "", 0, fmt.Errorf("%q is not a percentage between 0 and 100, e.g. 15 %%", strings.TrimSpace(num))
	}
	return localdamage.Quantities[i], 100 * v.Value, nil
}

// memberOverNominal is how far above its nominal a measured plate may read
// before it is taken for a slip: mill over-tolerances of plates and rolled
// sections are around a tenth of the thickness (EN 10029 and EN 10034, from
// memory); over a fifth, the reading is a typing slip, and its loss would
// count as a gain.
const memberOverNominal = 1.2

// measuredNearNominal refuses a measured plate thicker than its nominal by
// more than memberOverNominal; it reports whether all are within.
func (lr *localReader) measuredNearNominal(written []string, names map[string]string, nom []localdamage.Plate, measured map[string]float64) bool {
	ok := true
	for _, n := range written {
		v, has := measured[names[n]]
		i := slices.IndexFunc(nom, func(p localdamage.Plate) bool { return p.Name == names[n] })
		if !has || i < 0 || v <= nom[i].ThicknessMM*memberOverNominal {
			continue
		}
		in, _ := lr.find("measured " + n)
		lr.errorf(in.Line, "measured %s: %.4g mm is over %.0f %% more than its nominal %.4g mm: check the value and its unit (a measured plate is at most a little over nominal)", n, v, (memberOverNominal-1)*100, nom[i].ThicknessMM)
		ok = false
	}
	return ok
}
