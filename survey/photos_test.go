package survey

import (
	"image"
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
	photos, problems := ScanPhotos(filepath.Join("..", "testdata", "demo"))
	if len(problems) != 0 {
		t.Errorf("problems: %v", problems)
	}
	if len(photos) != 8 {
		t.Fatalf("%d photos, want 8", len(photos))
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

// Unreadable files are warnings about that file, never a crash.
func TestScanPhotosRobust(t *testing.T) {
	dir := t.TempDir()
	ph := filepath.Join(dir, PhotoDir)
	os.MkdirAll(filepath.Join(ph, "sub"), 0o755)
	good, err := jpegexif.Encode(image.NewGray(image.Rect(0, 0, 8, 8)), 80, jpegexif.Header{Taken: time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC), Lat: -33.5, Lon: 151.25, HasGPS: true, Orientation: 3})
	if err != nil {
		t.Fatal(err)
	}
	os.WriteFile(filepath.Join(ph, "sub", "good.JPG"), good, 0o644)
	os.WriteFile(filepath.Join(ph, "truncated.jpg"), good[:40], 0o644)
	os.WriteFile(filepath.Join(ph, "garbage.jpg"), []byte("not a jpeg at all"), 0o644)
	os.WriteFile(filepath.Join(ph, "plan.png"), []byte("\x89PNG"), 0o644)
	os.WriteFile(filepath.Join(ph, ".DS_Store"), []byte{0, 1}, 0o644)

	photos, problems := ScanPhotos(dir)
	if len(photos) != 3 {
		t.Fatalf("%d photos, want 3 (good, truncated, garbage)", len(photos))
	}
	byName := map[string]*Photo{}
	for _, p := range photos {
		byName[p.Name] = p
	}
	g := byName["sub/good.JPG"]
	if g == nil || g.GPS == nil || g.GPS.Lat != -33.5 || g.GPS.Lon != 151.25 || g.Orientation != 3 || g.Problem != "" {
		t.Errorf("good photo read as %+v", g)
	}
	for _, name := range []string{"truncated.jpg", "garbage.jpg"} {
		if byName[name].Problem == "" {
			t.Errorf("%s: no problem recorded", name)
		}
	}
	text := ""
	for _, p := range problems {
		text += p.String() + "\n"
	}
	for _, want := range []string{"plan.png: warning: not a JPEG", ".DS_Store: warning: not a JPEG", "garbage.jpg: warning: photo header cannot be read"} {
		if !strings.Contains(text, want) {
			t.Errorf("warnings lack %q:\n%s", want, text)
		}
	}
}
