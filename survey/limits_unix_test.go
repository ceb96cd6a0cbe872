//go:build unix

package survey

import (
	"os"
	"path/filepath"
	"syscall"
	"testing"
	"time"
)

// A survey.md that is a pipe or a link to a device is refused from its file
// type: reading it would block or never end.
func TestChecklistNotAFileRefused(t *testing.T) {
	fifo := t.TempDir()
	if err := syscall.Mkfifo(filepath.Join(fifo, ChecklistFile), 0o644); err != nil {
		t.Skip("no FIFO here:", err)
	}
	zero := t.TempDir()
	if err := os.Symlink("/dev/zero", filepath.Join(zero, ChecklistFile)); err != nil {
		t.Skip("no symlink here:", err)
	}
	for _, dir := range []string{fifo, zero} {
		done := make(chan ProblemList, 1)
		go func() { _, problems := Load(dir); done <- problems }()
		select {
		case problems := <-done:
			wantProblem(t, dir, problems, filepath.Join(dir, ChecklistFile)+": not a regular file")
		case <-time.After(5 * time.Second):
			t.Fatalf("%s: Load still reading after 5 s", dir)
		}
	}
}
