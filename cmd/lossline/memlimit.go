package main

import (
	"bufio"
	"bytes"
	"math"
	"os"
	"runtime"
	"runtime/debug"
	"runtime/metrics"
	"strconv"
	"strings"
	"sync/atomic"
)

// Soft heap limits (runtime/debug.SetMemoryLimit). After each collection
// the limit is set from the live heap: while it is small, a fixed headroom
// above it, so that the garbage of the photo stage's decoders (tens of
// megabytes a photo) is returned promptly and its peak stays near the live
// heap plus the headroom however many photos there are; above smallHeap,
// the collector's default pacing (twice the live heap), so that a big
// survey never collects continuously. Never above the ceiling, half the
// memory available (at least minCeiling): a survey too big for the machine
// collects harder instead of running out of memory.
const (
	smallHeap  = 160 << 20
	headroom   = 64 << 20
	minCeiling = 512 << 20
)

// setSoftLimit starts setting the soft limit after each collection, unless
// GOMEMLIMIT is set, which wins.
func setSoftLimit() {
	if os.Getenv("GOMEMLIMIT") != "" {
		return
	}
	p := &pacer{ceiling: ceiling(availableMemory())}
	p.adjust()
	p.watch()
}

// pacer sets the soft limit from the live heap.
type pacer struct {
	ceiling int64
	stop    atomic.Bool // no more adjusting
}

// gcTick is garbage whose finalizer runs once the collection after it
// was made has ended.
type gcTick struct{ _ *int }

// watch arranges for adjust to run after the next collection, and again
// after each one.
func (p *pacer) watch() {
	runtime.SetFinalizer(&gcTick{}, func(*gcTick) {
		if !p.stop.Load() {
			p.adjust()
			p.watch()
		}
	})
}

func (p *pacer) adjust() {
	live := []metrics.Sample{{Name: "/gc/heap/live:bytes"}}
	metrics.Read(live)
	if live[0].Value.Kind() != metrics.KindUint64 {
		debug.SetMemoryLimit(p.ceiling)
		return
	}
	debug.SetMemoryLimit(limitFor(int64(live[0].Value.Uint64()), p.ceiling))
}

// limitFor is the soft limit for a live heap.
func limitFor(live, ceiling int64) int64 {
	if live >= smallHeap {
		return ceiling
	}
	return min(live+headroom, ceiling)
}

// ceiling is the highest soft limit for the memory available: half of it,
// at least minCeiling; none (the largest int64) when that is unknown.
func ceiling(available int64) int64 {
	if available <= 0 {
		return math.MaxInt64
	}
	return max(available/2, minCeiling)
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
