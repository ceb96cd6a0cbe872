// Command demophotos writes the demo survey's photos: synthetic pictures of
// steel with a label, and EXIF time, GPS position and orientation, so the
// fixtures are reproducible. Run from the repository root:
//
//	go run ./tools/demophotos -root testdata
package main

import (
	"flag"
	"fmt"
	"image"
	"image/color"
	"image/draw"
	"log"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"time"

	"golang.org/x/image/font"
	"golang.org/x/image/font/basicfont"
	"golang.org/x/image/math/fixed"

	"github.com/lossline/lossline/internal/jpegexif"
)

// shot is one demo photo: what it shows, where and when it was taken, and how
// the camera was held (EXIF orientation).
type shot struct {
	survey      string // survey folder under the root
	file        string
	label       string
	taken       string
	lat, lon    float64
	orientation int
	rust        int // how many rust patches to draw
}

// The scenario is invented: Greyling Sound fuel depot, visit of 2026-11-18.
var shots = []shot{
	{"demo", "tank-t101/t101-c1-north.jpg", "T-101 course 1, CML T1-02", "2026-11-18 08:52:10", 45.602315, -61.351020, 1, 9},
	{"demo", "tank-t101/t101-c1-nozzle.jpg", "T-101 course 1, CML T1-04 at N3", "2026-11-18 09:05:44", 45.602140, -61.350805, 6, 5},
	{"demo", "tank-t101/t101-c2-west.jpg", "T-101 course 2, CML T2-03", "2026-11-18 09:31:02", 45.602205, -61.351240, 1, 3},
	{"demo", "line-p220/p220-a03-soil-air.jpg", "P-220 CML A-03 soil-to-air", "2026-11-18 11:14:27", 45.601540, -61.349890, 6, 14},
	{"demo", "line-p220/p220-a01-support.jpg", "P-220 CML A-01 at support", "2026-11-18 11:02:09", 45.601710, -61.350310, 1, 4},
	{"demo", "line-p220/p220-b02-rack.jpg", "P-220 CML B-02 pipe rack", "2026-11-18 11:40:51", 45.601205, -61.349120, 3, 2},
	{"demo", "bridge-fb2/fb2-g1-flange.jpg", "FB-2 girder G1 bottom flange", "2026-11-18 13:22:35", 45.600820, -61.348510, 8, 11},
	{"demo", "overview-east.jpg", "Depot overview from east gate", "2026-11-18 08:31:00", 45.601900, -61.348200, 1, 0},
	{"demo", "tank-t101/t101-stairway.jpg", "T-101 stairway landing", "2026-11-18 09:48:20", 45.602450, -61.350500, 1, 4},
	{"demo", "bridge-fb2/fb2-deck.jpg", "FB-2 deck drain (camera clock wrong)", "2025-08-02 13:40:05", 45.600950, -61.348300, 1, 3},
	// Earlier surveys of the same site, for before/after pairs.
	{"demo-2022", "p220/a3-soil-air-2022.jpg", "P-220 CML A-3 soil-to-air 2022", "2022-05-10 10:41:13", 45.601545, -61.349880, 1, 8},
	{"demo-2021", "fb2/g1-03-2021.jpg", "FB-2 G1-03 flange 2021", "2021-06-15 14:05:50", 45.600815, -61.348520, 1, 6},
}

func main() {
	root := flag.String("root", "testdata", "folder holding the demo survey folders")
	flag.Parse()
	for i, s := range shots {
		if err := write(filepath.Join(*root, s.survey, "photos"), s, uint64(i+1)); err != nil {
			log.Fatal(err)
		}
	}
	// A phone's HEIC file among the JPEGs, which lossline lists as skipped.
	heic := filepath.Join(*root, "demo", "photos", "IMG_2231.HEIC")
	if err := os.WriteFile(heic, []byte("\x00\x00\x00\x18ftypheic\x00\x00\x00\x00mif1heic"), 0o644); err != nil {
		log.Fatal(err)
	}
}

func write(dir string, s shot, seed uint64) error {
	taken, err := time.Parse("2006-01-02 15:04:05", s.taken)
	if err != nil {
		return err
	}
	img := storedForOrientation(picture(s, seed), s.orientation)
	data, err := jpegexif.Encode(img, 72, jpegexif.Header{
		Taken: taken, Lat: s.lat, Lon: s.lon, HasGPS: true, Orientation: s.orientation,
	})
	if err != nil {
		return err
	}
	path := filepath.Join(dir, filepath.FromSlash(s.file))
	if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
		return err
	}
	fmt.Println(path)
	return os.WriteFile(path, data, 0o644)
}

// picture draws an upright 960×720 scene: grey steel, rust patches, a label
// and an arrow pointing up so a wrongly turned photo is easy to see.
func picture(s shot, seed uint64) *image.RGBA {
	const w, h = 960, 720
	rng := rand.New(rand.NewPCG(seed, 42))
	img := image.NewRGBA(image.Rect(0, 0, w, h))
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			g := 120 + int(40*math.Sin(float64(x)/90)+20*math.Cos(float64(y)/60)) + rng.IntN(16)
			img.SetRGBA(x, y, color.RGBA{uint8(g), uint8(g + 4), uint8(g + 10), 255})
		}
	}
	for i := 0; i < s.rust; i++ {
		cx, cy, r := 80+rng.IntN(w-160), 200+rng.IntN(h-280), 15+rng.IntN(55)
		for y := cy - r; y <= cy+r; y++ {
			for x := cx - r; x <= cx+r; x++ {
				d := math.Hypot(float64(x-cx), float64(y-cy))
				if d <= float64(r)*(0.8+0.2*rng.Float64()) {
					img.SetRGBA(x, y, color.RGBA{uint8(140 + rng.IntN(40)), uint8(60 + rng.IntN(25)), 20, 255})
				}
			}
		}
	}
	draw.Draw(img, image.Rect(0, 0, w, 150), image.NewUniform(color.RGBA{250, 250, 245, 255}), image.Point{}, draw.Src)
	bigText(img, s.label, 20, 30, 3)
	bigText(img, "UP ^", w/2-70, 95, 3)
	return img
}

// bigText draws text with the 7×13 bitmap font enlarged by scale.
func bigText(dst *image.RGBA, s string, x, y, scale int) {
	small := image.NewRGBA(image.Rect(0, 0, 7*len(s)+2, 16))
	d := font.Drawer{Dst: small, Src: image.Black, Face: basicfont.Face7x13, Dot: fixed.P(1, 12)}
	d.DrawString(s)
	b := small.Bounds()
	for sy := 0; sy < b.Dy(); sy++ {
		for sx := 0; sx < b.Dx(); sx++ {
			if _, _, _, a := small.At(sx, sy).RGBA(); a > 0x8000 {
				draw.Draw(dst, image.Rect(x+sx*scale, y+sy*scale, x+(sx+1)*scale, y+(sy+1)*scale), image.Black, image.Point{}, draw.Src)
			}
		}
	}
}

// storedForOrientation turns an upright picture into what a camera held that
// way stores, so that applying the EXIF orientation makes it upright again.
func storedForOrientation(up *image.RGBA, o int) image.Image {
	b := up.Bounds()
	switch o {
	case 3: // stored upside down
		out := image.NewRGBA(b)
		for y := 0; y < b.Dy(); y++ {
			for x := 0; x < b.Dx(); x++ {
				out.Set(b.Dx()-1-x, b.Dy()-1-y, up.At(x, y))
			}
		}
		return out
	case 6, 8: // 6: display turns it 90° clockwise, so store it turned 90° anticlockwise; 8 the reverse
		out := image.NewRGBA(image.Rect(0, 0, b.Dy(), b.Dx()))
		for y := 0; y < b.Dy(); y++ {
			for x := 0; x < b.Dx(); x++ {
				if o == 6 {
					out.Set(y, b.Dx()-1-x, up.At(x, y))
				} else {
					out.Set(b.Dy()-1-y, x, up.At(x, y))
				}
			}
		}
		return out
	}
	return up
}
