// Package jpegscans writes JPEGs of any declared size made of any number of
// scans, to generate test fixtures: the picture is flat mid-grey and its coded
// data a few bits a block, so a file declaring megapixels takes kilobytes and
// image/jpeg decodes it. lossline itself never writes such files.
package jpegscans

import "bytes"

// Layout is a frame's components and their sampling factors.
type Layout int

const (
	Grey     Layout = iota // one component
	YCbCr420               // Y 2×2, Cb and Cr 1×1 (JFIF)
	YCbCr444               // Y, Cb and Cr 1×1 (JFIF)
	CMYK                   // four components 1×1, Adobe transform 0
)

// sampling is the packed H/V sampling factor of each component (T.81 B.2.2).
func (l Layout) sampling() []byte {
	switch l {
	case YCbCr420:
		return []byte{0x22, 0x11, 0x11}
	case YCbCr444:
		return []byte{0x11, 0x11, 0x11}
	case CMYK:
		return []byte{0x11, 0x11, 0x11, 0x11}
	}
	return []byte{0x11}
}

// Progressive writes a progressive JPEG (SOF2) of w × h pixels in n scans
// (n ≥ 1): a DC scan of all components, then AC scans of coefficients 1 to
// 63, one component each in turn, each coding end-of-band runs only.
func Progressive(w, h int, l Layout, n int) []byte {
	f := newFile(w, h, l, 0xC2, 0xE0)
	all := make([]int, len(f.sampling))
	for i := range all {
		all[i] = i
	}
	f.scan(all, 0, 0, repeat("0", f.blocks(all)))
	for i := 1; i < n; i++ {
		c := []int{(i - 1) % len(f.sampling)}
		// 0xE0 then 14 one bits: a run of 2^14 + 2^14 - 1 blocks.
		f.scan(c, 1, 63, repeat("011111111111111", (f.blocks(c)+32766)/32767))
	}
	return f.end()
}

// Sequential writes a baseline JPEG (SOF0) of w × h pixels in n scans, each
// coding one component whole, in turn: n above the number of components codes
// some of them again, which the standard does not allow (T.81 B.2.3: a
// sequential scan spans coefficients 0 to 63).
func Sequential(w, h int, l Layout, n int) []byte {
	f := newFile(w, h, l, 0xC0, 0x00)
	for i := range n {
		c := []int{i % len(f.sampling)}
		f.scan(c, 0, 63, repeat("00", f.blocks(c))) // DC category 0, then end of block
	}
	return f.end()
}

// file is a JPEG being written.
type file struct {
	bytes.Buffer
	w, h     int
	sampling []byte
}

// newFile writes the headers: JFIF or Adobe segment, a quantisation table of
// ones, the frame header and two Huffman tables of one one-bit code each: DC
// difference category 0, and the AC symbol ac (0xE0, an end-of-band run of
// 2^14 plus 14 bits, T.81 G.1.2.2; or 0x00, end of block).
func newFile(w, h int, l Layout, sof, ac byte) *file {
	f := &file{w: w, h: h, sampling: l.sampling()}
	f.Write([]byte{0xFF, 0xD8})
	if l == CMYK {
		f.segment(0xEE, []byte{'A', 'd', 'o', 'b', 'e', 0, 100, 0, 0, 0, 0, 0})
	} else {
		f.segment(0xE0, []byte("JFIF\x00\x01\x01\x00\x00\x01\x00\x01\x00\x00"))
	}
	q := make([]byte, 65)
	for i := 1; i < 65; i++ {
		q[i] = 1
	}
	f.segment(0xDB, q)
	frame := []byte{8, byte(h >> 8), byte(h), byte(w >> 8), byte(w), byte(len(f.sampling))}
	for i, s := range f.sampling {
		frame = append(frame, byte(i+1), s, 0)
	}
	f.segment(sof, frame)
	table := func(class byte, symbol byte) []byte {
		t := make([]byte, 1+16+1)
		t[0], t[1], t[17] = class<<4, 1, symbol
		return t
	}
	f.segment(0xC4, append(table(0, 0), table(1, ac)...))
	return f
}

// blocks is how many 8×8 blocks a scan of the components codes, counted in
// whole MCUs (image/jpeg reads the data it needs and passes over the rest).
func (f *file) blocks(comps []int) int {
	h0, v0 := int(f.sampling[0]>>4), int(f.sampling[0]&15)
	mxx, myy := (f.w+8*h0-1)/(8*h0), (f.h+8*v0-1)/(8*v0)
	n := 0
	for _, c := range comps {
		n += mxx * myy * int(f.sampling[c]>>4) * int(f.sampling[c]&15)
	}
	return n
}

// scan writes a scan header for the components (0-based) and coefficients
// ss to se, then the coded bits, padded with ones and byte-stuffed (T.81
// B.1.1.5, F.1.2.3).
func (f *file) scan(comps []int, ss, se int, bits []byte) {
	hdr := []byte{byte(len(comps))}
	for _, c := range comps {
		hdr = append(hdr, byte(c+1), 0x00)
	}
	hdr = append(hdr, byte(ss), byte(se), 0)
	f.segment(0xDA, hdr)
	var acc, n uint
	put := func(b byte) {
		f.WriteByte(b)
		if b == 0xFF {
			f.WriteByte(0)
		}
	}
	for _, b := range bits {
		acc, n = acc<<1|uint(b-'0'), n+1
		if n == 8 {
			put(byte(acc))
			acc, n = 0, 0
		}
	}
	if n > 0 {
		put(byte(acc<<(8-n) | (1<<(8-n) - 1)))
	}
}

func (f *file) segment(marker byte, payload []byte) {
	n := len(payload) + 2
	f.Write([]byte{0xFF, marker, byte(n >> 8), byte(n)})
	f.Write(payload)
}

func (f *file) end() []byte {
	f.Write([]byte{0xFF, 0xD9})
	return f.Bytes()
}

// repeat is s n times, as bits.
func repeat(s string, n int) []byte {
	return bytes.Repeat([]byte(s), n)
}
