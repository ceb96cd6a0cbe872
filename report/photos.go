package report

import (
	"bytes"
	"fmt"
	"image"
	"image/jpeg"
	"os"

	"golang.org/x/image/draw"
)

// PhotoSettings says how photos are embedded.
type PhotoSettings struct {
	LongSide int // pixels on the long side at most
	Quality  int // JPEG quality 1..100
}

// preparedPhoto is a photo ready to embed: upright, reduced, re-encoded.
type preparedPhoto struct {
	JPEG          []byte
	Width, Height int
}

// preparePhoto reads a JPEG, reduces it to fit LongSide, turns it upright by
// its EXIF orientation and encodes it again.
func preparePhoto(path string, orientation int, ps PhotoSettings) (p preparedPhoto, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("cannot decode: %v", r)
		}
	}()
	f, err := os.Open(path)
	if err != nil {
		return p, err
	}
	defer f.Close()
	src, err := jpeg.Decode(f)
	if err != nil {
		return p, fmt.Errorf("cannot decode: %w", err)
	}
	img := orient(reduce(src, ps.LongSide), orientation)
	var buf bytes.Buffer
	if err := jpeg.Encode(&buf, img, &jpeg.Options{Quality: ps.Quality}); err != nil {
		return p, err
	}
	b := img.Bounds()
	return preparedPhoto{JPEG: buf.Bytes(), Width: b.Dx(), Height: b.Dy()}, nil
}

// reduce scales img down (never up) so its long side is at most longSide.
func reduce(img image.Image, longSide int) *image.RGBA {
	b := img.Bounds()
	w, h := b.Dx(), b.Dy()
	if long := max(w, h); long > longSide && longSide > 0 {
		w, h = max(1, w*longSide/long), max(1, h*longSide/long)
	}
	dst := image.NewRGBA(image.Rect(0, 0, w, h))
	if w == b.Dx() && h == b.Dy() {
		draw.Draw(dst, dst.Bounds(), img, b.Min, draw.Src)
	} else {
		draw.CatmullRom.Scale(dst, dst.Bounds(), img, b, draw.Src, nil)
	}
	return dst
}

// orient applies an EXIF orientation (1..8) so the picture stands upright.
func orient(src *image.RGBA, o int) *image.RGBA {
	if o <= 1 || o > 8 {
		return src
	}
	w, h := src.Bounds().Dx(), src.Bounds().Dy()
	ow, oh := w, h
	if o >= 5 { // 5..8 swap the axes
		ow, oh = h, w
	}
	dst := image.NewRGBA(image.Rect(0, 0, ow, oh))
	for y := 0; y < oh; y++ {
		for x := 0; x < ow; x++ {
			var sx, sy int
			switch o {
			case 2:
				sx, sy = w-1-x, y
			case 3:
				sx, sy = w-1-x, h-1-y
			case 4:
				sx, sy = x, h-1-y
			case 5:
				sx, sy = y, x
			case 6:
				sx, sy = y, h-1-x
			case 7:
				sx, sy = w-1-y, h-1-x
			case 8:
				sx, sy = w-1-y, x
			}
			si, di := src.PixOffset(sx, sy), dst.PixOffset(x, y)
			copy(dst.Pix[di:di+4], src.Pix[si:si+4])
		}
	}
	return dst
}
