package survey

import (
	"os"
	"path"
	"path/filepath"
	"slices"
	"strings"
)

// ChecklistFile is the name of the checklist in a survey folder.
const ChecklistFile = "survey.md"

// Load reads a survey folder: the checklist and the photos it names or holds.
// It never writes to the folder. Problems come back sorted; the survey is
// usable only when none of them is an error.
func Load(dir string) (*Survey, ProblemList) {
	file := filepath.Join(dir, ChecklistFile)
	src, err := os.ReadFile(file)
	if err != nil {
		var l ProblemList
		if os.IsNotExist(err) {
			l.Errorf(file, 0, "no checklist: a survey folder holds survey.md (lossline new DIR writes one)")
		} else {
			l.Errorf(file, 0, "cannot read: %v", err)
		}
		return nil, l
	}
	s, problems := ParseChecklist(file, src)
	s.Dir = dir
	photos, photoProblems := ScanPhotos(dir)
	s.Photos = photos
	problems = append(problems, photoProblems...)
	problems = append(problems, linkPhotos(s)...)
	problems.Sort()
	s.Problems = problems.Warnings()
	return s, problems
}

// linkPhotos resolves the photo names in the reading tables against the
// photos found, inside the survey folder only.
func linkPhotos(s *Survey) ProblemList {
	var problems ProblemList
	byName := map[string]*Photo{}
	for _, p := range s.Photos {
		byName[p.Name] = p
	}
	for _, loc := range s.AllCMLs() {
		m := loc.CML
		for i, ref := range m.PhotoRefs {
			name := path.Clean(strings.ReplaceAll(ref, `\`, "/"))
			if path.IsAbs(name) || name == ".." || strings.HasPrefix(name, "../") || filepath.VolumeName(ref) != "" {
				problems.Errorf(s.File, m.Line, "photo %q of CML %s is outside the survey's photos folder", ref, m.ID)
				continue
			}
			p, ok := byName[name]
			if !ok {
				problems.Errorf(s.File, m.Line, "photo %q of CML %s is not in %s", ref, m.ID, filepath.Join(s.Dir, PhotoDir))
				continue
			}
			m.PhotoRefs[i] = name
			if !slices.Contains(p.CMLs, m.ID) {
				p.CMLs = append(p.CMLs, m.ID)
			}
		}
	}
	return problems
}
