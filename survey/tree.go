package survey

import (
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strings"
)

// FindSurveys lists the survey folders under the folders given: every folder
// holding a survey.md, at any depth (not inside photos/ or hidden folders,
// and without following links), except those another folder found names as
// an earlier survey (previous: or previous-other-site:), which are read
// with it: each series is listed once, by its latest folder. A root may be
// a survey folder or its survey.md. A root that is missing, or holds no
// survey folder, is an error.
func FindSurveys(roots []string) ([]string, ProblemList) {
	var problems ProblemList
	var found []string
	seen := map[string]bool{}
	for _, root := range roots {
		root = FolderOf(root)
		if st, err := os.Stat(root); err != nil || !st.IsDir() {
			problems.Errorf(root, 0, "no such folder")
			continue
		}
		n := len(found)
		err := filepath.WalkDir(root, func(path string, e fs.DirEntry, err error) error {
			if err != nil {
				problems.Errorf(path, 0, "cannot read: %v", err)
				return nil
			}
			if !e.IsDir() {
				return nil
			}
			if path != root && (strings.HasPrefix(e.Name(), ".") || e.Name() == PhotoDir) {
				return filepath.SkipDir
			}
			if st, err := os.Stat(filepath.Join(path, ChecklistFile)); err == nil && st.Mode().IsRegular() && !seen[absPath(path)] {
				seen[absPath(path)] = true
				found = append(found, path)
			}
			return nil
		})
		if err != nil {
			problems.Errorf(root, 0, "cannot read: %v", err)
		}
		if len(found) == n {
			problems.Errorf(root, 0, "no survey folder (a folder holding %s) in or under it", ChecklistFile)
		}
	}
	earlier := map[string]bool{}
	for _, dir := range found {
		src, err := readChecklistFile(filepath.Join(dir, ChecklistFile))
		if err != nil {
			continue // the reader reports it when the folder is loaded
		}
		s, _ := ParseChecklist(filepath.Join(dir, ChecklistFile), src)
		if s == nil {
			continue
		}
		for _, d := range append(slices.Clone(s.Previous), s.OtherSite...) {
			if !filepath.IsAbs(d) {
				d = filepath.Join(dir, d)
			}
			earlier[absPath(FolderOf(d))] = true
		}
	}
	var latest []string
	for _, dir := range found {
		if !earlier[absPath(dir)] {
			latest = append(latest, dir)
		}
	}
	slices.Sort(latest)
	return latest, problems
}
