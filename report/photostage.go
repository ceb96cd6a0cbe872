package report

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"image/jpeg"
	"os"
	"path/filepath"
	"runtime"
	"sync"

	"github.com/lossline/lossline/survey"
)

// photoResult is one photo after the photo stage.
type photoResult struct {
	prep   preparedPhoto
	err    error
	cached bool
	panic  any // what the reduction panicked with, if it did
}

// preparePhotos reduces photos on all cores and hands each result to use, in
// input order, as soon as it and all before it are done. Each worker holds one
// decoded image at a time and results are not kept here, so memory does not
// grow with the number of photos. With a cache folder, a photo whose content
// and settings were seen before is read back instead.
func preparePhotos(photos []*survey.Photo, ps PhotoSettings, use func(i int, r photoResult)) {
	workers := min(runtime.GOMAXPROCS(0), max(len(photos), 1))
	jobs := make(chan int)
	type done struct {
		i int
		r photoResult
	}
	results := make(chan done, workers)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range jobs {
				results <- done{i, prepareRecovered(photos[i], ps)}
			}
		}()
	}
	go func() {
		for i := range photos {
			jobs <- i
		}
		close(jobs)
		wg.Wait()
		close(results)
	}()
	pending := map[int]photoResult{}
	next, count := 0, 0
	var failed *RenderPanic
	for d := range results {
		count++
		if ps.Progress != nil {
			ps.Progress(count, len(photos))
		}
		pending[d.i] = d.r
		for r, ok := pending[next]; ok; r, ok = pending[next] {
			if r.panic != nil && failed == nil {
				failed = &RenderPanic{Stage: "photo " + photos[next].Name, Value: r.panic}
			}
			if failed == nil {
				use(next, r)
			}
			delete(pending, next)
			next++
		}
	}
	if failed != nil {
		// Raised again here, once every worker has finished, for the caller's
		// recover (Render) to report.
		panic(*failed)
	}
}

// prepareRecovered is prepareCached with a panic caught, since a panic in a
// worker goroutine could not be recovered by the caller.
func prepareRecovered(ph *survey.Photo, ps PhotoSettings) (r photoResult) {
	defer func() {
		if v := recover(); v != nil {
			r = photoResult{panic: v}
		}
	}()
	return prepareCached(ph, ps)
}

// cacheVersion changes whenever the reduction changes what it writes.
const cacheVersion = "planar-catmull-rom-1"

// cacheKey names a reduced photo by the original's content and every setting
// that shapes the result.
func cacheKey(ph *survey.Photo, ps PhotoSettings) string {
	sum := sha256.Sum256([]byte(fmt.Sprintf("%s|%s|%d|%d|%d", cacheVersion, ph.Hash, ph.Orientation, ps.LongSide, ps.Quality)))
	return hex.EncodeToString(sum[:])
}

func prepareCached(ph *survey.Photo, ps PhotoSettings) photoResult {
	if ps.CacheDir == "" || ph.Hash == "" {
		p, err := preparePhoto(ph.Path, ph.Orientation, ps)
		return photoResult{prep: p, err: err}
	}
	key := cacheKey(ph, ps)
	path := filepath.Join(ps.CacheDir, key[:2], key+".jpg")
	if data, err := os.ReadFile(path); err == nil {
		if cfg, err := jpeg.DecodeConfig(bytes.NewReader(data)); err == nil {
			return photoResult{prep: preparedPhoto{JPEG: data, Width: cfg.Width, Height: cfg.Height}, cached: true}
		}
	}
	p, err := preparePhoto(ph.Path, ph.Orientation, ps)
	if err == nil {
		storeCached(path, p.JPEG) // a cache that cannot be written only costs time
	}
	return photoResult{prep: p, err: err}
}

// storeCached writes a cache entry atomically (temporary file, then rename).
func storeCached(path string, data []byte) {
	if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
		return
	}
	tmp, err := os.CreateTemp(filepath.Dir(path), ".tmp-*")
	if err != nil {
		return
	}
	_, werr := tmp.Write(data)
	cerr := tmp.Close()
	if werr != nil || cerr != nil || os.Rename(tmp.Name(), path) != nil {
		os.Remove(tmp.Name())
	}
}
