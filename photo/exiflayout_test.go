package photo

import (
	"bytes"
	"encoding/binary"
	"image"
	"image/jpeg"
	"strings"
	"testing"
)

// entry is one 12-byte TIFF directory entry (TIFF 6.0, section 2): tag, type,
// count, and the value or its offset.
type entry struct {
	tag, typ     uint16
	count, value uint32
}

// tiffBlock lays out big-endian directories at the given offsets, each with
// its entries and the offset of the next directory.
func tiffBlock(dirs map[uint32][]entry, next map[uint32]uint32) []byte {
	b := make([]byte, 256)
	copy(b, "MM\x00\x2a\x00\x00\x00\x08")
	for off, es := range dirs {
		p := off
		binary.BigEndian.PutUint16(b[p:], uint16(len(es)))
		p += 2
		for _, e := range es {
			binary.BigEndian.PutUint16(b[p:], e.tag)
			binary.BigEndian.PutUint16(b[p+2:], e.typ)
			binary.BigEndian.PutUint32(b[p+4:], e.count)
			if e.typ == 3 && e.count == 1 {
				binary.BigEndian.PutUint16(b[p+8:], uint16(e.value)) // a short sits left-justified
			} else {
				binary.BigEndian.PutUint32(b[p+8:], e.value)
			}
			p += 12
		}
		binary.BigEndian.PutUint32(b[p:], next[off])
	}
	return b
}

// withEXIF is a small valid JPEG carrying tiff as its EXIF block.
func withEXIF(tiff []byte) []byte {
	var plain bytes.Buffer
	jpeg.Encode(&plain, image.NewGray(image.Rect(0, 0, 8, 8)), nil)
	seg := append([]byte("Exif\x00\x00"), tiff...)
	out := []byte{0xFF, 0xD8, 0xFF, 0xE1, byte((len(seg) + 2) >> 8), byte(len(seg) + 2)}
	return append(append(out, seg...), plain.Bytes()[2:]...)
}

// Layouts that made goexif exhaust memory or read forever are refused as a
// damaged EXIF header; the photo stays usable without its EXIF data. Tag
// numbers from CIPA DC-008 (Exif 2.3): 0x0112 orientation, 0x011A
// XResolution (rational), 0x8825 the GPS directory.
func TestDamagedEXIFLayouts(t *testing.T) {
	const huge = 0x20000001 // × 8 bytes per rational wraps to 8 in 32 bits
	for _, c := range []struct {
		name, want string
		tiff       []byte
	}{
		{"huge count in IFD0", "declares 536870913 values of 8 bytes",
			tiffBlock(map[uint32][]entry{8: {{0x011A, 5, huge, 0}}}, nil)},
		{"huge count in the GPS directory", "declares 536870913 values of 8 bytes",
			tiffBlock(map[uint32][]entry{8: {{0x0112, 3, 1, 6}, {0x8825, 4, 1, 40}}, 40: {{0x0002, 5, huge, 0}}}, nil)},
		{"directories in a loop", "directories form a loop",
			tiffBlock(map[uint32][]entry{8: {{0x0112, 3, 1, 6}}, 40: {{0x0112, 3, 1, 3}}}, map[uint32]uint32{8: 40, 40: 8})},
	} {
		h, err := ScanBytes(withEXIF(c.tiff), 200)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if h.EXIFErr == nil || !strings.Contains(h.EXIFErr.Error(), c.want) || h.Orientation != 1 || h.Width != 8 {
			t.Errorf("%s: %+v, want EXIF problem %q", c.name, h, c.want)
		}
	}
	// A sound chain of two directories with a rational tag reads as before.
	sound := tiffBlock(map[uint32][]entry{8: {{0x0112, 3, 1, 6}, {0x011A, 5, 1, 100}}, 40: {{0x0112, 3, 1, 3}}}, map[uint32]uint32{8: 40})
	if h, err := ScanBytes(withEXIF(sound), 200); err != nil || h.EXIFErr != nil || h.Orientation != 6 {
		t.Errorf("sound layout: %+v, %v; want orientation 6 and no EXIF problem", h, err)
	}
}
