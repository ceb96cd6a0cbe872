package photo

import (
	"bufio"
	"bytes"
	"image"
	"os"
	"path/filepath"
	"runtime"
	"testing"
	"time"

	"github.com/rwcarlsen/goexif/exif"

	"github.com/lossline/lossline/internal/jpegexif"
	"github.com/lossline/lossline/internal/jpegscans"
)

// demoPhotos are the demo survey's photos, the seeds of real cameras' layouts.
func demoPhotos(f *testing.F) [][]byte {
	paths, _ := filepath.Glob(filepath.Join("..", "testdata", "demo", "photos", "*", "*.jpg"))
	var out [][]byte
	for _, p := range paths {
		if b, err := os.ReadFile(p); err == nil {
			out = append(out, b)
		}
	}
	if len(out) == 0 {
		f.Fatal("no demo photos")
	}
	return out
}

// FuzzScan: any bytes give a header or a reason the file is not used, never a
// panic (EXIF parsing included). Seeded with the demo photos' headers and
// every hostile layout of the tests: EXIF loops and huge counts, 6,000 scans,
// scans a sequential file may not have, a frame too costly to decode.
// (Named pipes, links and oversized files are judged before any byte is
// read: open_test.go.)
func FuzzScan(f *testing.F) {
	for _, b := range demoPhotos(f) {
		f.Add(b[:min(len(b), 4096)]) // the headers, where EXIF lives
	}
	f.Add([]byte{0xFF, 0xD8, 0xFF, 0xE1, 0x00, 0x08, 'E', 'x', 'i', 'f', 0, 0})
	for _, c := range damagedEXIFCases() {
		f.Add(withEXIF(c.tiff))
	}
	f.Add(jpegscans.Progressive(4608, 3456, jpegscans.Grey, 6000))
	f.Add(jpegscans.Progressive(64, 48, jpegscans.YCbCr420, 12))
	f.Add(jpegscans.Sequential(64, 48, jpegscans.Grey, 2))
	f.Add(jpegscans.Sequential(64, 48, jpegscans.CMYK, 4))
	f.Add(jpegscans.Progressive(14000, 10000, jpegscans.YCbCr444, 1)[:2000])
	f.Fuzz(func(t *testing.T, data []byte) {
		h, err := ScanBytes(data, 200)
		if err != nil {
			if err.Error() == "" || h != (Header{}) {
				t.Fatalf("rejected with reason %q and header %+v", err, h)
			}
			return
		}
		if len(h.Hash) != 64 || h.Width <= 0 || h.Height <= 0 {
			t.Fatalf("accepted with header %+v", h)
		}
		if h.Orientation < 1 || h.Orientation > 8 {
			t.Fatalf("orientation %d", h.Orientation)
		}
	})
}

// maxEXIFBlock is the largest EXIF block one APP1 segment holds: 65535 bytes
// less the length field and "Exif\0\0".
const maxEXIFBlock = 65535 - 2 - 6

// FuzzEXIFGuard: for any TIFF bytes, checkEXIF returns, and a block it lets
// through is read by goexif, with the accessors lossline calls, without a
// panic (no recover here), within 16 MiB and within a second. Seeded with
// the demo photos' EXIF blocks, a generated one and every damaged layout of
// the tests.
func FuzzEXIFGuard(f *testing.F) {
	for _, b := range demoPhotos(f) {
		if l, err := readLayout(bufio.NewReader(bytes.NewReader(b))); err == nil && l.exif != nil {
			f.Add(l.exif)
		}
	}
	gen, err := jpegexif.Encode(image.NewGray(image.Rect(0, 0, 8, 8)), 80, jpegexif.Header{
		Taken: time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC), Lat: -33.5, Lon: 151.25, HasGPS: true, Orientation: 3})
	if err != nil {
		f.Fatal(err)
	}
	if l, err := readLayout(bufio.NewReader(bytes.NewReader(gen))); err == nil {
		f.Add(l.exif)
	}
	for _, c := range damagedEXIFCases() {
		f.Add(c.tiff)
	}
	f.Fuzz(func(t *testing.T, tiff []byte) {
		if len(tiff) > maxEXIFBlock || checkEXIF(tiff) != nil {
			return
		}
		var before, after runtime.MemStats
		runtime.ReadMemStats(&before)
		start := time.Now()
		x, err := exif.Decode(bytes.NewReader(tiff))
		if err == nil || !exif.IsCriticalError(err) {
			if x == nil {
				t.Fatalf("no EXIF and error %v", err)
			}
			if tag, err := x.Get(exif.DateTimeOriginal); err == nil {
				tag.StringVal()
			}
			x.LatLong()
			if tag, err := x.Get(exif.Orientation); err == nil {
				tag.Int(0)
			}
		}
		took := time.Since(start)
		runtime.ReadMemStats(&after)
		if alloc := after.TotalAlloc - before.TotalAlloc; alloc > 16<<20 {
			t.Fatalf("goexif allocated %d bytes for a %d-byte block that passed the guard", alloc, len(tiff))
		}
		if took > time.Second {
			t.Fatalf("goexif took %v for a %d-byte block that passed the guard", took, len(tiff))
		}
	})
}
