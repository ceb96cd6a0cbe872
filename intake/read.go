package intake

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/lossline/lossline/survey"
)

// Options are what reading a file needs besides the file.
type Options struct {
	Map   Map
	Date  *survey.VisitDate // the visit of rows without a date (--date)
	Units survey.Unit       // the survey's units: of values written without one
}

// File is what one import file holds.
type File struct {
	Name     string
	Notes    []string // what was found, in words: encoding, delimiter, decimal mark, shape and columns
	Readings []Reading
	NotRead  []string // CML ids of rows without a reading
}

// ReadFile reads an import file from disk: a regular file of at most
// MaxFileBytes, checked before it is read.
func ReadFile(path string, opt Options) (*File, ProblemList) {
	var problems ProblemList
	whole := Place{File: path}
	st, err := os.Stat(path)
	switch {
	case err != nil:
		problems.Errorf(whole, "cannot be read: %v", pathFailure(err))
		return nil, problems
	case !st.Mode().IsRegular():
		problems.Errorf(whole, "not a regular file")
		return nil, problems
	case st.Size() > MaxFileBytes:
		problems.Errorf(whole, "the file is %d bytes, more than the %d MiB lossline imports", st.Size(), MaxFileBytes>>20)
		return nil, problems
	}
	f, err := os.Open(path)
	if err != nil {
		problems.Errorf(whole, "cannot be read: %v", pathFailure(err))
		return nil, problems
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, MaxFileBytes+1))
	if err != nil || len(data) > MaxFileBytes {
		problems.Errorf(whole, "cannot be read whole (it grew past %d MiB, or a read failed)", MaxFileBytes>>20)
		return nil, problems
	}
	return Read(path, data, opt)
}

func pathFailure(err error) error {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err
	}
	return err
}

// zipMagic opens a zip archive, which an .xlsx workbook is.
var zipMagic = []byte("PK\x03\x04")

// Read reads the readings of an import file: a workbook (.xlsx) or a
// delimited text file. name is used in messages. Problems come back sorted;
// with problems, the File (nil when the file could not be read at all) holds
// the readings of the rows that could be read, so that they can be checked
// further, but they are not to be merged.
func Read(name string, data []byte, opt Options) (*File, ProblemList) {
	var problems ProblemList
	whole := Place{File: name}
	if len(data) > MaxFileBytes {
		problems.Errorf(whole, "the file is %d bytes, more than the %d MiB lossline imports", len(data), MaxFileBytes>>20)
		return nil, problems
	}
	var sheets []*sheet
	switch ext := strings.ToLower(filepath.Ext(name)); {
	case ext == ".xls":
		problems.Errorf(whole, "an Excel 97-2003 workbook (.xls): save it as .xlsx (Excel Workbook) or CSV")
		return nil, problems
	case ext == ".ods" || ext == ".numbers":
		problems.Errorf(whole, "lossline reads .xlsx workbooks and CSV: save the %s file as one of them", ext)
		return nil, problems
	case ext == ".xlsx" || ext == ".xlsm" || bytes.HasPrefix(data, zipMagic) || bytes.HasPrefix(data, oleMagic):
		sheets, problems = readWorkbook(name, data, opt.Map.Sheet)
	default:
		var s *sheet
		s, problems = readDelimited(name, data)
		if s != nil {
			sheets = []*sheet{s}
		}
	}
	if len(problems) > 0 {
		problems.Sort()
		return nil, problems
	}
	out := &File{Name: name}
	found := false
	for _, s := range sheets {
		label := ""
		if s.name != "" {
			label = fmt.Sprintf("sheet %q: ", s.name)
		}
		if blankSheet(s) {
			out.Notes = append(out.Notes, label+"empty")
			continue
		}
		hi := s.findHeader(opt.Map)
		if hi < 0 {
			if len(sheets) > 1 {
				out.Notes = append(out.Notes, label+"no header row with a CML column: skipped")
				continue
			}
			problems.Errorf(Place{File: name, Sheet: s.name}, "%s", noHeader(opt.Map))
			break
		}
		found = true
		lay, ps := s.columns(hi, opt.Map)
		if len(ps) > 0 {
			problems = append(problems, ps...)
			continue
		}
		rs, notRead, ps := s.readings(lay, opt)
		problems = append(problems, ps...)
		out.Notes = append(out.Notes, label+strings.Join(append(s.notes, lay.describe(s)), "; "))
		out.Readings = append(out.Readings, rs...)
		out.NotRead = append(out.NotRead, notRead...)
	}
	if !found && len(problems) == 0 {
		problems.Errorf(whole, "%s", noHeader(opt.Map))
	}
	problems.Sort()
	return out, problems
}

// noHeader says how to head the id column when none was found.
func noHeader(m Map) string {
	if m.ID != "" {
		return fmt.Sprintf("no header row with the column %q%s in the first %d rows", m.ID, m.from("id"), headerRows)
	}
	return fmt.Sprintf("no header row with a CML column in the first %d rows: head the column of CML ids CML, ID, location ID or TML, or map it (--map id=HEADER)", headerRows)
}

func blankSheet(s *sheet) bool {
	for _, r := range s.rows {
		if !blankRow(r) {
			return false
		}
	}
	return true
}
