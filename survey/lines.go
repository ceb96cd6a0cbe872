package survey

import "sort"

// lineIndex turns byte offsets of a source into 1-based line numbers.
type lineIndex []int // offsets where lines start

func newLineIndex(src []byte) lineIndex {
	idx := lineIndex{0}
	for i, b := range src {
		if b == '\n' {
			idx = append(idx, i+1)
		}
	}
	return idx
}

// line returns the 1-based line holding offset (clamped to the source).
func (idx lineIndex) line(offset int) int {
	if offset < 0 {
		offset = 0
	}
	return sort.Search(len(idx), func(i int) bool { return idx[i] > offset })
}
