package survey

import (
	"slices"
	"sort"
)

// median of a non-empty list; the mean of the middle two for an even count.
func median(v []float64) float64 {
	return medianSorting(slices.Clone(v))
}

// medianSorting is median sorting v in place.
func medianSorting(v []float64) float64 {
	slices.Sort(v)
	return sortedValues(v).medianWithout()
}

// sortedValues are values sorted once, so that the median of all of them
// but a few is found without copying or sorting them again: a check that
// judges each of n values against the median of the others costs n log n,
// not n² log n.
type sortedValues []float64

// newSortedValues sorts v in place.
func newSortedValues(v []float64) sortedValues {
	slices.Sort(v)
	return sortedValues(v)
}

// medianWithout is the median of the values with one occurrence of each of
// out left out; every one of out must be among them, and at least one value
// must remain. Its cost grows with len(out)², not with the values.
func (s sortedValues) medianWithout(out ...float64) float64 {
	var buf [8]int
	gone := buf[:0] // indexes left out, ascending
	for _, x := range out {
		i := sort.SearchFloat64s(s, x)
		for slices.Contains(gone, i) { // an equal value already left out
			i++
		}
		if i >= len(s) || s[i] != x {
			panic("medianWithout: value not among the values")
		}
		gone = append(gone, i)
	}
	slices.Sort(gone)
	n := len(s) - len(gone)
	if n%2 == 1 {
		return s[s.index(n/2, gone)]
	}
	return (s[s.index(n/2-1, gone)] + s[s.index(n/2, gone)]) / 2
}

// index is the index in s of the k-th (from 0) value left when the
// ascending indexes gone are left out.
func (s sortedValues) index(k int, gone []int) int {
	for _, g := range gone {
		if g <= k {
			k++
		}
	}
	return k
}
