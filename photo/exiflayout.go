package photo

import (
	"bytes"
	"encoding/binary"
	"errors"
	"fmt"
	"math"
)

// checkEXIFLayout walks the EXIF directories of a JPEG the way goexif
// (v0.0.0-20190401172101) reads them and refuses the two damaged layouts it
// cannot survive: a tag whose type size × count needs more than 32 bits
// (goexif computes the length in 32 bits, reads the wrapped short value and
// then allocates by the count: gigabytes, a fatal out-of-memory that recover
// cannot catch), and a chain of directories that loops (goexif notices only a
// directory naming itself as the next, and otherwise reads on without end).
// Other damage is left to goexif, which reports it as an error.
func checkEXIFLayout(jpegData []byte) error {
	t := exifTIFF(jpegData)
	if len(t) < 8 {
		return nil
	}
	var order binary.ByteOrder
	switch string(t[:2]) {
	case "II":
		order = binary.LittleEndian
	case "MM":
		order = binary.BigEndian
	default:
		return nil
	}
	if int16(order.Uint16(t[2:])) != 42 {
		return nil
	}
	// The chain from the header. A directory goexif cannot read ends its work
	// on the file, before any sub-directory.
	var pointers []int64
	seen := map[int64]bool{}
	for off := int64(int32(order.Uint32(t[4:]))); off != 0; {
		if seen[off] {
			return errors.New("damaged EXIF header: its directories form a loop")
		}
		seen[off] = true
		dir, ok, err := readIFD(t, order, off)
		if err != nil || !ok || dir.next == off {
			return err
		}
		pointers = append(pointers, dir.pointers...)
		off = dir.next
	}
	// goexif reads the Exif, GPS and interoperability sub-directories, each
	// without its chain; following every such pointer from every directory
	// covers them.
	for len(pointers) > 0 {
		off := pointers[0]
		pointers = pointers[1:]
		if seen[off] {
			continue
		}
		seen[off] = true
		dir, ok, err := readIFD(t, order, off)
		if err != nil {
			return err
		}
		if ok {
			pointers = append(pointers, dir.pointers...)
		}
	}
	return nil
}

// exifTIFF finds the EXIF block as goexif does: after the first 0xFF 0xE1
// byte pair anywhere in the file whose length field is not empty, if that
// segment starts "Exif\0\0".
func exifTIFF(data []byte) []byte {
	for i := 0; ; {
		j := bytes.IndexByte(data[i:], 0xFF)
		if j < 0 || i+j+1 >= len(data) {
			return nil
		}
		i += j + 2
		if data[i-1] != 0xE1 {
			continue
		}
		if i+2 > len(data) {
			return nil
		}
		n := int(binary.BigEndian.Uint16(data[i:])) - 2
		i += 2
		if n == 0 {
			continue
		}
		if n < 6 || i+n > len(data) || string(data[i:i+6]) != "Exif\x00\x00" {
			return nil
		}
		return data[i+6 : i+n]
	}
}

// ifd is what checkEXIFLayout needs from one directory.
type ifd struct {
	next     int64   // offset of the next directory in the chain; 0 for none
	pointers []int64 // offsets of the Exif, GPS and interoperability directories it names
}

// tiffTypeSize is the size in bytes of each TIFF field type (TIFF 6.0, section 2).
var tiffTypeSize = [...]uint64{1: 1, 2: 1, 3: 2, 4: 4, 5: 8, 6: 1, 7: 1, 8: 2, 9: 4, 10: 8, 11: 4, 12: 8}

// readIFD reads the directory at off in t, stopping where goexif's reader
// stops: ok is false when goexif fails on the directory (harmlessly), and the
// error names a tag goexif would read with a wrapped length.
func readIFD(t []byte, order binary.ByteOrder, off int64) (d ifd, ok bool, err error) {
	if off < 0 || off+2 > int64(len(t)) {
		return d, false, nil
	}
	p := int(off)
	n := int(int16(order.Uint16(t[p:])))
	p += 2
	for range max(n, 0) {
		if p+8 > len(t) {
			return d, false, nil
		}
		id, typ, count := order.Uint16(t[p:]), order.Uint16(t[p+2:]), order.Uint32(t[p+4:])
		p += 8
		if count == math.MaxUint32 || int(typ) >= len(tiffTypeSize) || tiffTypeSize[typ] == 0 {
			return d, false, nil
		}
		length := tiffTypeSize[typ] * uint64(count)
		read := uint64(uint32(length)) // goexif's 32-bit length
		var val []byte
		switch {
		case read == 0:
			return d, false, nil
		case read > 4:
			var voff uint64 // goexif keeps 0 when the offset cannot be read, and is then at the end
			if p+4 <= len(t) {
				voff = uint64(order.Uint32(t[p:]))
				p += 4
			} else {
				p = len(t)
			}
			if voff+read > uint64(len(t)) {
				return d, false, nil
			}
			val = t[voff : voff+read]
		default:
			if p+4 > len(t) {
				return d, false, nil
			}
			val = t[p : p+int(read)]
			p += 4
		}
		if length != read {
			return d, false, fmt.Errorf("damaged EXIF header: tag %#04x declares %d values of %d bytes", id, count, tiffTypeSize[typ])
		}
		if id == 0x8769 || id == 0x8825 || id == 0xA005 { // Exif, GPS, interoperability directory
			if v, isInt := firstInt(val, typ, order); isInt {
				d.pointers = append(d.pointers, v)
			}
		}
	}
	if p+4 > len(t) {
		return d, false, nil
	}
	d.next = int64(int32(order.Uint32(t[p:])))
	return d, true, nil
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
