// Command surveygen writes a large survey folder for scale benchmarks: units
// (assets) of circuits (components) of CMLs with readings at three visits,
// deterministic for a given size (internal/scalesurvey). With -history it
// writes three folders of one visit each, the newest naming the two earlier
// ones (OUT-2016, OUT-2021) under previous:. The data is invented.
//
//	go run ./tools/surveygen -cmls 100000 -o /tmp/scale100k [-history] [-gps]
package main

import (
	"flag"
	"fmt"
	"os"

	"github.com/lossline/lossline/internal/scalesurvey"
)

func main() {
	cmls := flag.Int("cmls", 10000, "number of CMLs")
	units := flag.Int("units", 50, "number of units (assets)")
	circuits := flag.Int("circuits", 20, "circuits (components) per unit")
	out := flag.String("o", "", "survey folder to write (must not exist)")
	history := flag.Bool("history", false, "write the visits as three folders (OUT-2016, OUT-2021, OUT) that OUT names under previous:")
	gps := flag.Bool("gps", false, "give every CML a gps position")
	flag.Parse()
	if *out == "" || *cmls < 1 || *units < 1 || *circuits < 1 {
		fmt.Fprintln(os.Stderr, "usage: surveygen -cmls N -o DIR [-units U -circuits C -history -gps]")
		os.Exit(2)
	}
	size := scalesurvey.Size{CMLs: *cmls, Units: *units, Circuits: *circuits, GPS: *gps}
	write := scalesurvey.Write
	if *history {
		write = scalesurvey.WriteSeries
	}
	if err := write(*out, size); err != nil {
		fmt.Fprintln(os.Stderr, "surveygen:", err)
		os.Exit(1)
	}
}
