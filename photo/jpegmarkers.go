package photo

import (
	"bufio"
	"bytes"
	"image/jpeg"
	"io"
)

// JPEG marker codes (ITU-T T.81, Table B.1).
const (
	markerSOF0  = 0xC0 // baseline sequential frame
	markerSOF1  = 0xC1 // extended sequential frame
	markerSOF2  = 0xC2 // progressive frame
	markerDHT   = 0xC4
	markerRST0  = 0xD0
	markerRST7  = 0xD7
	markerSOI   = 0xD8
	markerEOI   = 0xD9
	markerSOS   = 0xDA
	markerDQT   = 0xDB
	markerDRI   = 0xDD
	markerAPP0  = 0xE0
	markerAPP1  = 0xE1
	markerAPP14 = 0xEE
	markerAPP15 = 0xEF
	markerCOM   = 0xFE
)

// component is one image component of a frame header (T.81 B.2.2).
type component struct {
	id   byte
	h, v int // sampling factors, as image/jpeg takes them (1×1 for greyscale)
}

// layout is what a JPEG's marker segments say about it, read without
// decoding any pixel.
type layout struct {
	frame         byte // markerSOF0, markerSOF1 or markerSOF2
	width, height int
	comps         []component
	scans         int    // SOS markers up to the end of the image
	jfif          bool   // the last APP0 segment is JFIF (image/jpeg then takes 3 components as YCbCr)
	adobe         bool   // an APP14 Adobe segment was read
	transform     byte   // its colour transform (0: none, in practice RGB or CMYK)
	exif          []byte // the TIFF block of the first APP1 "Exif\0\0" segment; nil when none
}

// readLayout reads a JPEG's marker segments up to its first scan (the frame
// header, the EXIF block) and past it only the markers, to count the scans up
// to the end of the image. It accepts what image/jpeg accepts (the same
// markers, extraneous bytes and fill bytes) and judges the frame header with
// image/jpeg's own reader. Memory stays bounded whatever the input: segments
// other than the frame header and the EXIF block (at most 64 KiB) are skipped,
// never held.
func readLayout(r *bufio.Reader) (*layout, error) {
	var soi [2]byte
	if _, err := io.ReadFull(r, soi[:]); err != nil || soi != [2]byte{0xFF, markerSOI} {
		return nil, jpeg.FormatError("missing SOI marker")
	}
	l := &layout{}
	for l.scans == 0 {
		m, err := nextMarker(r)
		if err != nil {
			return nil, unexpectedEOF(err)
		}
		if m == markerEOI {
			return nil, jpeg.FormatError("missing SOS marker")
		}
		if markerRST0 <= m && m <= markerRST7 {
			continue
		}
		n, err := segmentLength(r)
		if err != nil {
			return nil, err
		}
		switch {
		case m == markerSOF0 || m == markerSOF1 || m == markerSOF2:
			err = l.readFrame(r, m, n)
		case m == markerSOS:
			if l.comps == nil {
				return nil, jpeg.FormatError("missing SOF marker")
			}
			l.scans = 1
			err = skip(r, n)
		case m == markerAPP0:
			err = l.readAPP0(r, n)
		case m == markerAPP1:
			err = l.readAPP1(r, n)
		case m == markerAPP14:
			err = l.readAPP14(r, n)
		default:
			err = skipKnown(r, m, n)
		}
		if err != nil {
			return nil, err
		}
	}
	// Past the first scan header: entropy-coded data never holds 0xFF followed
	// by a marker code (T.81 B.1.1.5: a data byte 0xFF is written 0xFF 0x00),
	// so the markers found are the segments between scans.
	for {
		m, err := nextMarker(r)
		if err == nil && m == markerEOI {
			return l, nil // anything after it (a second image of a camera's MPF set) is not this image
		}
		if err == nil && (m < markerRST0 || m > markerRST7) {
			var n int
			if n, err = segmentLength(r); err == nil {
				switch m {
				case markerSOS:
					l.scans++
					err = skip(r, n)
				case markerSOF0, markerSOF1, markerSOF2:
					err = jpeg.FormatError("multiple SOF markers")
				default:
					err = skipKnown(r, m, n)
				}
			}
		}
		if err == io.EOF || err == io.ErrUnexpectedEOF {
			return l, nil // a file cut short: its decoding will say so
		}
		if err != nil {
			return nil, err
		}
	}
}

// nextMarker reads up to the next marker and returns its code, passing over
// what image/jpeg passes over: bytes other than 0xFF, the pair 0xFF 0x00
// (stuffed data) and fill bytes 0xFF before a marker (T.81 B.1.1.2).
func nextMarker(r *bufio.Reader) (byte, error) {
	for {
		if _, err := r.ReadSlice(0xFF); err == bufio.ErrBufferFull {
			continue
		} else if err != nil {
			return 0, err
		}
		m, err := r.ReadByte()
		for err == nil && m == 0xFF {
			m, err = r.ReadByte()
		}
		if err != nil {
			return 0, err
		}
		if m != 0 {
			return m, nil
		}
	}
}

// segmentLength reads a marker segment's length field and returns the length
// of the rest of the segment.
func segmentLength(r *bufio.Reader) (int, error) {
	var b [2]byte
	if _, err := io.ReadFull(r, b[:]); err != nil {
		return 0, unexpectedEOF(err)
	}
	n := int(b[0])<<8 | int(b[1]) - 2
	if n < 0 {
		return 0, jpeg.FormatError("short segment length")
	}
	return n, nil
}

// skipKnown passes over a segment image/jpeg passes over while reading
// headers (tables, restart interval, application data, comments) and refuses
// the markers it does not read, with its messages.
func skipKnown(r *bufio.Reader, m byte, n int) error {
	switch {
	case m == markerDHT || m == markerDQT || m == markerDRI || markerAPP0 <= m && m <= markerAPP15 || m == markerCOM:
		return skip(r, n)
	case m < markerSOF0:
		return jpeg.FormatError("unknown marker")
	}
	return jpeg.UnsupportedError("unknown marker")
}

func skip(r *bufio.Reader, n int) error {
	_, err := r.Discard(n)
	return unexpectedEOF(err)
}

func unexpectedEOF(err error) error {
	if err == io.EOF {
		return io.ErrUnexpectedEOF
	}
	return err
}

// readFrame reads the frame header (T.81 B.2.2) and has image/jpeg judge it,
// so a frame accepted here is one image/jpeg decodes.
func (l *layout) readFrame(r *bufio.Reader, m byte, n int) error {
	if l.comps != nil {
		return jpeg.FormatError("multiple SOF markers")
	}
	if n != 6+3*1 && n != 6+3*3 && n != 6+3*4 {
		return jpeg.UnsupportedError("number of components")
	}
	seg := make([]byte, n)
	if _, err := io.ReadFull(r, seg); err != nil {
		return unexpectedEOF(err)
	}
	// SOI, this frame header and an empty scan header: image/jpeg's
	// DecodeConfig stops at the scan header, so this is all it reads.
	probe := append([]byte{0xFF, markerSOI, 0xFF, m, byte((n + 2) >> 8), byte(n + 2)}, seg...)
	probe = append(probe, 0xFF, markerSOS, 0, 2)
	cfg, err := jpeg.DecodeConfig(bytes.NewReader(probe))
	if err != nil {
		return err
	}
	if cfg.Width == 0 || cfg.Height == 0 {
		return jpeg.UnsupportedError("image size given later in the file (DNL)")
	}
	l.frame, l.width, l.height = m, cfg.Width, cfg.Height
	nc := int(seg[5])
	for i := range nc {
		c := component{id: seg[6+3*i], h: int(seg[7+3*i] >> 4), v: int(seg[7+3*i] & 0x0F)}
		if nc == 1 {
			c.h, c.v = 1, 1 // image/jpeg reads a single component as 1×1 blocks
		}
		l.comps = append(l.comps, c)
	}
	return nil
}

// readAPP0 notes whether an APP0 segment is JFIF, as image/jpeg does.
func (l *layout) readAPP0(r *bufio.Reader, n int) error {
	if n >= 5 {
		b, err := r.Peek(5)
		if err != nil {
			return unexpectedEOF(err)
		}
		l.jfif = string(b) == "JFIF\x00"
	}
	return skip(r, n)
}

// readAPP14 notes an Adobe segment's colour transform, as image/jpeg does.
func (l *layout) readAPP14(r *bufio.Reader, n int) error {
	if n >= 12 {
		b, err := r.Peek(12)
		if err != nil {
			return unexpectedEOF(err)
		}
		if string(b[:5]) == "Adobe" {
			l.adobe, l.transform = true, b[11]
		}
	}
	return skip(r, n)
}

// readAPP1 keeps the TIFF block of the first EXIF segment (CIPA DC-008,
// 4.7.2: "Exif" and two zero bytes, then the TIFF header).
func (l *layout) readAPP1(r *bufio.Reader, n int) error {
	if l.exif == nil && n >= 6 {
		b, err := r.Peek(6)
		if err != nil {
			return unexpectedEOF(err)
		}
		if string(b) == "Exif\x00\x00" {
			seg := make([]byte, n)
			if _, err := io.ReadFull(r, seg); err != nil {
				return unexpectedEOF(err)
			}
			l.exif = seg[6:]
			return nil
		}
	}
	return skip(r, n)
}

// progressive reports whether a JPEG's frame is progressive (an SOF2 or
// later progressive start-of-frame marker before the first scan).
func progressive(data []byte) bool {
	i := 2
	for i+4 <= len(data) {
		if data[i] != 0xFF {
			return false
		}
		m := data[i+1]
		switch {
		case m == 0xFF: // fill byte
			i++
			continue
		case m == 0xC2 || m == 0xC6 || m == 0xCA || m == 0xCE:
			return true
		case m == 0xC0 || m == 0xC1 || m == 0xDA:
			return false
		}
		i += 2 + int(data[i+2])<<8 + int(data[i+3])
	}
	return false
}
