//go:build unix

// Package hostilephotos makes the hostile files a photo folder may hold, one
// per case, with what lossline must say of each, to generate test fixtures:
// named pipes, links and sparse files cannot be committed, so tests make
// them. lossline itself never writes such files.
package hostilephotos

import (
	"bytes"
	"encoding/binary"
	"image"
	"image/jpeg"
	"os"
	"path/filepath"
	"syscall"

	"github.com/lossline/lossline/internal/jpegscans"
)

// Case is one hostile file.
type Case struct {
	Name string // its name in the photo folder
	// Skipped: the file is not used and Reason follows "skipped: ". Otherwise
	// it is kept as a photo without its EXIF data and Reason is in the warning.
	Skipped bool
	Reason  string
	// Make writes the file into the photo folder photos; outside is a folder
	// outside the survey, for a link to point into.
	Make func(photos, outside string) error
}

// Cases are the hostile files of issue 11: each hung, crashed or leaked a
// file into the report before.
func Cases() []Case {
	return []Case{
		{"p.jpg", true, "not a regular file (named pipe)", func(ph, _ string) error {
			return syscall.Mkfifo(filepath.Join(ph, "p.jpg"), 0o644)
		}},
		{"z.jpg", true, "link points outside photos/", func(ph, _ string) error {
			return os.Symlink("/dev/zero", filepath.Join(ph, "z.jpg"))
		}},
		{"secret.jpg", true, "link points outside photos/", func(ph, outside string) error {
			if err := os.WriteFile(filepath.Join(outside, "secret.jpg"), Plain(16, 16), 0o644); err != nil {
				return err
			}
			return os.Symlink(filepath.Join(outside, "secret.jpg"), filepath.Join(ph, "secret.jpg"))
		}},
		{"big.jpg", true, "file larger than 64 MiB", func(ph, _ string) error {
			f, err := os.Create(filepath.Join(ph, "big.jpg"))
			if err != nil {
				return err
			}
			defer f.Close()
			return f.Truncate(5 << 30) // sparse: 5 GiB declared, nothing written
		}},
		{"scans.jpg", true, "too many scans (6000) for a photo", func(ph, _ string) error {
			// 223 KB: 16 megapixels in 6,000 progressive scans.
			return os.WriteFile(filepath.Join(ph, "scans.jpg"), jpegscans.Progressive(4608, 3456, jpegscans.Grey, 6000), 0o644)
		}},
		{"loop.jpg", false, "damaged EXIF header: its directories form a loop", func(ph, _ string) error {
			return os.WriteFile(filepath.Join(ph, "loop.jpg"), WithTIFF(Plain(16, 16), EXIFLoop()), 0o644)
		}},
		{"count.jpg", false, "damaged EXIF header: tag 0x011a declares 536870913 values of 8 bytes", func(ph, _ string) error {
			return os.WriteFile(filepath.Join(ph, "count.jpg"), WithTIFF(Plain(16, 16), EXIFHugeCount()), 0o644)
		}},
	}
}

// Plain is a grey w × h baseline JPEG without EXIF.
func Plain(w, h int) []byte {
	var b bytes.Buffer
	jpeg.Encode(&b, image.NewGray(image.Rect(0, 0, w, h)), nil)
	return b.Bytes()
}

// EXIFLoop is a TIFF block (TIFF 6.0, section 2) whose two directories name
// each other as the next.
func EXIFLoop() []byte {
	b := make([]byte, 64)
	copy(b, "MM\x00\x2a\x00\x00\x00\x08")
	for _, d := range [][2]uint32{{8, 30}, {30, 8}} {
		binary.BigEndian.PutUint16(b[d[0]:], 1)
		binary.BigEndian.PutUint16(b[d[0]+2:], 0x0112) // orientation, SHORT, one value: 1
		binary.BigEndian.PutUint16(b[d[0]+4:], 3)
		binary.BigEndian.PutUint32(b[d[0]+6:], 1)
		binary.BigEndian.PutUint16(b[d[0]+10:], 1)
		binary.BigEndian.PutUint32(b[d[0]+14:], d[1])
	}
	return b
}

// EXIFHugeCount is a TIFF block whose XResolution (tag 0x011A, RATIONAL)
// counts 0x20000001 values: 8 bytes each, a size that wraps to 8 in 32 bits.
func EXIFHugeCount() []byte {
	b := make([]byte, 64)
	copy(b, "MM\x00\x2a\x00\x00\x00\x08")
	binary.BigEndian.PutUint16(b[8:], 1)
	binary.BigEndian.PutUint16(b[10:], 0x011A)
	binary.BigEndian.PutUint16(b[12:], 5)
	binary.BigEndian.PutUint32(b[14:], 0x20000001)
	return b
}

// WithTIFF puts a TIFF block into a JPEG as its EXIF segment.
func WithTIFF(plain, tiff []byte) []byte {
	seg := append([]byte("Exif\x00\x00"), tiff...)
	out := []byte{0xFF, 0xD8, 0xFF, 0xE1, byte((len(seg) + 2) >> 8), byte(len(seg) + 2)}
	return append(append(out, seg...), plain[2:]...)
}
