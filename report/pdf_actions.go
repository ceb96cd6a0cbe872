package report

import (
	"fmt"
	"strings"

	"github.com/lossline/lossline/actions"
)

// actionsSection writes the register of actions: open ones by due date, then
// priority, overdue ones said so in words; then those this survey closed.
func (d *doc) actionsSection() {
	var open, closed []actions.Action
	overdue := 0
	for _, a := range d.f.Actions {
		switch a.Status {
		case actions.Closed:
			closed = append(closed, a)
		case actions.Overdue:
			overdue++
			open = append(open, a)
		default:
			open = append(open, a)
		}
	}
	d.newPage(false)
	d.heading(0, "Actions")
	if len(open) == 0 && len(closed) == 0 {
		d.text("No action arises from this survey.")
		return
	}
	intro := fmt.Sprintf("%d open actions, by due date and then priority (immediate, high, medium, low).", len(open))
	if overdue > 0 {
		intro += fmt.Sprintf(" %d %s OVERDUE: due before this survey's date and not closed.", overdue, word(overdue, "is", "are"))
	}
	intro += " Computed actions are worked out afresh from every survey's readings; an action the inspector writes, and a scope item left not done, carries into later surveys until one closes it (a scope item also by ticking it). The id stays the same from survey to survey."
	d.text(intro)
	d.pdf.Ln(2)
	rows := make([][]string, d.capRows(len(open)))
	for i, a := range open[:len(rows)] {
		due := a.Due.Format(dateLayout)
		if a.Status == actions.Overdue {
			due += " OVERDUE"
		}
		rows[i] = []string{due, a.Priority.String(), a.ID, where(a), a.Reason, d.actionSource(a)}
	}
	w := d.width()
	d.table([]column{{"Due", 21, "L"}, {"Priority", 16, "L"}, {"Id", 25, "L"}, {"Asset / component / CML", 40, "L"},
		{"Action and reason", w - 21 - 16 - 25 - 40 - 28, "L"}, {"Raised by", 28, "L"}}, rows, func(i int) rowStyle {
		a := open[i]
		return rowStyle{bold: a.Status == actions.Overdue || a.Priority == actions.Immediate, shade: a.Status == actions.Overdue}
	}, smallSize)
	d.leftOut(len(rows), len(open), ActionsCSVFile)
	if len(closed) > 0 {
		d.heading(2, "Actions closed by this survey")
		rows := make([][]string, d.capRows(len(closed)))
		for i, a := range closed[:len(rows)] {
			rows[i] = []string{a.Closed.Date.Format(dateLayout), a.ID, where(a), a.Reason, a.Closed.Note}
		}
		d.table([]column{{"Closed", 21, "L"}, {"Id", 26, "L"}, {"Asset / component / CML", 40, "L"},
			{"Action", (w - 87) / 2, "L"}, {"What was done", (w - 87) / 2, "L"}}, rows, nil, smallSize)
		d.leftOut(len(rows), len(closed), ActionsCSVFile)
	}
}

// where is an action's asset, component and CML on one line.
func where(a actions.Action) string {
	var parts []string
	for _, p := range []string{a.Asset, a.Component} {
		if p != "" {
			parts = append(parts, p)
		}
	}
	if a.CML != "" {
		parts = append(parts, "CML "+a.CML)
	}
	if len(parts) == 0 {
		return "whole survey"
	}
	return strings.Join(parts, " / ")
}

// actionSource says in words what raised an action (file lines are for the
// exports and the data checks, not the client's pages).
func (d *doc) actionSource(a actions.Action) string {
	switch {
	case a.Kind != actions.Written:
		return "computed: " + string(a.Kind)
	case a.Raised.Before(d.s.Date):
		return "inspector, survey of " + a.Raised.Format(dateLayout)
	}
	return "inspector, this survey"
}

// word is one or many as n asks.
func word(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}
