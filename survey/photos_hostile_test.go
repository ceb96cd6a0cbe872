//go:build unix

package survey

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/internal/hostilephotos"
)

// Every hostile file (pipe, link to /dev/zero or out of the survey, sparse
// 5 GiB file, 6,000 scans, EXIF loop and huge EXIF count) is skipped with its
// reason, or kept with a warning when only its EXIF block is damaged, and the
// whole scan takes seconds at most. A link within photos/ is followed; a
// link that leads nowhere is skipped.
func TestScanPhotosHostileFiles(t *testing.T) {
	dir, outside := t.TempDir(), t.TempDir()
	ph := filepath.Join(dir, PhotoDir)
	os.MkdirAll(filepath.Join(ph, "sub"), 0o755)
	cases := hostilephotos.Cases()
	for _, c := range cases {
		if err := c.Make(ph, outside); err != nil {
			t.Fatalf("%s: %v", c.Name, err)
		}
	}
	os.WriteFile(filepath.Join(ph, "sub", "kept.bin"), hostilephotos.Plain(24, 24), 0o644)
	os.Symlink(filepath.Join("sub", "kept.bin"), filepath.Join(ph, "inside.jpg"))
	os.Symlink("../../nothing.jpg", filepath.Join(ph, "sub", "dangling.jpg"))

	start := time.Now()
	photos, skipped, problems := ScanPhotos(dir, DefaultMaxMegapixels)
	if took := time.Since(start); took > 5*time.Second {
		t.Errorf("scan took %v", took)
	}
	said := map[string]string{}
	for _, p := range problems {
		rel, _ := filepath.Rel(ph, p.File)
		said[filepath.ToSlash(rel)] += p.Message
	}
	want := map[string]string{"sub/dangling.jpg": "skipped: link leads nowhere"}
	for _, c := range cases {
		if c.Skipped {
			want[c.Name] = "skipped: " + c.Reason
		} else {
			want[c.Name] = "photo header cannot be read (" + c.Reason
		}
	}
	for name, w := range want {
		if !strings.Contains(said[name], w) {
			t.Errorf("%s: %q, want %q", name, said[name], w)
		}
	}
	kept := map[string]*Photo{}
	for _, p := range photos {
		kept[p.Name] = p
	}
	if len(photos) != 3 || kept["inside.jpg"] == nil || kept["inside.jpg"].Width != 24 || kept["loop.jpg"] == nil || kept["count.jpg"] == nil {
		t.Errorf("photos %v, want inside.jpg (a link within photos/), loop.jpg and count.jpg", photos)
	}
	if len(skipped) != 7 { // five hostile files, the dangling link and sub/kept.bin (not a JPEG by its name)
		t.Errorf("skipped %v, want 7", skipped)
	}
}
