//go:build linux || darwin || freebsd || netbsd || openbsd || dragonfly

package report

import (
	"errors"
	"os"
	"syscall"
)

// tryLock takes an exclusive flock on the file path, created if missing,
// without waiting. The kernel releases it when the process ends, however it
// ends, so a killed run never leaves the folder locked. The file stays.
func tryLock(path string) (release func(), busy bool, err error) {
	f, err := os.OpenFile(path, os.O_RDWR|os.O_CREATE, 0o644)
	if err != nil {
		return nil, false, err
	}
	if err := syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB); err != nil {
		f.Close()
		if errors.Is(err, syscall.EWOULDBLOCK) {
			return nil, true, nil
		}
		return nil, false, err
	}
	return func() {
		syscall.Flock(int(f.Fd()), syscall.LOCK_UN)
		f.Close()
	}, false, nil
}

// staleLockHint adds nothing: a flock dies with its process.
func staleLockHint(string) string { return "" }
