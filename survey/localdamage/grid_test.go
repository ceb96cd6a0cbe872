package localdamage

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/stat"
)

func near(got, want, rel float64) bool {
	return math.Abs(got-want) <= rel*math.Max(math.Abs(want), 1e-12)
}

func TestGrid(t *testing.T) {
	nan := math.NaN()
	// The 15 readings of the coefficient-of-variation example of API 579-1/ASME
	// FFS-1 Part 4 practice (COV = s/t_am, n−1): the statistics are checked
	// against gonum's stat.Mean and stat.StdDev (sample, n−1).
	fifteen := []float64{9.1, 9.4, 9.0, 9.3, 9.6, 8.9, 9.2, 9.5, 9.3, 9.1, 9.0, 9.4, 9.2, 9.3, 9.5}
	tests := []struct {
		name     string
		cells    [][]float64
		required float64
		wantMin  float64
		wantMean float64
		wantSD   float64
		below    int
		row, col int
	}{
		// Hand calculation (common practice): mean 9, deviations 1, 0, −1 → s = 1.
		{"hand 2x2 with a cell not read", [][]float64{{10, 9}, {8, nan}}, 8.5, 8, 9, 1, 1, 1, 0},
		// gonum stat.Mean / stat.StdDev as the reference library.
		{"15 readings, 3x5", [][]float64{fifteen[0:5], fifteen[5:10], fifteen[10:15]}, 9.05, 8.9,
			stat.Mean(fifteen, nil), stat.StdDev(fifteen, nil), 3, 1, 0},
		// One reading: no spread (common practice).
		{"single", [][]float64{{7.5}}, 0, 7.5, 7.5, 0, 0, 0, 0},
		// Ties: the first minimum in row order (our rule).
		{"tie", [][]float64{{6, 5}, {5, 6}}, 0, 5, 5.5, math.Sqrt(1.0 / 3), 0, 0, 1},
	}
	for _, tc := range tests {
		g, err := Grid(tc.cells, tc.required)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if g.MinMM != tc.wantMin || !near(g.MeanMM, tc.wantMean, 1e-12) || !near(g.StdDevMM, tc.wantSD, 1e-12) ||
			g.BelowCount != tc.below || g.MinRow != tc.row || g.MinCol != tc.col {
			t.Errorf("%s: got %+v", tc.name, g)
		}
	}
	// Values of the API 579 COV example recomputed by hand: t_am 9.2533, s 0.20656.
	g, _ := Grid([][]float64{fifteen}, 0)
	if !near(g.MeanMM, 9.25333, 1e-5) || !near(g.StdDevMM, 0.20656, 1e-4) {
		t.Errorf("15 readings: mean %v sd %v", g.MeanMM, g.StdDevMM)
	}
	for _, bad := range [][][]float64{{}, {{nan}}, {{5, -1}}, {{math.Inf(1)}}} {
		if _, err := Grid(bad, 0); err == nil {
			t.Errorf("Grid(%v) accepted", bad)
		}
	}
}
