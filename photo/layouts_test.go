package photo

import (
	"bytes"
	"image/jpeg"
	"os"
	"path/filepath"
	"testing"
)

// Fixtures (photo/testdata/layouts, 96×64 with a red top-left block) made
// with libjpeg-turbo's cjpeg (-sample 2x1, -sample 1x1, -grayscale,
// -progressive) and libvips (CMYK). Every layout must come out right, whether
// or not the libjpeg-turbo path is built in; that path takes only baseline 4:2:0.
func TestJPEGLayouts(t *testing.T) {
	for _, c := range []struct {
		file        string
		fast, prog  bool
		colourCheck bool
	}{
		{"s420.jpg", true, false, true}, {"s422.jpg", false, false, true}, {"s444.jpg", false, false, true},
		{"grey.jpg", false, false, false}, {"progressive.jpg", false, true, true}, {"cmyk.jpg", false, false, false},
	} {
		path := filepath.Join("testdata", "layouts", c.file)
		data, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		if got := progressive(data); got != c.prog {
			t.Errorf("%s: progressive %v, want %v", c.file, got, c.prog)
		}
		if _, ok := fastDecode(data, 48); ok != (c.fast && fastDecodeAvailable) {
			t.Errorf("%s: fast path taken %v", c.file, ok)
		}
		for _, o := range []int{1, 6} {
			p, err := Prepare(path, o, Settings{LongSide: 48, Quality: 95})
			if err != nil {
				t.Fatalf("%s: %v", c.file, err)
			}
			wantW, wantH := 48, 32
			if o == 6 {
				wantW, wantH = 32, 48
			}
			if p.Width != wantW || p.Height != wantH {
				t.Errorf("%s orientation %d: %d×%d, want %d×%d", c.file, o, p.Width, p.Height, wantW, wantH)
			}
			img, _ := jpeg.Decode(bytes.NewReader(p.JPEG))
			// The red block (top-left in the file) ends top-left upright, top-right after orientation 6.
			x, y := 3, 3
			if o == 6 {
				x = wantW - 4
			}
			r, g, b, _ := img.At(x, y).RGBA()
			if c.colourCheck && (r>>8 < 180 || g>>8 > 90 || b>>8 > 90) {
				t.Errorf("%s orientation %d: pixel (%d,%d) = %d,%d,%d, want red", c.file, o, x, y, r>>8, g>>8, b>>8)
			}
		}
	}
}
