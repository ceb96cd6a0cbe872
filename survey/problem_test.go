package survey

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"sort"
	"testing"
)

// ProblemList.Sort orders by file, then line, and keeps the order of
// problems at the same place: the same order as the standard library's
// stable sort (sort.SliceStable) on 500 random lists with many ties.
func TestProblemSortIsStable(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 7))
	for range 500 {
		var l ProblemList
		for i := range rng.IntN(60) {
			l.Warnf(fmt.Sprintf("f%d.md", rng.IntN(3)), rng.IntN(5), "problem %d", i)
		}
		want := slices.Clone(l)
		sort.SliceStable(want, func(i, j int) bool {
			if want[i].File != want[j].File {
				return want[i].File < want[j].File
			}
			return want[i].Line < want[j].Line
		})
		l.Sort()
		if !slices.Equal(l, want) {
			t.Fatalf("sorted\n%v\nwant\n%v", l, want)
		}
	}
}
