//go:build linux || darwin || freebsd || netbsd || openbsd || dragonfly

package report

import (
	"errors"
	"os"
	"syscall"
)

// tryLock takes an exclusive flock on the file path, created if missing,
// without waiting. The kernel releases it when the process ends, however it
// ends, so a killed run never leaves the folder locked. Releasing removes
// the file while still holding it; a run that meanwhile locked the removed
// file sees that path no longer names it and counts the lock as busy.
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
	held, err := f.Stat()
	if err != nil {
		f.Close()
		return nil, false, err
	}
	if now, err := os.Stat(path); err != nil || !os.SameFile(held, now) {
		f.Close() // closing releases the flock
		return nil, true, nil
	}
	return func() {
		os.Remove(path)
		f.Close()
	}, false, nil
}

// staleLockHint adds nothing: a flock dies with its process.
func staleLockHint(string) string { return "" }
