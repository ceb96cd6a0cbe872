package report

import "testing"

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
