package intake

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strings"
)

// Limits of what an import file may hold; beyond them it is refused at the
// line or row that crosses them. They are those of survey.md's tables.
const (
	MaxFileBytes = 32 << 20
	MaxRows      = 100_000
	MaxCells     = 2_000_000
	maxColumns   = 1_000
)

// delimiters are the cell separators a text file may use, in the order they
// are preferred when two split a file equally well.
var delimiters = []struct {
	r    rune
	name string
}{{'\t', "tabs"}, {';', "semicolons"}, {',', "commas"}}

// sampleRecords is how many records the delimiter is judged on.
const sampleRecords = 50

// readDelimited reads a CSV or TSV file (RFC 4180, with the delimiter a
// comma, semicolon or tab) in UTF-8, UTF-8 with a byte-order mark or UTF-16
// with one. An Excel `sep=;` first line names the delimiter.
func readDelimited(name string, data []byte) (*sheet, ProblemList) {
	var problems ProblemList
	text, enc, line, why := decodeText(data)
	if why != "" {
		problems.Errorf(Place{File: name, Row: line}, "%s", why)
		return nil, problems
	}
	skip := 0 // lines before the records
	delim, named := rune(0), false
	if first, _, _ := strings.Cut(text, "\n"); strings.HasPrefix(strings.ToLower(strings.TrimSpace(first)), "sep=") {
		sep := strings.TrimSpace(first)[4:]
		for _, d := range delimiters {
			if sep == string(d.r) {
				delim, named = d.r, true
			}
		}
		if !named {
			problems.Errorf(Place{File: name, Row: 1}, "%q names no delimiter lossline reads (comma, semicolon or tab)", strings.TrimSpace(first))
			return nil, problems
		}
		text, skip = text[len(first)+min(1, len(text)-len(first)):], 1
	}
	if !named {
		delim = detectDelimiter(text)
	}
	s := &sheet{file: name, commaDecimals: delim != ','}
	dname := ""
	for _, d := range delimiters {
		if d.r == delim {
			dname = d.name
		}
	}
	how := "detected"
	if named {
		how = "named by its sep= line"
	}
	s.notes = append(s.notes, fmt.Sprintf("%s, cells separated by %s (%s)", enc, dname, how))
	r := csv.NewReader(strings.NewReader(text))
	r.Comma, r.FieldsPerRecord = delim, -1
	cells := 0
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			problems.Errorf(Place{File: name, Row: parseErrorLine(err) + skip}, "%s", csvFailure(err))
			return nil, problems
		}
		n, _ := r.FieldPos(0)
		n += skip
		if len(s.rows) == MaxRows {
			problems.Errorf(Place{File: name, Row: n}, "more than %d records: lossline imports at most %d", MaxRows, MaxRows)
			return nil, problems
		}
		if len(rec) > maxColumns {
			problems.Errorf(Place{File: name, Row: n}, "%d cells in a record, more than the %d lossline reads", len(rec), maxColumns)
			return nil, problems
		}
		if cells += len(rec); cells > MaxCells {
			problems.Errorf(Place{File: name, Row: n}, "more than %d cells in all: lossline imports at most %d", MaxCells, MaxCells)
			return nil, problems
		}
		row := row{n: n, cells: make([]cell, len(rec))}
		for i, v := range rec {
			l, _ := r.FieldPos(i)
			row.cells[i] = cell{text: strings.TrimSpace(v), place: Place{File: name, Row: l + skip}}
		}
		s.rows = append(s.rows, row)
	}
	return s, nil
}

// detectDelimiter picks the delimiter that splits the most of the first
// records into the same number of cells (two or more): the count most of
// them have. Ties go to the more cells, then to the earlier delimiter.
func detectDelimiter(text string) rune {
	best, bestCount, bestCells := ',', -1, 0
	for _, d := range delimiters {
		r := csv.NewReader(strings.NewReader(text))
		r.Comma, r.FieldsPerRecord = d.r, -1
		counts := map[int]int{}
		for range sampleRecords {
			rec, err := r.Read()
			if err != nil {
				break
			}
			counts[len(rec)]++
		}
		mode, count := 0, 0
		for cells, n := range counts {
			if cells > 1 && (n > count || n == count && cells > mode) {
				mode, count = cells, n
			}
		}
		if count > bestCount || count == bestCount && mode > bestCells {
			best, bestCount, bestCells = d.r, count, mode
		}
	}
	return best
}

func parseErrorLine(err error) int {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return pe.Line
	}
	return 0
}

// csvFailure says in words why a record cannot be read (RFC 4180, §2).
func csvFailure(err error) string {
	var pe *csv.ParseError
	if !errors.As(err, &pe) {
		return "cannot be read: " + err.Error()
	}
	switch {
	case errors.Is(pe.Err, csv.ErrBareQuote):
		return `a " inside a cell that does not start with one: put the cell in quotes and double each " inside it`
	case errors.Is(pe.Err, csv.ErrQuote):
		if pe.StartLine != pe.Line {
			return fmt.Sprintf("the quoted cell opened on line %d is not closed as it should be: a quote inside it must be doubled", pe.StartLine)
		}
		return `a quoted cell goes on after its closing ": a quote inside it must be doubled`
	}
	return "cannot be read: " + pe.Err.Error()
}
