package report

import (
	"bytes"
	"fmt"
	"slices"
	"strings"

	"github.com/lossline/lossline/survey"
)

// maxNamedRunes is how many characters one warning names before it counts
// the rest.
const maxNamedRunes = 3

// TextWarnings warns at every line of the survey's checklist, and of the
// earlier surveys merged into it, that holds characters the PDF cannot draw
// and will show as Undrawable.
func TextWarnings(s *survey.Survey) survey.ProblemList {
	if s == nil {
		return nil
	}
	problems := checklistText(s.File, s.Source)
	if s.History != nil {
		for _, e := range s.History.Earlier {
			problems = append(problems, checklistText(e.File, e.Source)...)
		}
	}
	return problems
}

// checklistText warns at each line of src with characters the PDF cannot draw.
func checklistText(file string, src []byte) survey.ProblemList {
	var problems survey.ProblemList
	for n, line := range bytes.Split(src, []byte("\n")) {
		// Placeholder marks are refused at their line by the reader already.
		rs := slices.DeleteFunc(undrawableRunes(string(line)), survey.IsPlaceholderMark)
		if len(rs) == 0 {
			continue
		}
		names := make([]string, 0, maxNamedRunes+1)
		for i, r := range rs {
			if i == maxNamedRunes {
				names = append(names, fmt.Sprintf("%d more", len(rs)-i))
				break
			}
			names = append(names, describeRune(r))
		}
		if len(rs) == 1 {
			problems.Warnf(file, n+1, "%s cannot be drawn in the PDF; it will show as %s", names[0], Undrawable)
		} else {
			problems.Warnf(file, n+1, "these cannot be drawn in the PDF and will show as %s: %s", Undrawable, strings.Join(names, ", "))
		}
	}
	return problems
}
