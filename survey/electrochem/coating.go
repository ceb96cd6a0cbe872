package electrochem

import (
	"errors"
	"fmt"
	"math"
)

// d610Upper are the upper bounds, % of area rusted, of ASTM D610-08 (R2019)
// Table 1 grades 10 down to 1; more than 50 % is grade 0.
var d610Upper = []float64{0.01, 0.03, 0.1, 0.3, 1.0, 3.0, 10, 16, 33, 50}

// D610Grade is the ASTM D610 rust grade (10 best … 0) for a rusted area in %.
func D610Grade(percent float64) (int, error) {
	if percent < 0 || percent > 100 || math.IsNaN(percent) {
		return 0, fmt.Errorf("rusted area %g %% is not between 0 and 100", percent)
	}
	for i, u := range d610Upper {
		if percent <= u {
			return 10 - i, nil
		}
	}
	return 0, nil
}

// iso4628Points are ISO 4628-3:2016's nominal rusted areas, %, for Ri 1–5.
var iso4628Points = []float64{0.05, 0.5, 1, 8, 40}

// ISO4628Ri is the ISO 4628-3 degree of rusting Ri (0 best … 5) for a rusted
// area in %. The standard grades by comparison with pictures at nominal
// points (Ri 1 0.05 %, Ri 2 0.5 %, Ri 3 1 %, Ri 4 8 %, Ri 5 40/50 %); the
// mapping of a measured percentage is our convention: Ri 0 up to 0.01 %
// (ASTM D610 grade 10, no visible rust), else the nearest point on a
// logarithmic scale.
func ISO4628Ri(percent float64) (int, error) {
	if _, err := D610Grade(percent); err != nil {
		return 0, err
	}
	if percent <= 0.01 {
		return 0, nil
	}
	best, bestD := 1, math.Inf(1)
	for i, p := range iso4628Points {
		if d := math.Abs(math.Log10(percent) - math.Log10(p)); d < bestD {
			best, bestD = i+1, d
		}
	}
	return best, nil
}

// DFTJudgement is a batch of dry-film thickness readings judged by the
// ISO 19840 acceptance rule.
type DFTJudgement struct {
	Accepted      bool
	MeanUM, MinUM float64
	BelowNominal  int // readings below nominal (but not below 80 %)
	BelowEighty   int // readings below 80 % of nominal
	AboveMaximum  int // readings above the maximum, when one is given
	Reasons       []string
	Working
}

// JudgeDFT is ISO 19840:2012's acceptance rule for a batch of dry-film
// thickness readings in µm against the nominal: the mean is at least the
// nominal; no reading is below 80 % of nominal; readings from 80 % up to
// nominal are at most 20 % of all readings. maxUM, when positive, is the
// specification's maximum (often 3 × nominal). ISO 19840's roughness
// correction values are not applied: readings are taken as corrected.
func JudgeDFT(readingsUM []float64, nominalUM, maxUM float64) (DFTJudgement, error) {
	if nominalUM <= 0 {
		return DFTJudgement{}, errors.New("nominal dry-film thickness must be positive")
	}
	if len(readingsUM) == 0 {
		return DFTJudgement{}, errors.New("no dry-film thickness readings")
	}
	j := DFTJudgement{MinUM: math.Inf(1)}
	j.Source = "ISO 19840:2012 §6 acceptance criteria (from memory)"
	sum := 0.0
	for _, r := range readingsUM {
		if r <= 0 || math.IsNaN(r) {
			return DFTJudgement{}, fmt.Errorf("reading %g µm is not a thickness", r)
		}
		sum += r
		j.MinUM = min(j.MinUM, r)
		switch {
		case r < 0.8*nominalUM:
			j.BelowEighty++
		case r < nominalUM:
			j.BelowNominal++
		}
		if maxUM > 0 && r > maxUM {
			j.AboveMaximum++
		}
	}
	n := len(readingsUM)
	j.MeanUM = sum / float64(n)
	j.step("%d readings, mean %.1f µm against nominal %.0f µm", n, j.MeanUM, nominalUM)
	j.step("below 80 %% of nominal (%.0f µm): %d; from 80 %% to nominal: %d of %d (%.0f %%, at most 20 %%)",
		0.8*nominalUM, j.BelowEighty, j.BelowNominal, n, 100*float64(j.BelowNominal)/float64(n))
	if j.MeanUM < nominalUM {
		j.Reasons = append(j.Reasons, fmt.Sprintf("mean %.1f µm is below nominal %.0f µm", j.MeanUM, nominalUM))
	}
	if j.BelowEighty > 0 {
		j.Reasons = append(j.Reasons, fmt.Sprintf("%s below 80 %% of nominal (lowest %.0f µm)", readings(j.BelowEighty), j.MinUM))
	}
	if float64(j.BelowNominal) > 0.2*float64(n) {
		j.Reasons = append(j.Reasons, fmt.Sprintf("%d of %d readings between 80 %% and nominal, more than 20 %%", j.BelowNominal, n))
	}
	if j.AboveMaximum > 0 {
		j.Reasons = append(j.Reasons, fmt.Sprintf("%s above the maximum %.0f µm", readings(j.AboveMaximum), maxUM))
	}
	j.Accepted = len(j.Reasons) == 0
	return j, nil
}

// ZincRates are ISO 9223:2012 Table 2's first-year zinc corrosion rates by
// corrosivity category, lower and upper bound in µm/a (ISO 14713-1:2017
// Table 1 gives the same bands).
var ZincRates = map[string][2]float64{
	"C1": {0, 0.1},
	"C2": {0.1, 0.7},
	"C3": {0.7, 2.1},
	"C4": {2.1, 4.2},
	"C5": {4.2, 8.4},
	"CX": {8.4, 25},
}

// GalvanizingLife is the time to first maintenance of a zinc coating.
type GalvanizingLife struct {
	ShortestY float64 // thickness / upper rate of the category
	LongestY  float64 // thickness / lower rate; +Inf in C1
	Working
}

// GalvanizingLifeOf divides the measured zinc thickness in µm by the zinc
// rates bounding the site's ISO 9223 category, as ISO 14713-1 does for its
// life ranges; the shorter life governs planning.
func GalvanizingLifeOf(zincUM float64, category string) (GalvanizingLife, error) {
	r, ok := ZincRates[category]
	if !ok {
		return GalvanizingLife{}, fmt.Errorf("corrosivity category %q is not C1–C5 or CX", category)
	}
	if zincUM <= 0 {
		return GalvanizingLife{}, errors.New("zinc thickness must be positive")
	}
	g := GalvanizingLife{ShortestY: zincUM / r[1], LongestY: math.Inf(1)}
	g.Source = "ISO 9223:2012 Table 2 zinc rates; ISO 14713-1:2017 life = thickness / rate"
	if r[0] > 0 {
		g.LongestY = zincUM / r[0]
		g.step("%s: zinc %.3g–%.3g µm/a; life = %.0f µm / %.3g = %.1f y (shortest) to %.0f / %.3g = %.1f y",
			category, r[0], r[1], zincUM, r[1], g.ShortestY, zincUM, r[0], g.LongestY)
	} else {
		g.step("%s: zinc ≤ %.3g µm/a; life ≥ %.0f µm / %.3g = %.1f y", category, r[1], zincUM, r[1], g.ShortestY)
	}
	return g, nil
}

// readings is n readings in words.
func readings(n int) string {
	if n == 1 {
		return "1 reading"
	}
	return fmt.Sprintf("%d readings", n)
}
