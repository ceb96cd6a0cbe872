// Package jpegexif writes JPEG files with a minimal EXIF header: time taken,
// GPS position and orientation. It exists to generate reproducible photo
// fixtures; lossline itself only reads EXIF.
package jpegexif

import (
	"bytes"
	"encoding/binary"
	"fmt"
	"image"
	"image/jpeg"
	"math"
	"sort"
	"time"
)

// Header is what the EXIF block records.
type Header struct {
	Taken       time.Time // written as DateTimeOriginal, camera wall clock
	Lat, Lon    float64   // decimal degrees, WGS 84
	HasGPS      bool
	Orientation int // 1..8, 0 to omit
}

// Encode writes img as a JPEG at the given quality with the EXIF header h.
func Encode(img image.Image, quality int, h Header) ([]byte, error) {
	var buf bytes.Buffer
	if err := jpeg.Encode(&buf, img, &jpeg.Options{Quality: quality}); err != nil {
		return nil, err
	}
	return WithHeader(buf.Bytes(), h)
}

// WithHeader inserts the EXIF header h into a JPEG that has none.
func WithHeader(plain []byte, h Header) ([]byte, error) {
	if len(plain) < 2 || plain[0] != 0xFF || plain[1] != 0xD8 {
		return nil, fmt.Errorf("no JPEG start marker")
	}
	app1 := append([]byte("Exif\x00\x00"), tiff(h)...)
	out := []byte{0xFF, 0xD8, 0xFF, 0xE1}
	out = binary.BigEndian.AppendUint16(out, uint16(len(app1)+2))
	out = append(out, app1...)
	return append(out, plain[2:]...), nil
}

// TIFF field types.
const (
	typeByte     = 1
	typeASCII    = 2
	typeShort    = 3
	typeLong     = 4
	typeRational = 5
)

type entry struct {
	tag, typ uint16
	count    uint32
	value    []byte // big-endian encoded value
}

var be = binary.BigEndian

func short(tag, v uint16) entry { return entry{tag, typeShort, 1, be.AppendUint16(nil, v)} }
func long(tag uint16, v uint32) entry {
	return entry{tag, typeLong, 1, be.AppendUint32(nil, v)}
}
func ascii(tag uint16, s string) entry {
	return entry{tag, typeASCII, uint32(len(s) + 1), append([]byte(s), 0)}
}
func rationals(tag uint16, vals ...[2]uint32) entry {
	var b []byte
	for _, v := range vals {
		b = be.AppendUint32(b, v[0])
		b = be.AppendUint32(b, v[1])
	}
	return entry{tag, typeRational, uint32(len(vals)), b}
}

// dms writes decimal degrees as degrees, minutes and seconds/10000 rationals.
func dms(deg float64) [][2]uint32 {
	deg = math.Abs(deg)
	d := math.Floor(deg)
	m := math.Floor((deg - d) * 60)
	s := ((deg-d)*60 - m) * 60
	return [][2]uint32{{uint32(d), 1}, {uint32(m), 1}, {uint32(math.Round(s * 10000)), 10000}}
}

func ifdSize(entries []entry) int {
	n := 2 + 12*len(entries) + 4
	for _, e := range entries {
		if len(e.value) > 4 {
			n += len(e.value) + len(e.value)%2
		}
	}
	return n
}

// ifd encodes entries as an IFD starting at offset (from the TIFF header).
func ifd(entries []entry, offset int) []byte {
	sort.Slice(entries, func(i, j int) bool { return entries[i].tag < entries[j].tag })
	out := be.AppendUint16(nil, uint16(len(entries)))
	data := []byte{}
	dataStart := offset + 2 + 12*len(entries) + 4
	for _, e := range entries {
		out = be.AppendUint16(out, e.tag)
		out = be.AppendUint16(out, e.typ)
		out = be.AppendUint32(out, e.count)
		if len(e.value) <= 4 {
			v := make([]byte, 4)
			copy(v, e.value)
			out = append(out, v...)
		} else {
			out = be.AppendUint32(out, uint32(dataStart+len(data)))
			data = append(data, e.value...)
			if len(data)%2 == 1 {
				data = append(data, 0)
			}
		}
	}
	out = be.AppendUint32(out, 0) // no next IFD
	return append(out, data...)
}

func tiff(h Header) []byte {
	exifEntries := []entry{ascii(0x9003, h.Taken.Format("2006:01:02 15:04:05"))}
	var gpsEntries []entry
	if h.HasGPS {
		latRef, lonRef := "N", "E"
		if h.Lat < 0 {
			latRef = "S"
		}
		if h.Lon < 0 {
			lonRef = "W"
		}
		gpsEntries = []entry{
			{0x0000, typeByte, 4, []byte{2, 3, 0, 0}},
			ascii(0x0001, latRef), rationals(0x0002, dms(h.Lat)...),
			ascii(0x0003, lonRef), rationals(0x0004, dms(h.Lon)...),
		}
	}
	ifd0 := []entry{long(0x8769, 0)}
	if h.Orientation > 0 {
		ifd0 = append(ifd0, short(0x0112, uint16(h.Orientation)))
	}
	if h.HasGPS {
		ifd0 = append(ifd0, long(0x8825, 0))
	}
	exifOff := 8 + ifdSize(ifd0)
	exifIFD := ifd(exifEntries, exifOff)
	gpsOff := exifOff + len(exifIFD)
	for i := range ifd0 {
		switch ifd0[i].tag {
		case 0x8769:
			ifd0[i] = long(0x8769, uint32(exifOff))
		case 0x8825:
			ifd0[i] = long(0x8825, uint32(gpsOff))
		}
	}
	out := []byte{'M', 'M', 0, 42, 0, 0, 0, 8}
	out = append(out, ifd(ifd0, 8)...)
	out = append(out, exifIFD...)
	if h.HasGPS {
		out = append(out, ifd(gpsEntries, gpsOff)...)
	}
	return out
}
