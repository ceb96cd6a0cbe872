package findings

import (
	"path/filepath"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

// The demo's electro findings: TP-2 at −815 mV CSE instant-off with 70 mV of
// polarisation fails NACE SP0169-2013 §6.2.2.1 (from memory); XG-3's batch
// has a reading of 198 µm, below 80 % of 250 µm (ISO 19840:2012, from
// memory); mild steel against passive 316 is 0.61 V apart (galvanic series in
// seawater, ASTM G82 guide; 0.25 V limit, common practice).
func TestElectroFindingsOfDemo(t *testing.T) {
	s, problems := survey.LoadSeries(filepath.Join("..", "testdata", "demo"), nil, survey.DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	f := Compute(s, Settings{Policy: wallloss.DefaultPolicy})
	got := f.Electro()
	if len(got) != 3 {
		t.Fatalf("%d findings: %+v", len(got), got)
	}
	want := []string{"Tank farm cathodic protection / Test points and anode bed AB-1 / TP-2: cp not protected: instant-off -815 mV CSE",
		"Jetty access bridge B-2 / Cross girder XG-3 coating: dft rejected: 1 reading below 80 %",
		"Fuel jetty J-1 / Pile P-7 splash zone: metal pair warn: mild steel and 316 stainless (passive) are 0.61 V apart"}
	for i, w := range []int{0, 2, 1} {
		if !strings.HasPrefix(got[w].Text(), want[i]) {
			t.Errorf("finding %d: %q, want %q…", w, got[w].Text(), want[i])
		}
	}
	if len(f.CPFailing()) != 1 || got[0].Line == 0 {
		t.Errorf("failing points %+v", f.CPFailing())
	}
}
