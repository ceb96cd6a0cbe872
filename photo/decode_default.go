//go:build !turbojpeg || !cgo

package photo

import "image"

// fastDecodeAvailable says the libjpeg-turbo path is compiled in (build tag turbojpeg).
const fastDecodeAvailable = false

// fastDecode is the libjpeg-turbo path; without the build tag it declines
// every file and the pure-Go decoder runs.
func fastDecode(data []byte, longSide int) (*image.YCbCr, bool) { return nil, false }

// fastEncode is the libjpeg-turbo encoder; without the build tag the Go
// encoder runs.
func fastEncode(m *image.YCbCr, quality int) ([]byte, bool) { return nil, false }
