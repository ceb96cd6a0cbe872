package survey

import (
	"bytes"
	"encoding/binary"
	"unicode/utf16"
	"unicode/utf8"
)

// Byte-order marks a text editor may put at the start of a file.
var (
	bomUTF8    = []byte{0xEF, 0xBB, 0xBF}
	bomUTF16LE = []byte{0xFF, 0xFE}
	bomUTF16BE = []byte{0xFE, 0xFF}
)

// decodeText turns a checklist's bytes into UTF-8 without a byte-order mark:
// a UTF-8 mark is dropped, UTF-16 with its mark (what some Windows editors
// save as "Unicode") is decoded. The lines stay the lines of the file. It
// returns a problem message when the text cannot be read as UTF-8, and the
// line of the first bad byte.
func decodeText(src []byte) (text []byte, line int, problem string) {
	switch {
	case bytes.HasPrefix(src, bomUTF8):
		src = src[len(bomUTF8):]
	case bytes.HasPrefix(src, bomUTF16LE):
		src = decodeUTF16(src[2:], binary.LittleEndian)
	case bytes.HasPrefix(src, bomUTF16BE):
		src = decodeUTF16(src[2:], binary.BigEndian)
	}
	if i := bytes.IndexByte(src, 0); i >= 0 {
		return nil, 1, "the file holds NUL bytes: it is not UTF-8 text (UTF-16 without a byte-order mark?); save it as UTF-8"
	}
	if !utf8.Valid(src) {
		bad := 0
		for bad < len(src) {
			r, n := utf8.DecodeRune(src[bad:])
			if r == utf8.RuneError && n <= 1 {
				break
			}
			bad += n
		}
		return src, bytes.Count(src[:bad], []byte("\n")) + 1, "this line is not UTF-8 text (the file was saved in another encoding, such as Windows-1252 or Latin-1): save it as UTF-8"
	}
	return src, 0, ""
}

// decodeUTF16 decodes UTF-16 in the given byte order to UTF-8; an odd last
// byte and unpaired surrogates become U+FFFD.
func decodeUTF16(b []byte, order binary.ByteOrder) []byte {
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
