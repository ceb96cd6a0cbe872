// Package templates holds the report's fixed prose (cautions, methods) and the
// scaffold that `lossline new` writes, as Markdown embedded in the binary. A
// folder given in the settings replaces the methods text and the scaffold
// files it holds, and adds to the cautions, which always print.
package templates

import (
	"embed"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"github.com/lossline/lossline/internal/folder"
)

//go:embed report/*.md scaffold/*
var builtin embed.FS

// MaxFileBytes is the largest template file a folder may hold.
const MaxFileBytes = 256 << 10

// Additive lists the templates a folder cannot replace, only add to: the
// built-in text always prints and the folder's copy follows it.
var Additive = []string{"report/cautions.md"}

// Set is the embedded templates with an optional folder of the user's in
// front.
type Set struct {
	Override string // folder whose files replace or add to the embedded ones; "" for none
}

// Error is a template refused or failed: the file (or folder) and why.
type Error struct {
	File string
	Err  error
}

func (e *Error) Error() string { return e.File + ": " + e.Err.Error() }

func (e *Error) Unwrap() error { return e.Err }

// Open returns the set with dir as its folder once dir, with its symbolic
// links resolved, is found inside one of roots (resolved too): the survey
// folder and the folders named on the command line. dir "" is no folder.
func Open(dir string, roots ...string) (Set, error) {
	if dir == "" {
		return Set{}, nil
	}
	real, err := folder.Resolve(dir)
	if err != nil {
		return Set{}, &Error{File: dir, Err: err}
	}
	if st, err := os.Stat(real); err != nil || !st.IsDir() {
		return Set{}, &Error{File: dir, Err: errors.New("templates folder not found")}
	}
	for _, r := range roots {
		if root, err := folder.Resolve(r); err == nil && folder.Contains(root, real) {
			return Set{Override: dir}, nil
		}
	}
	leads := ""
	if abs, _ := filepath.Abs(dir); abs != real {
		leads = " (it leads to " + real + ")"
	}
	return Set{}, &Error{File: dir, Err: fmt.Errorf("templates folder%s is outside %s: it must be inside the survey folder "+
		"or a folder named on the command line (--templates, the folder of --config)", leads, strings.Join(roots, " and "))}
}

// Read returns the named template ("report/methods.md", "scaffold/survey.md"):
// from the folder when it holds the file, else the embedded copy.
func (s Set) Read(name string) ([]byte, error) {
	b, err := s.readOverride(name)
	if b != nil || err != nil {
		return b, err
	}
	return builtin.ReadFile(name)
}

// readOverride reads the folder's copy of the named template: nil when the
// folder has none. The file must be a regular file no larger than
// MaxFileBytes, inside the folder once its links are resolved.
func (s Set) readOverride(name string) ([]byte, error) {
	if s.Override == "" {
		return nil, nil
	}
	path := filepath.Join(s.Override, filepath.FromSlash(name))
	if _, err := os.Lstat(path); errors.Is(err, fs.ErrNotExist) {
		return nil, nil
	}
	root, err := filepath.EvalSymlinks(s.Override)
	if err != nil {
		return nil, &Error{File: s.Override, Err: err}
	}
	real, err := filepath.EvalSymlinks(path)
	if err != nil {
		return nil, &Error{File: path, Err: fmt.Errorf("cannot be read: %w", err)}
	}
	if !folder.Contains(root, real) {
		return nil, &Error{File: path, Err: fmt.Errorf("leads to %s, outside the templates folder %s", real, s.Override)}
	}
	st, err := os.Stat(real)
	switch {
	case err != nil:
		return nil, &Error{File: path, Err: err}
	case !st.Mode().IsRegular():
		return nil, &Error{File: path, Err: errors.New("is not a regular file")}
	case st.Size() > MaxFileBytes:
		return nil, &Error{File: path, Err: fmt.Errorf("is %d KiB, more than the %d KiB a template may have", st.Size()>>10, MaxFileBytes>>10)}
	}
	f, err := os.Open(real)
	if err != nil {
		return nil, &Error{File: path, Err: err}
	}
	defer f.Close()
	b, err := io.ReadAll(io.LimitReader(f, MaxFileBytes+1))
	if err != nil {
		return nil, &Error{File: path, Err: err}
	}
	if len(b) > MaxFileBytes {
		return nil, &Error{File: path, Err: fmt.Errorf("grew past the %d KiB a template may have while read", MaxFileBytes>>10)}
	}
	return b, nil
}

// Execute reads the named template and fills it with data (text/template),
// within the limits of run. A template the folder only adds to (Additive)
// comes from the embedded set.
func (s Set) Execute(name string, data any) (string, error) {
	if slices.Contains(Additive, name) {
		s.Override = ""
	}
	src, err := s.Read(name)
	if err != nil {
		return "", err
	}
	return run(s.fileName(name), src, data)
}

// Addition returns the folder's text for a template it adds to (Additive),
// filled with data: "" when the folder has none.
func (s Set) Addition(name string, data any) (string, error) {
	src, err := s.readOverride(name)
	if err != nil || src == nil {
		return "", err
	}
	return run(s.fileName(name), src, data)
}

// fileName names the template in messages: its path in the folder, or the
// embedded name.
func (s Set) fileName(name string) string {
	if s.Override != "" {
		if _, err := os.Lstat(filepath.Join(s.Override, filepath.FromSlash(name))); err == nil {
			return filepath.Join(s.Override, filepath.FromSlash(name))
		}
	}
	return "built-in " + name
}

// Scaffold lists the files `lossline new` writes, relative to the new folder.
var Scaffold = []string{"survey.md", "lossline.yaml"}
