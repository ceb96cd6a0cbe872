package survey

import (
	"fmt"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey/wallloss"
)

// bigChecklist writes a synthetic checklist of n components × 50 CMLs × 4 visits.
func bigChecklist(n int) []byte {
	var b strings.Builder
	b.WriteString("---\ntitle: bench\nsite: bench\ndate: 2026-01-10\ninspector: bench\nunits: mm\n---\n# Asset\n")
	for c := 0; c < n; c++ {
		fmt.Fprintf(&b, "\n## Component %d\n\n- nominal: 10\n- required: 5\n- installed: 2000-01\n- consequence: high\n\n", c)
		b.WriteString("| CML | location | 2011-01-10 | 2016-01-10 | 2021-01-10 | 2026-01-10 |\n|---|---|---|---|---|---|\n")
		for m := 0; m < 50; m++ {
			fmt.Fprintf(&b, "| C%d-%d | spot %d | 9.9 | 9.%d | 9.%d 9.5 | 8.%d |\n", c, m, m, 8-m%3, 6-m%4, 9-m%7)
		}
	}
	return []byte(b.String())
}

// BenchmarkParseAndAssess reads and assesses 5,000 CMLs (20,000 visits).
func BenchmarkParseAndAssess(b *testing.B) {
	src := bigChecklist(100)
	b.SetBytes(int64(len(src)))
	b.ReportAllocs()
	for b.Loop() {
		s, problems := readChecklist("survey.md", src)
		if problems.HasErrors() {
			b.Fatal(problems)
		}
		if items := Assess(s, wallloss.DefaultPolicy); len(items) != 5000 {
			b.Fatal(len(items))
		}
	}
}
