// Package folder answers where a path really is: absolute, with every symbolic
// link resolved, and whether it lies inside another folder. lossline uses it
// to keep what it reads inside the folders it was given and what it writes
// out of its inputs.
package folder

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
)

// Resolve returns path made absolute and cleaned, with the symbolic links of
// its longest existing part resolved; the part that does not exist yet is
// appended as written. A path whose existing part cannot be examined (a loop
// of links, no permission) is an error.
func Resolve(path string) (string, error) {
	abs, err := filepath.Abs(path)
	if err != nil {
		return "", err
	}
	var rest []string
	for p := abs; ; {
		real, err := filepath.EvalSymlinks(p)
		if err == nil {
			return filepath.Join(append([]string{real}, rest...)...), nil
		}
		if !errors.Is(err, fs.ErrNotExist) {
			return "", err
		}
		parent := filepath.Dir(p)
		if parent == p {
			return abs, nil
		}
		rest = append([]string{filepath.Base(p)}, rest...)
		p = parent
	}
}

// Contains reports whether path is dir or lies under it. Both must be
// resolved (Resolve); the comparison is by path elements, so /a/bc is not
// inside /a/b.
func Contains(dir, path string) bool {
	rel, err := filepath.Rel(dir, path)
	if err != nil {
		return false
	}
	return rel == "." || (rel != ".." && !strings.HasPrefix(rel, ".."+string(filepath.Separator)) && !filepath.IsAbs(rel))
}

// WriteWhole writes data to a temporary file beside path and renames it over
// path, so that path holds the old bytes or the new, never a part.
func WriteWhole(path string, data []byte, perm fs.FileMode) error {
	f, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return err
	}
	tmp := f.Name()
	_, err = f.Write(data)
	if err2 := f.Sync(); err == nil {
		err = err2
	}
	if err2 := f.Chmod(perm); err == nil {
		err = err2
	}
	if err2 := f.Close(); err == nil {
		err = err2
	}
	if err == nil {
		err = os.Rename(tmp, path)
	}
	if err != nil {
		os.Remove(tmp)
	}
	return err
}
