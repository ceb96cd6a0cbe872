package photo

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"image"
	"image/color"
	"image/jpeg"
	"math"
	"os"
	"path/filepath"
	"testing"

	"golang.org/x/image/draw"
)

// testPhoto writes a w × h JPEG (4:2:0, as cameras write) of smooth colour
// gradients and returns it as a Source with its content hash.
func testPhoto(t testing.TB, dir, name string, w, h, orientation int) Source {
	img := image.NewRGBA(image.Rect(0, 0, w, h))
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			img.SetRGBA(x, y, color.RGBA{uint8(255 * x / w), uint8(255 * y / h), uint8(128 + 100*math.Sin(float64(x+y)/97)), 255})
		}
	}
	var b bytes.Buffer
	if err := jpeg.Encode(&b, img, &jpeg.Options{Quality: 90}); err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(dir, name)
	os.WriteFile(path, b.Bytes(), 0o644)
	sum := sha256.Sum256(b.Bytes())
	return Source{Path: path, Orientation: orientation, Hash: hex.EncodeToString(sum[:])}
}

// The planar reduction against x/image/draw's Catmull-Rom on the whole RGBA
// image (an independent resampler): the same picture within a few levels.
func TestPlanarReductionMatchesDraw(t *testing.T) {
	dir := t.TempDir()
	ph := testPhoto(t, dir, "a.jpg", 2000, 1500, 1)
	got, err := Prepare(ph.Path, 1, Settings{LongSide: 800, Quality: 95})
	if err != nil {
		t.Fatal(err)
	}
	if got.Width != 800 || got.Height != 600 {
		t.Fatalf("size %d×%d, want 800×600", got.Width, got.Height)
	}
	f, _ := os.Open(ph.Path)
	src, _ := jpeg.Decode(f)
	f.Close()
	ref := image.NewRGBA(image.Rect(0, 0, 800, 600))
	draw.CatmullRom.Scale(ref, ref.Bounds(), src, src.Bounds(), draw.Src, nil)
	mine, _ := jpeg.Decode(bytes.NewReader(got.JPEG))
	var sum float64
	for y := 0; y < 600; y += 3 {
		for x := 0; x < 800; x += 3 {
			r1, g1, b1, _ := mine.At(x, y).RGBA()
			r2, g2, b2, _ := ref.At(x, y).RGBA()
			sum += math.Abs(float64(r1)-float64(r2)) + math.Abs(float64(g1)-float64(g2)) + math.Abs(float64(b1)-float64(b2))
		}
	}
	if mean := sum / (3 * 200 * 267) / 257; mean > 3 {
		t.Errorf("mean difference %.2f levels from x/image/draw's Catmull-Rom", mean)
	}
}

// Orientation 1-8 each turned upright on the planes: a 4:2:0 picture whose
// top-left quarter is bright red must end with red in the corner the EXIF
// table names (CIPA DC-008, tag 0x0112).
func TestOrientPlanes(t *testing.T) {
	img := image.NewRGBA(image.Rect(0, 0, 64, 32))
	for y := 0; y < 32; y++ {
		for x := 0; x < 64; x++ {
			c := color.RGBA{0, 0, 255, 255}
			if x < 16 && y < 8 {
				c = color.RGBA{255, 0, 0, 255}
			}
			img.SetRGBA(x, y, c)
		}
	}
	var b bytes.Buffer
	jpeg.Encode(&b, img, &jpeg.Options{Quality: 95})
	src, _ := jpeg.Decode(&b)
	ycc := src.(*image.YCbCr)
	for o, corner := range map[int][2]int{1: {0, 0}, 2: {1, 0}, 3: {1, 1}, 4: {0, 1}, 5: {0, 0}, 6: {1, 0}, 7: {1, 1}, 8: {0, 1}} {
		out := orientYCbCr(ycc, o)
		bw, bh := out.Bounds().Dx(), out.Bounds().Dy()
		if (o >= 5) != (bw == 32) {
			t.Errorf("orientation %d: size %d×%d", o, bw, bh)
		}
		x, y := 2+corner[0]*(bw-5), 2+corner[1]*(bh-5)
		r, g, bl, _ := out.At(x, y).RGBA()
		if r>>8 < 200 || g>>8 > 60 || bl>>8 > 60 {
			t.Errorf("orientation %d: pixel (%d,%d) is %d,%d,%d, want red", o, x, y, r>>8, g>>8, bl>>8)
		}
	}
}

// The cache: a second run reads the same bytes back; other settings miss.
func TestPhotoCache(t *testing.T) {
	dir, cache := t.TempDir(), t.TempDir()
	photos := []Source{testPhoto(t, dir, "a.jpg", 900, 600, 6), testPhoto(t, dir, "b.jpg", 600, 900, 1)}
	ps := Settings{LongSide: 400, Quality: 80, CacheDir: cache}
	first, second := collect(photos, ps), collect(photos, ps)
	for i := range photos {
		if first[i].err != nil || first[i].cached || !second[i].cached || !bytes.Equal(first[i].prep.JPEG, second[i].prep.JPEG) {
			t.Errorf("photo %d: first cached %v, second cached %v, equal %v", i, first[i].cached, second[i].cached,
				bytes.Equal(first[i].prep.JPEG, second[i].prep.JPEG))
		}
	}
	if r := first[0].prep; r.Width != 267 || r.Height != 400 {
		t.Errorf("orientation 6: %d×%d, want 267×400", r.Width, r.Height)
	}
	ps.Quality = 70
	if again := collect(photos, ps); again[0].cached {
		t.Error("a different quality hit the cache")
	}
	var calls int
	ps.Progress = func(done, total int) { calls++ }
	collect(photos, ps)
	if calls != 2 {
		t.Errorf("progress called %d times, want 2", calls)
	}
}

// collect runs the photo stage and keeps every result, in order.
func collect(photos []Source, ps Settings) []result {
	out := make([]result, 0, len(photos))
	stage(photos, ps, func(i int, r result) {
		if i != len(out) {
			panic("results out of order")
		}
		out = append(out, r)
	})
	return out
}

// Stage hands over every photo in input order, a file that cannot be
// prepared with its error and the others unharmed.
func TestStageOrderAndErrors(t *testing.T) {
	dir := t.TempDir()
	srcs := []Source{
		testPhoto(t, dir, "a.jpg", 300, 200, 1),
		{Path: filepath.Join(dir, "missing.jpg"), Orientation: 1},
		testPhoto(t, dir, "c.jpg", 200, 300, 1),
	}
	var got []int
	Stage(srcs, Settings{LongSide: 100, Quality: 80}, func(i int, p Prepared, err error) {
		got = append(got, i)
		if (err != nil) != (i == 1) {
			t.Errorf("photo %d: error %v", i, err)
		}
		if i != 1 && (max(p.Width, p.Height) != 100 || len(p.JPEG) == 0) {
			t.Errorf("photo %d: %d×%d, %d bytes", i, p.Width, p.Height, len(p.JPEG))
		}
	})
	if len(got) != 3 || got[0] != 0 || got[1] != 1 || got[2] != 2 {
		t.Errorf("order %v, want [0 1 2]", got)
	}
}

// A panic in a worker goroutine reaches the caller, once every worker has
// stopped, as a Panic naming the photo, instead of ending the process.
func TestStageWorkerPanicReachesCaller(t *testing.T) {
	saved := prepareOne
	defer func() { prepareOne = saved }()
	prepareOne = func(src Source, s Settings, _ *memoryBudget) result {
		panic("reduction failed on " + src.Path)
	}
	used := 0
	defer func() {
		v := recover()
		p, ok := v.(Panic)
		if !ok || p.Path != "bad.jpg" || used != 0 {
			t.Fatalf("recovered %v after %d photos used, want a Panic for bad.jpg and none used", v, used)
		}
	}()
	Stage([]Source{{Path: "bad.jpg"}}, Settings{LongSide: 200, Quality: 80}, func(int, Prepared, error) { used++ })
	t.Fatal("Stage returned after a worker panicked")
}

// A file replaced after the scan (a link pointed elsewhere, a photo
// overwritten) no longer has its scanned hash and is refused, not embedded.
func TestStageRefusesChangedFile(t *testing.T) {
	dir := t.TempDir()
	a, b := testPhoto(t, dir, "a.jpg", 300, 200, 1), testPhoto(t, dir, "b.jpg", 200, 300, 1)
	a.Hash = b.Hash
	Stage([]Source{a}, Settings{LongSide: 100, Quality: 80}, func(_ int, p Prepared, err error) {
		if err == nil || err.Error() != "file changed since it was scanned" || len(p.JPEG) != 0 {
			t.Errorf("changed file: %d bytes, %v", len(p.JPEG), err)
		}
	})
}
