package photo

import (
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"sync"
	"testing"
	"time"

	"github.com/lossline/lossline/internal/benchphotos"
)

// benchPhotos returns n generated 12-megapixel photos, made once into the
// temp folder and reused by later runs (not committed).
func benchPhotos(b *testing.B, n int) []Source {
	b.Helper()
	paths, err := benchphotos.Base(filepath.Join(os.TempDir(), "lossline-bench-12mp"), n)
	if err != nil {
		b.Fatal(err)
	}
	var photos []Source
	for _, p := range paths {
		h, err := Scan(p, 200)
		if err != nil {
			b.Fatal(err)
		}
		photos = append(photos, Source{Path: p, Orientation: 1, Hash: h.Hash})
	}
	return photos
}

// BenchmarkPhotoStage12MP: the cold photo stage (no cache) on 20 photos of
// 12 MP to 1600 px at quality 80, on all cores. Reports ms/photo.
func BenchmarkPhotoStage12MP(b *testing.B) {
	photos := benchPhotos(b, 20)
	ps := Settings{LongSide: 1600, Quality: 80}
	var size int
	for b.Loop() {
		size = 0
		Stage(photos, ps, func(_ int, p Prepared, err error) {
			if err != nil {
				b.Fatal(err)
			}
			size += len(p.JPEG)
		})
	}
	b.ReportMetric(float64(b.Elapsed().Milliseconds())/float64(b.N)/float64(len(photos)), "ms/photo")
	b.ReportMetric(float64(size)/float64(len(photos))/1024, "KB/photo")
}

// BenchmarkPhotoStageVsVips12MP runs the cold photo stage and libvips'
// vipsthumbnail (one process per core, same files, size and quality) in turn
// in each iteration, and reports both and their ratio: the target is a ratio
// of at most 1.5. Skipped when vipsthumbnail is not installed (Debian
// libvips-tools).
func BenchmarkPhotoStageVsVips12MP(b *testing.B) {
	if _, err := exec.LookPath("vipsthumbnail"); err != nil {
		b.Skip("vipsthumbnail not installed (Debian libvips-tools)")
	}
	photos := benchPhotos(b, 20)
	ps := Settings{LongSide: 1600, Quality: 80}
	out := b.TempDir()
	procs := runtime.GOMAXPROCS(0)
	var ours, vips time.Duration
	for b.Loop() {
		start := time.Now()
		Stage(photos, ps, func(_ int, _ Prepared, err error) {
			if err != nil {
				b.Fatal(err)
			}
		})
		ours += time.Since(start)
		start = time.Now()
		var wg sync.WaitGroup
		for p := 0; p < procs; p++ {
			args := []string{"-s", "1600", "-o", filepath.Join(out, "%s.jpg[Q=80]")}
			for i := p; i < len(photos); i += procs {
				args = append(args, photos[i].Path)
			}
			wg.Add(1)
			go func() {
				defer wg.Done()
				if out, err := exec.Command("vipsthumbnail", args...).CombinedOutput(); err != nil {
					b.Errorf("vipsthumbnail: %v %s", err, out)
				}
			}()
		}
		wg.Wait()
		vips += time.Since(start)
	}
	n := float64(b.N * len(photos))
	b.ReportMetric(float64(ours.Milliseconds())/n, "lossline-ms/photo")
	b.ReportMetric(float64(vips.Milliseconds())/n, "vips-ms/photo")
	b.ReportMetric(float64(ours)/float64(vips), "ratio")
}
