package survey

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path"
	"path/filepath"
	"strings"
)

// ChecklistFile is the name of the checklist in a survey folder.
const ChecklistFile = "survey.md"

// FolderOf returns the survey folder a command-line argument names: the
// argument itself, or the folder holding it when it is the path of a
// survey.md (which need not exist yet, so that the missing file is what the
// reader reports).
func FolderOf(arg string) string {
	if !strings.EqualFold(filepath.Base(arg), ChecklistFile) {
		return arg
	}
	if fi, err := os.Stat(arg); err == nil && fi.IsDir() {
		return arg
	}
	return filepath.Dir(arg)
}

// Options are the reading settings.
type Options struct {
	MaxMegapixels float64
	Place         PlaceOptions
}

// DefaultOptions are the reading settings when none are given.
var DefaultOptions = Options{MaxMegapixels: DefaultMaxMegapixels, Place: DefaultPlaceOptions}

// Load reads a survey folder with the default options.
func Load(dir string) (*Survey, ProblemList) { return LoadWith(dir, DefaultOptions) }

// LoadWith reads a survey folder: the checklist and the photos it names or
// holds. It never writes to the folder. Problems come back sorted; the survey
// is usable only when none of them is an error. Photos are placed by LoadSeries.
func LoadWith(dir string, opt Options) (*Survey, ProblemList) {
	s, problems := loadFolder(dir, opt)
	if s != nil {
		problems = append(problems, requiredWarnings(s)...)
	}
	return sorted(s, problems)
}

// loadFolder is LoadWith before its problems are sorted.
func loadFolder(dir string, opt Options) (*Survey, ProblemList) {
	file := filepath.Join(dir, ChecklistFile)
	src, err := readChecklistFile(file)
	if err != nil {
		var l ProblemList
		if os.IsNotExist(err) {
			l.Errorf(file, 0, "no checklist: a survey folder holds survey.md (lossline new DIR writes one)")
		} else {
			l.Errorf(file, 0, "%v", err)
		}
		return nil, l
	}
	s, problems := ParseChecklist(file, src)
	joinSurveyDays(s)
	problems = append(problems, applyScope(s)...)
	problems = append(problems, ComputeRequired(s)...)
	problems = append(problems, ComputeElectro(s)...)
	problems = append(problems, ComputeLocal(s)...)
	s.Dir, s.Source = dir, src
	photos, skipped, photoProblems := ScanPhotos(dir, opt.MaxMegapixels)
	s.Photos, s.Skipped = photos, skipped
	problems = append(problems, photoProblems...)
	problems = append(problems, linkPhotos(s)...)
	return s, problems
}

// readChecklistFile reads a checklist that is a regular file of at most
// MaxChecklistBytes, looking at its size before reading any of it (a pipe or
// a device is refused unopened; a file growing while read stops at the limit).
func readChecklistFile(file string) ([]byte, error) {
	st, err := os.Stat(file)
	switch {
	case os.IsNotExist(err):
		return nil, err
	case err != nil:
		return nil, fmt.Errorf("cannot read: %w", err)
	case !st.Mode().IsRegular():
		return nil, errors.New("not a regular file: the checklist must be a file")
	case st.Size() > MaxChecklistBytes:
		return nil, fmt.Errorf("the checklist is %d bytes, more than the %d MiB lossline reads", st.Size(), MaxChecklistBytes>>20)
	}
	f, err := os.Open(file)
	if err != nil {
		return nil, fmt.Errorf("cannot read: %w", err)
	}
	defer f.Close()
	src, err := io.ReadAll(io.LimitReader(f, MaxChecklistBytes+1))
	switch {
	case err != nil:
		return nil, fmt.Errorf("cannot read: %w", err)
	case len(src) > MaxChecklistBytes:
		return nil, fmt.Errorf("the checklist grew past the %d MiB lossline reads while being read", MaxChecklistBytes>>20)
	}
	return src, nil
}

// sorted sorts the problems once, at the end of a public entry point, and
// keeps the warnings on the survey.
func sorted(s *Survey, problems ProblemList) (*Survey, ProblemList) {
	problems.Sort()
	if s != nil {
		s.Problems = problems.Warnings()
	}
	return s, problems
}

// linkPhotos resolves the photo names in the reading tables against the
// photos found, inside the survey folder only.
func linkPhotos(s *Survey) ProblemList {
	var problems ProblemList
	byName := make(map[string]*Photo, len(s.Photos))
	for _, p := range s.Photos {
		byName[p.Name] = p
	}
	var names []string            // of the photos, for suggestions; made at the first missing one
	var skipped map[string]string // why a file was skipped, by name; likewise
	for loc := range s.CMLs() {
		m := loc.CML
		for i, ref := range m.PhotoRefs {
			name := path.Clean(strings.ReplaceAll(ref, `\`, "/"))
			if path.IsAbs(name) || name == ".." || strings.HasPrefix(name, "../") || filepath.VolumeName(ref) != "" {
				problems.Errorf(s.File, m.Line, "photo %q of CML %s is outside the survey's photos folder", ref, m.ID)
				continue
			}
			p, ok := byName[name]
			if !ok {
				if names == nil {
					names = photoNames(s)
					skipped = make(map[string]string, len(s.Skipped))
					for _, sk := range s.Skipped {
						skipped[sk.Name] = sk.Reason
					}
				}
				why := "is not in " + filepath.Join(s.Dir, PhotoDir) + didYouMean(closeNames(name, names, 3))
				if reason, ok := skipped[name]; ok {
					why = "was skipped: " + reason
				}
				problems.Errorf(s.File, m.Line, "photo %q of CML %s %s", ref, m.ID, why)
				continue
			}
			m.PhotoRefs[i] = name
			// A checklist lists a CML once, so only this CML's own earlier
			// references to the photo can have added its id.
			if n := len(p.CMLs); n == 0 || p.CMLs[n-1] != m.ID {
				p.CMLs = append(p.CMLs, m.ID)
			}
		}
	}
	return problems
}

func photoNames(s *Survey) []string {
	names := make([]string, len(s.Photos))
	for i, p := range s.Photos {
		names[i] = p.Name
	}
	return names
}
