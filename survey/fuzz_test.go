package survey

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/lossline/lossline/survey/wallloss"
)

// FuzzParseChecklist: any input yields a survey and problems, never a panic,
// and every problem points inside the file.
func FuzzParseChecklist(f *testing.F) {
	seeds, _ := filepath.Glob(filepath.Join("..", "testdata", "*", "survey.md"))
	more, _ := filepath.Glob(filepath.Join("..", "testdata", "bad", "*", "survey.md"))
	for _, p := range append(seeds, more...) {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(b)
		}
	}
	f.Fuzz(func(t *testing.T, src []byte) {
		s, problems := readChecklist("survey.md", src)
		if s == nil {
			t.Fatal("nil survey")
		}
		lines := len(newLineIndex(src))
		for _, p := range problems {
			if p.Line < 0 || p.Line > lines {
				t.Fatalf("problem at line %d of a %d-line file: %v", p.Line, lines, p)
			}
		}
		_ = Assess(s, wallloss.DefaultPolicy)
	})
}

// FuzzScanPhoto: any bytes in the photos folder give a photo or a reason to
// skip the file, never a panic (EXIF parsing included).
func FuzzScanPhoto(f *testing.F) {
	seeds, _ := filepath.Glob(filepath.Join("..", "testdata", "demo", "photos", "*", "*.jpg"))
	for _, p := range seeds {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(b[:min(len(b), 4096)]) // the headers, where EXIF lives
		}
	}
	f.Add([]byte{0xFF, 0xD8, 0xFF, 0xE1, 0x00, 0x08, 'E', 'x', 'i', 'f', 0, 0})
	f.Fuzz(func(t *testing.T, data []byte) {
		sc := scanData("x.jpg", "photos/x.jpg", data, DefaultMaxMegapixels)
		if (sc.photo == nil) == (sc.skip == "") {
			t.Fatalf("scan gave photo %v and reason %q", sc.photo, sc.skip)
		}
		if sc.photo != nil && (sc.photo.Orientation < 1 || sc.photo.Orientation > 8) {
			t.Fatalf("orientation %d", sc.photo.Orientation)
		}
	})
}
