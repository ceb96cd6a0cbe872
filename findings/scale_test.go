package findings

import (
	"fmt"
	"path/filepath"
	"testing"

	"github.com/lossline/lossline/internal/scalesurvey"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// BenchmarkCheckAndCompute is the computation of `lossline report` before
// rendering: LoadSeries and Compute of a generated survey of 50 units × 20
// circuits, three visits in one folder or one in each of three. The 100k
// cases are skipped under -short.
func BenchmarkCheckAndCompute(b *testing.B) {
	for _, c := range []struct {
		cmls    int
		history bool
	}{{10_000, false}, {10_000, true}, {100_000, false}, {100_000, true}} {
		name := fmt.Sprintf("%dk", c.cmls/1000)
		if c.history {
			name += "-history"
		}
		b.Run(name, func(b *testing.B) {
			if c.cmls >= 100_000 && testing.Short() {
				b.Skip("100k CMLs: not under -short")
			}
			dir := filepath.Join(b.TempDir(), "survey")
			write := scalesurvey.Write
			if c.history {
				write = scalesurvey.WriteSeries
			}
			if err := write(dir, scalesurvey.Size{CMLs: c.cmls}); err != nil {
				b.Fatal(err)
			}
			set := Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25}
			b.ReportAllocs()
			for b.Loop() {
				s, problems := survey.LoadSeries(dir, nil, survey.DefaultOptions)
				if problems.HasErrors() {
					b.Fatal(problems)
				}
				if f := Compute(s, set); len(f.Items) != c.cmls {
					b.Fatalf("%d items", len(f.Items))
				}
			}
		})
	}
}
