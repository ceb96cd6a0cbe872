// Package textfile reads the text files a user hands lossline (the
// checklist, CSV exports) in the encodings editors save them in, and writes
// text back in the encoding it came in.
package textfile

import (
	"bytes"
	"encoding/binary"
	"unicode/utf16"
	"unicode/utf8"
)

// Encoding is how a text file's characters are stored.
type Encoding int

// The encodings read: UTF-8 with or without a byte-order mark, and UTF-16
// with one (what some Windows programs save as "Unicode"). The marks are
// those of the Unicode Standard, §23.8 (U+FEFF).
const (
	UTF8 Encoding = iota
	UTF8BOM
	UTF16LE
	UTF16BE
)

var encodingNames = []string{"UTF-8", "UTF-8 with byte-order mark", "UTF-16 little-endian", "UTF-16 big-endian"}

func (e Encoding) String() string { return encodingNames[e] }

var (
	bomUTF8    = []byte{0xEF, 0xBB, 0xBF}
	bomUTF16LE = []byte{0xFF, 0xFE}
	bomUTF16BE = []byte{0xFE, 0xFF}
)

// Decode returns data as UTF-8 text without a byte-order mark and the
// encoding it was in; the lines stay the lines of the file. When the text
// cannot be read it also returns the line of the first bad byte and why.
// Text that is not valid UTF-8 still comes back (a reader may go on to find
// other problems); a file with NUL bytes comes back as nil.
func Decode(data []byte) (text []byte, enc Encoding, line int, why string) {
	switch {
	case bytes.HasPrefix(data, bomUTF8):
		data, enc = data[len(bomUTF8):], UTF8BOM
	case bytes.HasPrefix(data, bomUTF16LE):
		data, enc = fromUTF16(data[2:], binary.LittleEndian), UTF16LE
	case bytes.HasPrefix(data, bomUTF16BE):
		data, enc = fromUTF16(data[2:], binary.BigEndian), UTF16BE
	}
	if i := bytes.IndexByte(data, 0); i >= 0 {
		return nil, enc, bytes.Count(data[:i], []byte("\n")) + 1,
			"the file holds NUL bytes: it is not UTF-8 text (UTF-16 without a byte-order mark?); save it as UTF-8"
	}
	if !utf8.Valid(data) {
		bad := 0
		for bad < len(data) {
			r, n := utf8.DecodeRune(data[bad:])
			if r == utf8.RuneError && n <= 1 {
				break
			}
			bad += n
		}
		return data, enc, bytes.Count(data[:bad], []byte("\n")) + 1,
			"this line is not UTF-8 text (the file was saved in another encoding, such as Windows-1252 or Latin-1): save it as UTF-8"
	}
	return data, enc, 0, ""
}

// Encode writes UTF-8 text back in enc, with its byte-order mark.
func Encode(text string, enc Encoding) []byte {
	switch enc {
	case UTF8BOM:
		return append(bytes.Clone(bomUTF8), text...)
	case UTF16LE, UTF16BE:
		var order binary.AppendByteOrder = binary.LittleEndian
		out := bytes.Clone(bomUTF16LE)
		if enc == UTF16BE {
			order, out = binary.BigEndian, bytes.Clone(bomUTF16BE)
		}
		for _, u := range utf16.Encode([]rune(text)) {
			out = order.AppendUint16(out, u)
		}
		return out
	}
	return []byte(text)
}

// fromUTF16 decodes UTF-16 in the given byte order to UTF-8; an odd last
// byte and unpaired surrogates become U+FFFD.
func fromUTF16(b []byte, order binary.ByteOrder) []byte {
	units := make([]uint16, len(b)/2)
	for i := range units {
		units[i] = order.Uint16(b[2*i:])
	}
	out := []byte(string(utf16.Decode(units)))
	if len(b)%2 == 1 {
		out = utf8.AppendRune(out, utf8.RuneError)
	}
	return out
}
