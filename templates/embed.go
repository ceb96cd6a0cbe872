// Package templates holds the report's fixed prose (cautions, methods) and the
// scaffold that `lossline new` writes, as Markdown embedded in the binary. A
// folder given in the settings overrides any file of the same name.
package templates

import (
	"bytes"
	"embed"
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"text/template"
)

//go:embed report/*.md scaffold/*
var builtin embed.FS

// Set is the embedded templates with an optional override folder in front.
type Set struct {
	Override string // folder whose files replace the embedded ones; "" for none
}

// Read returns the named template ("report/cautions.md", "scaffold/survey.md"):
// from the override folder when it has the file, else the embedded copy.
func (s Set) Read(name string) ([]byte, error) {
	if s.Override != "" {
		b, err := os.ReadFile(filepath.Join(s.Override, filepath.FromSlash(name)))
		if err == nil {
			return b, nil
		}
		if !errors.Is(err, fs.ErrNotExist) {
			return nil, err
		}
	}
	return builtin.ReadFile(name)
}

// Execute reads the named template and fills it with data (text/template).
func (s Set) Execute(name string, data any) (string, error) {
	src, err := s.Read(name)
	if err != nil {
		return "", err
	}
	t, err := template.New(name).Option("missingkey=error").Parse(string(src))
	if err != nil {
		return "", err
	}
	var b bytes.Buffer
	if err := t.Execute(&b, data); err != nil {
		return "", err
	}
	return b.String(), nil
}

// Scaffold lists the files `lossline new` writes, relative to the new folder.
var Scaffold = []string{"survey.md", "lossline.yaml"}
