package report

import (
	"fmt"
	"time"
)

// lockPoll is how often a waiting run tries the lock again.
const lockPoll = 50 * time.Millisecond

// lockFolder takes the lock of the output folder out, held in the file path,
// waiting up to opt.Wait for another run that holds it. It returns the
// function that releases the lock.
func lockFolder(path, out string, opt WriteOptions) (func(), error) {
	deadline := time.Now().Add(opt.Wait)
	told := false
	for {
		release, busy, err := tryLock(path)
		if err != nil {
			return nil, fmt.Errorf("locking %s: %w", out, err)
		}
		if !busy {
			return release, nil
		}
		if !told && opt.Waiting != nil {
			opt.Waiting()
			told = true
		}
		if time.Now().After(deadline) {
			return nil, fmt.Errorf("another lossline run is still writing %s after %v; try again later%s", out, opt.Wait, staleLockHint(path))
		}
		time.Sleep(lockPoll)
	}
}
