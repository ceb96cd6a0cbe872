package photo

import (
	"fmt"
	"sync"
)

// MaxDecodeBytes is the most memory one photo may need to be decoded: 1 GiB.
// A 200-megapixel baseline 4:2:0 photo needs about 300 MB; a progressive one
// about five times its size in pixels (image/jpeg keeps every coefficient
// until the last scan), so progressive photos are taken to about
// 140 megapixels. Photos are prepared at once only while together they stay
// within this (memoryBudget), so a run needs little more than 1 GiB for its
// photos however many cores it has.
const MaxDecodeBytes = 1 << 30

// maxProgressiveScans is the most scans taken in a progressive JPEG. Each scan
// is one more pass of the decoder over every block of its components, so the
// count bounds decoding time. libjpeg's jpeg_simple_progression (jcparam.c),
// the script most encoders use, writes 10 scans for YCbCr and 2 + 4 per
// component otherwise (18 for CMYK); 100 leaves room for tuned scripts and
// refuses the thousands of near-empty scans that stall a decoder for minutes.
const maxProgressiveScans = 100

// decodable says why decoding a JPEG of this layout would take too long or
// too much memory, or nil.
func (l *layout) decodable() error {
	if l.frame == markerSOF2 {
		if l.scans > maxProgressiveScans {
			return fmt.Errorf("too many scans (%d) for a photo", l.scans)
		}
	} else if l.scans > len(l.comps) {
		// A sequential frame codes each component whole in a single scan:
		// every sequential scan spans coefficients 0 to 63 (T.81 B.2.3, Ss and
		// Se), and a scan holds one to four components (B.2.2).
		return fmt.Errorf("too many scans (%d) for a photo: a sequential JPEG codes its %d components in %d at most", l.scans, len(l.comps), len(l.comps))
	}
	if need := l.decodeBytes(); need > MaxDecodeBytes {
		return fmt.Errorf("%d×%d pixels in this layout need about %d MiB to decode, over the %d MiB limit", l.width, l.height, need>>20, MaxDecodeBytes>>20)
	}
	return nil
}

// mcus is the frame's size in MCUs across and down, as image/jpeg counts them
// (the first component has the largest sampling factors in every layout it
// reads).
func (l *layout) mcus() (mxx, myy int64) {
	h0, v0 := int64(8*l.comps[0].h), int64(8*l.comps[0].v)
	return (int64(l.width) + h0 - 1) / h0, (int64(l.height) + v0 - 1) / v0
}

// planeBytes is the size of the decoded image's sample planes, one byte per
// sample, padded to whole MCUs as image/jpeg allocates them.
func (l *layout) planeBytes() int64 {
	mxx, myy := l.mcus()
	var n int64
	for _, c := range l.comps {
		n += 8 * int64(c.h) * mxx * 8 * int64(c.v) * myy
	}
	return n
}

// decodeBytes estimates what image/jpeg allocates to decode the file: the
// sample planes; for a progressive frame a 64-coefficient block of int32 (256
// bytes) per 8×8 block of every component, kept until the last scan; and an
// RGBA or CMYK copy at 4 bytes a pixel when it converts RGB or 4-component
// files.
func (l *layout) decodeBytes() int64 {
	planes := l.planeBytes()
	n := planes
	if l.frame == markerSOF2 {
		n += planes / 64 * 256
	}
	if len(l.comps) == 4 || l.rgb() {
		n += 4 * int64(l.width) * int64(l.height)
	}
	return n
}

// rgb reports whether image/jpeg takes a 3-component frame as RGB rather
// than YCbCr (its decoder's isRGB).
func (l *layout) rgb() bool {
	if len(l.comps) != 3 || l.jfif {
		return false
	}
	if l.adobe {
		return l.transform == 0
	}
	return l.comps[0].id == 'R' && l.comps[1].id == 'G' && l.comps[2].id == 'B'
}

// prepareBytes estimates what Prepare allocates for the photo reduced to
// longSide: decoding; reducing, for 4:2:0 and 4:4:4 YCbCr on the planes (less
// than another copy of them), for other layouts through x/image/draw's
// Catmull-Rom (a 32-byte temporary per destination column and source row);
// then the reduced picture turned (8 bytes a pixel of it at most) and encoded
// (under a byte a pixel), and 1 MiB of decoder and encoder state.
func (l *layout) prepareBytes(longSide int) int64 {
	dw, dh := fitLongSide(l.width, l.height, longSide)
	var reduce int64
	switch {
	case l.planar():
		reduce = l.planeBytes()
	case dw != l.width || dh != l.height:
		reduce = 32 * int64(dw) * int64(l.height)
	}
	return l.decodeBytes() + reduce + 9*int64(dw)*int64(dh) + 1<<20
}

// planar reports whether image/jpeg decodes the file to 4:2:0 or 4:4:4
// YCbCr, which Prepare reduces on its planes.
func (l *layout) planar() bool {
	if len(l.comps) != 3 || l.rgb() || l.comps[1].h != 1 || l.comps[1].v != 1 || l.comps[2].h != 1 || l.comps[2].v != 1 {
		return false
	}
	y := l.comps[0]
	return y.h == 1 && y.v == 1 || y.h == 2 && y.v == 2
}

// memoryBudget lets photos be prepared at the same time only while the
// memory they are estimated to need stays within a total; a photo needing
// more than the total waits to run alone. Photos are let in first come,
// first served, so a large one is not overtaken for ever.
type memoryBudget struct {
	mu            sync.Mutex
	turn          sync.Cond
	free, total   int64
	next, serving uint64 // tickets handed out; the ticket whose turn it is
}

func newMemoryBudget(total int64) *memoryBudget {
	b := &memoryBudget{free: total, total: total}
	b.turn.L = &b.mu
	return b
}

// acquire waits until n bytes (at most the total) are free and takes them; it
// returns what it took, for release.
func (b *memoryBudget) acquire(n int64) int64 {
	n = min(max(n, 0), b.total)
	b.mu.Lock()
	defer b.mu.Unlock()
	ticket := b.next
	b.next++
	for b.serving != ticket || b.free < n {
		b.turn.Wait()
	}
	b.serving++
	b.free -= n
	b.turn.Broadcast()
	return n
}

// release gives back what acquire took.
func (b *memoryBudget) release(n int64) {
	b.mu.Lock()
	b.free += n
	b.mu.Unlock()
	b.turn.Broadcast()
}
