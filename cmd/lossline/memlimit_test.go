package main

import "testing"

// The soft heap limit is half the memory available, never below 512 MiB,
// none when the memory is unknown; the available memory is the lower of
// /proc/meminfo's MemAvailable and the cgroup limit (Linux proc(5):
// MemAvailable in kB; cgroup v2 memory.max "max" or bytes; cgroup v1
// memory.limit_in_bytes near the largest int64 when unlimited).
func TestSoftLimit(t *testing.T) {
	for _, c := range []struct {
		available, want int64
	}{
		{0, 0},
		{-1, 0},
		{24 << 30, 12 << 30},
		{800 << 20, 512 << 20},
		{100 << 20, 512 << 20},
	} {
		if got := softLimit(c.available); got != c.want {
			t.Errorf("softLimit(%d) = %d, want %d", c.available, got, c.want)
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
