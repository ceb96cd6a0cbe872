package report

import (
	"bufio"
	"bytes"
	"compress/zlib"
	"fmt"
	"io"
	"regexp"
	"strconv"
)

// pageCompressor writes a PDF that fpdf made without compression with its
// page contents compressed by one zlib writer reused for every page (fpdf
// makes a new one, about 1 MB, for each page), and a new cross-reference
// table for the moved objects. Other streams (fonts, images) are copied as
// they are. It takes fpdf's output in one Write: fpdf hands over its whole
// buffer at once, and the pass reads it without copying.
type pageCompressor struct {
	w      io.Writer
	photos *photoSpool // writes the photos in place of their stand-ins; nil: none
	zw     *zlib.Writer
	buf    bytes.Buffer
	err    error
}

// pageDict is the dictionary fpdf writes for an uncompressed page content stream.
var pageDict = regexp.MustCompile(`^<</Length (\d+)>>$`)

// streamLength finds the /Length of a stream dictionary ("/Length1" of fonts is another key).
var streamLength = regexp.MustCompile(`/Length (\d+)[^0-9]`)

// objHeader is the line that opens an object: "12 0 obj".
var objHeader = regexp.MustCompile(`^(\d+) 0 obj$`)

// Write rewrites the whole PDF pdf to the underlying writer.
func (c *pageCompressor) Write(pdf []byte) (int, error) {
	if c.err != nil {
		return 0, c.err
	}
	if c.err = c.rewrite(pdf); c.err != nil {
		return 0, c.err
	}
	return len(pdf), nil
}

// rewrite copies pdf line by line outside streams, compressing page streams,
// recording where each object now starts and writing the xref table anew.
func (c *pageCompressor) rewrite(pdf []byte) error {
	out := bufio.NewWriterSize(c.w, 256<<10)
	var (
		written int64
		offsets []int64 // by object number
		dict    []byte  // the current object's lines before "stream"
		inObj   bool
	)
	put := func(b ...[]byte) {
		for _, p := range b {
			n, _ := out.Write(p)
			written += int64(n)
		}
	}
	nl := []byte("\n")
	for i := 0; i < len(pdf); {
		end := bytes.IndexByte(pdf[i:], '\n')
		if end < 0 {
			return fmt.Errorf("PDF: no line end after byte %d", i)
		}
		line := pdf[i : i+end]
		i += end + 1
		switch {
		case !inObj && objHeader.Match(line):
			n, _ := strconv.Atoi(string(objHeader.FindSubmatch(line)[1]))
			for len(offsets) <= n {
				offsets = append(offsets, 0)
			}
			offsets[n] = written
			put(line, nl)
			inObj, dict = true, dict[:0]
		case inObj && string(line) == "stream":
			m := streamLength.FindSubmatch(append(dict, ' '))
			if m == nil {
				return fmt.Errorf("PDF: a stream without a length before byte %d", i)
			}
			l, _ := strconv.Atoi(string(m[1]))
			if i+l > len(pdf) || !bytes.HasPrefix(pdf[i+l:], []byte("\nendstream\n")) {
				return fmt.Errorf("PDF: a stream of %d bytes at byte %d does not end where its length says", l, i)
			}
			data := pdf[i : i+l]
			i += l + len("\nendstream\n")
			if ph, ok := c.photos.photoOf(data); ok && bytes.Contains(dict, []byte("/Subtype /Image")) {
				n, err := c.photos.writeImage(out, ph)
				written += n
				if err != nil {
					return err
				}
			} else if pageDict.Match(bytes.TrimSuffix(dict, nl)) {
				z, err := c.compress(data)
				if err != nil {
					return err
				}
				put([]byte("<</Filter /FlateDecode /Length "+strconv.Itoa(len(z))+">>\nstream\n"), z, []byte("\nendstream\n"))
			} else {
				put(dict, []byte("stream\n"), data, []byte("\nendstream\n"))
			}
			dict = dict[:0]
		case inObj && string(line) == "endobj":
			put(dict, line, nl)
			inObj, dict = false, dict[:0]
		case inObj:
			dict = append(append(dict, line...), '\n')
		case string(line) == "xref":
			return c.tail(out, pdf[i:], offsets, written)
		default:
			put(line, nl)
		}
	}
	return fmt.Errorf("PDF: no cross-reference table")
}

// tail writes the new xref table for offsets, and the trailer that follows
// the old table in rest with startxref pointing at the new one.
func (c *pageCompressor) tail(out *bufio.Writer, rest []byte, offsets []int64, at int64) error {
	fmt.Fprintf(out, "xref\n0 %d\n0000000000 65535 f \n", len(offsets))
	for _, o := range offsets[1:] {
		fmt.Fprintf(out, "%010d 00000 n \n", o)
	}
	t := bytes.Index(rest, []byte("trailer\n"))
	s := bytes.Index(rest, []byte("startxref\n"))
	if t < 0 || s < t {
		return fmt.Errorf("PDF: no trailer after the cross-reference table")
	}
	out.Write(rest[t:s])
	fmt.Fprintf(out, "startxref\n%d\n%%%%EOF\n", at)
	return out.Flush()
}

// compress deflates one page stream with the one zlib writer, at the speed
// fpdf uses.
func (c *pageCompressor) compress(data []byte) ([]byte, error) {
	c.buf.Reset()
	if c.zw == nil {
		zw, err := zlib.NewWriterLevel(&c.buf, zlib.BestSpeed)
		if err != nil {
			return nil, err
		}
		c.zw = zw
	} else {
		c.zw.Reset(&c.buf)
	}
	if _, err := c.zw.Write(data); err != nil {
		return nil, err
	}
	if err := c.zw.Close(); err != nil {
		return nil, err
	}
	return c.buf.Bytes(), nil
}
