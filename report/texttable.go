package report

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"strings"
	"text/tabwriter"
)

// textTable renders rows under a header as CSV, or as an aligned table for a
// terminal: header in capitals, "-" in empty cells.
func textTable(header []string, rows [][]string, asCSV bool) ([]byte, error) {
	var b bytes.Buffer
	if asCSV {
		w := csv.NewWriter(&b)
		_ = w.Write(header)
		_ = w.WriteAll(rows)
		w.Flush()
		return b.Bytes(), w.Error()
	}
	tw := tabwriter.NewWriter(&b, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, strings.ToUpper(strings.Join(header, "\t")))
	for _, r := range rows {
		cells := make([]string, len(r))
		for i, v := range r {
			cells[i] = v
			if v == "" {
				cells[i] = "-"
			}
		}
		fmt.Fprintln(tw, strings.Join(cells, "\t"))
	}
	tw.Flush()
	return b.Bytes(), nil
}
