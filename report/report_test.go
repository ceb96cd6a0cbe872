package report

import (
	"bytes"
	"encoding/csv"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/paulmach/orb"
	"github.com/paulmach/orb/geojson"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/photo"
	"github.com/lossline/lossline/survey"
	"github.com/lossline/lossline/survey/wallloss"
)

var update = flag.Bool("update", false, "rewrite golden files")

func demo(t *testing.T) *findings.Findings {
	t.Helper()
	s, problems := survey.LoadSeries(filepath.Join("..", "testdata", "demo"), nil, survey.DefaultOptions)
	if problems.HasErrors() {
		t.Fatal(problems)
	}
	return findings.Compute(s, findings.Settings{Policy: wallloss.DefaultPolicy, AccelerationPct: 25})
}

func testOptions() Options {
	ps := photo.Settings{LongSide: 1600, Quality: 80}
	return Options{
		Place:         survey.DefaultPlaceOptions,
		Photos:        ps,
		PreparePhotos: func(srcs []photo.Source, use func(int, photo.Prepared, error)) { photo.Stage(srcs, ps, use) },
		Created:       time.Date(2026, 11, 20, 9, 0, 0, 0, time.UTC),
		Version:       "test",
	}
}

// results.json of the demo against the reviewed golden copy
// (go test ./report -run Golden -update rewrites it).
func TestGoldenResultsJSON(t *testing.T) {
	f := demo(t)
	files, _, err := Render(f, testOptions())
	if err != nil {
		t.Fatal(err)
	}
	var got []byte
	for _, f := range files {
		if f.Name == JSONFile {
			got = f.Data
		}
	}
	got = bytes.ReplaceAll(got, []byte(filepath.Join("..", "testdata")), []byte("testdata"))
	golden := filepath.Join("testdata", "demo-results.golden.json")
	if *update {
		if err := os.WriteFile(golden, got, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(golden)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("results.json differs from %s (run with -update after checking the change)", golden)
	}
}

func TestCSVHasOneRowPerCML(t *testing.T) {
	f := demo(t)
	s, items := f.Survey, f.Items
	res := BuildResults(f, nil)
	b, err := CSV(res, Display{}.resolve(s.Units))
	if err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(bytes.NewReader(b)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 1+len(items) {
		t.Fatalf("%d rows, want header + %d", len(rows), len(items))
	}
	if rows[0][8] != "thickness_mm" || rows[1][3] != "A-03" || rows[1][8] != "3.620" {
		t.Errorf("header %v / first row %v", rows[0], rows[1])
	}
}

func TestCSVInInches(t *testing.T) {
	res := Results{Items: []Item{{Rank: 1, CML: "X", ThicknessMM: ptr(9.525), RateMMPerY: ptr(0.254)}}}
	// 9.525 mm = 0.375 in; 0.254 mm/y = 0.010 in/y = 10 mpy (1 mil = 0.001 in; exact).
	for _, c := range []struct{ rate, header, want string }{{"mpy", "rate_mpy", "10.00"}, {"in/y", "rate_in_per_y", "0.0100"}} {
		b, _ := CSV(res, Display{Thickness: survey.Inch, Rate: c.rate})
		rows, _ := csv.NewReader(bytes.NewReader(b)).ReadAll()
		if rows[0][8] != "thickness_in" || rows[1][8] != "0.3750" || rows[0][13] != c.header || rows[1][13] != c.want {
			t.Errorf("inch CSV: %v / %v", rows[0], rows[1])
		}
	}
	if d := (Display{}).resolve(survey.Inch); d.Rate != "mpy" {
		t.Errorf("inch surveys show mpy by default, not %s", d.Rate)
	}
}

func ptr(v float64) *float64 { return &v }

// The trend chart's projection ends at the computed retirement date, on the
// required thickness.
func TestTrendProjectionMatchesRetirement(t *testing.T) {
	f := demo(t)
	s, items := f.Survey, f.Items
	byCML := map[*survey.CML]*survey.Assessed{}
	for _, it := range items {
		byCML[it.CML] = it
	}
	checked := 0
	for _, a := range s.Assets {
		for _, c := range a.Components {
			ch := buildTrendChart(c, f.Item)
			for _, series := range ch.Series {
				var it *survey.Assessed
				for _, m := range c.CMLs {
					if m.ID == series.ID {
						it = byCML[m]
					}
				}
				r := it.Result
				if r.Retirement == nil || r.Class != wallloss.FiniteLife {
					if series.Proj != nil {
						t.Errorf("%s: projection without a retirement date", series.ID)
					}
					continue
				}
				if series.Proj == nil || !series.Proj[1].T.Equal(*r.Retirement) || series.Proj[1].MM != *c.Design.RequiredMM ||
					!series.Proj[0].T.Equal(*r.CurrentDate) || series.Proj[0].MM != *r.ThicknessMM {
					t.Errorf("%s: projection %v, want %s at %.3f mm from the current reading", series.ID, series.Proj, r.Retirement.Format(dateLayout), *c.Design.RequiredMM)
				}
				checked++
			}
		}
	}
	if checked < 10 {
		t.Errorf("only %d projections checked", checked)
	}
}

func TestComparison(t *testing.T) {
	f := demo(t)
	items := f.Items
	text, err := Comparison(f, Display{}, false)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"crossed-required", "accelerating", "no longer listed: CML G2-04", "design change: Transfer line P-220"} {
		if !strings.Contains(string(text), want) {
			t.Errorf("comparison lacks %q:\n%s", want, text)
		}
	}
	b, _ := Comparison(f, Display{}, true)
	rows, err := csv.NewReader(bytes.NewReader(b)).ReadAll()
	if err != nil || len(rows) != 1+len(items) || rows[1][1] != "A-03" {
		t.Errorf("CSV: %v, %d rows", err, len(rows))
	}
}

// locations.geojson read back by a general-purpose GeoJSON library: a
// FeatureCollection of points, longitude first (RFC 7946 §3.1.1).
func TestGeoJSON(t *testing.T) {
	f := demo(t)
	b, err := GeoJSON(f)
	if err != nil {
		t.Fatal(err)
	}
	fc, err := geojson.UnmarshalFeatureCollection(b)
	if err != nil {
		t.Fatal(err)
	}
	var cmls, photos int
	for _, f := range fc.Features {
		pt, ok := f.Geometry.(orb.Point)
		if !ok {
			t.Fatalf("%v is not a point", f.Geometry)
		}
		// The demo site is at about 45.60° N, 61.35° W: longitude first.
		if pt.Lon() > -61.3 || pt.Lon() < -61.4 || pt.Lat() < 45.5 || pt.Lat() > 45.7 {
			t.Errorf("point %v: coordinates not [longitude, latitude]", pt)
		}
		switch f.Properties["kind"] {
		case "cml":
			cmls++
		case "photo":
			photos++
		}
	}
	if cmls != 14 || photos != 10 {
		t.Errorf("%d CML and %d photo features, want 14 and 10", cmls, photos)
	}
}
