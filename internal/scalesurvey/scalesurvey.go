// Package scalesurvey writes large survey folders for scale benchmarks:
// units (assets) of circuits (components) of CMLs with readings at three
// visits, the same bytes for the same size. The data is invented.
package scalesurvey

import (
	"bufio"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
)

// Size is the shape of a generated survey.
type Size struct {
	CMLs     int
	Units    int  // assets; 50 when 0
	Circuits int  // components per unit; 20 when 0
	GPS      bool // a gps column: CMLs scattered over about a kilometre
}

// visit is a reading column: its date and its index in the series.
type visit struct {
	date  string
	index int
}

// dates are the three visits, oldest first.
var dates = []visit{{"2016-05-10", 0}, {"2021-05-12", 1}, {"2026-05-14", 2}}

// Write writes the survey folder dir (which must not exist) with all three
// visits in its reading tables.
func Write(dir string, size Size) error {
	return size.write(dir, dates, nil)
}

// WriteSeries writes three survey folders of one visit each: dir-2016 and
// dir-2021, and dir, which names the other two under previous:.
func WriteSeries(dir string, size Size) error {
	for _, v := range dates[:2] {
		if err := size.write(EarlierFolder(dir, v.date[:4]), []visit{v}, nil); err != nil {
			return err
		}
	}
	base := filepath.Base(dir)
	prev := []string{"../" + base + "-2016", "../" + base + "-2021"}
	return size.write(dir, dates[2:], prev)
}

// EarlierFolder is the folder WriteSeries writes a year's visit to.
func EarlierFolder(dir, year string) string { return dir + "-" + year }

func (g Size) write(dir string, visits []visit, previous []string) error {
	if g.Units == 0 {
		g.Units = 50
	}
	if g.Circuits == 0 {
		g.Circuits = 20
	}
	if g.CMLs < 1 || g.Units < 1 || g.Circuits < 1 {
		return fmt.Errorf("a survey needs at least one CML, unit and circuit")
	}
	if _, err := os.Stat(dir); err == nil {
		return fmt.Errorf("%s exists", dir)
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	f, err := os.Create(filepath.Join(dir, "survey.md"))
	if err != nil {
		return err
	}
	w := bufio.NewWriterSize(f, 1<<20)
	g.checklist(w, visits, previous)
	if err := w.Flush(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// checklist writes survey.md.
func (g Size) checklist(w *bufio.Writer, visits []visit, previous []string) {
	date := visits[len(visits)-1].date
	fmt.Fprintf(w, "---\ntitle: Generated scale survey %s\nsite: Generated refinery\ndate: %s\ninspector: Generator\nunits: mm\n", date[:4], date)
	if len(previous) > 0 {
		fmt.Fprintf(w, "previous:\n")
		for _, p := range previous {
			fmt.Fprintf(w, "  - %s\n", p)
		}
	}
	fmt.Fprintf(w, "---\n\nInvented data for scale benchmarks.\n")
	comps := g.Units * g.Circuits
	n := 0
	for c := 0; c < comps; c++ {
		u, k := c/g.Circuits, c%g.Circuits
		per := g.CMLs / comps
		if c < g.CMLs%comps {
			per++
		}
		if per == 0 {
			continue
		}
		if k == 0 {
			fmt.Fprintf(w, "\n# Unit %03d\n", u+1)
		}
		// Each circuit has its own corrosion rate; CMLs scatter about it.
		rng := rand.New(rand.NewPCG(uint64(c), 7))
		nominal := []float64{6.02, 7.11, 8.18, 9.27, 10.97, 12.7}[rng.IntN(6)]
		required := nominal * (0.45 + 0.2*rng.Float64())
		rate := 0.02 + 0.12*rng.Float64()
		fmt.Fprintf(w, "\n## Circuit %03d-%02d\n\n- nominal: %.2f\n- required: %.2f\n- installed: 2001-06\n- consequence: %s\n\n",
			u+1, k+1, nominal, required, []string{"low", "medium", "high"}[rng.IntN(3)])
		fmt.Fprintf(w, "| CML | location |")
		if g.GPS {
			fmt.Fprintf(w, " gps |")
		}
		for _, v := range visits {
			fmt.Fprintf(w, " %s |", v.date)
		}
		fmt.Fprintf(w, "\n|---|---|")
		if g.GPS {
			fmt.Fprintf(w, "---|")
		}
		for range visits {
			fmt.Fprintf(w, "---|")
		}
		fmt.Fprintln(w)
		for i := 0; i < per; i++ {
			n++
			r := rand.New(rand.NewPCG(uint64(n), 11))
			start := nominal - 0.1*r.Float64()
			own := rate * (0.5 + r.Float64())
			fmt.Fprintf(w, "| C%06d | point %d |", n, i+1)
			if g.GPS {
				p := rand.New(rand.NewPCG(uint64(n), 13))
				fmt.Fprintf(w, " %.6f, %.6f |", 45.6+0.01*p.Float64(), -61.35+0.014*p.Float64())
			}
			for _, v := range visits {
				years := []float64{15, 20, 25}[v.index]
				fmt.Fprintf(w, " %.2f |", max(start-own*years+0.05*r.NormFloat64(), 0.5))
			}
			fmt.Fprintln(w)
		}
	}
}
