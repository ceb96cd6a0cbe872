package report

import (
	"math"
	"sort"
)

// box is a rectangle on the page, mm: top-left corner, width and height.
type box struct{ X, Y, W, H float64 }

func (a box) overlaps(b box) bool {
	return a.X < b.X+b.W && b.X < a.X+a.W && a.Y < b.Y+b.H && b.Y < a.Y+a.H
}

func (a box) inside(frame box) bool {
	return a.X >= frame.X && a.Y >= frame.Y && a.X+a.W <= frame.X+frame.W && a.Y+a.H <= frame.Y+frame.H
}

// labelSpot is where a label goes: its box, and whether it stands off its
// point far enough to need a leader line back to it.
type labelSpot struct {
	Box    box
	Leader bool
}

// placeLabels places labels of sizes w×h beside their points (x, y), in the
// order given (the most important first, so it gets the nearest place). Each
// label takes the first place, nearest first, that overlaps no marker (a
// square of half-width rs[i] around point i) and no label placed before it,
// and stays inside frame; a label set off beyond the first ring gets a leader
// line. When nothing is free, the label goes right of its point.
func placeLabels(xs, ys, ws, rs []float64, h float64, frame box) []labelSpot {
	marks := make([]box, len(xs))
	for i := range xs {
		marks[i] = box{xs[i] - rs[i], ys[i] - rs[i], 2 * rs[i], 2 * rs[i]}
	}
	var placed []box
	out := make([]labelSpot, len(xs))
	for i := range xs {
		gap := rs[i] + 0.6
		first := box{xs[i] + gap, ys[i] - h/2, ws[i], h}
		out[i] = labelSpot{Box: first}
	search:
		for ring := 1; ring <= 6; ring++ {
			d := gap + float64(ring-1)*h*1.2
			for _, c := range labelCandidates(xs[i], ys[i], ws[i], h, d) {
				if !c.inside(frame) {
					continue
				}
				free := true
				for j, m := range marks {
					if j != i && c.overlaps(m) || j == i && c.overlaps(shrink(m, 0.2)) {
						free = false
						break
					}
				}
				for _, p := range placed {
					if free && c.overlaps(p) {
						free = false
					}
				}
				if free {
					out[i] = labelSpot{Box: c, Leader: ring > 1}
					break search
				}
			}
		}
		placed = append(placed, out[i].Box)
	}
	return out
}

// shrink is a box made smaller by d on every side.
func shrink(b box, d float64) box { return box{b.X + d, b.Y + d, b.W - 2*d, b.H - 2*d} }

// labelCandidates are the places at distance d around (x, y): right, left,
// above, below, then the four corners.
func labelCandidates(x, y, w, h, d float64) []box {
	return []box{
		{x + d, y - h/2, w, h}, {x - d - w, y - h/2, w, h},
		{x - w/2, y - d - h, w, h}, {x - w/2, y + d, w, h},
		{x + d, y - d - h, w, h}, {x - d - w, y - d - h, w, h},
		{x + d, y + d, w, h}, {x - d - w, y + d, w, h},
	}
}

// spreadLabels moves label centres ys (mm, down the page) apart so that no
// two are closer than gap, each moved as little as the order allows, and all
// kept within [lo, hi] when they fit. The order of the labels is kept.
func spreadLabels(ys []float64, gap, lo, hi float64) []float64 {
	idx := make([]int, len(ys))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return ys[idx[a]] < ys[idx[b]] })
	pos := make([]float64, len(ys))
	for k, i := range idx {
		pos[k] = math.Max(ys[i], lo)
		if k > 0 && pos[k] < pos[k-1]+gap {
			pos[k] = pos[k-1] + gap
		}
	}
	for k := len(pos) - 1; k >= 0; k-- {
		limit := hi
		if k < len(pos)-1 {
			limit = pos[k+1] - gap
		}
		if pos[k] > limit {
			pos[k] = math.Max(limit, lo)
		}
	}
	out := make([]float64, len(ys))
	for k, i := range idx {
		out[i] = pos[k]
	}
	return out
}
