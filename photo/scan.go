package photo

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"image/jpeg"
	"io"
	"os"
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
// file cannot be used as a photo: it cannot be read, is not a readable JPEG,
// or declares more than maxMP megapixels.
func Scan(path string, maxMP float64) (Header, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return Header{}, fmt.Errorf("cannot be read: %w", err)
	}
	return ScanBytes(data, maxMP)
}

// ScanBytes is Scan on a file's content; it never panics.
func ScanBytes(data []byte, maxMP float64) (h Header, err error) {
	defer func() {
		if r := recover(); r != nil {
			h, err = Header{}, fmt.Errorf("damaged file: %v", r)
		}
	}()
	sum := sha256.Sum256(data)
	cfg, err := jpeg.DecodeConfig(bytes.NewReader(data))
	if err != nil {
		return Header{}, fmt.Errorf("not a readable JPEG: %w", err)
	}
	if mp := float64(cfg.Width) * float64(cfg.Height) / 1e6; mp > maxMP {
		return Header{}, fmt.Errorf("%d×%d pixels (%.0f MP) is over the %g MP limit", cfg.Width, cfg.Height, mp, maxMP)
	}
	h = Header{Hash: hex.EncodeToString(sum[:]), Width: cfg.Width, Height: cfg.Height, Orientation: 1}
	if h.EXIFErr = checkEXIFLayout(data); h.EXIFErr == nil {
		h.EXIFErr = readEXIF(&h, bytes.NewReader(data))
	}
	return h, nil
}

// readEXIF fills h from the file's EXIF header. A panic inside the EXIF
// library on a damaged file is turned into an error for that file alone.
func readEXIF(h *Header, r io.Reader) (err error) {
	defer func() {
		if rec := recover(); rec != nil {
			err = fmt.Errorf("damaged EXIF header: %v", rec)
		}
	}()
	x, err := exif.Decode(r)
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
