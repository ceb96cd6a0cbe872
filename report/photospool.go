package report

import (
	"bytes"
	"crypto/sha256"
	"fmt"
	"image"
	"image/color"
	"image/jpeg"
	"io"
	"os"
	"strconv"
	"sync"
)

// photoSpool keeps the prepared photos of a PDF in a temporary file until
// the PDF is written, so that memory does not grow with the number of
// photos: fpdf is given a small stand-in JPEG for each photo (a 1 × 1 image
// whose comment names the photo), and pageCompressor writes the photo itself
// from the file in place of the stand-in's image object.
type photoSpool struct {
	file   *os.File
	size   int64
	photos []spooled
	seen   map[[32]byte]int // photos by content, so equal photos are embedded once
	closed bool
}

// spooled is one photo in the spool file: where, and what the image object says of it.
type spooled struct {
	at, n         int64
	width, height int
	colorSpace    string // DeviceRGB, DeviceGray or DeviceCMYK
}

// standInMark opens the comment of a stand-in: "lossline-photo:12;".
const standInMark = "lossline-photo:"

func newPhotoSpool() (*photoSpool, error) {
	f, err := os.CreateTemp("", "lossline-photos-*")
	if err != nil {
		return nil, fmt.Errorf("photos: %w", err)
	}
	// Removed now where an open file can be (gone when closed, whatever
	// happens), else by close.
	os.Remove(f.Name())
	return &photoSpool{file: f, seen: map[[32]byte]int{}}, nil
}

// add writes a prepared JPEG to the spool and returns its stand-in.
func (s *photoSpool) add(jpg []byte) ([]byte, error) {
	sum := sha256.Sum256(jpg)
	i, ok := s.seen[sum]
	if !ok {
		cfg, err := jpeg.DecodeConfig(bytes.NewReader(jpg))
		if err != nil {
			return nil, err
		}
		cs := "DeviceRGB"
		switch cfg.ColorModel {
		case color.GrayModel:
			cs = "DeviceGray"
		case color.CMYKModel:
			cs = "DeviceCMYK"
		}
		if _, err := s.file.WriteAt(jpg, s.size); err != nil {
			return nil, fmt.Errorf("photos: %w", err)
		}
		i = len(s.photos)
		s.photos = append(s.photos, spooled{at: s.size, n: int64(len(jpg)), width: cfg.Width, height: cfg.Height, colorSpace: cs})
		s.size += int64(len(jpg))
		s.seen[sum] = i
	}
	return standIn(i), nil
}

// close removes the spool file; closing again does nothing.
func (s *photoSpool) close() {
	if s != nil && !s.closed {
		s.closed = true
		s.file.Close()
		os.Remove(s.file.Name())
	}
}

// photoOf finds the photo a stand-in image stream names.
func (s *photoSpool) photoOf(data []byte) (spooled, bool) {
	if s == nil {
		return spooled{}, false
	}
	k := bytes.Index(data, []byte(standInMark))
	if k < 0 {
		return spooled{}, false
	}
	rest := data[k+len(standInMark):]
	end := bytes.IndexByte(rest, ';')
	if end < 0 {
		return spooled{}, false
	}
	i, err := strconv.Atoi(string(rest[:end]))
	if err != nil || i < 0 || i >= len(s.photos) {
		return spooled{}, false
	}
	return s.photos[i], true
}

// writeImage writes photo p as an image object's dictionary and stream.
func (s *photoSpool) writeImage(w io.Writer, p spooled) (int64, error) {
	dict := fmt.Sprintf("<</Type /XObject\n/Subtype /Image\n/Width %d\n/Height %d\n/ColorSpace /%s\n", p.width, p.height, p.colorSpace)
	if p.colorSpace == "DeviceCMYK" {
		dict += "/Decode [1 0 1 0 1 0 1 0]\n"
	}
	dict += fmt.Sprintf("/BitsPerComponent 8\n/Filter /DCTDecode\n/Length %d>>\nstream\n", p.n)
	n1, err := io.WriteString(w, dict)
	if err != nil {
		return int64(n1), err
	}
	n2, err := io.Copy(w, io.NewSectionReader(s.file, p.at, p.n))
	if err == nil && n2 != p.n {
		err = fmt.Errorf("photos: spool file short by %d bytes", p.n-n2)
	}
	n3, err2 := io.WriteString(w, "\nendstream\n")
	if err == nil {
		err = err2
	}
	return int64(n1) + n2 + int64(n3), err
}

// tinyJPEG is a 1 × 1 grey JPEG, the body of every stand-in.
var tinyJPEG = sync.OnceValue(func() []byte {
	var b bytes.Buffer
	img := image.NewGray(image.Rect(0, 0, 1, 1))
	img.Pix[0] = 128
	if err := jpeg.Encode(&b, img, nil); err != nil {
		panic(err)
	}
	return b.Bytes()
})

// standIn is the stand-in of the i-th photo: the tiny JPEG with a comment
// segment naming i right after its start marker.
func standIn(i int) []byte {
	tiny := tinyJPEG()
	com := standInMark + strconv.Itoa(i) + ";"
	out := make([]byte, 0, len(tiny)+4+len(com))
	out = append(out, tiny[:2]...) // SOI
	n := len(com) + 2
	out = append(out, 0xFF, 0xFE, byte(n>>8), byte(n))
	out = append(out, com...)
	return append(out, tiny[2:]...)
}
