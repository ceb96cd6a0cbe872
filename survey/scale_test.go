package survey

import (
	"fmt"
	"path/filepath"
	"testing"

	"github.com/lossline/lossline/internal/scalesurvey"
)

// scaleCases are the generated surveys of the scale benchmarks: 50 units ×
// 20 circuits, three visits in one folder, or one visit in each of three
// folders (the newest naming the two earlier under previous:).
var scaleCases = []struct {
	cmls    int
	history bool
}{{10_000, false}, {10_000, true}, {100_000, false}, {100_000, true}}

// scaleName names a case in benchmark output.
func scaleName(cmls int, history bool) string {
	name := fmt.Sprintf("%dk", cmls/1000)
	if history {
		name += "-history"
	}
	return name
}

// scaleFolder writes a generated survey into a temporary folder and
// returns the folder to load.
func scaleFolder(tb testing.TB, size scalesurvey.Size, history bool) string {
	tb.Helper()
	dir := filepath.Join(tb.TempDir(), "survey")
	write := scalesurvey.Write
	if history {
		write = scalesurvey.WriteSeries
	}
	if err := write(dir, size); err != nil {
		tb.Fatal(err)
	}
	return dir
}

// BenchmarkCheck is `lossline check` without its settings: LoadSeries of a
// generated survey, with or without two earlier folders. The 100k cases are
// skipped under -short.
func BenchmarkCheck(b *testing.B) {
	for _, c := range scaleCases {
		b.Run(scaleName(c.cmls, c.history), func(b *testing.B) {
			if c.cmls >= 100_000 && testing.Short() {
				b.Skip("100k CMLs: not under -short")
			}
			dir := scaleFolder(b, scalesurvey.Size{CMLs: c.cmls}, c.history)
			b.ReportAllocs()
			for b.Loop() {
				s, problems := LoadSeries(dir, nil, DefaultOptions)
				if problems.HasErrors() || s.CMLCount() != c.cmls {
					b.Fatalf("%d CMLs, problems %v", s.CMLCount(), problems)
				}
			}
		})
	}
}
