package survey

import (
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"

	"github.com/lossline/lossline/photo"
)

// PhotoDir is the folder of a survey that holds its photos.
const PhotoDir = "photos"

// DefaultMaxMegapixels rejects images larger than any phone or compact camera
// makes (200 MP) before anything decodes them.
const DefaultMaxMegapixels = 200

// ScanPhotos lists the JPEGs under dir/photos (any depth) with their EXIF
// time, position and orientation, their size from the JPEG header and a hash
// of their content. Files that are not JPEG, links that lead out of the
// folder, anything but a regular file, files that cannot be read or that
// photo.Scan refuses (too large, more than maxMP megapixels, too costly to
// decode), and files that repeat another file's content are listed as
// skipped with the reason; a missing folder is no problem.
func ScanPhotos(dir string, maxMP float64) ([]*Photo, []SkippedFile, ProblemList) {
	var skipped []SkippedFile
	var problems ProblemList
	root := filepath.Join(dir, PhotoDir)
	realRoot, _ := filepath.EvalSymlinks(root) // "" when missing: no link then leads inside
	skip := func(name, path, why string) {
		skipped = append(skipped, SkippedFile{Name: name, Path: path, Reason: why})
		problems.Warnf(path, 0, "skipped: %s", why)
	}
	var names, paths, reals []string // reals: the files opened, links resolved
	err := filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			if path == root && os.IsNotExist(err) {
				return filepath.SkipDir
			}
			problems.Warnf(path, 0, "cannot read: %v", err)
			return nil
		}
		if d.IsDir() {
			return nil
		}
		rel, _ := filepath.Rel(root, path)
		name := filepath.ToSlash(rel)
		if why := photo.NotPhoto(name); why != "" {
			skip(name, path, why)
			return nil
		}
		real := path
		if d.Type()&fs.ModeSymlink != 0 {
			var why string
			if real, why = resolveInside(realRoot, path); why != "" {
				skip(name, path, why)
				return nil
			}
		}
		names, paths, reals = append(names, name), append(paths, path), append(reals, real)
		return nil
	})
	if err != nil {
		problems.Warnf(root, 0, "cannot read the photo folder: %v", err)
	}
	// Read, hash and parse the headers on all cores; decide in walk order.
	scans := make([]photoScan, len(paths))
	var wg sync.WaitGroup
	next := make(chan int)
	for w := 0; w < runtime.GOMAXPROCS(0); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				scans[i] = scanPhoto(names[i], paths[i], reals[i], maxMP)
			}
		}()
	}
	for i := range paths {
		next <- i
	}
	close(next)
	wg.Wait()
	var photos []*Photo
	byHash := map[string]*Photo{}
	for i, sc := range scans {
		switch {
		case sc.skip != "":
			skip(names[i], paths[i], sc.skip)
		case byHash[sc.photo.Hash] != nil:
			skip(names[i], paths[i], "same content as "+byHash[sc.photo.Hash].Name)
		default:
			if sc.photo.Problem != "" {
				problems.Warnf(paths[i], 0, "photo header cannot be read (%s): shown without time and position", sc.photo.Problem)
			}
			byHash[sc.photo.Hash] = sc.photo
			photos = append(photos, sc.photo)
		}
	}
	sort.Slice(photos, func(i, j int) bool { return photos[i].Name < photos[j].Name })
	return photos, skipped, problems
}

// photoScan is what reading one file found: a photo, or why it is skipped.
type photoScan struct {
	photo *Photo
	skip  string
}

// scanPhoto reads the file real (path with links resolved) for the photo
// named name at path.
func scanPhoto(name, path, real string, maxMP float64) photoScan {
	h, err := photo.Scan(real, maxMP)
	if err != nil {
		return photoScan{skip: err.Error()}
	}
	p := &Photo{Name: name, Path: path, Orientation: h.Orientation, Hash: h.Hash, Width: h.Width, Height: h.Height, Taken: h.Taken}
	if h.HasGPS {
		p.GPS = &LatLon{Lat: h.Lat, Lon: h.Lon}
	}
	if h.EXIFErr != nil {
		p.Problem = h.EXIFErr.Error()
	}
	return photoScan{photo: p}
}

// resolveInside resolves the links in path and says why the file it leads to
// is not taken, or "" when it lies inside the photo folder realRoot (itself
// resolved): a link must not bring a file from elsewhere into the report.
func resolveInside(realRoot, path string) (real, why string) {
	real, err := filepath.EvalSymlinks(path)
	if err != nil {
		return "", "link leads nowhere"
	}
	rel, err := filepath.Rel(realRoot, real)
	if realRoot == "" || err != nil || rel == ".." || strings.HasPrefix(rel, ".."+string(filepath.Separator)) || filepath.IsAbs(rel) {
		return "", "link points outside " + PhotoDir + "/"
	}
	return real, ""
}
