//go:build !(linux || darwin || freebsd || netbsd || openbsd || dragonfly)

package report

import (
	"errors"
	"io/fs"
	"os"
)

// tryLock creates the file path exclusively, without waiting; the file is
// the lock and releasing removes it. Used where flock is not available.
func tryLock(path string) (release func(), busy bool, err error) {
	f, err := os.OpenFile(path, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
	if errors.Is(err, fs.ErrExist) {
		return nil, true, nil
	}
	if err != nil {
		return nil, false, err
	}
	f.Close()
	return func() { os.Remove(path) }, false, nil
}

// staleLockHint tells how to clear a lock file a killed run left behind.
func staleLockHint(path string) string {
	return " (if no other run is writing, a killed run left the lock: remove " + path + ")"
}
