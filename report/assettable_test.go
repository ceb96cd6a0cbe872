package report

import (
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// A summary-first report sums up each asset in one row of one table, each
// row starting with the asset's name and its CMLs / components, so no asset's
// figures are split from its name across a page break and the assets take a
// few pages, not one card each.
func TestSummaryFirstAssetsOneRowEach(t *testing.T) {
	needPoppler(t)
	f := generated(t, 1200, 30, 4) // 30 assets of 40 CMLs on 4 components
	pdf, _, err := PDF(f, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	text, _ := pdfText(t, pdf)
	start := strings.Index(text, "summarised per asset")
	end := strings.Index(text, summaryMark)
	if start < 0 || end < start {
		t.Fatalf("no asset summary before %q", summaryMark)
	}
	part := text[start:end]
	rows := regexp.MustCompile(`(?m)^\s*(Unit \d+)\s+(\d+) / (\d+)\s`).FindAllStringSubmatch(part, -1)
	if len(rows) != len(f.Survey.Assets) {
		t.Fatalf("%d asset rows, want one for each of the %d assets", len(rows), len(f.Survey.Assets))
	}
	for i, r := range rows {
		a := f.Survey.Assets[i]
		if r[1] != a.Name || r[3] != strconv.Itoa(len(a.Components)) {
			t.Errorf("row %d is %q with %s components, want %q with %d", i+1, r[1], r[3], a.Name, len(a.Components))
		}
	}
	// The list of what needs attention names its column as every other
	// table does: the repair window, not a "status".
	head := strings.Index(text, "Needs attention because") // the list's last column title
	if head < 0 {
		t.Fatal("no list of what needs attention")
	}
	attention := text[max(0, head-1200) : head+30]
	if !strings.Contains(attention, "Repair window") || regexp.MustCompile(`\sStatus\s`).MatchString(attention) {
		t.Errorf("the list of what needs attention does not head its column Repair window:\n%s", attention)
	}
	if strings.Count(part, "\f") > 3 {
		t.Errorf("the asset summary of %d assets runs over %d page breaks", len(rows), strings.Count(part, "\f"))
	}
}
