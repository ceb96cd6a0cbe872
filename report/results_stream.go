package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"io"

	"github.com/lossline/lossline/findings"
	"github.com/lossline/lossline/survey"
)

// WriteJSON writes results.json to w as JSON renders it (the same bytes),
// one item at a time: an item is built, encoded, written and dropped, so
// memory does not grow with the number of CMLs.
func WriteJSON(w io.Writer, f *findings.Findings, warnings survey.ProblemList) error {
	r := resultsFrame(f, warnings)
	sw := &jsonStream{w: w}
	sw.raw("{\n  \"survey\": ")
	sw.value(r.Survey, "  ")
	sw.raw(",\n  \"items\": ")
	sw.array(len(f.Items), func(i int) any { return buildItem(f, i, f.Items[i]) })
	for _, part := range []struct {
		key string
		n   int
		at  func(i int) any
	}{
		{"dropped", len(r.Dropped), func(i int) any { return r.Dropped[i] }},
		{"design_changes", len(r.DesignChanges), func(i int) any { return r.DesignChanges[i] }},
		{"photos", len(r.Photos), func(i int) any { return r.Photos[i] }},
		{"skipped_files", len(r.Skipped), func(i int) any { return r.Skipped[i] }},
		{"warnings", len(r.Warnings), func(i int) any { return r.Warnings[i] }},
		{"actions", len(r.Actions), func(i int) any { return r.Actions[i] }},
		{"electro", len(r.Electro), func(i int) any { return r.Electro[i] }},
		{"cp_failing_points", len(r.CPFailing), func(i int) any { return r.CPFailing[i] }},
		{"grids", len(r.Grids), func(i int) any { return r.Grids[i] }},
		{"local_damage", len(r.LocalDamage), func(i int) any { return r.LocalDamage[i] }},
	} {
		sw.raw(",\n  \"" + part.key + "\": ")
		sw.array(part.n, part.at)
	}
	sw.raw("\n}\n")
	return sw.err
}

// jsonStream writes pieces of an indented JSON document, keeping the first
// error. Array elements go through one encoder and buffer, reused.
type jsonStream struct {
	w   io.Writer
	err error
	buf bytes.Buffer
	enc *json.Encoder
}

func (s *jsonStream) raw(t string) {
	if s.err == nil {
		_, s.err = io.WriteString(s.w, t)
	}
}

// value writes v indented as it stands at prefix.
func (s *jsonStream) value(v any, prefix string) {
	if s.err != nil {
		return
	}
	b, err := json.MarshalIndent(v, prefix, "  ")
	if err != nil {
		s.err = err
		return
	}
	_, s.err = s.w.Write(b)
}

// element writes v indented as an element of a top-level array, as
// MarshalIndent would.
func (s *jsonStream) element(v any) {
	if s.err != nil {
		return
	}
	if s.enc == nil {
		s.enc = json.NewEncoder(&s.buf)
		s.enc.SetIndent("    ", "  ")
	}
	s.buf.Reset()
	if s.err = s.enc.Encode(v); s.err != nil {
		return
	}
	_, s.err = s.w.Write(bytes.TrimSuffix(s.buf.Bytes(), []byte("\n")))
}

// array writes an array of n elements, a member of the top-level object.
func (s *jsonStream) array(n int, at func(i int) any) {
	if n == 0 {
		s.raw("[]")
		return
	}
	s.raw("[\n    ")
	for i := range n {
		if i > 0 {
			s.raw(",\n    ")
		}
		s.element(at(i))
	}
	s.raw("\n  ]")
}

// WriteCSV writes results.csv to w as CSV renders it, one row at a time.
func WriteCSV(w io.Writer, f *findings.Findings, disp Display) error {
	cw := csv.NewWriter(w)
	u := units{disp.Thickness, disp.Rate}
	_ = cw.Write(csvHeader(u))
	for i, it := range f.Items {
		_ = cw.Write(csvRow(u, buildItem(f, i, it)))
	}
	cw.Flush()
	return cw.Error()
}
