package textfile

import (
	"bytes"
	"testing"
)

// The byte-order marks are those of the Unicode Standard, §23.8 (U+FEFF in
// each encoding form); each encoding read comes back unchanged when written.
func TestRoundTrip(t *testing.T) {
	text := "CML;Wand\nA-01;7,5 °\n"
	for _, c := range []struct {
		enc  Encoding
		mark []byte
	}{{UTF8, nil}, {UTF8BOM, []byte{0xEF, 0xBB, 0xBF}}, {UTF16LE, []byte{0xFF, 0xFE}}, {UTF16BE, []byte{0xFE, 0xFF}}} {
		data := Encode(text, c.enc)
		if !bytes.HasPrefix(data, c.mark) {
			t.Errorf("%s: written without its mark % x", c.enc, c.mark)
		}
		got, enc, _, why := Decode(data)
		if string(got) != text || enc != c.enc || why != "" {
			t.Errorf("%s: read back %q as %s (%s)", c.enc, got, enc, why)
		}
	}
}

func TestBadText(t *testing.T) {
	if _, _, line, why := Decode([]byte("a\nb\n\xb0c\n")); line != 3 || why == "" {
		t.Errorf("Latin-1 byte on line 3: line %d, %q", line, why)
	}
	if got, _, line, why := Decode([]byte("a\nb\x00\n")); got != nil || line != 2 || why == "" {
		t.Errorf("NUL on line 2: %q line %d, %q", got, line, why)
	}
}
