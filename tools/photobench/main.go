// Command photobench makes a survey folder with many 12-megapixel photos for
// measuring the report's photo stage at survey scale (time, peak memory,
// cache). The photos share 20 generated images but each has its own EXIF
// header (time, position), so every file has its own content hash and is
// decoded in full. Nothing it makes is committed.
//
//	go run ./tools/photobench -n 300 -o /tmp/bench300
//	/usr/bin/time -v go run ./cmd/lossline report /tmp/bench300 -o /tmp/out300 --no-photo-cache
package main

import (
	"flag"
	"fmt"
	"log"
	"os"
	"path/filepath"
	"strings"
	"time"

	"github.com/lossline/lossline/internal/benchphotos"
	"github.com/lossline/lossline/internal/jpegexif"
)

func main() {
	n := flag.Int("n", 300, "number of photos")
	out := flag.String("o", "", "survey folder to create")
	flag.Parse()
	if *out == "" {
		log.Fatal("give -o FOLDER")
	}
	base, err := benchphotos.Base(filepath.Join(os.TempDir(), "lossline-bench-12mp"), 20)
	if err != nil {
		log.Fatal(err)
	}
	photos := filepath.Join(*out, "photos")
	if err := os.MkdirAll(photos, 0o755); err != nil {
		log.Fatal(err)
	}
	const lat0, lon0 = 45.6020, -61.3500
	var rows strings.Builder
	for c := 0; c < 10; c++ {
		fmt.Fprintf(&rows, "| C-%02d | %.6f, %.6f | 9.%d |\n", c, lat0+float64(c)*0.0002, lon0, 5+c%4)
	}
	start := time.Date(2026, 5, 20, 8, 0, 0, 0, time.UTC)
	for i := 0; i < *n; i++ {
		src, err := os.ReadFile(base[i%len(base)])
		if err != nil {
			log.Fatal(err)
		}
		h := jpegexif.Header{Taken: start.Add(time.Duration(i) * 90 * time.Second), Lat: lat0 + float64(i%10)*0.0002 + 0.00003,
			Lon: lon0 + 0.00002*float64(i%7), HasGPS: true, Orientation: []int{1, 6, 1, 3, 8}[i%5]}
		data, err := jpegexif.WithHeader(src, h)
		if err != nil {
			log.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(photos, fmt.Sprintf("IMG_%04d.jpg", i)), data, 0o644); err != nil {
			log.Fatal(err)
		}
	}
	md := fmt.Sprintf("---\ntitle: Photo benchmark, %d photos\nsite: generated\ndate: 2026-05-20\ninspector: benchmark\nunits: mm\n---\n\n"+
		"# Tank\n\n## Course 1\n\n- nominal: 10\n- required: 6\n- installed: 2006-05\n\n| CML | gps | 2026-05-20 |\n|---|---|---|\n%s", *n, rows.String())
	if err := os.WriteFile(filepath.Join(*out, "survey.md"), []byte(md), 0o644); err != nil {
		log.Fatal(err)
	}
	fmt.Printf("wrote %s with %d photos\n", *out, *n)
}
