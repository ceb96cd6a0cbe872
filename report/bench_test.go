package report

import (
	"io"
	"path/filepath"
	"testing"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/internal/scalesurvey"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// BenchmarkRenderDemo renders the demo's three outputs in memory (8 photos).
func BenchmarkRenderDemo(b *testing.B) {
	t := &testing.T{}
	f := demo(t)
	opts := testOptions()
	b.ReportAllocs()
	for b.Loop() {
		if _, _, err := Render(f, opts); err != nil {
			b.Fatal(err)
		}
	}
}

// scaleFindings reads and assesses a generated survey of n CMLs (50 units ×
// 20 circuits, three visits).
func scaleFindings(tb testing.TB, n int) *findings.Findings {
	tb.Helper()
	dir := filepath.Join(tb.TempDir(), "survey")
	if err := scalesurvey.Write(dir, scalesurvey.Size{CMLs: n}); err != nil {
		tb.Fatal(err)
	}
	s, problems := survey.LoadSeries(dir, nil, survey.DefaultOptions)
	if problems.HasErrors() {
		tb.Fatal(problems)
	}
	return findings.Compute(s, findings.Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25})
}

// benchmarkRender streams every output of a generated survey of n CMLs to
// io.Discard, as `lossline report` writes them (the reading and assessment
// are outside the timing).
func benchmarkRender(b *testing.B, n int) {
	if n >= 100_000 && testing.Short() {
		b.Skip("100k CMLs: not under -short")
	}
	f := scaleFindings(b, n)
	opts := testOptions()
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		files, _ := Streams(f, opts)
		for _, file := range files {
			if err := file.Write(io.Discard); err != nil {
				b.Fatal(err)
			}
		}
	}
}

func BenchmarkRender10k(b *testing.B)  { benchmarkRender(b, 10_000) }
func BenchmarkRender100k(b *testing.B) { benchmarkRender(b, 100_000) }
