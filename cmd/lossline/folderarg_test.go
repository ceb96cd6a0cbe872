package main

import (
	"strings"
	"testing"
)

// Every command that reads a survey folder also takes the path of its survey.md.
func TestSurveyMarkdownPathNamesItsFolder(t *testing.T) {
	for _, c := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"check", "../../testdata/demo/survey.md"}, exitOK, "0 errors, 2 warnings"},
		{[]string{"check", "../../testdata/bad/duplicate-cml/survey.md"}, exitBadInput, "duplicate-cml/survey.md:20: CML C1 is listed twice"},
		{[]string{"report", "../../testdata/bad/duplicate-cml/survey.md", "-o", "OUT"}, exitBadInput, "duplicate-cml/survey.md:20: CML C1 is listed twice"},
		{[]string{"photos", "../../testdata/demo/survey.md"}, exitOK, "IMG_2231.HEIC"},
		{[]string{"compare", "../../testdata/demo-2022/survey.md", "../../testdata/demo/survey.md"}, exitOK, "crossed-required"},
		{[]string{"plan", "../../testdata/demo/survey.md"}, exitOK, "Year 1 (from 2026-11-18)"},
		{[]string{"check", "../../testdata/no-such-survey/survey.md"}, exitBadInput, "no-such-survey/survey.md: no checklist"},
	} {
		for i, a := range c.args {
			if a == "OUT" {
				c.args[i] = t.TempDir()
			}
		}
		code, out, errOut := runCLI(t, c.args...)
		if code != c.code || !strings.Contains(out+errOut, c.want) {
			t.Errorf("lossline %v: exit %d, want %d; output lacks %q?\n%s%s", c.args, code, c.code, c.want, out, errOut)
		}
	}
}
