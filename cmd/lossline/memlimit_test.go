package main

import (
	"math"
	"runtime"
	"runtime/debug"
	"testing"
	"time"
)

// The soft heap limit is the live heap plus 64 MiB while the live heap is
// under 160 MiB, above that the ceiling (the collector's own pacing), and
// never above the ceiling: half the memory available, at least 512 MiB,
// none when unknown. The available memory is the lower of /proc/meminfo's
// MemAvailable and the cgroup limit (Linux proc(5): MemAvailable in kB;
// cgroup v2 memory.max "max" or bytes; cgroup v1 memory.limit_in_bytes near
// the largest int64 when unlimited).
func TestSoftLimit(t *testing.T) {
	const mib = 1 << 20
	for _, c := range []struct {
		available, want int64
	}{
		{0, math.MaxInt64},
		{-1, math.MaxInt64},
		{24 << 30, 12 << 30},
		{800 * mib, 512 * mib},
		{100 * mib, 512 * mib},
	} {
		if got := ceiling(c.available); got != c.want {
			t.Errorf("ceiling(%d) = %d, want %d", c.available, got, c.want)
		}
	}
	for _, c := range []struct {
		live, ceiling, want int64
	}{
		{0, 12 << 30, 64 * mib},
		{100 * mib, 12 << 30, 164 * mib},
		{159 * mib, 12 << 30, 223 * mib},
		{160 * mib, 12 << 30, 12 << 30},
		{3 << 30, 12 << 30, 12 << 30},
		{100 * mib, 150 * mib, 150 * mib},
	} {
		if got := limitFor(c.live, c.ceiling); got != c.want {
			t.Errorf("limitFor(%d, %d) = %d, want %d", c.live, c.ceiling, got, c.want)
		}
	}
	meminfo := "MemTotal:       24683336 kB\nMemFree:        18057272 kB\nMemAvailable:   21997024 kB\nBuffers:          212680 kB\n"
	if got := memAvailable([]byte(meminfo)); got != 21997024<<10 {
		t.Errorf("memAvailable = %d", got)
	}
	if got := memAvailable([]byte("MemTotal: 1 kB\n")); got != 0 {
		t.Errorf("memAvailable without the line = %d", got)
	}
	for text, want := range map[string]int64{"max\n": 0, "9223372036854771712\n": 0, "2147483648\n": 2 << 30, "junk": 0, "-5": 0} {
		if got := cgroupLimit([]byte(text)); got != want {
			t.Errorf("cgroupLimit(%q) = %d, want %d", text, got, want)
		}
	}
}

// After a collection the pacer has set the limit from the live heap.
func TestPacerFollowsCollections(t *testing.T) {
	defer debug.SetMemoryLimit(debug.SetMemoryLimit(-1))
	debug.SetMemoryLimit(math.MaxInt64)
	p := &pacer{ceiling: 1 << 40}
	defer p.stop.Store(true)
	p.watch()
	for i := 0; i < 200 && debug.SetMemoryLimit(-1) == math.MaxInt64; i++ {
		runtime.GC()
		time.Sleep(5 * time.Millisecond)
	}
	if got := debug.SetMemoryLimit(-1); got < headroom || got >= smallHeap+headroom {
		t.Errorf("limit %d after collections of a small heap, want the live heap plus %d", got, headroom)
	}
}
