//go:build unix

package templates

import (
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// A FIFO in the folder is refused at once instead of blocking the read.
func TestFolderFIFOIsRefused(t *testing.T) {
	dir := t.TempDir()
	os.MkdirAll(filepath.Join(dir, "report"), 0o755)
	if err := syscall.Mkfifo(filepath.Join(dir, "report", "methods.md"), 0o644); err != nil {
		t.Skip("no FIFOs here:", err)
	}
	start := time.Now()
	_, err := Set{Override: dir}.Execute("report/methods.md", nil)
	if err == nil || !strings.Contains(err.Error(), "not a regular file") || time.Since(start) > time.Second {
		t.Errorf("a FIFO: %v after %v", err, time.Since(start))
	}
}
