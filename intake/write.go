package intake

import (
	"bytes"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"strconv"

	"github.com/lossline/lossline/internal/folder"
)

// maxBackups is how many numbered previous versions are tried before giving up.
const maxBackups = 1000

// WriteChecklist replaces the checklist at path with data, in one rename, and
// keeps the version it replaces as path.orig (path.orig.1, .2 … when that
// exists already; an earlier one is never overwritten). old is what the
// checklist held when it was read: if it changed since, nothing is written.
// It returns the name of the previous version.
func WriteChecklist(path string, old, data []byte) (string, error) {
	st, err := os.Stat(path)
	if err != nil {
		return "", err
	}
	now, err := os.ReadFile(path)
	if err != nil {
		return "", err
	}
	if !bytes.Equal(now, old) {
		return "", fmt.Errorf("%s changed while the import ran: run it again", path)
	}
	backup, err := keep(path, old, st.Mode().Perm())
	if err != nil {
		return "", err
	}
	if err := folder.WriteWhole(path, data, st.Mode().Perm()); err != nil {
		os.Remove(backup)
		return "", err
	}
	return backup, nil
}

// Restore puts the previous version kept by WriteChecklist back in place.
func Restore(path, backup string) error { return os.Rename(backup, path) }

// keep makes the previous version: a hard link to the file (which the
// rename then leaves holding the old bytes), or a copy where links fail.
func keep(path string, old []byte, perm fs.FileMode) (string, error) {
	for n := 0; n < maxBackups; n++ {
		name := path + ".orig"
		if n > 0 {
			name += "." + strconv.Itoa(n)
		}
		err := os.Link(path, name)
		if err == nil {
			return name, nil
		}
		if errors.Is(err, fs.ErrExist) {
			continue
		}
		f, err := os.OpenFile(name, os.O_WRONLY|os.O_CREATE|os.O_EXCL, perm)
		if errors.Is(err, fs.ErrExist) {
			continue
		}
		if err != nil {
			return "", fmt.Errorf("cannot keep the previous version: %w", err)
		}
		_, err = f.Write(old)
		if err2 := f.Sync(); err == nil {
			err = err2
		}
		if err2 := f.Close(); err == nil {
			err = err2
		}
		if err != nil {
			os.Remove(name)
			return "", fmt.Errorf("cannot keep the previous version: %w", err)
		}
		return name, nil
	}
	return "", fmt.Errorf("cannot keep the previous version: %s.orig to .orig.%d all exist", path, maxBackups-1)
}
