//go:build turbojpeg && cgo

package photo

/*
#cgo LDFLAGS: -lturbojpeg
#include <stdlib.h>
#include <turbojpeg.h>

// lossline_header reads a JPEG's size, subsampling and colour space.
static int lossline_header(const unsigned char *buf, unsigned long size, int *w, int *h, int *subsamp, int *cs) {
	tjhandle t = tjInitDecompress();
	if (!t) return -1;
	int r = tjDecompressHeader3(t, buf, size, w, h, subsamp, cs);
	tjDestroy(t);
	return r;
}

// lossline_decode decodes into Y, Cb and Cr planes at the largest scale that
// fits w × h (DCT scaling on load: 1/2, 1/4, 1/8).
static int lossline_decode(const unsigned char *buf, unsigned long size, int w, int h,
		unsigned char *y, unsigned char *cb, unsigned char *cr) {
	tjhandle t = tjInitDecompress();
	if (!t) return -1;
	unsigned char *planes[3] = {y, cb, cr};
	int r = tjDecompressToYUVPlanes(t, buf, size, planes, w, NULL, h, 0);
	tjDestroy(t);
	return r;
}
// lossline_encode compresses 4:2:0 planes; the caller frees *out with tjFree.
static int lossline_encode(const unsigned char *y, const unsigned char *cb, const unsigned char *cr,
		int w, int ystride, int cstride, int h, int quality, unsigned char **out, unsigned long *size) {
	tjhandle t = tjInitCompress();
	if (!t) return -1;
	const unsigned char *planes[3] = {y, cb, cr};
	int strides[3] = {ystride, cstride, cstride};
	*out = NULL;
	*size = 0;
	int r = tjCompressFromYUVPlanes(t, planes, w, strides, h, TJSAMP_420, out, size, quality, 0);
	tjDestroy(t);
	return r;
}
*/
import "C"

import (
	"image"
	"unsafe"
)

// fastDecodeAvailable says the libjpeg-turbo path is compiled in.
const fastDecodeAvailable = true

// fastDecode decodes a baseline 4:2:0 YCbCr JPEG with libjpeg-turbo's DCT
// scaling, at the smallest of 1/8, 1/4, 1/2 or full size whose long side is
// still at least longSide. Other layouts (4:2:2, 4:4:4, grey, CMYK,
// progressive) return false and go through the pure-Go decoder.
func fastDecode(data []byte, longSide int) (*image.YCbCr, bool) {
	if len(data) == 0 || progressive(data) {
		return nil, false
	}
	buf := (*C.uchar)(unsafe.Pointer(&data[0]))
	var w, h, subsamp, cs C.int
	if C.lossline_header(buf, C.ulong(len(data)), &w, &h, &subsamp, &cs) != 0 ||
		subsamp != C.TJSAMP_420 || cs != C.TJCS_YCbCr {
		return nil, false
	}
	sw, sh := int(w), int(h)
	for _, den := range []int{8, 4, 2} {
		cw, ch := (int(w)+den-1)/den, (int(h)+den-1)/den // TJSCALED for 1/den
		if max(cw, ch) >= longSide {
			sw, sh = cw, ch
			break
		}
	}
	yw, yh := int(C.tjPlaneWidth(0, C.int(sw), C.TJSAMP_420)), int(C.tjPlaneHeight(0, C.int(sh), C.TJSAMP_420))
	cw, ch := int(C.tjPlaneWidth(1, C.int(sw), C.TJSAMP_420)), int(C.tjPlaneHeight(1, C.int(sh), C.TJSAMP_420))
	m := &image.YCbCr{
		Y: make([]uint8, yw*yh), Cb: make([]uint8, cw*ch), Cr: make([]uint8, cw*ch),
		YStride: yw, CStride: cw, SubsampleRatio: image.YCbCrSubsampleRatio420, Rect: image.Rect(0, 0, sw, sh),
	}
	if C.lossline_decode(buf, C.ulong(len(data)), C.int(sw), C.int(sh),
		(*C.uchar)(unsafe.Pointer(&m.Y[0])), (*C.uchar)(unsafe.Pointer(&m.Cb[0])), (*C.uchar)(unsafe.Pointer(&m.Cr[0]))) != 0 {
		return nil, false
	}
	return m, true
}

// fastEncode compresses a 4:2:0 image with libjpeg-turbo; other layouts
// return false and go through the Go encoder.
func fastEncode(m *image.YCbCr, quality int) ([]byte, bool) {
	if m.SubsampleRatio != image.YCbCrSubsampleRatio420 || m.Rect.Min != (image.Point{}) {
		return nil, false
	}
	var out *C.uchar
	var size C.ulong
	if C.lossline_encode((*C.uchar)(unsafe.Pointer(&m.Y[0])), (*C.uchar)(unsafe.Pointer(&m.Cb[0])), (*C.uchar)(unsafe.Pointer(&m.Cr[0])),
		C.int(m.Rect.Dx()), C.int(m.YStride), C.int(m.CStride), C.int(m.Rect.Dy()), C.int(quality), &out, &size) != 0 {
		if out != nil {
			C.tjFree(out)
		}
		return nil, false
	}
	defer C.tjFree(out)
	return C.GoBytes(unsafe.Pointer(out), C.int(size)), true
}
