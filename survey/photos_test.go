package survey

import (
	"bytes"
	"image"
	"image/jpeg"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/internal/jpegexif"
)

// The demo photos carry the EXIF the generator (tools/demophotos) wrote;
// goexif, an independent reader, must read the same values back.
func TestScanDemoPhotos(t *testing.T) {
	photos, skipped, problems := ScanPhotos(filepath.Join("..", "testdata", "demo"), DefaultMaxMegapixels)
	if len(skipped) != 1 || skipped[0].Name != "IMG_2231.HEIC" {
		t.Errorf("skipped: %v, want the HEIC file", skipped)
	}
	if len(problems) != 1 {
		t.Errorf("problems: %v", problems)
	}
	if len(photos) != 10 {
		t.Fatalf("%d photos, want 10", len(photos))
	}
	var nozzle *Photo
	for _, p := range photos {
		if p.Name == "tank-t101/t101-c1-nozzle.jpg" {
			nozzle = p
		}
	}
	if nozzle == nil {
		t.Fatal("nozzle photo not found by its slash-separated name")
	}
	if nozzle.Orientation != 6 {
		t.Errorf("orientation %d, want 6", nozzle.Orientation)
	}
	if nozzle.Taken == nil || nozzle.Taken.Format("2006-01-02 15:04:05") != "2026-11-18 09:05:44" {
		t.Errorf("taken %v", nozzle.Taken)
	}
	// Seconds are stored to 1/10000: 1e-6 degrees is about 0.1 m.
	if nozzle.GPS == nil || math.Abs(nozzle.GPS.Lat-45.602140) > 1e-6 || math.Abs(nozzle.GPS.Lon+61.350805) > 1e-6 {
		t.Errorf("gps %v", nozzle.GPS)
	}
}

// Unreadable, foreign, oversized and duplicate files are skipped with the
// reason, never a crash.
func TestScanPhotosRobust(t *testing.T) {
	dir := t.TempDir()
	ph := filepath.Join(dir, PhotoDir)
	os.MkdirAll(filepath.Join(ph, "sub"), 0o755)
	good, err := jpegexif.Encode(image.NewGray(image.Rect(0, 0, 8, 8)), 80, jpegexif.Header{Taken: time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC), Lat: -33.5, Lon: 151.25, HasGPS: true, Orientation: 3})
	if err != nil {
		t.Fatal(err)
	}
	write := func(name string, data []byte) { os.WriteFile(filepath.Join(ph, name), data, 0o644) }
	write("sub/good.JPG", good)
	write("zz-copy.jpg", good)
	write("truncated.jpg", good[:40])
	write("garbage.jpg", []byte("not a jpeg at all"))
	write("plan.png", []byte("\x89PNG"))
	write("IMG_0001.HEIC", []byte("ftypheic"))
	write("clip.mp4", []byte{0, 0, 0, 24})
	write(".DS_Store", []byte{0, 1})
	write("huge.jpg", hugeHeader(t, 20000, 15000))

	photos, skipped, _ := ScanPhotos(dir, 200)
	if len(photos) != 1 || photos[0].Name != "sub/good.JPG" {
		t.Fatalf("photos %v, want only sub/good.JPG", photos)
	}
	g := photos[0]
	if g.GPS == nil || g.GPS.Lat != -33.5 || g.GPS.Lon != 151.25 || g.Orientation != 3 || g.Width != 8 || len(g.Hash) != 64 {
		t.Errorf("good photo read as %+v", g)
	}
	reasons := map[string]string{}
	for _, s := range skipped {
		reasons[s.Name] = s.Reason
	}
	for name, want := range map[string]string{
		"zz-copy.jpg":   "same content as sub/good.JPG",
		"truncated.jpg": "not a readable JPEG",
		"garbage.jpg":   "not a readable JPEG",
		"plan.png":      "not a JPEG (png)",
		"IMG_0001.HEIC": "HEIC photo",
		"clip.mp4":      "video",
		".DS_Store":     "system file",
		"huge.jpg":      "20000×15000 pixels (300 MP) is over the 200 MP limit",
	} {
		if !strings.Contains(reasons[name], want) {
			t.Errorf("%s: reason %q, want %q", name, reasons[name], want)
		}
	}
}

// hugeHeader is a valid small JPEG whose frame header declares w × h pixels.
func hugeHeader(t *testing.T, w, h int) []byte {
	var b bytes.Buffer
	jpeg.Encode(&b, image.NewGray(image.Rect(0, 0, 8, 8)), nil)
	data := b.Bytes()
	for i := 0; i+8 < len(data); i++ {
		if data[i] == 0xFF && data[i+1] == 0xC0 { // SOF0: length, precision, height, width
			data[i+5], data[i+6] = byte(h>>8), byte(h)
			data[i+7], data[i+8] = byte(w>>8), byte(w)
			return data
		}
	}
	t.Fatal("no SOF0 marker")
	return nil
}
