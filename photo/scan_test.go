package photo

import (
	"bytes"
	"image"
	"image/jpeg"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/internal/jpegexif"
)

// A header written by internal/jpegexif is read back by goexif, an
// independent reader; the frame size comes from the JPEG header.
func TestScanBytes(t *testing.T) {
	taken := time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC)
	data, err := jpegexif.Encode(image.NewGray(image.Rect(0, 0, 40, 30)), 80, jpegexif.Header{Taken: taken, Lat: -33.5, Lon: 151.25, HasGPS: true, Orientation: 8})
	if err != nil {
		t.Fatal(err)
	}
	h, err := ScanBytes(data, 200)
	if err != nil {
		t.Fatal(err)
	}
	if h.Width != 40 || h.Height != 30 || h.Orientation != 8 || !h.HasGPS || h.Lat != -33.5 || h.Lon != 151.25 ||
		h.Taken == nil || !h.Taken.Equal(taken) || len(h.Hash) != 64 || h.EXIFErr != nil {
		t.Errorf("read as %+v", h)
	}

	var plain bytes.Buffer
	jpeg.Encode(&plain, image.NewGray(image.Rect(0, 0, 8, 8)), nil)
	h, err = ScanBytes(plain.Bytes(), 200)
	if err != nil || h.EXIFErr == nil || h.Orientation != 1 || h.Taken != nil || h.HasGPS {
		t.Errorf("JPEG without EXIF: %+v, %v; want orientation 1, no time or position, an EXIF problem", h, err)
	}
	if _, err := ScanBytes([]byte("not a jpeg"), 200); err == nil || !strings.Contains(err.Error(), "not a readable JPEG") {
		t.Errorf("not a JPEG: %v", err)
	}
}

// The megapixel limit is judged on the frame header before any decoding:
// 20000 × 15000 is 300 MP.
func TestScanMegapixelLimit(t *testing.T) {
	data := frameSize(t, 20000, 15000)
	if _, err := ScanBytes(data, 200); err == nil || err.Error() != "20000×15000 pixels (300 MP) is over the 200 MP limit" {
		t.Errorf("over the limit: %v", err)
	}
	if h, err := ScanBytes(data, 300); err != nil || h.Width != 20000 || h.Height != 15000 {
		t.Errorf("at the limit: %+v, %v", h, err)
	}
}

// frameSize is a valid small JPEG whose frame header declares w × h pixels.
func frameSize(t *testing.T, w, h int) []byte {
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

func TestNotPhoto(t *testing.T) {
	for name, want := range map[string]string{
		"IMG_0001.jpg": "", "sub/a.JPEG": "", "b.jpe": "",
		"IMG_0002.HEIC": "HEIC photo: export it as JPEG", "plan.png": "not a JPEG (png)", "scan.TIFF": "not a JPEG (tiff)",
		"clip.MOV": "video", ".DS_Store": "system file", "sub/._IMG_0001.jpg": "system file", "Thumbs.db": "system file",
		"notes.txt": "not a JPEG", "README": "not a JPEG",
	} {
		if got := NotPhoto(name); got != want {
			t.Errorf("%s: %q, want %q", name, got, want)
		}
	}
}
