package report

import (
	"errors"
	"path/filepath"

	"github.com/lossline/lossline/internal/folder"
	"github.com/lossline/lossline/survey"
)

// CheckOutput refuses, before anything is rendered, an output folder that
// WriteFolder would refuse (CheckReplaceable) or that would put the report
// among its inputs: the survey folder itself, anything inside its photos
// folder or inside an earlier survey folder merged in, or a folder holding
// any of them. Paths are compared with their symbolic links resolved.
func CheckOutput(out string, s *survey.Survey) error {
	real, err := folder.Resolve(out)
	if err != nil {
		return err
	}
	if err := placeOf(out, real, s); err != nil {
		return err
	}
	err = CheckReplaceable(real)
	var refused *OutputRefused
	if errors.As(err, &refused) {
		refused.Dir = out
	}
	return err
}

// placeOf refuses an output folder among the survey's inputs; real is out
// resolved.
func placeOf(out, real string, s *survey.Survey) error {
	type input struct {
		dir, what string
		earlier   bool // an earlier survey: nothing may be written inside it
	}
	inputs := []input{{s.Dir, "the survey folder", false}}
	earlier := []string{}
	if s.History != nil {
		for _, e := range s.History.Earlier {
			earlier = append(earlier, e.Dir)
		}
	}
	for _, p := range s.Previous {
		if !filepath.IsAbs(p) {
			p = filepath.Join(s.Dir, p)
		}
		earlier = append(earlier, p)
	}
	for _, d := range earlier {
		inputs = append(inputs, input{d, "the earlier survey folder", true})
	}
	for _, in := range inputs {
		dir, err := folder.Resolve(in.dir)
		if err != nil {
			continue
		}
		photos := filepath.Join(dir, survey.PhotoDir)
		switch {
		case real == dir:
			return &OutputRefused{Dir: out, Why: "is " + in.what + " " + in.dir + " itself; give a folder of its own, such as " + filepath.Join(in.dir, "report")}
		case folder.Contains(photos, real):
			return &OutputRefused{Dir: out, Why: "is inside the photos folder " + filepath.Join(in.dir, survey.PhotoDir) + " of " + in.what + " " + in.dir}
		case in.earlier && folder.Contains(dir, real):
			return &OutputRefused{Dir: out, Why: "is inside " + in.what + " " + in.dir + ", whose files are inputs of this report"}
		case folder.Contains(real, dir):
			return &OutputRefused{Dir: out, Why: "holds " + in.what + " " + in.dir + ", which replacing it would remove"}
		}
	}
	return nil
}
