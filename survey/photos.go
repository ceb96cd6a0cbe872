package survey

import (
	"bufio"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"time"

	"github.com/rwcarlsen/goexif/exif"
)

// PhotoDir is the folder of a survey that holds its photos.
const PhotoDir = "photos"

// ScanPhotos lists the JPEGs under dir/photos (any depth) with their EXIF
// time, position and orientation. Files that are not JPEG, or whose header
// cannot be read, come back as warnings; a missing folder is no problem.
func ScanPhotos(dir string) ([]*Photo, ProblemList) {
	var photos []*Photo
	var problems ProblemList
	root := filepath.Join(dir, PhotoDir)
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
		ext := strings.ToLower(filepath.Ext(path))
		if ext != ".jpg" && ext != ".jpeg" {
			problems.Warnf(path, 0, "not a JPEG photo: skipped")
			return nil
		}
		p := &Photo{Name: filepath.ToSlash(rel), Path: path, Orientation: 1}
		if err := readEXIF(p); err != nil {
			p.Problem = err.Error()
			problems.Warnf(path, 0, "photo header cannot be read (%v): shown without time and position", err)
		}
		photos = append(photos, p)
		return nil
	})
	if err != nil {
		problems.Warnf(root, 0, "cannot read the photo folder: %v", err)
	}
	sort.Slice(photos, func(i, j int) bool { return photos[i].Name < photos[j].Name })
	return photos, problems
}

// readEXIF fills p from the file's EXIF header. A panic inside the EXIF
// library on a damaged file is turned into an error for that file alone.
func readEXIF(p *Photo) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("damaged EXIF header: %v", r)
		}
	}()
	f, err := os.Open(p.Path)
	if err != nil {
		return err
	}
	defer f.Close()
	x, err := exif.Decode(bufio.NewReader(f))
	if err != nil {
		if exif.IsCriticalError(err) {
			return fmt.Errorf("no EXIF data")
		}
	}
	if x == nil {
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
