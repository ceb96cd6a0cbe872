package intake

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"
)

// Place is where something was read: a line of a text file, or a cell (or
// row) of a worksheet.
type Place struct {
	File  string // as given
	Sheet string // worksheet; "" for a text file
	Row   int    // 1-based line of a text file or row of a worksheet; 0: the whole file or sheet
	Col   int    // 1-based worksheet column; 0: the whole row
}

// String writes the place as `file:line` or `file:Sheet!C14`.
func (p Place) String() string {
	if p.Sheet == "" {
		if p.Row == 0 {
			return p.File
		}
		return p.File + ":" + strconv.Itoa(p.Row)
	}
	sheet := p.Sheet
	if strings.ContainsFunc(sheet, func(r rune) bool {
		return !(r == '_' || r == '.' || r >= '0' && r <= '9' || r >= 'A' && r <= 'Z' || r >= 'a' && r <= 'z')
	}) {
		sheet = "'" + strings.ReplaceAll(sheet, "'", "''") + "'"
	}
	switch {
	case p.Row == 0:
		return p.File + ":" + sheet
	case p.Col == 0:
		return fmt.Sprintf("%s:%s!%d:%d", p.File, sheet, p.Row, p.Row)
	}
	cell, _ := excelize.CoordinatesToCellName(p.Col, p.Row)
	return p.File + ":" + sheet + "!" + cell
}

// Problem is a reason an import cannot go ahead, at its place.
type Problem struct {
	Place   Place
	Message string
}

func (p Problem) String() string { return p.Place.String() + ": " + p.Message }

// ProblemList collects problems; all of them are errors.
type ProblemList []Problem

// Errorf records a problem at place.
func (l *ProblemList) Errorf(place Place, format string, args ...any) {
	*l = append(*l, Problem{Place: place, Message: fmt.Sprintf(format, args...)})
}

// Sort orders the problems by file, sheet, row and column, keeping the order
// of equal places.
func (l ProblemList) Sort() {
	slices.SortStableFunc(l, func(a, b Problem) int {
		x, y := a.Place, b.Place
		if c := strings.Compare(x.File, y.File); c != 0 {
			return c
		}
		if c := strings.Compare(x.Sheet, y.Sheet); c != 0 {
			return c
		}
		if x.Row != y.Row {
			return x.Row - y.Row
		}
		return x.Col - y.Col
	})
}

// Err returns the list as an error, or nil when it is empty.
func (l ProblemList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return Error{l}
}

// Error is returned when an import cannot go ahead; it lists every problem.
type Error struct{ Problems ProblemList }

func (e Error) Error() string {
	lines := make([]string, len(e.Problems))
	for i, p := range e.Problems {
		lines[i] = p.String()
	}
	return strings.Join(lines, "\n")
}
