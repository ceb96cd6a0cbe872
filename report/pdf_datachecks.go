package report

import (
	"fmt"
	"strconv"

	"github.com/lossline/lossline/survey"
)

// dataChecksTitle is the final appendix: the one place where file paths,
// checklist lines and skipped files are printed (the quality-assurance
// record behind the client pages).
const dataChecksTitle = "Appendix D — Data checks"

// dataChecks writes the final appendix: the files read, every warning at its
// file and line, the photo files not used, where the earlier values behind
// the changes section were read, and where each setting came from.
func (d *doc) dataChecks() {
	d.chapter(80)
	d.heading(0, dataChecksTitle)
	d.text("For the inspector's check of the data: the files this report was computed from, and the place of every " +
		"warning and earlier value. The client pages state in words what these mean for the results.")

	d.heading(1, "Files read")
	rows := [][]string{{d.s.File, d.s.Date.Format(dateLayout), d.s.Inspector, "this survey"}}
	if h := d.s.History; h != nil {
		for _, e := range h.Earlier {
			rows = append(rows, []string{e.File, e.Date.Format(dateLayout), e.Inspector, "earlier survey, merged in"})
		}
	}
	d.table([]column{{"File", 90, "L"}, {"Survey date", 24, "L"}, {"Inspector", 30, "L"}, {"Used as", d.width() - 144, "L"}}, rows, nil, smallSize)

	d.heading(1, "Warnings")
	all := append(append(d.s.Problems[:0:0], d.s.Problems...), d.warnings...)
	if len(all) == 0 {
		d.text("Reading the survey raised no warnings.")
	} else {
		d.text("Problems found while reading the survey that did not stop the report. Check each one.")
		d.pdf.Ln(1)
		rows := make([][]string, d.capRows(len(all)))
		for i, w := range all[:len(rows)] {
			rows[i] = []string{place(w.File, w.Line), w.Message}
		}
		d.table([]column{{"File and line", 70, "L"}, {"Warning", d.width() - 70, "L"}}, rows, nil, smallSize)
		d.leftOut(len(rows), len(all), JSONFile+" (warnings)")
	}

	if len(d.s.Skipped) > 0 {
		d.heading(1, "Files in the photos folder not used")
		rows := make([][]string, d.capRows(len(d.s.Skipped)))
		for i, s := range d.s.Skipped[:len(rows)] {
			rows[i] = []string{s.Name, s.Reason}
		}
		d.table([]column{{"File", 70, "L"}, {"Why", d.width() - 70, "L"}}, rows, nil, smallSize)
		d.leftOut(len(rows), len(d.s.Skipped), JSONFile+" (skipped_files)")
	}

	if h := d.s.History; h != nil && (len(h.Dropped) > 0 || len(h.DesignChanges) > 0) {
		d.heading(1, "Where earlier values were read")
		var rows [][]string
		for _, x := range h.Dropped {
			rows = append(rows, []string{"CML " + x.ID + " no longer listed: last reading", place(x.Last.File, x.Last.Line)})
		}
		for _, x := range h.DesignChanges {
			rows = append(rows, []string{x.Asset + " / " + x.Component + ": earlier " + x.Field + " thickness", place(x.OldFile, x.OldLine)})
		}
		n := len(rows)
		rows = rows[:d.capRows(n)]
		d.table([]column{{"Value", 100, "L"}, {"File and line", d.width() - 100, "L"}}, rows, nil, smallSize)
		d.leftOut(len(rows), n, JSONFile+" (dropped, design_changes)")
	}

	if len(d.opts.Settings) > 0 {
		d.heading(1, "Every setting, its value and where it came from")
		rows := make([][]string, len(d.opts.Settings))
		for i, r := range d.opts.Settings {
			rows[i] = []string{r.Name, r.Value, r.Default, r.Source}
		}
		d.table([]column{{"Setting", 42, "L"}, {"Value", 48, "L"}, {"Default", 40, "L"}, {"From", d.width() - 130, "L"}}, rows, nil, smallSize)
	}
	if d.opts.Templates.Override != "" {
		d.heading(1, "Report texts")
		d.text("Templates folder: " + d.opts.Templates.Override)
	}
}

// place writes file:line, or the file alone when the line is not known.
func place(file string, line int) string {
	if line > 0 {
		return file + ":" + strconv.Itoa(line)
	}
	return file
}

// earlierSurveyWords names an earlier survey by its date and inspector, the
// way the client pages refer to it.
func earlierSurveyWords(e *survey.Survey) string {
	if e.Inspector == "" {
		return "the survey of " + e.Date.Format(dateLayout)
	}
	return fmt.Sprintf("the survey of %s by %s", e.Date.Format(dateLayout), e.Inspector)
}

// warningsAt are the messages of the survey's warnings at file:line (line 0:
// about the file as a whole), so that a client page can say a warning in
// words where it matters while its place stays in the data checks appendix.
func (d *doc) warningsAt(file string, line int) []string {
	if d.warnAt == nil {
		d.warnAt = map[string][]string{}
		for _, w := range d.s.Problems {
			k := place(w.File, w.Line)
			d.warnAt[k] = append(d.warnAt[k], w.Message)
		}
	}
	return d.warnAt[place(file, line)]
}

// cmlWarnings says, under a component's results, the warnings raised at its
// CMLs' rows: what to check before relying on those results.
func (d *doc) cmlWarnings(c *survey.Component) {
	var msgs []string
	seen := map[string]bool{}
	for _, m := range c.CMLs {
		type at struct {
			file string
			line int
		}
		places := []at{{m.File, m.Line}}
		for _, v := range m.Visits {
			places = append(places, at{v.File, v.Line})
		}
		for _, pl := range places {
			for _, msg := range d.warningsAt(pl.file, pl.line) {
				if !seen[msg] {
					seen[msg] = true
					msgs = append(msgs, msg)
				}
			}
		}
	}
	if len(msgs) == 0 {
		return
	}
	d.need(20)
	d.font("B", smallSize)
	d.pdf.MultiCell(0, 3.8, "Check before relying on these results (each warning's line of the checklist is in "+dataChecksTitle+"):", "", "L", false)
	d.font("", smallSize)
	for _, msg := range msgs {
		d.pdf.MultiCell(0, 3.8, "• "+msg, "", "L", false)
	}
	d.pdf.Ln(1)
	d.font("", bodySize)
}
