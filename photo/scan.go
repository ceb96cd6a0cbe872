package photo

import (
	"bufio"
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"strings"
	"time"

	"github.com/rwcarlsen/goexif/exif"
)

// Header is what a scan reads from one JPEG without decoding its pixels.
type Header struct {
	Hash          string     // SHA-256 of the file, hex
	Width, Height int        // pixels, as stored (before orientation)
	Orientation   int        // EXIF orientation 1..8; 1 when absent
	Taken         *time.Time // EXIF DateTimeOriginal, the camera's wall clock; nil when absent
	HasGPS        bool       // Lat and Lon hold the EXIF GPS position
	Lat, Lon      float64    // degrees
	// EXIFErr says why the EXIF header could not be read; the file is still
	// a usable photo, without time and position.
	EXIFErr error
}

// Scan reads a JPEG file's header: its content hash, its size from the frame
// header and its EXIF time, position and orientation. The error says why the
// file cannot be used as a photo: it is not a regular file or is larger than
// MaxFileBytes (both judged before it is opened), cannot be read, is not a
// readable JPEG, declares more than maxMP megapixels, or would take too long
// or too much memory to decode (see decodable).
//
// Only the marker segments are parsed; the file is read once, in a bounded
// buffer, for its hash.
func Scan(path string, maxMP float64) (Header, error) {
	f, err := openPhoto(path)
	if err != nil {
		return Header{}, err
	}
	defer f.Close()
	return scan(f, maxMP)
}

// ScanBytes is Scan on a file's content; it never panics.
func ScanBytes(data []byte, maxMP float64) (Header, error) {
	return scan(bytes.NewReader(data), maxMP)
}

func scan(r io.Reader, maxMP float64) (h Header, err error) {
	defer func() {
		if rec := recover(); rec != nil {
			h, err = Header{}, fmt.Errorf("damaged file: %v", rec)
		}
	}()
	sum := sha256.New()
	limited := &io.LimitedReader{R: r, N: MaxFileBytes + 1}
	br := bufio.NewReaderSize(io.TeeReader(limited, sum), 64<<10)
	l, err := readLayout(br)
	if limited.N == 0 {
		return Header{}, errTooLarge
	}
	if err != nil {
		return Header{}, fmt.Errorf("not a readable JPEG: %w", err)
	}
	if mp := float64(l.width) * float64(l.height) / 1e6; mp > maxMP {
		return Header{}, fmt.Errorf("%d×%d pixels (%.0f MP) is over the %g MP limit", l.width, l.height, mp, maxMP)
	}
	if err := l.decodable(); err != nil {
		return Header{}, err
	}
	// The rest of the file, for the hash only.
	if _, err := io.Copy(io.Discard, br); err != nil {
		return Header{}, fmt.Errorf("cannot be read: %w", err)
	}
	if limited.N == 0 {
		return Header{}, errTooLarge
	}
	h = Header{Hash: hex.EncodeToString(sum.Sum(nil)), Width: l.width, Height: l.height, Orientation: 1}
	if l.exif == nil {
		h.EXIFErr = errors.New("no EXIF data")
	} else if h.EXIFErr = checkEXIF(l.exif); h.EXIFErr == nil {
		h.EXIFErr = readEXIF(&h, l.exif)
	}
	return h, nil
}

// readEXIF fills h from an EXIF block that passed checkEXIF; goexif reads the
// block alone, never the file. A panic inside goexif is turned into an error
// for that file alone.
func readEXIF(h *Header, tiff []byte) (err error) {
	defer func() {
		if rec := recover(); rec != nil {
			err = fmt.Errorf("damaged EXIF header: %v", rec)
		}
	}()
	x, err := exif.Decode(bytes.NewReader(tiff))
	if err != nil && exif.IsCriticalError(err) || x == nil {
		return errors.New("no EXIF data")
	}
	if tag, err := x.Get(exif.DateTimeOriginal); err == nil {
		if s, err := tag.StringVal(); err == nil {
			// EXIF times carry no zone: they are kept as the camera's wall clock.
			if t, err := time.Parse("2006:01:02 15:04:05", strings.TrimRight(s, "\x00 ")); err == nil {
				h.Taken = &t
			}
		}
	}
	if lat, lon, err := x.LatLong(); err == nil && lat >= -90 && lat <= 90 && lon >= -180 && lon <= 180 && !(lat == 0 && lon == 0) {
		h.HasGPS, h.Lat, h.Lon = true, lat, lon
	}
	if tag, err := x.Get(exif.Orientation); err == nil {
		if o, err := tag.Int(0); err == nil && o >= 1 && o <= 8 {
			h.Orientation = o
		}
	}
	return nil
}
