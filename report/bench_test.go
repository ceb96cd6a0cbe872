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

// BenchmarkPageCompression writes the full-detail report.pdf of 10k CMLs
// (every component in full, about 2,700 pages, no photos) with fpdf's own
// compression (a new zlib writer per page) and with pageCompressor (one
// reused); page building is outside the timing.
func BenchmarkPageCompression(b *testing.B) {
	if testing.Short() {
		b.Skip("2,700 pages: not under -short")
	}
	f := scaleFindings(b, 10_000)
	opts := testOptions()
	opts.Limits = Limits{FullDetailMaxCMLs: 1 << 30, FullDetailMaxComponents: 1 << 30, DetailWindowYears: 5, ListMaxRows: 500}
	for _, own := range []bool{true, false} {
		name := map[bool]string{true: "fpdf", false: "reused"}[own]
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				b.StopTimer()
				d := newDoc(f, opts)
				d.pdf.SetCompression(own)
				if err := d.sections(); err != nil {
					b.Fatal(err)
				}
				b.StartTimer()
				var err error
				if own {
					err = d.pdf.Output(io.Discard)
				} else {
					err = d.output(io.Discard)
				}
				if err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
