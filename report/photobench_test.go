package report

import (
	"bytes"
	"fmt"
	"image"
	"image/jpeg"
	"math/rand/v2"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"sync"
	"testing"
	"time"

	"github.com/lossline/lossline/survey"
)

// benchPhotos returns n generated 12-megapixel photos (4032×3024, 4:2:0,
// quality 90: a phone's output), made once into the temp folder and reused by
// later runs. They are not committed.
func benchPhotos(b *testing.B, n int) []*survey.Photo {
	b.Helper()
	dir := filepath.Join(os.TempDir(), "lossline-bench-12mp")
	os.MkdirAll(dir, 0o755)
	var photos []*survey.Photo
	for i := 0; i < n; i++ {
		path := filepath.Join(dir, fmt.Sprintf("p%03d.jpg", i))
		if _, err := os.Stat(path); err != nil {
			writeBenchPhoto(b, path, uint64(i))
		}
		photos = append(photos, &survey.Photo{Name: filepath.Base(path), Path: path, Orientation: 1, Hash: fmt.Sprint(i)})
	}
	return photos
}

// writeBenchPhoto draws smooth shading with fine noise, so the JPEG has the
// size and entropy of a real photo (about 3-5 MB).
func writeBenchPhoto(b *testing.B, path string, seed uint64) {
	const w, h = 4032, 3024
	rng := rand.New(rand.NewPCG(seed, 99))
	img := image.NewYCbCr(image.Rect(0, 0, w, h), image.YCbCrSubsampleRatio420)
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			img.Y[y*img.YStride+x] = uint8(60 + (x*120)/w + (y*40)/h + rng.IntN(24))
		}
	}
	for y := 0; y < h/2; y++ {
		for x := 0; x < w/2; x++ {
			img.Cb[y*img.CStride+x] = uint8(110 + rng.IntN(12) + x*20/w)
			img.Cr[y*img.CStride+x] = uint8(130 + rng.IntN(12) + y*20/h)
		}
	}
	var buf bytes.Buffer
	if err := jpeg.Encode(&buf, img, &jpeg.Options{Quality: 90}); err != nil {
		b.Fatal(err)
	}
	if err := os.WriteFile(path, buf.Bytes(), 0o644); err != nil {
		b.Fatal(err)
	}
}

// BenchmarkPhotoStage12MP: the cold photo stage (no cache) on 20 photos of
// 12 MP to 1600 px at quality 80, on all cores. Reports ms/photo.
func BenchmarkPhotoStage12MP(b *testing.B) {
	photos := benchPhotos(b, 20)
	ps := PhotoSettings{LongSide: 1600, Quality: 80}
	var size int
	for b.Loop() {
		size = 0
		for _, r := range preparePhotos(photos, ps) {
			if r.err != nil {
				b.Fatal(r.err)
			}
			size += len(r.prep.JPEG)
		}
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
	ps := PhotoSettings{LongSide: 1600, Quality: 80}
	out := b.TempDir()
	procs := runtime.GOMAXPROCS(0)
	var ours, vips time.Duration
	for b.Loop() {
		start := time.Now()
		for _, r := range preparePhotos(photos, ps) {
			if r.err != nil {
				b.Fatal(r.err)
			}
		}
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
