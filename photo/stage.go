package photo

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"image/jpeg"
	"os"
	"path/filepath"
	"runtime"
	"sync"
)

// Source is what the photo stage needs to know about one file.
type Source struct {
	Path        string
	Hash        string // content hash (Header.Hash); the file must still have it; "" bypasses the cache and that check
	Orientation int    // EXIF orientation 1..8
}

// result is one photo after the photo stage.
type result struct {
	prep   Prepared
	err    error
	cached bool
	panic  any // what the reduction panicked with, if it did
}

// Stage prepares srcs on all cores and hands each result to use, in input
// order, as soon as it and all before it are done. Each worker holds one
// decoded image at a time, photos are decoded at once only while their
// estimated memory together stays within MaxDecodeBytes, and results are not
// kept here, so memory does not grow with the number of photos or cores. With s.CacheDir set, a photo whose content
// and settings were seen before is read back instead of prepared again.
func Stage(srcs []Source, s Settings, use func(i int, p Prepared, err error)) {
	stage(srcs, s, func(i int, r result) { use(i, r.prep, r.err) })
}

func stage(srcs []Source, s Settings, use func(i int, r result)) {
	workers := min(runtime.GOMAXPROCS(0), max(len(srcs), 1))
	jobs := make(chan int)
	type done struct {
		i int
		r result
	}
	results := make(chan done, workers)
	budget := newMemoryBudget(MaxDecodeBytes)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range jobs {
				results <- done{i, prepareRecovered(srcs[i], s, budget)}
			}
		}()
	}
	go func() {
		for i := range srcs {
			jobs <- i
		}
		close(jobs)
		wg.Wait()
		close(results)
	}()
	pending := map[int]result{}
	next, count := 0, 0
	var failed *Panic
	for d := range results {
		count++
		if s.Progress != nil {
			s.Progress(count, len(srcs))
		}
		pending[d.i] = d.r
		for r, ok := pending[next]; ok; r, ok = pending[next] {
			if r.panic != nil && failed == nil {
				failed = &Panic{Path: srcs[next].Path, Value: r.panic}
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
func prepareRecovered(src Source, s Settings, budget *memoryBudget) (r result) {
	defer func() {
		if v := recover(); v != nil {
			r = result{panic: v}
		}
	}()
	return prepareOne(src, s, budget)
}

// prepareOne prepares one photo in a worker; tests replace it to make a worker panic.
var prepareOne = prepareCached

// Panic is a panic raised while preparing one photo, raised again by Stage
// once every worker has stopped, so that the caller can recover it.
type Panic struct {
	Path  string
	Value any
}

func (p Panic) Error() string { return fmt.Sprintf("photo %s: %v", p.Path, p.Value) }

// cacheVersion changes whenever the reduction changes what it writes.
const cacheVersion = "planar-catmull-rom-1"

// cacheKey names a reduced photo by the original's content and every setting
// that shapes the result.
func cacheKey(src Source, s Settings) string {
	sum := sha256.Sum256([]byte(fmt.Sprintf("%s|%s|%d|%d|%d", cacheVersion, src.Hash, src.Orientation, s.LongSide, s.Quality)))
	return hex.EncodeToString(sum[:])
}

// prepareCached prepares one photo, or reads it back from the cache. A file
// whose content no longer has the hash it was scanned with is refused: it was
// changed or replaced since. Decoding waits for its estimated memory in budget.
func prepareCached(src Source, s Settings, budget *memoryBudget) result {
	var path string
	if s.CacheDir != "" && src.Hash != "" {
		key := cacheKey(src, s)
		path = filepath.Join(s.CacheDir, key[:2], key+".jpg")
		if data, err := os.ReadFile(path); err == nil {
			if cfg, err := jpeg.DecodeConfig(bytes.NewReader(data)); err == nil {
				return result{prep: Prepared{JPEG: data, Width: cfg.Width, Height: cfg.Height}, cached: true}
			}
		}
	}
	data, err := readPhoto(src.Path)
	if err != nil {
		return result{err: err}
	}
	if src.Hash != "" {
		if sum := sha256.Sum256(data); hex.EncodeToString(sum[:]) != src.Hash {
			return result{err: errors.New("file changed since it was scanned")}
		}
	}
	l, err := decodableLayout(data)
	if err != nil {
		return result{err: err}
	}
	held := budget.acquire(int64(len(data)) + l.prepareBytes(s.LongSide))
	p, err := prepare(data, l, src.Orientation, s)
	budget.release(held)
	if err == nil && path != "" {
		storeCached(path, p.JPEG) // a cache that cannot be written only costs time
	}
	return result{prep: p, err: err}
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
