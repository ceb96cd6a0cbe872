package photo

import (
	"bytes"
	"image"
	"image/color"
	"image/jpeg"
	"os"
	"path/filepath"
	"testing"
)

// EXIF orientation (CIPA DC-008, Exif 2.3, tag 0x0112): the value says where
// the stored picture's first row and column belong. A 3×2 picture with a marked
// top-left pixel must end with that pixel where the table puts it.
func TestOrient(t *testing.T) {
	src := image.NewRGBA(image.Rect(0, 0, 3, 2))
	mark := color.RGBA{255, 0, 0, 255}
	src.SetRGBA(0, 0, mark)
	for _, c := range []struct {
		o          int
		w, h, x, y int // output size and where the stored top-left pixel lands
	}{
		{1, 3, 2, 0, 0}, {2, 3, 2, 2, 0}, {3, 3, 2, 2, 1}, {4, 3, 2, 0, 1},
		{5, 2, 3, 0, 0}, {6, 2, 3, 1, 0}, {7, 2, 3, 1, 2}, {8, 2, 3, 0, 2},
	} {
		out := orient(src, c.o)
		if b := out.Bounds(); b.Dx() != c.w || b.Dy() != c.h {
			t.Errorf("orientation %d: size %v, want %d×%d", c.o, b, c.w, c.h)
			continue
		}
		if out.RGBAAt(c.x, c.y) != mark {
			t.Errorf("orientation %d: marked pixel not at (%d,%d)", c.o, c.x, c.y)
		}
	}
}

func TestPrepareReduces(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "big.jpg")
	var b bytes.Buffer
	jpeg.Encode(&b, image.NewGray(image.Rect(0, 0, 2400, 1200)), nil)
	os.WriteFile(path, b.Bytes(), 0o644)
	p, err := Prepare(path, 6, Settings{LongSide: 1600, Quality: 80})
	if err != nil {
		t.Fatal(err)
	}
	if p.Width != 800 || p.Height != 1600 {
		t.Errorf("prepared %d×%d, want 800×1600 (reduced, then turned upright)", p.Width, p.Height)
	}
	if _, err := Prepare(filepath.Join(dir, "none.jpg"), 1, Settings{LongSide: 1600, Quality: 80}); err == nil {
		t.Error("missing file: no error")
	}
}
