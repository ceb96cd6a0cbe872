package photo

import (
	"encoding/binary"
	"fmt"
)

// Limits of the EXIF structure handed to goexif. A camera writes five
// directories (IFD0, the Exif, GPS and interoperability directories, IFD1 for
// the thumbnail) of a few dozen entries each (CIPA DC-008, Exif 2.3, 4.6).
const (
	maxEXIFDirs    = 10
	maxEXIFEntries = 1000
	// Tag values out of line together at most this many times the block: in
	// a sound block they do not overlap, so they add up to less than it;
	// goexif copies each value out, so values that all point at the same
	// bytes would multiply its memory by the number of entries.
	maxEXIFValueShare = 4
)

// checkEXIF walks the TIFF structure of an EXIF block (TIFF 6.0, section 2)
// before goexif reads it and refuses a block that could make goexif loop,
// exhaust memory or read outside it: directories reached twice (a loop),
// more than maxEXIFDirs directories or maxEXIFEntries entries in one, a
// directory or a tag value that does not fit in the block (a count whose
// size overflows included), values that together exceed maxEXIFValueShare
// times the block. It follows what goexif follows: the chain of directories
// from the header, and the Exif, GPS and interoperability directories any of
// them names. The block is at most 64 KiB (one APP1 segment), so the walk is
// bounded too.
func checkEXIF(t []byte) error {
	if len(t) < 8 {
		return damagedEXIF("too short for a TIFF header")
	}
	var order binary.ByteOrder
	switch string(t[:2]) {
	case "II":
		order = binary.LittleEndian
	case "MM":
		order = binary.BigEndian
	default:
		return damagedEXIF("no TIFF byte order")
	}
	if order.Uint16(t[2:]) != 42 {
		return damagedEXIF("no TIFF header")
	}
	type dirRef struct {
		off   uint32
		chain bool // in the chain from the header: its next directory is read too
	}
	w := exifWalk{t: t, order: order, valueRoom: maxEXIFValueShare * uint64(len(t))}
	seen := map[uint32]bool{}
	queue := []dirRef{{order.Uint32(t[4:]), true}}
	for len(queue) > 0 {
		d := queue[0]
		queue = queue[1:]
		if seen[d.off] {
			return damagedEXIF(fmt.Sprintf("its directories form a loop (offset %d reached twice)", d.off))
		}
		seen[d.off] = true
		if len(seen) > maxEXIFDirs {
			return damagedEXIF(fmt.Sprintf("more than %d directories", maxEXIFDirs))
		}
		next, subs, err := w.dir(d.off)
		if err != nil {
			return err
		}
		if d.chain && next != 0 {
			queue = append(queue, dirRef{next, true})
		}
		for _, s := range subs {
			queue = append(queue, dirRef{s, false})
		}
	}
	return nil
}

func damagedEXIF(why string) error { return fmt.Errorf("damaged EXIF header: %s", why) }

// exifWalk is the state of one checkEXIF walk.
type exifWalk struct {
	t         []byte
	order     binary.ByteOrder
	valueRoom uint64 // bytes of out-of-line values still allowed
}

// tiffTypeSize is the size in bytes of each TIFF field type (TIFF 6.0,
// section 2), as goexif's table has them; other types it refuses itself,
// holding nothing.
var tiffTypeSize = [...]uint64{1: 1, 2: 1, 3: 2, 4: 4, 5: 8, 6: 1, 7: 1, 8: 2, 9: 4, 10: 8, 11: 4, 12: 8}

// dir checks the directory at off: its 2-byte entry count, 12-byte entries
// and 4-byte offset of the next directory, and every entry's value. It
// returns that offset and the directories the entries name.
func (w *exifWalk) dir(off uint32) (next uint32, subs []uint32, err error) {
	t := w.t
	if uint64(off)+2 > uint64(len(t)) {
		return 0, nil, damagedEXIF(fmt.Sprintf("directory at offset %d lies outside the block", off))
	}
	n := uint64(w.order.Uint16(t[off:]))
	if n > maxEXIFEntries {
		return 0, nil, damagedEXIF(fmt.Sprintf("directory at offset %d has %d entries (limit %d)", off, n, maxEXIFEntries))
	}
	end := uint64(off) + 2 + 12*n + 4
	if end > uint64(len(t)) {
		return 0, nil, damagedEXIF(fmt.Sprintf("directory at offset %d runs past the end of the block", off))
	}
	for i := range n {
		e := t[uint64(off)+2+12*i:]
		id, typ, count := w.order.Uint16(e), w.order.Uint16(e[2:]), w.order.Uint32(e[4:])
		if int(typ) >= len(tiffTypeSize) || tiffTypeSize[typ] == 0 || count == 0 {
			continue
		}
		size := tiffTypeSize[typ] * uint64(count)
		val := e[8 : 8+min(size, 4)]
		if size > 4 {
			voff := uint64(w.order.Uint32(e[8:]))
			if voff+size > uint64(len(t)) {
				return 0, nil, damagedEXIF(fmt.Sprintf("tag %#04x declares %d values of %d bytes, more than the block holds", id, count, tiffTypeSize[typ]))
			}
			if size > w.valueRoom {
				return 0, nil, damagedEXIF(fmt.Sprintf("tag values add up to more than %d times the block", maxEXIFValueShare))
			}
			w.valueRoom -= size
			val = t[voff : voff+size]
		}
		if id == 0x8769 || id == 0x8825 || id == 0xA005 { // Exif, GPS, interoperability directory
			if v, isInt := firstInt(val, typ, w.order); isInt {
				subs = append(subs, uint32(v))
			}
		}
	}
	return w.order.Uint32(t[end-4:]), subs, nil
}

// firstInt is the first value of an integer-typed tag, as goexif's Int64(0).
func firstInt(val []byte, typ uint16, order binary.ByteOrder) (int64, bool) {
	switch typ {
	case 1:
		return int64(val[0]), true
	case 6:
		return int64(int8(val[0])), true
	case 3:
		return int64(order.Uint16(val)), true
	case 8:
		return int64(int16(order.Uint16(val))), true
	case 4:
		return int64(order.Uint32(val)), true
	case 9:
		return int64(int32(order.Uint32(val))), true
	}
	return 0, false
}
