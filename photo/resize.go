package photo

import (
	"image"
	"math"
)

// plane is one 8-bit channel of an image.
type plane struct {
	pix          []uint8
	w, h, stride int
}

// halve averages 2×2 blocks (a box filter): the cheap first steps of a large
// reduction, before the exact resampling.
func (p plane) halve() plane {
	w, h := p.w/2, p.h/2
	out := plane{pix: make([]uint8, w*h), w: w, h: h, stride: w}
	for y := 0; y < h; y++ {
		r0, r1 := p.pix[2*y*p.stride:], p.pix[(2*y+1)*p.stride:]
		o := out.pix[y*w:]
		for x := 0; x < w; x++ {
			o[x] = uint8((uint16(r0[2*x]) + uint16(r0[2*x+1]) + uint16(r1[2*x]) + uint16(r1[2*x+1]) + 2) / 4)
		}
	}
	return out
}

// catmullRom is the cubic convolution kernel with a = −0.5 (Keys 1981).
func catmullRom(x float64) float64 {
	x = math.Abs(x)
	switch {
	case x < 1:
		return (1.5*x-2.5)*x*x + 1
	case x < 2:
		return ((-0.5*x+2.5)*x-4)*x + 2
	}
	return 0
}

// weights are the taps of a 1-D resampling from n to m samples.
type weights struct {
	start []int
	taps  [][]float32
}

func resampleWeights(n, m int) weights {
	scale := float64(n) / float64(m)
	support := 2 * math.Max(scale, 1)
	ws := weights{start: make([]int, m), taps: make([][]float32, m)}
	for i := 0; i < m; i++ {
		center := (float64(i)+0.5)*scale - 0.5
		lo, hi := int(math.Ceil(center-support)), int(math.Floor(center+support))
		var sum float64
		taps := make([]float64, 0, hi-lo+1)
		for j := lo; j <= hi; j++ {
			w := catmullRom((float64(j) - center) / math.Max(scale, 1))
			taps = append(taps, w)
			sum += w
		}
		ws.start[i] = lo
		ws.taps[i] = make([]float32, len(taps))
		for k, w := range taps {
			ws.taps[i][k] = float32(w / sum)
		}
	}
	return ws
}

func clampIndex(i, n int) int {
	if i < 0 {
		return 0
	}
	if i >= n {
		return n - 1
	}
	return i
}

func toUint8(v float32) uint8 {
	switch {
	case v <= 0:
		return 0
	case v >= 255:
		return 255
	}
	return uint8(v + 0.5)
}

// resize resamples a plane to w × h: box halving while the plane is at least
// twice the target, then a separable Catmull-Rom pass each way. The
// intermediate buffer is one float32 row set of the target width, not the
// whole source image.
func (p plane) resize(w, h int) plane {
	for p.w >= 2*w && p.h >= 2*h && p.w >= 2 && p.h >= 2 {
		p = p.halve()
	}
	if p.w == w && p.h == h {
		return p
	}
	hw, vw := resampleWeights(p.w, w), resampleWeights(p.h, h)
	// Flatten the horizontal taps with their source columns clamped once.
	var cols []int32
	var taps []float32
	span := make([]int32, w+1)
	for x := 0; x < w; x++ {
		for k, t := range hw.taps[x] {
			cols = append(cols, int32(clampIndex(hw.start[x]+k, p.w)))
			taps = append(taps, t)
		}
		span[x+1] = int32(len(cols))
	}
	// Horizontally filtered rows are made when the vertical pass first needs
	// them and kept in a small ring: the passes never hold a whole image.
	ringN := 0
	for _, t := range vw.taps {
		ringN = max(ringN, len(t))
	}
	ringN++
	ring := make([]float32, ringN*w)
	ringRow := make([]int, ringN)
	for i := range ringRow {
		ringRow[i] = -1
	}
	hrow := func(sy int) []float32 {
		slot := sy % ringN
		buf := ring[slot*w : (slot+1)*w]
		if ringRow[slot] == sy {
			return buf
		}
		ringRow[slot] = sy
		row := p.pix[sy*p.stride : sy*p.stride+p.w]
		for x := range buf {
			var s float32
			for k := span[x]; k < span[x+1]; k++ {
				s += taps[k] * float32(row[cols[k]])
			}
			buf[x] = s
		}
		return buf
	}
	out := plane{pix: make([]uint8, w*h), w: w, h: h, stride: w}
	acc := make([]float32, w)
	for y := 0; y < h; y++ {
		clear(acc)
		for k, t := range vw.taps[y] {
			row := hrow(clampIndex(vw.start[y]+k, p.h))
			for x, v := range row {
				acc[x] += t * v
			}
		}
		o := out.pix[y*w:][:w]
		for x, v := range acc {
			o[x] = toUint8(v)
		}
	}
	return out
}

// chromaSize is the size of a chroma plane for a luma size and subsampling.
func chromaSize(w, h int, r image.YCbCrSubsampleRatio) (int, int) {
	switch r {
	case image.YCbCrSubsampleRatio422:
		return (w + 1) / 2, h
	case image.YCbCrSubsampleRatio420:
		return (w + 1) / 2, (h + 1) / 2
	case image.YCbCrSubsampleRatio440:
		return w, (h + 1) / 2
	case image.YCbCrSubsampleRatio411:
		return (w + 3) / 4, h
	case image.YCbCrSubsampleRatio410:
		return (w + 3) / 4, (h + 1) / 2
	}
	return w, h
}

// reduceYCbCr scales a decoded JPEG down on its Y, Cb and Cr planes, keeping
// its chroma subsampling.
func reduceYCbCr(src *image.YCbCr, w, h int) *image.YCbCr {
	b := src.Bounds()
	cw, ch := chromaSize(b.Dx(), b.Dy(), src.SubsampleRatio)
	y := plane{pix: src.Y[src.YOffset(b.Min.X, b.Min.Y):], w: b.Dx(), h: b.Dy(), stride: src.YStride}
	cb := plane{pix: src.Cb[src.COffset(b.Min.X, b.Min.Y):], w: cw, h: ch, stride: src.CStride}
	cr := plane{pix: src.Cr[src.COffset(b.Min.X, b.Min.Y):], w: cw, h: ch, stride: src.CStride}
	tcw, tch := chromaSize(w, h, src.SubsampleRatio)
	out := image.NewYCbCr(image.Rect(0, 0, w, h), src.SubsampleRatio)
	copyPlane(out.Y, out.YStride, y.resize(w, h))
	copyPlane(out.Cb, out.CStride, cb.resize(tcw, tch))
	copyPlane(out.Cr, out.CStride, cr.resize(tcw, tch))
	return out
}

func copyPlane(dst []uint8, stride int, p plane) {
	for y := 0; y < p.h; y++ {
		copy(dst[y*stride:y*stride+p.w], p.pix[y*p.stride:y*p.stride+p.w])
	}
}

// orientPlane applies an EXIF orientation (1..8) to one plane.
func orientPlane(p plane, o int) plane {
	if o <= 1 || o > 8 {
		return p
	}
	w, h := p.w, p.h
	ow, oh := w, h
	if o >= 5 {
		ow, oh = h, w
	}
	out := plane{pix: make([]uint8, ow*oh), w: ow, h: oh, stride: ow}
	for y := 0; y < oh; y++ {
		row := out.pix[y*ow:]
		for x := 0; x < ow; x++ {
			sx, sy := orientSource(o, x, y, w, h)
			row[x] = p.pix[sy*p.stride+sx]
		}
	}
	return out
}

// orientSource maps an output pixel of an oriented image to its source pixel.
func orientSource(o, x, y, w, h int) (int, int) {
	switch o {
	case 2:
		return w - 1 - x, y
	case 3:
		return w - 1 - x, h - 1 - y
	case 4:
		return x, h - 1 - y
	case 5:
		return y, x
	case 6:
		return y, h - 1 - x
	case 7:
		return w - 1 - y, h - 1 - x
	case 8:
		return w - 1 - y, x
	}
	return x, y
}

// orientYCbCr turns a 4:2:0 or 4:4:4 image upright plane by plane (their
// subsampling is the same both ways, so it survives a quarter turn).
func orientYCbCr(m *image.YCbCr, o int) *image.YCbCr {
	if o <= 1 || o > 8 {
		return m
	}
	b := m.Bounds()
	cw, ch := chromaSize(b.Dx(), b.Dy(), m.SubsampleRatio)
	y := orientPlane(plane{m.Y, b.Dx(), b.Dy(), m.YStride}, o)
	cb := orientPlane(plane{m.Cb, cw, ch, m.CStride}, o)
	cr := orientPlane(plane{m.Cr, cw, ch, m.CStride}, o)
	out := &image.YCbCr{Y: y.pix, Cb: cb.pix, Cr: cr.pix, YStride: y.stride, CStride: cb.stride,
		SubsampleRatio: m.SubsampleRatio, Rect: image.Rect(0, 0, y.w, y.h)}
	return out
}
