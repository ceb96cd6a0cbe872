//go:build unix

package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/lossline/lossline/internal/hostilephotos"
)

// hostileSurvey is a survey of one CML whose photo folder holds nothing but
// the file the test puts there.
const hostileSurvey = `---
title: Hostile photo fixture
site: Test yard
date: 2025-06-10
inspector: Test
units: mm
---

# Tank A

## Course 1

- nominal: 10.0
- required: 6.0
- consequence: high

| CML | 2020-06-01 | 2025-06-10 | photos |
|-----|------------|------------|--------|
| C1  | 9.80       | 9.60       |        |
`

// One survey per hostile file: check, photos and report each end within
// seconds, under the 4 GB address-space limit, with exit 0 and the file's
// reason in their output. Before, the pipe hung every command, /dev/zero and
// the sparse file exhausted memory, the EXIF count crashed, the EXIF loop and
// the 6,000 scans stalled for minutes, and the outside link put another
// folder's file into the PDF.
func TestHostilePhotos(t *testing.T) {
	for _, c := range hostilephotos.Cases() {
		t.Run(c.Name, func(t *testing.T) {
			dir, outside := t.TempDir(), t.TempDir()
			ph := filepath.Join(dir, "photos")
			os.MkdirAll(ph, 0o755)
			os.WriteFile(filepath.Join(dir, "survey.md"), []byte(hostileSurvey), 0o644)
			if err := c.Make(ph, outside); err != nil {
				t.Fatal(err)
			}
			want := c.Reason // a kept photo's EXIF problem, in the warning or the photo list
			if c.Skipped {
				want = "skipped: " + c.Reason
			}
			for _, args := range [][]string{
				{"check", dir},
				{"photos", dir},
				{"report", dir, "-o", filepath.Join(t.TempDir(), "out")},
			} {
				r := runLimited(t, args...)
				if r.Code != 0 || !strings.Contains(r.Stdout+r.Stderr, want) {
					t.Errorf("lossline %s: exit %d, output lacks %q:\n%s%s", args[0], r.Code, want, r.Stdout, r.Stderr)
				}
				if r.Took > 10*time.Second {
					t.Errorf("lossline %s took %v", args[0], r.Took)
				}
			}
		})
	}
}
