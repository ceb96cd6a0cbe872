package report

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"github.com/lossline/lossline/internal/folder"
)

// File is one output: its content in memory, or a function that writes it
// straight to its file.
type File struct {
	Name  string
	Data  []byte                  // the content, when Write is nil
	Write func(w io.Writer) error // writes the content; nil: Data
	Size  int64                   // bytes written, set by WriteFolder
}

// Outputs are the names of the files Render writes.
var Outputs = []string{PDFFile, JSONFile, CSVFile, GeoJSONFile, ActionsCSVFile, ElectroCSVFile}

// MarkerFile marks a folder as one lossline wrote, and lists its files.
const MarkerFile = ".lossline-report"

// WriteOptions say how WriteFolder waits for another run writing the same
// folder.
type WriteOptions struct {
	Wait    time.Duration // how long to wait for the other run before giving up
	Waiting func()        // called once when the folder is found locked; may be nil
}

// OutputRefused is an output folder lossline will not write, and why.
type OutputRefused struct {
	Dir, Why string
}

func (e *OutputRefused) Error() string { return "output folder " + e.Dir + " " + e.Why }

// Names of the files WriteFolder keeps beside the output folder out: the
// lock, the folder being written and the previous report while it is being
// replaced. They start with a dot and the folder's name, so that leftovers
// of a killed run are known as ours.
func lockName(out string) string     { return sibling(out, ".lock") }
func tempPrefix(out string) string   { return filepath.Base(sibling(out, ".tmp-")) }
func backupPrefix(out string) string { return filepath.Base(sibling(out, ".old-")) }

func sibling(out, suffix string) string {
	return filepath.Join(filepath.Dir(out), "."+filepath.Base(out)+suffix)
}

// rename is os.Rename; tests replace it to fail a step of the swap.
var rename = os.Rename

// WriteFolder makes out a folder holding exactly files and the marker,
// replacing any report folder there in one rename: the files are written
// into a temporary sibling folder, the previous folder is moved aside, the
// new one is renamed into place and only then is the previous one removed;
// if any step fails the previous folder is put back and the temporary one
// removed. A lock beside out makes a second run writing the same folder
// wait for the first. Leftovers of a run that was killed are cleared first.
// A folder holding anything lossline did not write is refused, not replaced.
func WriteFolder(given string, files []File, opt WriteOptions) error {
	out, err := folder.Resolve(given)
	if err != nil {
		return err
	}
	parent := filepath.Dir(out)
	if err := os.MkdirAll(parent, 0o755); err != nil {
		return err
	}
	unlock, err := lockFolder(lockName(out), out, opt)
	if err != nil {
		return err
	}
	defer unlock()
	if err := clearLeftovers(out); err != nil {
		return err
	}
	if err := CheckReplaceable(out); err != nil {
		var refused *OutputRefused
		if errors.As(err, &refused) {
			refused.Dir = given
		}
		return err
	}
	tmp, err := os.MkdirTemp(parent, tempPrefix(out))
	if err != nil {
		return err
	}
	if err := fill(tmp, files); err != nil {
		os.RemoveAll(tmp)
		return err
	}
	if err := swap(tmp, out); err != nil {
		os.RemoveAll(tmp)
		return err
	}
	return nil
}

// fill writes the marker and the files into the new folder dir.
func fill(dir string, files []File) error {
	names := make([]string, len(files))
	for i, f := range files {
		names[i] = f.Name
	}
	marker := File{Name: MarkerFile, Data: []byte("Written by lossline report; the next run replaces this folder whole.\n" +
		strings.Join(names, "\n") + "\n")}
	if err := writeFile(filepath.Join(dir, marker.Name), &marker); err != nil {
		return fmt.Errorf("writing %s: %w", marker.Name, err)
	}
	for i := range files {
		if err := writeFile(filepath.Join(dir, files[i].Name), &files[i]); err != nil {
			return fmt.Errorf("writing %s: %w", files[i].Name, err)
		}
	}
	return os.Chmod(dir, 0o755)
}

// writeFile writes one file, straight from its Write function when it has
// one, and records its size.
func writeFile(path string, file *File) error {
	f, err := os.OpenFile(path, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
	if err != nil {
		return err
	}
	counted := &countingWriter{w: f}
	var werr error
	if file.Write != nil {
		b := bufio.NewWriterSize(counted, 1<<20)
		werr = file.Write(b)
		werr = errors.Join(werr, b.Flush())
	} else {
		_, werr = counted.Write(file.Data)
	}
	file.Size = counted.n
	serr := f.Sync()
	cerr := f.Close()
	return errors.Join(werr, serr, cerr)
}

// countingWriter counts the bytes written through it.
type countingWriter struct {
	w io.Writer
	n int64
}

func (c *countingWriter) Write(p []byte) (int, error) {
	n, err := c.w.Write(p)
	c.n += int64(n)
	return n, err
}

// swap puts the new folder tmp in out's place, keeping the previous folder
// aside until the new one is in place.
func swap(tmp, out string) error {
	if _, err := os.Lstat(out); errors.Is(err, fs.ErrNotExist) {
		return rename(tmp, out)
	}
	backup := filepath.Join(filepath.Dir(out), backupPrefix(out)+strings.TrimPrefix(filepath.Base(tmp), tempPrefix(out)))
	if err := rename(out, backup); err != nil {
		return fmt.Errorf("moving the previous report aside: %w", err)
	}
	if err := rename(tmp, out); err != nil {
		if rerr := rename(backup, out); rerr != nil {
			return fmt.Errorf("%w; the previous report is kept in %s (%v)", err, backup, rerr)
		}
		return err
	}
	// The new report is in place; a previous one that cannot be removed is
	// only clutter, cleared by the next run.
	os.RemoveAll(backup)
	return nil
}

// clearLeftovers removes what a killed run left beside out: temporary
// folders, and previous reports moved aside. A previous report moved aside
// while out is missing is put back first, so it is not lost if this run
// fails too. Only folders with our names holding only our files are touched.
func clearLeftovers(out string) error {
	entries, err := os.ReadDir(filepath.Dir(out))
	if err != nil {
		return err
	}
	_, statErr := os.Lstat(out)
	missing := errors.Is(statErr, fs.ErrNotExist)
	for _, e := range entries {
		name := e.Name()
		path := filepath.Join(filepath.Dir(out), name)
		isTemp, isBackup := strings.HasPrefix(name, tempPrefix(out)), strings.HasPrefix(name, backupPrefix(out))
		if !e.IsDir() || (!isTemp && !isBackup) || CheckReplaceable(path) != nil {
			continue
		}
		if isBackup && missing {
			if err := rename(path, out); err == nil {
				missing = false
				continue
			}
		}
		if err := os.RemoveAll(path); err != nil {
			return fmt.Errorf("removing %s, left by an earlier run: %w", path, err)
		}
	}
	return nil
}

// CheckReplaceable refuses a folder that lossline did not write: it may be
// missing, empty, or hold only lossline's outputs (those of this version and
// those its marker lists) and the temporary files of earlier versions.
func CheckReplaceable(dir string) error {
	st, err := os.Lstat(dir)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return err
	}
	if !st.IsDir() {
		return &OutputRefused{Dir: dir, Why: "is a file, not a folder"}
	}
	entries, err := os.ReadDir(dir)
	if err != nil {
		return err
	}
	ours := append(slices.Clone(Outputs), MarkerFile)
	if marker, err := os.ReadFile(filepath.Join(dir, MarkerFile)); err == nil {
		lines := strings.Split(string(marker), "\n")
		ours = append(ours, lines[1:]...)
	}
	for _, e := range entries {
		name := e.Name()
		if e.Type().IsRegular() && (slices.Contains(ours, name) || earlierTemporary(name, ours)) {
			continue
		}
		return &OutputRefused{Dir: dir, Why: fmt.Sprintf("holds %s, which lossline did not write; "+
			"lossline replaces its output folder whole, so it writes only to a new or empty folder or to one it wrote before", name)}
	}
	return nil
}

// earlierTemporary reports whether name is a temporary file the earlier
// one-file-at-a-time writer could leave: ".results.json.123.tmp".
func earlierTemporary(name string, ours []string) bool {
	if !strings.HasPrefix(name, ".") || !strings.HasSuffix(name, ".tmp") {
		return false
	}
	for _, o := range ours {
		if o != "" && strings.HasPrefix(name, "."+o+".") {
			return true
		}
	}
	return false
}
