//go:build unix

package survey

import (
	"runtime"
	"syscall"
	"testing"
	"time"

	"github.com/lossline/lossline/internal/scalesurvey"
)

// LoadSeries (what check runs: reading, merging earlier folders, the checks
// after the merge, placing photos) costs in proportion to the CMLs: four
// times the CMLs take at most eight times the CPU time (the least of three
// runs; a cost growing with the square would take sixteen) and at most 4.5
// times the allocations and bytes allocated, for a refinery of 1,000
// components, the same in three folders, and one component of many CMLs
// with positions (where checks that judge a CML against the component's or
// asset's others would grow with the square).
func TestCheckCostIsLinear(t *testing.T) {
	if testing.Short() {
		t.Skip("generates and reads surveys of up to 80,000 CMLs")
	}
	for _, c := range []struct {
		name    string
		size    scalesurvey.Size
		history bool
	}{
		{"refinery", scalesurvey.Size{CMLs: 20_000}, false},
		{"refinery in three folders", scalesurvey.Size{CMLs: 20_000}, true},
		{"one component with positions", scalesurvey.Size{CMLs: 10_000, Units: 1, Circuits: 1, GPS: true}, false},
	} {
		t.Run(c.name, func(t *testing.T) {
			small := checkCost(t, c.size, c.history)
			big := c.size
			big.CMLs *= 4
			large := checkCost(t, big, c.history)
			t.Logf("%d CMLs: %v, %d allocations, %d bytes; %d CMLs: %v, %d allocations, %d bytes",
				c.size.CMLs, small.cpu, small.allocs, small.bytes, big.CMLs, large.cpu, large.allocs, large.bytes)
			if r := float64(large.cpu) / float64(small.cpu); r > 8 {
				t.Errorf("CPU time grew %.1f times for 4 times the CMLs", r)
			}
			if r := float64(large.allocs) / float64(small.allocs); r > 4.5 {
				t.Errorf("allocations grew %.1f times for 4 times the CMLs", r)
			}
			if r := float64(large.bytes) / float64(small.bytes); r > 4.5 {
				t.Errorf("bytes allocated grew %.1f times for 4 times the CMLs", r)
			}
		})
	}
}

type cost struct {
	cpu           time.Duration
	allocs, bytes uint64
}

// checkCost is the least CPU time of three LoadSeries of a generated
// survey, and the allocations of the last.
func checkCost(t *testing.T, size scalesurvey.Size, history bool) cost {
	dir := scaleFolder(t, size, history)
	best := cost{cpu: time.Duration(1<<63 - 1)}
	for range 3 {
		runtime.GC()
		var m0, m1 runtime.MemStats
		runtime.ReadMemStats(&m0)
		c0 := processCPU(t)
		s, problems := LoadSeries(dir, nil, DefaultOptions)
		c1 := processCPU(t)
		runtime.ReadMemStats(&m1)
		if problems.HasErrors() || s.CMLCount() != size.CMLs {
			t.Fatalf("%d CMLs, problems %v", s.CMLCount(), problems)
		}
		best = cost{min(best.cpu, c1-c0), m1.Mallocs - m0.Mallocs, m1.TotalAlloc - m0.TotalAlloc}
	}
	return best
}

// processCPU is the CPU time the test process has used, user and system.
func processCPU(t *testing.T) time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		t.Fatal(err)
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
