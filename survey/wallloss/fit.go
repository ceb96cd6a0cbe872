package wallloss

import "math"

// LineFit is a least-squares line through thickness readings against time.
type LineFit struct {
	Slope     float64 // mm per year; negative when the wall is thinning
	Intercept float64 // mm at the first reading's date
	SESlope   float64 // standard error of the slope, mm/y
	N         int
}

// FitLine fits thickness = intercept + slope·t by ordinary least squares,
// t in years from the first reading. It needs three or more readings at two
// or more dates; the standard error uses n − 2 degrees of freedom.
func FitLine(readings []Reading) (LineFit, bool) {
	n := len(readings)
	if n < 3 {
		return LineFit{}, false
	}
	t0 := readings[0].Date
	var st, sy float64
	for _, r := range readings {
		st += YearsBetween(t0, r.Date)
		sy += r.ThicknessMM
	}
	mt, my := st/float64(n), sy/float64(n)
	var stt, sty float64
	for _, r := range readings {
		dt := YearsBetween(t0, r.Date) - mt
		stt += dt * dt
		sty += dt * (r.ThicknessMM - my)
	}
	if stt == 0 {
		return LineFit{}, false
	}
	f := LineFit{Slope: sty / stt, N: n}
	f.Intercept = my - f.Slope*mt
	var sse float64
	for _, r := range readings {
		e := r.ThicknessMM - (f.Intercept + f.Slope*YearsBetween(t0, r.Date))
		sse += e * e
	}
	f.SESlope = math.Sqrt(sse / float64(n-2) / stt)
	return f, true
}

// tOneSided95 holds Student's t at one-sided 95 % (two-sided 90 %) for 1 to 30
// degrees of freedom, as printed in statistics tables (e.g. NIST/SEMATECH
// e-Handbook of Statistical Methods, §1.3.6.7.2).
var tOneSided95 = []float64{
	6.314, 2.920, 2.353, 2.132, 2.015, 1.943, 1.895, 1.860, 1.833, 1.812,
	1.796, 1.782, 1.771, 1.761, 1.753, 1.746, 1.740, 1.734, 1.729, 1.725,
	1.721, 1.717, 1.714, 1.711, 1.708, 1.706, 1.703, 1.701, 1.699, 1.697,
}

// StudentT95 is the one-sided 95 % quantile of Student's t with df degrees of
// freedom: the table up to 30, then the Cornish-Fisher expansion about the
// normal quantile (error below 1e-4 beyond 30).
func StudentT95(df int) float64 {
	if df < 1 {
		return math.Inf(1)
	}
	if df <= len(tOneSided95) {
		return tOneSided95[df-1]
	}
	const z = 1.6448536269514722 // one-sided 95 % normal quantile
	v := float64(df)
	z3, z5, z7 := z*z*z, math.Pow(z, 5), math.Pow(z, 7)
	return z + (z3+z)/(4*v) + (5*z5+16*z3+3*z)/(96*v*v) + (3*z7+19*z5+17*z3-15*z)/(384*v*v*v)
}
