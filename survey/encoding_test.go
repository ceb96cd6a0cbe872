package survey

import (
	"encoding/binary"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"unicode/utf16"
)

// utf16Bytes encodes s as UTF-16 in the given byte order, after a byte-order
// mark when bom is set.
func utf16Bytes(s string, order binary.AppendByteOrder, bom bool) []byte {
	var b []byte
	units := utf16.Encode([]rune(s))
	if bom {
		units = append([]uint16{0xFEFF}, units...)
	}
	for _, u := range units {
		b = order.AppendUint16(b, u)
	}
	return b
}

// The same checklist saved with a UTF-8 byte-order mark, or as UTF-16 with
// its mark (what "Unicode" means in some Windows editors), reads the same,
// and its problems keep their lines.
func TestEncodingsReadTheSame(t *testing.T) {
	src, err := os.ReadFile(filepath.Join("..", "testdata", "bad", "duplicate-cml", "survey.md"))
	if err != nil {
		t.Fatal(err)
	}
	text := string(src)
	want, wantProblems := readChecklist("survey.md", src)
	for name, b := range map[string][]byte{
		"UTF-8 with BOM": append([]byte("\xef\xbb\xbf"), src...),
		"UTF-16 LE":      utf16Bytes(text, binary.LittleEndian, true),
		"UTF-16 BE":      utf16Bytes(text, binary.BigEndian, true),
		"UTF-16 LE CRLF": utf16Bytes(strings.ReplaceAll(text, "\n", "\r\n"), binary.LittleEndian, true),
	} {
		s, problems := readChecklist("survey.md", b)
		if s.Title != want.Title || len(s.AllCMLs()) != len(want.AllCMLs()) || s.Date != want.Date {
			t.Errorf("%s: title %q, %d CMLs, date %v", name, s.Title, len(s.AllCMLs()), s.Date)
		}
		if len(problems) != len(wantProblems) {
			t.Errorf("%s: problems %v, want %v", name, problems, wantProblems)
			continue
		}
		for i := range problems {
			if problems[i].String() != wantProblems[i].String() {
				t.Errorf("%s: problem %v, want %v", name, problems[i], wantProblems[i])
			}
		}
	}
}

func TestEncodingsRefused(t *testing.T) {
	good := "---\ntitle: x\ndate: 2025-07-01\nunits: mm\n---\n## C\n\n| CML | 2025-06-01 |\n|---|---|\n| A | 12.5 |\n"
	for _, c := range []struct {
		name string
		src  []byte
		want string
	}{
		{"UTF-16 without a byte-order mark", utf16Bytes(good, binary.LittleEndian, false), "survey.md:1: the file holds NUL bytes: it is not UTF-8 text (UTF-16 without a byte-order mark?); save it as UTF-8"},
		{"Windows-1252 degree sign on line 6", []byte(strings.Replace(good, "## C", "## C at 90\xb0", 1)), "survey.md:6: this line is not UTF-8 text"},
	} {
		_, problems := readChecklist("survey.md", c.src)
		wantError(t, c.name, problems, c.want)
	}
}
