package photo

import (
	"os"
	"path/filepath"
	"testing"
)

// FuzzScan: any bytes give a header or a reason the file is not used, never a
// panic (EXIF parsing included).
func FuzzScan(f *testing.F) {
	seeds, _ := filepath.Glob(filepath.Join("..", "testdata", "demo", "photos", "*", "*.jpg"))
	for _, p := range seeds {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(b[:min(len(b), 4096)]) // the headers, where EXIF lives
		}
	}
	f.Add([]byte{0xFF, 0xD8, 0xFF, 0xE1, 0x00, 0x08, 'E', 'x', 'i', 'f', 0, 0})
	f.Fuzz(func(t *testing.T, data []byte) {
		h, err := ScanBytes(data, 200)
		if err != nil {
			if err.Error() == "" || h != (Header{}) {
				t.Fatalf("rejected with reason %q and header %+v", err, h)
			}
			return
		}
		if len(h.Hash) != 64 || h.Width < 0 || h.Height < 0 {
			t.Fatalf("accepted with header %+v", h)
		}
		if h.Orientation < 1 || h.Orientation > 8 {
			t.Fatalf("orientation %d", h.Orientation)
		}
	})
}
