package report

import (
	"bytes"
	"encoding/csv"
	"strconv"

	"github.com/lossline/lossline/actions"
	"github.com/lossline/lossline/findings"
)

// ActionsCSVFile is the name of the actions export.
const ActionsCSVFile = "actions.csv"

// ActionInfo is one action of the register in results.json and actions.csv.
type ActionInfo struct {
	ID         string  `json:"id"`
	Kind       string  `json:"kind"`
	Priority   string  `json:"priority"`
	Due        string  `json:"due"`
	Status     string  `json:"status"`
	Asset      string  `json:"asset"`
	Component  string  `json:"component"`
	CML        string  `json:"cml"`
	Reason     string  `json:"reason"`
	Rule       string  `json:"rule"`
	File       string  `json:"file"`
	Line       int     `json:"line"`
	Raised     string  `json:"raised"`
	ClosedDate *string `json:"closed_date"`
	ClosedNote *string `json:"closed_note"`
	ClosedLine *int    `json:"closed_line"`
}

// actionsOf lists the register for the exports, in its order.
func actionsOf(f *findings.Findings) []ActionInfo {
	out := make([]ActionInfo, 0, len(f.Actions))
	for _, a := range f.Actions {
		out = append(out, actionInfo(a))
	}
	return out
}

func actionInfo(a actions.Action) ActionInfo {
	x := ActionInfo{ID: a.ID, Kind: string(a.Kind), Priority: a.Priority.String(), Due: a.Due.Format(dateLayout),
		Status: string(a.Status), Asset: a.Asset, Component: a.Component, CML: a.CML, Reason: a.Reason, Rule: a.Rule,
		File: a.File, Line: a.Line, Raised: a.Raised.Format(dateLayout)}
	if c := a.Closed; c != nil {
		d, n, l := c.Date.Format(dateLayout), c.Note, c.Line
		x.ClosedDate, x.ClosedNote, x.ClosedLine = &d, &n, &l
	}
	return x
}

// ActionsCSV renders actions.csv: one row per action, in the register's order.
func ActionsCSV(r Results) ([]byte, error) {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	_ = w.Write([]string{"id", "kind", "priority", "due", "status", "asset", "component", "cml", "reason", "rule",
		"file", "line", "raised", "closed_date", "closed_note"})
	for _, a := range r.Actions {
		_ = w.Write([]string{a.ID, a.Kind, a.Priority, a.Due, a.Status, a.Asset, a.Component, a.CML, a.Reason, a.Rule,
			a.File, strconv.Itoa(a.Line), a.Raised, str(a.ClosedDate), str(a.ClosedNote)})
	}
	w.Flush()
	return b.Bytes(), w.Error()
}
