package survey

import (
	"bytes"
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"image/jpeg"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"strings"
	"sync"
	"time"

	"github.com/rwcarlsen/goexif/exif"
)

// PhotoDir is the folder of a survey that holds its photos.
const PhotoDir = "photos"

// DefaultMaxMegapixels rejects images larger than any phone or compact camera
// makes (200 MP) before anything decodes them.
const DefaultMaxMegapixels = 200

// ScanPhotos lists the JPEGs under dir/photos (any depth) with their EXIF
// time, position and orientation, their size from the JPEG header and a hash
// of their content. Files that are not JPEG, cannot be read, declare more
// than maxMP megapixels, or repeat another file's content are listed as
// skipped with the reason; a missing folder is no problem.
func ScanPhotos(dir string, maxMP float64) ([]*Photo, []SkippedFile, ProblemList) {
	var skipped []SkippedFile
	var problems ProblemList
	root := filepath.Join(dir, PhotoDir)
	skip := func(name, path, why string) {
		skipped = append(skipped, SkippedFile{Name: name, Path: path, Reason: why})
		problems.Warnf(path, 0, "skipped: %s", why)
	}
	var names, paths []string
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
		if why := notPhoto(name); why != "" {
			skip(name, path, why)
			return nil
		}
		names, paths = append(names, name), append(paths, path)
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
				scans[i] = scanPhoto(names[i], paths[i], maxMP)
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

func scanPhoto(name, path string, maxMP float64) photoScan {
	data, err := os.ReadFile(path)
	if err != nil {
		return photoScan{skip: "cannot be read: " + err.Error()}
	}
	return scanData(name, path, data, maxMP)
}

// scanData reads a photo's header from its bytes; it never panics.
func scanData(name, path string, data []byte, maxMP float64) (sc photoScan) {
	defer func() {
		if r := recover(); r != nil {
			sc = photoScan{skip: fmt.Sprintf("damaged file: %v", r)}
		}
	}()
	sum := sha256.Sum256(data)
	cfg, err := jpeg.DecodeConfig(bytes.NewReader(data))
	if err != nil {
		return photoScan{skip: "not a readable JPEG: " + err.Error()}
	}
	if mp := float64(cfg.Width) * float64(cfg.Height) / 1e6; mp > maxMP {
		return photoScan{skip: fmt.Sprintf("%d×%d pixels (%.0f MP) is over the %g MP limit", cfg.Width, cfg.Height, mp, maxMP)}
	}
	p := &Photo{Name: name, Path: path, Orientation: 1, Hash: hex.EncodeToString(sum[:]), Width: cfg.Width, Height: cfg.Height}
	if err := readEXIF(p, bytes.NewReader(data)); err != nil {
		p.Problem = err.Error()
	}
	return photoScan{photo: p}
}

// notPhoto says why a file is not taken as a photo, or "" when it may be one.
func notPhoto(name string) string {
	base := filepath.Base(name)
	ext := strings.ToLower(filepath.Ext(name))
	switch {
	case strings.HasPrefix(base, "._") || base == ".DS_Store" || base == "Thumbs.db" || base == "desktop.ini":
		return "system file"
	case ext == ".jpg" || ext == ".jpeg" || ext == ".jpe":
		return ""
	case ext == ".heic" || ext == ".heif":
		return "HEIC photo: export it as JPEG"
	case ext == ".png" || ext == ".gif" || ext == ".tif" || ext == ".tiff" || ext == ".webp" || ext == ".bmp" || ext == ".dng":
		return "not a JPEG (" + strings.TrimPrefix(ext, ".") + ")"
	case ext == ".mp4" || ext == ".mov" || ext == ".avi" || ext == ".m4v" || ext == ".3gp":
		return "video"
	}
	return "not a JPEG"
}

// readEXIF fills p from the file's EXIF header. A panic inside the EXIF
// library on a damaged file is turned into an error for that file alone.
func readEXIF(p *Photo, r io.Reader) (err error) {
	defer func() {
		if rec := recover(); rec != nil {
			err = fmt.Errorf("damaged EXIF header: %v", rec)
		}
	}()
	x, err := exif.Decode(r)
	if err != nil && exif.IsCriticalError(err) || x == nil {
		return fmt.Errorf("no EXIF data")
	}
	if tag, err := x.Get(exif.DateTimeOriginal); err == nil {
		if s, err := tag.StringVal(); err == nil {
			// EXIF times carry no zone: they are kept as the camera's wall clock.
			if t, err := time.Parse("2006:01:02 15:04:05", strings.TrimRight(s, "\x00 ")); err == nil {
				p.Taken = &t
			}
		}
	}
	if lat, lon, err := x.LatLong(); err == nil && lat >= -90 && lat <= 90 && lon >= -180 && lon <= 180 && !(lat == 0 && lon == 0) {
		p.GPS = &LatLon{Lat: lat, Lon: lon}
	}
	if tag, err := x.Get(exif.Orientation); err == nil {
		if o, err := tag.Int(0); err == nil && o >= 1 && o <= 8 {
			p.Orientation = o
		}
	}
	return nil
}
