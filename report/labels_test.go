package report

import (
	"math"
	"testing"
)

// No two placed labels overlap, none covers a marker, all stay in the frame,
// and a label with free space beside its point is put there without a leader.
// The cases are invented crowds of markers (no outside source: geometry).
func TestPlaceLabelsDoNotOverlap(t *testing.T) {
	frame := box{0, 0, 100, 60}
	// Five markers stacked 1 mm apart, and one alone.
	xs := []float64{50, 50, 50, 50, 50, 10}
	ys := []float64{30, 31, 32, 33, 34, 10}
	ws := []float64{12, 12, 12, 12, 12, 12}
	rs := []float64{1.2, 1.2, 1.2, 1.2, 1.2, 1.2}
	spots := placeLabels(xs, ys, ws, rs, 2.8, frame)
	for i, a := range spots {
		if !a.Box.inside(frame) {
			t.Errorf("label %d at %+v leaves the frame", i, a.Box)
		}
		for j, b := range spots {
			if i < j && a.Box.overlaps(b.Box) {
				t.Errorf("labels %d and %d overlap: %+v %+v", i, j, a.Box, b.Box)
			}
		}
		for j := range xs {
			m := box{xs[j] - rs[j], ys[j] - rs[j], 2 * rs[j], 2 * rs[j]}
			if a.Box.overlaps(m) && j != i {
				t.Errorf("label %d covers marker %d", i, j)
			}
		}
	}
	if spots[5].Leader || spots[5].Box.X < xs[5] {
		t.Errorf("the lone label was moved: %+v", spots[5])
	}
	leaders := 0
	for _, s := range spots[:5] {
		if s.Leader {
			leaders++
		}
	}
	if leaders == 0 {
		t.Error("a crowd of five markers 1 mm apart placed every label without a leader line")
	}
}

// Labels closer than the gap are moved apart by the least amount, in order,
// and kept inside the bounds.
func TestSpreadLabels(t *testing.T) {
	for _, c := range []struct {
		in, want []float64
	}{
		{[]float64{10, 10.5, 30}, []float64{10, 13, 30}},
		{[]float64{30, 10}, []float64{30, 10}},           // already apart, order of input kept
		{[]float64{49, 49.5, 50}, []float64{44, 47, 50}}, // pushed up from the lower bound
	} {
		got := spreadLabels(c.in, 3, 0, 50)
		for i := range got {
			if math.Abs(got[i]-c.want[i]) > 1e-9 {
				t.Errorf("spreadLabels(%v) = %v, want %v", c.in, got, c.want)
				break
			}
		}
	}
}
