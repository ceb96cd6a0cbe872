// Package benchphotos makes the 12-megapixel photos the photo-stage
// benchmarks run on. They are generated, never committed.
package benchphotos

import (
	"bytes"
	"fmt"
	"image"
	"image/jpeg"
	"math/rand/v2"
	"os"
	"path/filepath"
)

// Size of a generated photo: a phone's 12 MP, 4:3.
const (
	Width  = 4032
	Height = 3024
)

// Base returns the paths of n distinct 12 MP JPEGs (4:2:0, quality 90, 3-5 MB
// each: smooth shading with fine noise, the entropy of a real photo), made
// once into dir and reused by later runs.
func Base(dir string, n int) ([]string, error) {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, err
	}
	var paths []string
	for i := 0; i < n; i++ {
		path := filepath.Join(dir, fmt.Sprintf("p%03d.jpg", i))
		if _, err := os.Stat(path); err != nil {
			if err := write(path, uint64(i)); err != nil {
				return nil, err
			}
		}
		paths = append(paths, path)
	}
	return paths, nil
}

func write(path string, seed uint64) error {
	rng := rand.New(rand.NewPCG(seed, 99))
	img := image.NewYCbCr(image.Rect(0, 0, Width, Height), image.YCbCrSubsampleRatio420)
	for y := 0; y < Height; y++ {
		for x := 0; x < Width; x++ {
			img.Y[y*img.YStride+x] = uint8(60 + (x*120)/Width + (y*40)/Height + rng.IntN(24))
		}
	}
	for y := 0; y < Height/2; y++ {
		for x := 0; x < Width/2; x++ {
			img.Cb[y*img.CStride+x] = uint8(110 + rng.IntN(12) + x*20/Width)
			img.Cr[y*img.CStride+x] = uint8(130 + rng.IntN(12) + y*20/Height)
		}
	}
	var buf bytes.Buffer
	if err := jpeg.Encode(&buf, img, &jpeg.Options{Quality: 90}); err != nil {
		return err
	}
	return os.WriteFile(path, buf.Bytes(), 0o644)
}
