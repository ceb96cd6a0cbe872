package survey

import (
	"math"
	"path/filepath"
	"slices"
	"testing"

	"github.com/lossline/lossline/survey/wallloss"
)

func demoChanges(t *testing.T) map[string]Change {
	t.Helper()
	s, problems := LoadSeries(filepath.Join("..", "testdata", "demo"), nil, DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	items := Assess(s, wallloss.DefaultPolicy)
	out := map[string]Change{}
	for _, c := range Changes(s, items, IndexPhotos(s), wallloss.DefaultPolicy, 25) {
		out[c.Item.CML.ID] = c
	}
	return out
}

// The rate over each interval is the short-term rate of API 570 §7.1.1,
// (t_previous − t_actual) / years, applied to every pair of consecutive visits.
// A-01 (merged from the 2022 survey, renamed from A-1): day counts by calendar.
func TestIntervalRatesByHand(t *testing.T) {
	c := demoChanges(t)["A-01"]
	want := []float64{(8.05 - 7.40) / (1843 / 365.25), (7.40 - 6.62) / (1834 / 365.25), (6.62 - 5.71) / (1653 / 365.25)}
	if len(c.Intervals) != len(want) {
		t.Fatalf("%d intervals, want %d", len(c.Intervals), len(want))
	}
	for i, w := range want {
		if math.Abs(c.Intervals[i].RateMMPerY-w) > 1e-9 {
			t.Errorf("interval %d: %.6f mm/y, want %.6f", i, c.Intervals[i].RateMMPerY, w)
		}
	}
	// Latest interval 0.2011 mm/y against the long-term 0.1604 mm/y: 25.4 % faster, over the 25 % setting.
	if !Has(c.Codes, ChangeAccelerating) {
		t.Errorf("A-01 codes %v lack accelerating", c.Codes)
	}
}

func TestDemoChanges(t *testing.T) {
	ch := demoChanges(t)
	for id, want := range map[string]ChangeCode{
		"A-03":  {Kind: ChangeCrossedRequired}, // 5.20 mm in 2022, 3.62 mm now, required 3.8 mm
		"G2-03": {Kind: ChangeNotRemeasured},
		"N5-01": {Kind: ChangeNewCML},
		"T2-02": {Kind: ChangeGainedFlag, Flag: wallloss.FlagThicknessIncrease},
	} {
		if !slices.Contains(ch[id].Codes, want) {
			t.Errorf("%s codes %v lack %s", id, ch[id].Codes, want)
		}
	}
	if Has(ch["A-03"].Codes, ChangeAccelerating) {
		t.Error("A-03 (19 % above its long-term rate) marked accelerating at 25 %")
	}
	if p := ch["A-03"]; len(p.PhotosBefore) != 1 || len(p.PhotosCurrent) != 1 {
		t.Errorf("A-03 before/after photos: %d / %d", len(p.PhotosBefore), len(p.PhotosCurrent))
	}
	if w := ch["A-03"].WindowBefore; w == wallloss.WindowNow || w == wallloss.WindowUnknown {
		t.Errorf("A-03 window before %v", w)
	}
}
