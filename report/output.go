package report

import (
	"fmt"
	"os"
	"path/filepath"
)

// File is one output, rendered in memory.
type File struct {
	Name string
	Data []byte
}

// WriteFiles writes every file into dir, each to a temporary file first and
// then renamed over its final name, only once all are written. An earlier
// report in dir stays whole if anything fails before the renames.
func WriteFiles(dir string, files []File) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return err
	}
	var temps []string
	cleanup := func() {
		for _, t := range temps {
			os.Remove(t)
		}
	}
	for _, f := range files {
		tmp, err := os.CreateTemp(dir, "."+f.Name+".*.tmp")
		if err != nil {
			cleanup()
			return err
		}
		temps = append(temps, tmp.Name())
		_, werr := tmp.Write(f.Data)
		cerr := tmp.Close()
		if werr != nil || cerr != nil {
			cleanup()
			return fmt.Errorf("writing %s: %w", f.Name, firstErr(werr, cerr))
		}
		if err := os.Chmod(tmp.Name(), 0o644); err != nil {
			cleanup()
			return err
		}
	}
	for i, f := range files {
		if err := os.Rename(temps[i], filepath.Join(dir, f.Name)); err != nil {
			cleanup()
			return err
		}
	}
	return nil
}

func firstErr(errs ...error) error {
	for _, e := range errs {
		if e != nil {
			return e
		}
	}
	return nil
}
