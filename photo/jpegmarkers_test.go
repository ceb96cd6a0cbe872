package photo

import (
	"bufio"
	"bytes"
	"image/jpeg"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/internal/jpegscans"
)

// layoutOf reads the layout of a JPEG in memory.
func layoutOf(t *testing.T, data []byte) *layout {
	t.Helper()
	l, err := readLayout(bufio.NewReader(bytes.NewReader(data)))
	if err != nil {
		t.Fatal(err)
	}
	return l
}

// Scans counted against files from an independent encoder: libjpeg-turbo's
// cjpeg writes one interleaved scan for a baseline file, and for
// -progressive the script of jpeg_simple_progression (libjpeg, jcparam.c):
// 10 scans for YCbCr.
func TestScanCountOfEncoderFiles(t *testing.T) {
	for file, want := range map[string]int{
		"s420.jpg": 1, "s422.jpg": 1, "s444.jpg": 1, "grey.jpg": 1, "progressive.jpg": 10,
	} {
		data, err := os.ReadFile(filepath.Join("testdata", "layouts", file))
		if err != nil {
			t.Fatal(err)
		}
		if l := layoutOf(t, data); l.scans != want || l.width != 96 || l.height != 64 {
			t.Errorf("%s: %d scans, %d×%d; want %d scans, 96×64", file, l.scans, l.width, l.height, want)
		}
	}
}

// Scan counts are judged in the scan stage, before any decoding: the
// 223 KB progressive 16-megapixel file of 6,000 scans (which image/jpeg takes
// over a minute to decode) is refused at once, and Prepare refuses it too.
func TestTooManyScans(t *testing.T) {
	const w, h = 4608, 3456 // 15.9 MP
	for _, c := range []struct {
		name string
		data []byte
		want string // "" for accepted
	}{
		{"progressive, 6000 scans", jpegscans.Progressive(w, h, jpegscans.Grey, 6000), "too many scans (6000) for a photo"},
		{"progressive, 101 scans", jpegscans.Progressive(w, h, jpegscans.YCbCr420, 101), "too many scans (101) for a photo"},
		{"progressive, 100 scans", jpegscans.Progressive(w, h, jpegscans.YCbCr420, 100), ""},
		{"sequential grey, 2 scans", jpegscans.Sequential(w, h, jpegscans.Grey, 2), "too many scans (2) for a photo"},
		{"sequential 4:2:0, one scan a component", jpegscans.Sequential(w, h, jpegscans.YCbCr420, 3), ""},
		{"sequential 4:2:0, 4 scans", jpegscans.Sequential(w, h, jpegscans.YCbCr420, 4), "too many scans (4) for a photo"},
	} {
		start := time.Now()
		hd, err := ScanBytes(c.data, 200)
		if took := time.Since(start); took > 2*time.Second {
			t.Errorf("%s: scan took %v", c.name, took)
		}
		switch {
		case c.want == "" && (err != nil || hd.Width != w || hd.Height != h):
			t.Errorf("%s: %+v, %v; want accepted", c.name, hd, err)
		case c.want != "" && (err == nil || !strings.Contains(err.Error(), c.want)):
			t.Errorf("%s: %v, want %q", c.name, err, c.want)
		}
		if c.want == "" {
			continue
		}
		path := filepath.Join(t.TempDir(), "scans.jpg")
		os.WriteFile(path, c.data, 0o644)
		start = time.Now()
		if _, err := Prepare(path, 1, Settings{LongSide: 400, Quality: 80}); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: Prepare %v, want %q", c.name, err, c.want)
		}
		if took := time.Since(start); took > 2*time.Second {
			t.Errorf("%s: Prepare took %v", c.name, took)
		}
	}
	if n := len(jpegscans.Progressive(w, h, jpegscans.Grey, 6000)); n/1000 != 223 {
		t.Errorf("the 6000-scan fixture is %d bytes, want the 223 KB of the report", n)
	}
}

// What follows the end of the image (a camera's second image, MPF) is not
// counted; a file cut short is counted as far as it goes; markers image/jpeg
// does not read are refused with its words.
func TestLayoutEnds(t *testing.T) {
	one := jpegscans.Progressive(64, 64, jpegscans.Grey, 3)
	if l := layoutOf(t, append(append([]byte{}, one...), one...)); l.scans != 3 {
		t.Errorf("two images in a row: %d scans, want the first image's 3", l.scans)
	}
	if l := layoutOf(t, one[:len(one)-4]); l.scans != 3 {
		t.Errorf("cut short: %d scans, want 3", l.scans)
	}
	for _, c := range []struct {
		name string
		data []byte
		want string
	}{
		{"arithmetic coding (SOF9)", bytes.Replace(one, []byte{0xFF, 0xC2}, []byte{0xFF, 0xC9}, 1), "unsupported JPEG feature: unknown marker"},
		{"no scan", one[:bytes.Index(one, []byte{0xFF, 0xDA})], "unexpected EOF"},
		{"scan before frame", bytes.Replace(one, []byte{0xFF, 0xC2}, []byte{0xFF, 0xFE}, 1), "missing SOF marker"},
		{"12-bit samples", bytes.Replace(one, []byte{0xFF, 0xC2, 0, 11, 8}, []byte{0xFF, 0xC2, 0, 11, 12}, 1), "unsupported JPEG feature: precision"},
		{"no start marker", one[2:], "missing SOI marker"},
	} {
		if _, err := ScanBytes(c.data, 200); err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "not a readable JPEG") {
			t.Errorf("%s: %v, want not a readable JPEG: …%s", c.name, err, c.want)
		}
	}
}

// A baseline file coding its components in separate scans is decoded by
// image/jpeg in either build (libjpeg-turbo would keep all its coefficients):
// the flat mid-grey picture comes out flat mid-grey.
func TestPrepareScanPerComponent(t *testing.T) {
	path := filepath.Join(t.TempDir(), "three-scans.jpg")
	os.WriteFile(path, jpegscans.Sequential(320, 240, jpegscans.YCbCr420, 3), 0o644)
	p, err := Prepare(path, 1, Settings{LongSide: 160, Quality: 90})
	if err != nil || p.Width != 160 || p.Height != 120 {
		t.Fatalf("%d×%d, %v; want 160×120", p.Width, p.Height, err)
	}
	img, err := jpeg.Decode(bytes.NewReader(p.JPEG))
	if err != nil {
		t.Fatal(err)
	}
	if r, g, b, _ := img.At(80, 60).RGBA(); r>>8 < 120 || r>>8 > 136 || g>>8 < 120 || g>>8 > 136 || b>>8 < 120 || b>>8 > 136 {
		t.Errorf("centre %d,%d,%d, want mid-grey", r>>8, g>>8, b>>8)
	}
}
