package photo

import (
	"runtime"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/lossline/lossline/internal/jpegscans"
)

// What Prepare allocates stays within prepareBytes, the estimate the photo
// stage budgets by, and the estimate is not so loose that it turns real
// photos away: measured with the runtime's own count of allocated bytes, for
// every layout image/jpeg decodes and both reduction paths, turned (which
// allocates more than leaving the picture as stored).
func TestPrepareMemoryWithinEstimate(t *testing.T) {
	if testing.Short() {
		t.Skip("decodes several 3-megapixel images")
	}
	const w, h = 2000, 1500
	for _, c := range []struct {
		name string
		data []byte
	}{
		{"sequential grey", jpegscans.Sequential(w, h, jpegscans.Grey, 1)},
		{"sequential 4:2:0", jpegscans.Sequential(w, h, jpegscans.YCbCr420, 3)},
		{"sequential 4:4:4", jpegscans.Sequential(w, h, jpegscans.YCbCr444, 3)},
		{"sequential CMYK", jpegscans.Sequential(w, h, jpegscans.CMYK, 4)},
		{"progressive grey", jpegscans.Progressive(w, h, jpegscans.Grey, 5)},
		{"progressive 4:2:0", jpegscans.Progressive(w, h, jpegscans.YCbCr420, 10)},
		{"progressive 4:4:4", jpegscans.Progressive(w, h, jpegscans.YCbCr444, 10)},
		{"progressive CMYK", jpegscans.Progressive(w, h, jpegscans.CMYK, 18)},
		{"progressive 4:2:0, not reduced", jpegscans.Progressive(1200, 800, jpegscans.YCbCr420, 10)},
		{"progressive CMYK, not reduced", jpegscans.Progressive(1200, 800, jpegscans.CMYK, 18)},
	} {
		l, err := decodableLayout(c.data)
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		est := l.prepareBytes(1600)
		var before, after runtime.MemStats
		runtime.GC()
		runtime.ReadMemStats(&before)
		p, err := prepare(c.data, l, 6, Settings{LongSide: 1600, Quality: 80})
		runtime.ReadMemStats(&after)
		if err != nil || max(p.Width, p.Height) != min(1600, max(l.width, l.height)) {
			t.Fatalf("%s: %d×%d, %v", c.name, p.Width, p.Height, err)
		}
		if got := int64(after.TotalAlloc - before.TotalAlloc); got > est || est > 3*got {
			t.Errorf("%s: allocated %d bytes, estimated %d", c.name, got, est)
		}
	}
}

// A file whose decoding needs more than MaxDecodeBytes is refused in the
// scan stage by its frame header alone: 140 megapixels of progressive 4:4:4
// (image/jpeg keeps 256 bytes of coefficients per 64 samples of each
// component): 3 × 140e6 × (1 + 4) bytes = 2002 MiB. The same pixels as
// baseline 4:2:0 pass.
func TestDecodeMemoryLimit(t *testing.T) {
	const w, h = 14000, 10000
	head := func(data []byte) []byte { return data[:2000] } // the headers and the start of the first scan
	prog := head(jpegscans.Progressive(w, h, jpegscans.YCbCr444, 1))
	if _, err := ScanBytes(prog, 200); err == nil || !strings.Contains(err.Error(), "14000×10000 pixels in this layout need about 2002 MiB to decode, over the 1024 MiB limit") {
		t.Errorf("progressive 4:4:4: %v", err)
	}
	if hd, err := ScanBytes(head(jpegscans.Sequential(w, h, jpegscans.YCbCr420, 3)), 200); err != nil || hd.Width != w {
		t.Errorf("baseline 4:2:0: %+v, %v", hd, err)
	}
}

// The budget lets photos in while their estimates fit together, one larger
// than the whole alone, in the order they asked.
func TestMemoryBudget(t *testing.T) {
	b := newMemoryBudget(100)
	var mu sync.Mutex
	var inUse, peak int64
	var order []int64
	var wg sync.WaitGroup
	for i, need := range []int64{60, 30, 250, 50, 40, 10} {
		wg.Add(1)
		go func() {
			defer wg.Done()
			time.Sleep(time.Duration(i) * 20 * time.Millisecond) // ask in this order
			held := b.acquire(need)
			mu.Lock()
			order = append(order, need)
			inUse += held
			peak = max(peak, inUse)
			mu.Unlock()
			time.Sleep(50 * time.Millisecond)
			mu.Lock()
			inUse -= held
			mu.Unlock()
			b.release(held)
		}()
	}
	wg.Wait()
	if peak != 100 {
		t.Errorf("peak %d, want 100 (the large one alone)", peak)
	}
	if len(order) != 6 || order[0] != 60 || order[1] != 30 || order[2] != 250 {
		t.Errorf("let in %v, want 60, 30, 250 first", order)
	}
	if b.free != 100 {
		t.Errorf("%d free after all released, want 100", b.free)
	}
}
