package report

import (
	"fmt"

	"github.com/lossline/lossline/survey/plan"
)

// DueText renders what is overdue or due across survey folders as an aligned
// table or CSV, soonest first.
func DueText(ds []plan.Due, asCSV bool) ([]byte, error) {
	header := []string{"status", "date", "what", "folder", "asset / component", "cml", "detail", "place"}
	rows := make([][]string, len(ds))
	for i, d := range ds {
		status := "due"
		if d.Overdue {
			status = "overdue"
		}
		place := d.File
		if d.Line > 0 {
			place = fmt.Sprintf("%s:%d", d.File, d.Line)
		}
		rows[i] = []string{status, d.Date.Format(dateLayout), string(d.Kind), d.Folder, d.Asset + " / " + d.Component, d.CML, d.Detail, place}
	}
	return textTable(header, rows, asCSV)
}
