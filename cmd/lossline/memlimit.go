package main

import (
	"bufio"
	"bytes"
	"os"
	"runtime/debug"
	"strconv"
	"strings"
)

// minSoftLimit is the lowest soft heap limit set: below it a survey of a
// few hundred thousand CMLs, whose live heap is a few hundred megabytes,
// would collect continuously.
const minSoftLimit = 512 << 20

// setSoftLimit sets the Go heap's soft limit (runtime/debug.SetMemoryLimit)
// to half the memory available to the process, at least minSoftLimit: a
// survey too big for the machine then collects harder instead of running out
// of memory, and an ordinary run is left to the collector's default pacing
// (twice the live heap). GOMEMLIMIT, when set, wins. The photo stage bounds
// its own memory by its workers. It returns the limit set, 0 for none.
func setSoftLimit() int64 {
	if os.Getenv("GOMEMLIMIT") != "" {
		return 0
	}
	limit := softLimit(availableMemory())
	if limit > 0 {
		debug.SetMemoryLimit(limit)
	}
	return limit
}

// softLimit is the soft heap limit for the memory available, 0 (none) when
// that is unknown.
func softLimit(available int64) int64 {
	if available <= 0 {
		return 0
	}
	return max(available/2, minSoftLimit)
}

// availableMemory is the memory the process may still use: MemAvailable of
// /proc/meminfo, or the cgroup's limit (v2 memory.max, v1
// memory.limit_in_bytes) if lower; 0 when neither can be read.
func availableMemory() int64 {
	avail := int64(0)
	if b, err := os.ReadFile("/proc/meminfo"); err == nil {
		avail = memAvailable(b)
	}
	for _, f := range []string{"/sys/fs/cgroup/memory.max", "/sys/fs/cgroup/memory/memory.limit_in_bytes"} {
		if b, err := os.ReadFile(f); err == nil {
			if n := cgroupLimit(b); n > 0 && (avail == 0 || n < avail) {
				avail = n
			}
			break
		}
	}
	return avail
}

// memAvailable reads the MemAvailable line of /proc/meminfo, in bytes; 0
// when it has none.
func memAvailable(meminfo []byte) int64 {
	sc := bufio.NewScanner(bytes.NewReader(meminfo))
	for sc.Scan() {
		f := strings.Fields(sc.Text())
		if len(f) == 3 && f[0] == "MemAvailable:" && f[2] == "kB" {
			if n, err := strconv.ParseInt(f[1], 10, 64); err == nil && n > 0 && n < 1<<53 {
				return n << 10
			}
		}
	}
	return 0
}

// cgroupLimit reads a cgroup memory limit file: a number of bytes, or "max"
// (v2) or a value near the largest int64 (v1) for none, which give 0.
func cgroupLimit(b []byte) int64 {
	n, err := strconv.ParseInt(strings.TrimSpace(string(b)), 10, 64)
	if err != nil || n <= 0 || n >= 1<<62 {
		return 0
	}
	return n
}
