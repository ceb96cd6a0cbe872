package survey

import (
	"errors"
	"fmt"
	"slices"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/lossline/lossline/survey/electrochem"
	"github.com/lossline/lossline/survey/number"
	"github.com/lossline/lossline/survey/wallloss"
)

// The design keys of electro data join the design list's table of keys here,
// so that the list in checklist.go stays as it is.
func init() {
	for k, f := range electroKeys {
		designKeys[k] = f
	}
}

func electroOf(d *Design) *Electro {
	if d.Electro == nil {
		d.Electro = &Electro{}
	}
	return d.Electro
}

// valueIn reads a number followed by one of the units given (or none).
func valueIn(key, value string, units ...string) (float64, error) {
	t := strings.TrimSpace(value)
	for _, u := range units {
		// "cm2" does not end in the unit "m2": the unit must follow a number.
		if s, ok := strings.CutSuffix(t, u); ok && !endsInLetter(s) {
			t = s
			break
		}
	}
	v, err := number.Parse(t)
	if f := strings.Fields(t); err != nil && len(f) == 2 {
		if _, numErr := number.Parse(f[0]); numErr == nil {
			return 0, fmt.Errorf("%s: the unit %q is not %s: write the value in %s", key, f[1], strings.Join(units, " or "), units[0])
		}
	}
	if err != nil {
		return 0, fmt.Errorf("%s: %w (units: %s)", key, err, strings.Join(units, " or "))
	}
	return v, nil
}

var electroKeys = map[string]func(d *Design, value string, units Unit) error{
	"material": func(d *Design, value string, _ Unit) error {
		if _, err := electrochem.FindInSeries(value); err != nil {
			return fmt.Errorf("material: %w", err)
		}
		electroOf(d).Material = strings.TrimSpace(value)
		return nil
	},
	"in contact with": func(d *Design, value string, _ Unit) error {
		if _, err := electrochem.FindInSeries(value); err != nil {
			return fmt.Errorf("in contact with: %w", err)
		}
		electroOf(d).InContactWith = strings.TrimSpace(value)
		return nil
	},
	"rate source": func(d *Design, value string, _ Unit) error {
		s, err := wallloss.ParseRateSource(value)
		electroOf(d).RateSource = s
		return err
	},
	"cp soil": func(d *Design, value string, _ Unit) error {
		switch strings.ToLower(strings.TrimSpace(value)) {
		case "anaerobic":
			electroOf(d).Anaerobic = true
		case "aerobic":
		default:
			return fmt.Errorf("cp soil: %q is not aerobic or anaerobic", value)
		}
		return nil
	},
	"overprotection limit": func(d *Design, value string, _ Unit) error {
		v, err := valueIn("overprotection limit", value, "mV CSE")
		if err != nil {
			return err
		}
		if v > electrochem.PolarisedLimitMV || v < -2000 {
			return fmt.Errorf("overprotection limit: %g mV CSE is not between −2000 and −850", v)
		}
		electroOf(d).OverLimitMV = &v
		return nil
	},
	"anode cost": func(d *Design, value string, _ Unit) error {
		t, _ := strings.CutSuffix(strings.TrimSpace(value), "each")
		m, err := ParseCost(t)
		if err != nil {
			return fmt.Errorf("anode cost: %q is %w (write the cost of one anode, e.g. `950 each`)", value, err)
		}
		electroOf(d).AnodeCost = &m
		return nil
	},
	"recoat cost": func(d *Design, value string, _ Unit) error {
		t := strings.TrimSpace(value)
		for _, u := range []string{"per m²", "per m2", "/m²", "/m2"} {
			if s, ok := strings.CutSuffix(t, u); ok {
				t = s
				break
			}
		}
		m, err := ParseCost(t)
		if err != nil {
			return fmt.Errorf("recoat cost: %q is %w (write a price per m², e.g. `140 per m2`)", value, err)
		}
		electroOf(d).RecoatCostPerM2 = &m
		return nil
	},
	"rusted area": func(d *Design, value string, _ Unit) error {
		v, err := valueIn("rusted area", value, "%")
		switch {
		case err != nil:
		case v < 0 || v > 100:
			err = fmt.Errorf("rusted area: %g %% is not between 0 and 100", v)
		case v < 1 && v > 0 && !strings.HasSuffix(strings.TrimSpace(value), "%"):
			err = fmt.Errorf("rusted area: %q has no %% sign: write `%g %%` for a percentage (or `%g %%` if it is a fraction of the area)", strings.TrimSpace(value), v, v*100)
		}
		electroOf(d).Coating.RustedPct = &v
		return err
	},
	"breakdown area": func(d *Design, value string, _ Unit) error {
		v, err := valueIn("breakdown area", value, "m²", "m2")
		if err == nil && v <= 0 {
			err = errors.New("breakdown area: the area to recoat must be more than 0 m² (leave the key out when none needs recoating)")
		}
		electroOf(d).Coating.BreakdownM2 = &v
		return err
	},
	"dft nominal": func(d *Design, value string, _ Unit) error {
		v, err := valueIn("dft nominal", value, "µm", "um")
		if err == nil && v <= 0 {
			err = errors.New("dft nominal: the nominal dry-film thickness must be positive")
		}
		if err == nil {
			err = coatingMicrons("dft nominal", v)
		}
		electroOf(d).Coating.DFTNominalUM = &v
		return err
	},
	"dft maximum": func(d *Design, value string, _ Unit) error {
		v, err := valueIn("dft maximum", value, "µm", "um")
		if err == nil {
			err = coatingMicrons("dft maximum", v)
		}
		if err != nil {
			return err // not kept: the judgement would run against 0 µm
		}
		electroOf(d).Coating.DFTMaxUM = &v
		return nil
	},
	"dft readings": func(d *Design, value string, _ Unit) error {
		t := strings.TrimSpace(value)
		for _, u := range []string{"µm", "um"} {
			t, _ = strings.CutSuffix(t, u)
		}
		var rs []float64
		for _, f := range strings.Fields(t) {
			v, err := number.Parse(f)
			if err != nil {
				return fmt.Errorf("dft readings: %w (write the readings in µm separated by spaces)", err)
			}
			if v <= 0 {
				return fmt.Errorf("dft readings: %g µm is not a thickness", v)
			}
			if err := coatingMicrons("dft readings", v); err != nil {
				return err
			}
			rs = append(rs, v)
		}
		if len(rs) == 0 {
			return errors.New("dft readings: no readings (write them in µm separated by spaces)")
		}
		electroOf(d).Coating.DFTReadingsUM = rs
		return nil
	},
	"zinc thickness": func(d *Design, value string, _ Unit) error {
		v, err := valueIn("zinc thickness", value, "µm", "um")
		if err == nil && v <= 0 {
			err = errors.New("zinc thickness: must be positive")
		}
		if err == nil {
			err = coatingMicrons("zinc thickness", v)
		}
		electroOf(d).Coating.ZincUM = &v
		return err
	},
}

// electroTables are the header rows of the electro tables, lower case with
// units written plainly; date columns follow where the last entry is "…".
var electroTables = map[string][]string{
	"coupon":     {"coupon", "metal", "installed", "removed", "mass before g", "mass after g", "area cm2", "deepest pit mm"},
	"er probe":   {"er probe", "span mm", "…"},
	"lpr probe":  {"lpr probe", "metal", "b mv", "…"},
	"test point": {"test point", "date", "electrode", "on mv", "off mv", "native mv"},
	"anode":      {"anode", "material", "installed kg", "remaining kg", "current a", "utilisation"},
}

func headerKey(s string) string {
	s = strings.NewReplacer("(", " ", ")", " ", "²", "2", "cm^2", "cm2", "utilization", "utilisation").Replace(strings.ToLower(s))
	return strings.Join(strings.Fields(s), " ")
}

// electroTable reads a table whose first header cell names an electro table;
// it reports whether it did.
func (r *checklistReader) electroTable(t *tableBlock, names []string, headerLine int) bool {
	kind := headerKey(names[0])
	want, ok := electroTables[kind]
	if !ok {
		return false
	}
	e := electroOf(&r.comp.Design)
	fixed := want
	var dates []VisitDate
	if want[len(want)-1] == "…" {
		fixed = want[:len(want)-1]
	}
	bad := len(names) < len(fixed) || (len(fixed) == len(want) && len(names) != len(want))
	for i := 0; !bad && i < len(fixed); i++ {
		bad = headerKey(names[i]) != fixed[i]
	}
	if bad {
		h := strings.Join(fixed, " | ")
		if len(fixed) < len(want) {
			h += " | DATE | DATE …"
		}
		r.problems.Errorf(r.file, headerLine, "a %s table's header is | %s | (units as shown)", kind, h)
		return true
	}
	for _, n := range names[len(fixed):] {
		d, ok := ParseVisitDate(n)
		if !ok || d.MonthOnly {
			r.problems.Errorf(r.file, headerLine, "column %q of the %s table is not a date such as 2026-05-18", n, kind)
			return true
		}
		if len(dates) > 0 && !d.Time.After(dates[len(dates)-1].Time) {
			r.problems.Errorf(r.file, headerLine, "the date columns of the %s table must be in order, each once", kind)
			return true
		}
		dates = append(dates, d)
	}
	if len(t.rows) < 2 {
		r.problems.Warnf(r.file, headerLine, "the %s table has no rows: write a row under the header, or leave the table out", kind)
	}
	line := headerLine
	var shape, cells []string
	for _, row := range t.rows[1:] {
		line = r.lines.advance(line, row.Start)
		var ok bool
		if shape, cells, ok = r.rowCells(shape, cells, r.lineText(row.Start), line, len(names), "value"); !ok {
			continue
		}
		var err error
		switch kind {
		case "coupon":
			err = e.couponRow(cells, line)
		case "er probe":
			err = e.erRow(cells, dates, line)
		case "lpr probe":
			err = e.lprRow(cells, dates, line)
		case "test point":
			err = e.testPointRow(cells, line)
		case "anode":
			err = e.anodeRow(cells, line)
		}
		if err != nil {
			r.problems.Errorf(r.file, line, "%s %s: %v", kind, strings.TrimSpace(cells[0]), err)
		}
	}
	return true
}

func cellNumber(name, s string) (float64, error) {
	v, err := number.Parse(s)
	if err != nil {
		return 0, fmt.Errorf("%s: %w", name, err)
	}
	return v, nil
}

// optional reads a cell that may be "-" (not measured).
func optional(name, s string) (*float64, error) {
	if t := strings.TrimSpace(s); t == "-" || t == "—" || t == "" {
		return nil, nil
	}
	v, err := cellNumber(name, s)
	return &v, err
}

func cellDate(name, s string) (VisitDate, error) {
	d, ok := ParseVisitDate(strings.TrimSpace(s))
	if !ok || d.MonthOnly {
		return d, fmt.Errorf("%s %q is not a date such as 2026-05-18", name, s)
	}
	return d, nil
}

func (e *Electro) couponRow(c []string, line int) error {
	row := &CouponRow{ID: strings.TrimSpace(c[0]), Metal: strings.TrimSpace(c[1]), Line: line}
	if row.ID == "" {
		return errors.New("no coupon id")
	}
	if l := duplicateID(e.Coupons, row.ID, func(o *CouponRow) (string, int) { return o.ID, o.Line }); l > 0 {
		return fmt.Errorf("already in the table at line %d: give each coupon its own id", l)
	}
	a, err := electrochem.FindAlloy(row.Metal)
	if err != nil {
		return err
	}
	if row.Installed, err = cellDate("installed", c[2]); err != nil {
		return err
	}
	if row.Removed, err = cellDate("removed", c[3]); err != nil {
		return err
	}
	if !row.Removed.Time.After(row.Installed.Time) {
		return fmt.Errorf("removed %s is not after installed %s", row.Removed, row.Installed)
	}
	cp := electrochem.Coupon{DensityG: a.DensityG, Hours: row.Removed.Time.Sub(row.Installed.Time).Hours()}
	for i, p := range []*float64{&cp.MassBeforeG, &cp.MassAfterG, &cp.AreaCM2} {
		if *p, err = cellNumber([]string{"mass before", "mass after", "area"}[i], c[4+i]); err != nil {
			return err
		}
	}
	pit, err := optional("deepest pit", c[7])
	if err != nil {
		return err
	}
	if pit != nil {
		cp.PitDepthMM = *pit
	}
	row.Coupon = cp
	e.Coupons = append(e.Coupons, row)
	return nil
}

func (e *Electro) erRow(c []string, dates []VisitDate, line int) error {
	p := &ERProbe{ID: strings.TrimSpace(c[0]), Line: line}
	if l := duplicateID(e.ERProbes, p.ID, func(o *ERProbe) (string, int) { return o.ID, o.Line }); l > 0 {
		return fmt.Errorf("already in the table at line %d: write each probe once, its readings under the date columns", l)
	}
	var err error
	if p.SpanMM, err = cellNumber("span", c[1]); err != nil {
		return err
	}
	for i, d := range dates {
		v, err := optional("reading on "+d.String(), c[2+i])
		if err != nil {
			return err
		}
		if v != nil {
			p.Dates, p.Readings = append(p.Dates, d), append(p.Readings, *v)
		}
	}
	e.ERProbes = append(e.ERProbes, p)
	return nil
}

func (e *Electro) lprRow(c []string, dates []VisitDate, line int) error {
	p := &LPRProbe{ID: strings.TrimSpace(c[0]), Metal: strings.TrimSpace(c[1]), Line: line}
	if l := duplicateID(e.LPRProbes, p.ID, func(o *LPRProbe) (string, int) { return o.ID, o.Line }); l > 0 {
		return fmt.Errorf("already in the table at line %d: write each probe once, its readings under the date columns", l)
	}
	if _, err := electrochem.FindAlloy(p.Metal); err != nil {
		return err
	}
	switch b := strings.TrimSpace(c[2]); {
	case b == "-" || b == "":
	case strings.Contains(b, "/"):
		x, y, _ := strings.Cut(b, "/")
		var err error
		if p.BetaA, err = cellNumber("anodic Tafel slope", x); err != nil {
			return err
		}
		if p.BetaC, err = cellNumber("cathodic Tafel slope", y); err != nil {
			return err
		}
		if err := tafelMillivolts(b, p.BetaA, p.BetaC); err != nil {
			return err
		}
	default:
		v, err := cellNumber("B", b)
		if err != nil {
			return err
		}
		if v <= 0 {
			return errors.New("the Stern–Geary B must be positive")
		}
		if err := tafelMillivolts(b, v); err != nil {
			return err
		}
		p.BmV = v
	}
	for i, d := range dates {
		v, err := optional("R_p on "+d.String(), c[3+i])
		if err != nil {
			return err
		}
		if v != nil {
			p.Dates, p.RpOhmCM2 = append(p.Dates, d), append(p.RpOhmCM2, *v)
		}
	}
	e.LPRProbes = append(e.LPRProbes, p)
	return nil
}

func (e *Electro) testPointRow(c []string, line int) error {
	id := strings.TrimSpace(c[0])
	if id == "" {
		return errors.New("no test point id")
	}
	d, err := cellDate("date", c[1])
	if err != nil {
		return err
	}
	el, err := electrochem.ParseElectrode(c[2])
	if err != nil {
		return err
	}
	v := CPVisit{Date: d, Line: line, Potentials: electrochem.Potentials{Electrode: el}}
	ps := []**float64{&v.Potentials.On, &v.Potentials.Off, &v.Potentials.Native}
	for i, name := range []string{"on", "off", "native"} {
		if *ps[i], err = optional(name, c[3+i]); err != nil {
			return err
		}
	}
	for i, name := range []string{"on", "off", "native"} {
		if err := checkPotential(name, *ps[i], el); err != nil {
			return err
		}
	}
	if v.Potentials.On == nil && v.Potentials.Off == nil {
		return errors.New("give an on or an off potential (mV)")
	}
	i := slices.IndexFunc(e.TestPoints, func(t *TestPoint) bool { return t.ID == id })
	if i < 0 {
		e.TestPoints = append(e.TestPoints, &TestPoint{ID: id})
		i = len(e.TestPoints) - 1
	}
	tp := e.TestPoints[i]
	for _, o := range tp.Visits {
		if o.Date == d {
			return fmt.Errorf("%s has two rows on %s (first at line %d)", id, d, o.Line)
		}
	}
	tp.Visits = append(tp.Visits, v)
	slices.SortStableFunc(tp.Visits, func(a, b CPVisit) int { return a.Date.Time.Compare(b.Date.Time) })
	return nil
}

func (e *Electro) anodeRow(c []string, line int) error {
	row := &AnodeRow{ID: strings.TrimSpace(c[0]), Material: strings.TrimSpace(c[1]), Line: line, UseNote: strings.TrimSpace(c[5])}
	if l := duplicateID(e.Anodes, row.ID, func(o *AnodeRow) (string, int) { return o.ID, o.Line }); l > 0 {
		return fmt.Errorf("already in the table at line %d: give each anode its own id", l)
	}
	m, err := electrochem.FindAnodeMetal(row.Material)
	if err != nil {
		return err
	}
	a := electrochem.Anode{Metal: m}
	inst, err := optional("installed mass", c[2])
	if err != nil {
		return err
	}
	if inst != nil {
		a.InitialKG = *inst
	}
	if a.RemainingKG, err = cellNumber("remaining mass", c[3]); err != nil {
		return err
	}
	if a.CurrentA, err = cellNumber("current", c[4]); err != nil {
		return err
	}
	if u, ok := electrochem.Utilisation[strings.ToLower(row.UseNote)]; ok {
		a.Utilisation = u
	} else if a.Utilisation, err = cellNumber("utilisation", row.UseNote); err != nil {
		var shapes []string
		for k := range electrochem.Utilisation {
			shapes = append(shapes, k)
		}
		slices.Sort(shapes)
		return fmt.Errorf("%w, or a shape (%s)", err, strings.Join(shapes, ", "))
	}
	row.Anode = a
	e.Anodes = append(e.Anodes, row)
	return nil
}

// endsInLetter reports whether s ends in a letter.
func endsInLetter(s string) bool {
	r, _ := utf8.DecodeLastRuneInString(s)
	return unicode.IsLetter(r)
}
