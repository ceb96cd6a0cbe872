// Command surveygen writes a large survey folder for scale benchmarks: units
// (assets) of circuits (components) of CMLs with readings at three visits,
// deterministic for a given size. With -history it also writes two earlier
// survey folders that the newest names under previous:. The data is invented.
//
//	go run ./tools/surveygen -cmls 100000 -o /tmp/scale100k [-history]
package main

import (
	"bufio"
	"flag"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
)

func main() {
	cmls := flag.Int("cmls", 10000, "number of CMLs")
	units := flag.Int("units", 50, "number of units (assets)")
	circuits := flag.Int("circuits", 20, "circuits (components) per unit")
	out := flag.String("o", "", "survey folder to write (must not exist)")
	history := flag.Bool("history", false, "also write two earlier survey folders (OUT-2016, OUT-2021) that OUT names under previous:")
	flag.Parse()
	if *out == "" || *cmls < 1 || *units < 1 || *circuits < 1 {
		fmt.Fprintln(os.Stderr, "usage: surveygen -cmls N -o DIR [-units U -circuits C -history]")
		os.Exit(2)
	}
	g := generator{cmls: *cmls, units: *units, circuits: *circuits}
	if *history {
		base := filepath.Base(*out)
		for _, v := range []visit{{"2016-05-10", 0}, {"2021-05-12", 1}} {
			if err := g.write(*out+"-"+v.date[:4], []visit{v}, nil); err != nil {
				fail(err)
			}
		}
		prev := []string{"../" + base + "-2016", "../" + base + "-2021"}
		if err := g.write(*out, []visit{{"2026-05-14", 2}}, prev); err != nil {
			fail(err)
		}
		return
	}
	if err := g.write(*out, []visit{{"2016-05-10", 0}, {"2021-05-12", 1}, {"2026-05-14", 2}}, nil); err != nil {
		fail(err)
	}
}

func fail(err error) {
	fmt.Fprintln(os.Stderr, "surveygen:", err)
	os.Exit(1)
}

// visit is a reading column: its date and its index in the series.
type visit struct {
	date  string
	index int
}

type generator struct{ cmls, units, circuits int }

// write writes one survey folder with the given reading columns.
func (g generator) write(dir string, visits []visit, previous []string) error {
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
	date := visits[len(visits)-1].date
	fmt.Fprintf(w, "---\ntitle: Generated scale survey %s\nsite: Generated refinery\ndate: %s\ninspector: Generator\nunits: mm\n", date[:4], date)
	if len(previous) > 0 {
		fmt.Fprintf(w, "previous:\n")
		for _, p := range previous {
			fmt.Fprintf(w, "  - %s\n", p)
		}
	}
	fmt.Fprintf(w, "---\n\nInvented data for scale benchmarks.\n")
	comps := g.units * g.circuits
	n := 0
	for c := 0; c < comps; c++ {
		u, k := c/g.circuits, c%g.circuits
		per := g.cmls / comps
		if c < g.cmls%comps {
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
		for _, v := range visits {
			fmt.Fprintf(w, " %s |", v.date)
		}
		fmt.Fprintf(w, "\n|---|---|")
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
			for _, v := range visits {
				years := []float64{15, 20, 25}[v.index]
				fmt.Fprintf(w, " %.2f |", max(start-own*years+0.05*r.NormFloat64(), 0.5))
			}
			fmt.Fprintln(w)
		}
	}
	if err := w.Flush(); err != nil {
		return err
	}
	return f.Close()
}
