package survey

import (
	"path/filepath"
	"strings"
	"testing"
)

// A follow-up survey (and an earlier follow-up it names) that inherits its
// design data raises no "no required thickness"; a survey that gets none from
// anywhere still does, at its own component heading.
func TestInheritedDesignRaisesNothing(t *testing.T) {
	root := t.TempDir()
	writeSurvey(t, root, "y2016", "2016-05-01", "", "- nominal: 10\n- required: 5\n", "| CML | 2016-05-01 |\n|---|---|\n| C-1 | 9.6 |\n")
	writeSurvey(t, root, "y2021", "2021-05-01", "previous: ../y2016\n", "", "| CML | 2021-05-01 |\n|---|---|\n| C-1 | 9.3 |\n")
	newest := writeSurvey(t, root, "y2026", "2026-05-01", "previous: ../y2021\n", "", "| CML | 2026-05-01 |\n|---|---|\n| C-1 | 9.0 |\n")
	_, problems := LoadSeries(newest, nil, DefaultOptions)
	if len(problems) != 0 {
		t.Errorf("inherited design data raised:\n%s", problemText(problems))
	}

	alone := writeSurvey(t, root, "alone", "2026-05-01", "", "- nominal: 10\n", "| CML | 2026-05-01 |\n|---|---|\n| C-1 | 9.0 |\n")
	_, problems = LoadSeries(alone, nil, DefaultOptions)
	want := filepath.Join(alone, "survey.md") + `:10: warning: "Course" has no required thickness`
	if len(problems) != 1 || !strings.HasPrefix(problems[0].String(), want) {
		t.Errorf("problems:\n%swant one starting %q", problemText(problems), want)
	}
}
