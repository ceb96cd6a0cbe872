package survey

import (
	"bytes"
	"sort"
)

// lineIndex turns byte offsets of a source into 1-based line numbers.
type lineIndex []int // offsets where lines start

func newLineIndex(src []byte) lineIndex {
	idx := make(lineIndex, 1, bytes.Count(src, []byte("\n"))+1)
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

// advance returns the line holding offset, counting on from line, a line at
// or before it: reading the lines in order costs one step per line.
func (idx lineIndex) advance(line, offset int) int {
	for line < len(idx) && idx[line] <= offset {
		line++
	}
	return line
}
