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
	size := 256
	for off, es := range dirs {
		size = max(size, int(off)+2+12*len(es)+4)
	}
	b := make([]byte, size)
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

// exifCase is an EXIF block checkEXIF refuses, and why.
type exifCase struct {
	name, want string
	tiff       []byte
}

// damagedEXIFCases are the layouts that made goexif exhaust memory (a count
// whose size wraps in 32 bits) or read forever (a loop), and the others
// checkEXIF bounds. Tag numbers from CIPA DC-008 (Exif 2.3): 0x0112
// orientation, 0x011A XResolution (rational), 0x010F Make, 0x8769 the Exif
// directory, 0x8825 the GPS directory.
func damagedEXIFCases() []exifCase {
	const huge = 0x20000001 // × 8 bytes per rational wraps to 8 in 32 bits
	return []exifCase{
		{"huge count in IFD0", "declares 536870913 values of 8 bytes",
			tiffBlock(map[uint32][]entry{8: {{0x011A, 5, huge, 0}}}, nil)},
		{"huge count in the GPS directory", "declares 536870913 values of 8 bytes",
			tiffBlock(map[uint32][]entry{8: {{0x0112, 3, 1, 6}, {0x8825, 4, 1, 40}}, 40: {{0x0002, 5, huge, 0}}}, nil)},
		{"directories in a loop", "directories form a loop",
			tiffBlock(map[uint32][]entry{8: {{0x0112, 3, 1, 6}}, 40: {{0x0112, 3, 1, 3}}}, map[uint32]uint32{8: 40, 40: 8})},
		{"GPS directory pointing back at IFD0", "directories form a loop (offset 8 reached twice)",
			tiffBlock(map[uint32][]entry{8: {{0x0112, 3, 1, 6}, {0x8825, 4, 1, 8}}}, nil)},
		{"chain of eleven directories", "more than 10 directories",
			tiffBlock(chain(11), nextInChain(11))},
		{"1001 entries", "directory at offset 8 has 1001 entries (limit 1000)",
			tiffBlock(map[uint32][]entry{8: make([]entry, 1001)}, nil)},
		{"directory past the end", "directory at offset 250 runs past the end of the block",
			tiffBlock(map[uint32][]entry{8: {{0x8769, 4, 1, 250}}, 250: {{0x9003, 2, 20, 100}, {0x9004, 2, 20, 100}}}, nil)[:256]},
		{"Exif directory outside", "directory at offset 70000 lies outside the block",
			tiffBlock(map[uint32][]entry{8: {{0x8769, 4, 1, 70000}}}, nil)},
		{"value past the end", "tag 0x010f declares 300 values of 1 bytes, more than the block holds",
			tiffBlock(map[uint32][]entry{8: {{0x010F, 2, 300, 100}}}, nil)},
		{"40 tags sharing one value", "tag values add up to more than 4 times the block",
			tiffBlock(map[uint32][]entry{8: sharing(40, 200)}, nil)},
	}
}

// A damaged layout is refused as a damaged EXIF header before goexif reads
// it; the photo stays usable without its EXIF data.
func TestDamagedEXIFLayouts(t *testing.T) {
	for _, c := range damagedEXIFCases() {
		h, err := ScanBytes(withEXIF(c.tiff), 200)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if h.EXIFErr == nil || !strings.Contains(h.EXIFErr.Error(), c.want) || h.Orientation != 1 || h.Width != 8 {
			t.Errorf("%s: %+v, want EXIF problem %q", c.name, h, c.want)
		}
	}
	// A sound chain of two directories with a rational tag reads as before;
	// so does a block sharing a value a few times.
	sound := tiffBlock(map[uint32][]entry{8: {{0x0112, 3, 1, 6}, {0x011A, 5, 1, 100}}, 40: {{0x0112, 3, 1, 3}}}, map[uint32]uint32{8: 40})
	if h, err := ScanBytes(withEXIF(sound), 200); err != nil || h.EXIFErr != nil || h.Orientation != 6 {
		t.Errorf("sound layout: %+v, %v; want orientation 6 and no EXIF problem", h, err)
	}
	shared := tiffBlock(map[uint32][]entry{8: append(sharing(3, 200), entry{0x0112, 3, 1, 6})}, nil)
	if h, err := ScanBytes(withEXIF(shared), 200); err != nil || h.EXIFErr != nil || h.Orientation != 6 {
		t.Errorf("shared values: %+v, %v; want orientation 6 and no EXIF problem", h, err)
	}
}

// chain is n directories of one orientation entry at offsets 8, 40, 72 …
func chain(n int) map[uint32][]entry {
	dirs := map[uint32][]entry{}
	for i := range n {
		dirs[uint32(8+32*i)] = []entry{{0x0112, 3, 1, 1}}
	}
	return dirs
}

// nextInChain links chain(n) in order.
func nextInChain(n int) map[uint32]uint32 {
	next := map[uint32]uint32{}
	for i := range n - 1 {
		next[uint32(8+32*i)] = uint32(8 + 32*(i+1))
	}
	return next
}

// sharing is n entries of type UNDEFINED whose values all lie at the same
// size bytes at offset 10.
func sharing(n int, size uint32) []entry {
	es := make([]entry, n)
	for i := range es {
		es[i] = entry{uint16(0xC000 + i), 7, size, 10}
	}
	return es
}

// goexif is handed the EXIF segment alone, found by the JPEG's structure: an
// XMP segment (also APP1) before it, or the bytes 0xFF 0xE1 inside a comment,
// do not hide it.
func TestEXIFSegmentFound(t *testing.T) {
	sound := tiffBlock(map[uint32][]entry{8: {{0x0112, 3, 1, 6}}}, nil)
	data := withEXIF(sound)
	xmp := append([]byte("http://ns.adobe.com/xap/1.0/\x00"), "<x:xmpmeta/>"...)
	seg := func(marker byte, payload []byte) []byte {
		return append([]byte{0xFF, marker, byte((len(payload) + 2) >> 8), byte(len(payload) + 2)}, payload...)
	}
	withXMP := append(append(append([]byte{0xFF, 0xD8}, seg(0xFE, []byte{0xFF, 0xE1, 0, 0})...), seg(0xE1, xmp)...), data[2:]...)
	if h, err := ScanBytes(withXMP, 200); err != nil || h.EXIFErr != nil || h.Orientation != 6 {
		t.Errorf("EXIF after a comment and XMP: %+v, %v; want orientation 6", h, err)
	}
}
