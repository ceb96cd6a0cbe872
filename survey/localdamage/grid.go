package localdamage

import (
	"errors"
	"math"
)

// GridStats are the statistics of a grid of thickness readings (mm).
type GridStats struct {
	Count      int
	MinMM      float64
	MeanMM     float64
	StdDevMM   float64 // sample standard deviation (n − 1); 0 for one reading
	BelowCount int     // readings below the required thickness; 0 when none is given
	MinRow     int     // position of the minimum, 0-based; the first in row order on ties
	MinCol     int
}

// Grid computes the statistics of a grid; a cell that is NaN was not read.
// requiredMM ≤ 0 means no required thickness is known.
func Grid(cells [][]float64, requiredMM float64) (GridStats, error) {
	g := GridStats{MinMM: math.Inf(1)}
	sum := 0.0
	for i, row := range cells {
		for j, v := range row {
			if math.IsNaN(v) {
				continue
			}
			if v <= 0 || math.IsInf(v, 0) {
				return g, errors.New("a grid reading is not a positive thickness")
			}
			g.Count++
			sum += v
			if v < g.MinMM {
				g.MinMM, g.MinRow, g.MinCol = v, i, j
			}
			if requiredMM > 0 && v < requiredMM {
				g.BelowCount++
			}
		}
	}
	if g.Count == 0 {
		return g, errors.New("the grid has no readings")
	}
	g.MeanMM = sum / float64(g.Count)
	if g.Count > 1 {
		ss := 0.0
		for _, row := range cells {
			for _, v := range row {
				if !math.IsNaN(v) {
					ss += (v - g.MeanMM) * (v - g.MeanMM)
				}
			}
		}
		g.StdDevMM = math.Sqrt(ss / float64(g.Count-1))
	}
	return g, nil
}
