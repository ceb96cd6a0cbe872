//go:build unix

package photo

import (
	"bytes"
	"image"
	"image/jpeg"
	"net"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// Files that are not regular, or too large, are refused by their type and
// size before they are opened: none of these may block, stream without end or
// be read whole. Each case must end well within a second.
func TestScanOpensOnlyRegularFiles(t *testing.T) {
	dir := t.TempDir()
	at := func(name string) string { return filepath.Join(dir, name) }
	if err := syscall.Mkfifo(at("p.jpg"), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink("/dev/zero", at("z.jpg")); err != nil {
		t.Fatal(err)
	}
	big, err := os.Create(at("big.jpg")) // sparse: 5 GiB declared, nothing written
	if err != nil {
		t.Fatal(err)
	}
	if err := big.Truncate(5 << 30); err != nil {
		t.Fatal(err)
	}
	big.Close()
	os.Mkdir(at("folder.jpg"), 0o755)
	sock, err := net.Listen("unix", at("s.jpg"))
	if err != nil {
		t.Fatal(err)
	}
	defer sock.Close()
	var plain bytes.Buffer
	jpeg.Encode(&plain, image.NewGray(image.Rect(0, 0, 8, 8)), nil)
	os.WriteFile(at("ok.jpg"), plain.Bytes(), 0o644)

	for name, want := range map[string]string{
		"p.jpg":      "not a regular file (named pipe)",
		"z.jpg":      "not a regular file (device)",
		"big.jpg":    "file larger than 64 MiB",
		"folder.jpg": "not a regular file (folder)",
		"s.jpg":      "not a regular file (socket)",
		"none.jpg":   "cannot be read",
		"ok.jpg":     "",
	} {
		for _, step := range []struct {
			name string
			run  func(string) error
		}{
			{"Scan", func(p string) error { _, err := Scan(p, 200); return err }},
			{"Prepare", func(p string) error { _, err := Prepare(p, 1, Settings{LongSide: 100, Quality: 80}); return err }},
		} {
			done := make(chan error, 1)
			start := time.Now()
			go func() { done <- step.run(at(name)) }()
			select {
			case err := <-done:
				if took := time.Since(start); took > time.Second {
					t.Errorf("%s %s: took %v", step.name, name, took)
				}
				if want == "" && err != nil || want != "" && (err == nil || !strings.Contains(err.Error(), want)) {
					t.Errorf("%s %s: %v, want %q", step.name, name, err, want)
				}
			case <-time.After(10 * time.Second):
				t.Fatalf("%s %s: still running after 10 s", step.name, name)
			}
		}
	}
}

// The non-blocking open is the second guard: a named pipe opened by it
// returns at once (the type check before it is the first).
func TestOpenNonBlockingFIFO(t *testing.T) {
	path := filepath.Join(t.TempDir(), "p.jpg")
	if err := syscall.Mkfifo(path, 0o644); err != nil {
		t.Fatal(err)
	}
	done := make(chan error, 1)
	go func() {
		f, err := os.OpenFile(path, os.O_RDONLY|openNonBlocking, 0)
		if err == nil {
			f.Close()
		}
		done <- err
	}()
	select {
	case err := <-done:
		if err != nil {
			t.Errorf("non-blocking open of a pipe: %v", err)
		}
	case <-time.After(5 * time.Second):
		t.Fatal("opening a named pipe blocked")
	}
}
