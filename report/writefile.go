package report

import "github.com/lossline/lossline/internal/folder"

// WriteFile writes one output file whole: into a temporary file beside path,
// then renamed over it, so that path never holds part of it.
func WriteFile(path string, data []byte) error { return folder.WriteWhole(path, data, 0o644) }
