package photo

import (
	"bufio"
	"bytes"
	"fmt"
	"image"
	"image/jpeg"

	"golang.org/x/image/draw"
)

// Settings say how photos are prepared.
type Settings struct {
	LongSide int    // pixels on the long side at most
	Quality  int    // JPEG quality 1..100
	CacheDir string // folder of reduced photos kept between runs; "" for none
	// Progress, when set, is called after each photo with the count done.
	Progress func(done, total int)
}

// Prepared is a photo ready to embed: upright, reduced, re-encoded as JPEG.
type Prepared struct {
	JPEG          []byte
	Width, Height int
}

// Prepare reads a JPEG, reduces it to fit s.LongSide, turns it upright by its
// EXIF orientation (1..8) and encodes it again at s.Quality. Baseline 4:2:0
// and 4:4:4 JPEGs (what cameras and phones write) are reduced and turned on
// their Y, Cb and Cr planes; other layouts go through RGBA. A file Scan would
// refuse (not a regular file, too large, too many scans, too much memory to
// decode) is refused here too.
func Prepare(path string, orientation int, s Settings) (Prepared, error) {
	data, err := readPhoto(path)
	if err != nil {
		return Prepared{}, err
	}
	l, err := decodableLayout(data)
	if err != nil {
		return Prepared{}, err
	}
	return prepare(data, l, orientation, s)
}

// decodableLayout reads the layout of a JPEG in memory and says why it is not
// decoded, if so.
func decodableLayout(data []byte) (*layout, error) {
	l, err := readLayout(bufio.NewReader(bytes.NewReader(data)))
	if err != nil {
		return nil, fmt.Errorf("not a readable JPEG: %w", err)
	}
	return l, l.decodable()
}

// prepare is Prepare on a file's content that passed decodableLayout, l its
// layout. libjpeg-turbo takes single-scan files only: for several scans it
// keeps every coefficient of the image (2 bytes a sample, outside the Go heap
// and its estimate), where image/jpeg decodes each baseline scan straight to
// pixels.
func prepare(data []byte, l *layout, orientation int, s Settings) (p Prepared, err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("cannot decode: %v", r)
		}
	}()
	var src image.Image
	if l.scans == 1 {
		if y, ok := fastDecode(data, s.LongSide); ok {
			src = y
		}
	}
	if src == nil {
		if src, err = jpeg.Decode(bytes.NewReader(data)); err != nil {
			return p, fmt.Errorf("cannot decode: %w", err)
		}
	}
	sb := src.Bounds()
	w, h := fitLongSide(sb.Dx(), sb.Dy(), s.LongSide)
	var img image.Image
	if y, ok := src.(*image.YCbCr); ok && (y.SubsampleRatio == image.YCbCrSubsampleRatio420 || y.SubsampleRatio == image.YCbCrSubsampleRatio444) {
		if w != sb.Dx() || h != sb.Dy() {
			y = reduceYCbCr(y, w, h)
		}
		img = orientYCbCr(y, orientation)
	} else {
		img = orient(reduce(src, s.LongSide), orientation)
	}
	b := img.Bounds()
	if y, ok := img.(*image.YCbCr); ok {
		if out, ok := fastEncode(y, s.Quality); ok {
			return Prepared{JPEG: out, Width: b.Dx(), Height: b.Dy()}, nil
		}
	}
	var buf bytes.Buffer
	if err := jpeg.Encode(&buf, img, &jpeg.Options{Quality: s.Quality}); err != nil {
		return p, err
	}
	return Prepared{JPEG: buf.Bytes(), Width: b.Dx(), Height: b.Dy()}, nil
}

// fitLongSide scales w × h down (never up) so the long side is at most long.
func fitLongSide(w, h, long int) (int, int) {
	if l := max(w, h); l > long && long > 0 {
		return max(1, (w*long+l/2)/l), max(1, (h*long+l/2)/l)
	}
	return w, h
}

// reduce scales img down (never up) so its long side is at most longSide.
func reduce(img image.Image, longSide int) *image.RGBA {
	b := img.Bounds()
	w, h := fitLongSide(b.Dx(), b.Dy(), longSide)
	dst := image.NewRGBA(image.Rect(0, 0, w, h))
	if w == b.Dx() && h == b.Dy() {
		draw.Draw(dst, dst.Bounds(), img, b.Min, draw.Src)
	} else {
		draw.CatmullRom.Scale(dst, dst.Bounds(), img, b, draw.Src, nil)
	}
	return dst
}

// orient applies an EXIF orientation (1..8) to an RGBA image.
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
			sx, sy := orientSource(o, x, y, w, h)
			si, di := src.PixOffset(sx, sy), dst.PixOffset(x, y)
			copy(dst.Pix[di:di+4], src.Pix[si:si+4])
		}
	}
	return dst
}
