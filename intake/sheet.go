package intake

// sheet is one table of cells read from an import file: a text file's
// records or a worksheet's rows, before the columns are known.
type sheet struct {
	file, name string // name: the worksheet; "" for a text file
	rows       []row
	// commaDecimals says whether a decimal comma may be read: not in a file
	// whose cells are separated by commas.
	commaDecimals bool
	notes         []string // what was detected about the file, in words
}

// row is one record of a sheet.
type row struct {
	n     int // line of the file (its first, for a record over several) or worksheet row
	cells []cell
}

// cell is one value as read.
type cell struct {
	text  string // as written (text files) or shown (worksheets), spaces trimmed
	place Place
	// number is set for a worksheet cell that holds a number; text is then
	// the number in digits with a decimal point.
	number bool
	// date is set for a worksheet number shown as a date; text is then the
	// date as YYYY-MM-DD.
	date bool
	// formula is the formula of a worksheet cell that has no stored result.
	formula string
	// merged names the merged range the cell is part of ("C14:C15"); covered
	// is set for the cells of the range other than its first, whose text is
	// the first cell's.
	merged  string
	covered bool
}

// at returns the cell of r in column i, or an empty one placed there.
func (s *sheet) at(r row, i int) cell {
	if i >= 0 && i < len(r.cells) {
		return r.cells[i]
	}
	return cell{place: s.place(r.n, i)}
}

// place is the place of row n, column i (0-based) of the sheet.
func (s *sheet) place(n, i int) Place {
	if s.name == "" {
		return Place{File: s.file, Row: n}
	}
	return Place{File: s.file, Sheet: s.name, Row: n, Col: i + 1}
}

// rowPlace is the place of a whole row.
func (s *sheet) rowPlace(n int) Place {
	return Place{File: s.file, Sheet: s.name, Row: n}
}
