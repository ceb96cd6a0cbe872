package intake

import "github.com/lossline/lossline/internal/textfile"

// decodeText returns data as UTF-8 text without a byte-order mark and the
// encoding it was in, or the line of the first bad byte and why it cannot
// be read.
func decodeText(data []byte) (text string, enc textfile.Encoding, line int, why string) {
	b, enc, line, why := textfile.Decode(data)
	if why != "" {
		return "", enc, line, why
	}
	return string(b), enc, 0, ""
}

// encodeText writes UTF-8 text back in enc, with its byte-order mark.
func encodeText(text string, enc textfile.Encoding) []byte { return textfile.Encode(text, enc) }
