package report

import (
	"bytes"
	"fmt"
	"image"
	"image/jpeg"
	"io"
	"math/rand/v2"
	"os"
	"runtime"
	"runtime/debug"
	"sync/atomic"
	"testing"
	"time"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/photo"
	"github.com/lossline/lossline/survey"
)

// withPhotos is the demo with n more photos, placed on nothing (so they
// print in Appendix A), each prepared as its own JPEG of 800 × 600 pixels:
// one noise image told apart by a comment segment of 60 KB naming the photo,
// so no two are equal and fpdf cannot embed one for several.
func withPhotos(t *testing.T, n int) (*findings.Findings, Options) {
	t.Helper()
	f := demo(t)
	var base bytes.Buffer
	img := image.NewGray(image.Rect(0, 0, 800, 600))
	rng := rand.New(rand.NewPCG(1, 2))
	for i := range img.Pix {
		img.Pix[i] = byte(rng.IntN(256))
	}
	if err := jpeg.Encode(&base, img, &jpeg.Options{Quality: 80}); err != nil {
		t.Fatal(err)
	}
	s := *f.Survey
	s.Photos = append([]*survey.Photo(nil), s.Photos...)
	first := len(s.Photos)
	for i := range n {
		s.Photos = append(s.Photos, &survey.Photo{Name: fmt.Sprintf("extra-%04d.jpg", i), Path: fmt.Sprintf("extra-%04d.jpg", i), Orientation: 1})
	}
	f2 := *f
	f2.Survey = &s
	opts := testOptions()
	real := opts.PreparePhotos
	opts.PreparePhotos = func(srcs []photo.Source, use func(int, photo.Prepared, error)) {
		real(srcs[:first], use)
		for i := first; i < len(srcs); i++ {
			b := base.Bytes()
			com := bytes.Repeat([]byte{byte(i)}, 60_000)
			copy(com, fmt.Sprintf("photo %d", i))
			jpg := append(append(append([]byte{}, b[:2]...), 0xFF, 0xFE, byte((len(com)+2)>>8), byte(len(com)+2)), com...)
			use(i, photo.Prepared{JPEG: append(jpg, b[2:]...), Width: 800, Height: 600}, nil)
		}
	}
	return &f2, opts
}

// peakHeap renders report.pdf to w and returns the largest live heap seen
// (sampled every millisecond after a collection), bytes.
func peakHeap(t *testing.T, f *findings.Findings, opts Options, w io.Writer) uint64 {
	t.Helper()
	runtime.GC()
	var peak atomic.Uint64
	stop := make(chan struct{})
	done := make(chan struct{})
	go func() {
		defer close(done)
		var m runtime.MemStats
		for {
			select {
			case <-stop:
				return
			case <-time.After(time.Millisecond):
				runtime.ReadMemStats(&m)
				if m.HeapAlloc > peak.Load() {
					peak.Store(m.HeapAlloc)
				}
			}
		}
	}()
	if _, err := WritePDF(w, f, opts); err != nil {
		t.Fatal(err)
	}
	close(stop)
	<-done
	return peak.Load()
}

// The report's memory does not grow with the number of photos: 400 more
// distinct photos (24 MB of JPEG) raise the peak heap by far less than
// their size, while the PDF holds every one of them.
func TestPhotoMemoryFlat(t *testing.T) {
	if testing.Short() {
		t.Skip("renders 500 photos")
	}
	defer debug.SetGCPercent(debug.SetGCPercent(10))
	f100, o100 := withPhotos(t, 100)
	f500, o500 := withPhotos(t, 500)
	var out100, out500 countingWriter
	out100.w, out500.w = io.Discard, io.Discard
	p100 := peakHeap(t, f100, o100, &out100)
	p500 := peakHeap(t, f500, o500, &out500)
	if grown := out500.n - out100.n; grown < 400*60_000 {
		t.Fatalf("the PDF grew by %d bytes for 400 photos of 60 KB", grown)
	}
	if p500 > p100+8<<20 {
		t.Errorf("peak heap %d MB with 100 photos, %d MB with 500", p100>>20, p500>>20)
	}
	t.Logf("peak heap %d MB with 100 photos, %d MB with 500; PDF %d and %d MB", p100>>20, p500>>20, out100.n>>20, out500.n>>20)
}

// The photos written from the spool read back: poppler finds every one at
// its own size.
func TestSpooledPhotosReadBack(t *testing.T) {
	needPoppler(t)
	f, opts := withPhotos(t, 3)
	tmp := t.TempDir()
	t.Setenv("TMPDIR", tmp)
	pdf, _, err := PDF(f, opts)
	if err != nil {
		t.Fatal(err)
	}
	checkXref(t, pdf)
	if left, _ := os.ReadDir(tmp); len(left) > 0 {
		t.Errorf("the spool file is left: %v", left)
	}
	text, _ := pdfText(t, pdf)
	for i := range 3 {
		if !bytes.Contains([]byte(text), fmt.Appendf(nil, "extra-%04d.jpg", i)) {
			t.Errorf("caption of extra-%04d.jpg missing", i)
		}
	}
	f0, opts0 := withPhotos(t, 0)
	pdf0, _, err := PDF(f0, opts0)
	if err != nil {
		t.Fatal(err)
	}
	if n := bytes.Count(pdf, []byte("/Subtype /Image")) - bytes.Count(pdf0, []byte("/Subtype /Image")); n != 3 {
		t.Errorf("%d more images in the PDF, want 3", n)
	}
	for i := range 3 {
		if !bytes.Contains(pdf, fmt.Appendf(nil, "photo %d", len(f.Survey.Photos)-3+i)) {
			t.Errorf("the JPEG of extra photo %d is not in the PDF", i)
		}
	}
	if bytes.Contains(pdf, []byte(standInMark)) {
		t.Error("a stand-in is left in the PDF")
	}
}
