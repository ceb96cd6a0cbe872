package report

import (
	"errors"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"sync"
	"sync/atomic"
	"testing"
	"time"

	"github.com/lossline/lossline/survey"
)

// outputs is a set of files whose content says which run wrote it.
func outputs(run string) []File {
	var files []File
	for _, name := range Outputs {
		files = append(files, File{Name: name, Data: []byte(run + " " + name)})
	}
	return files
}

// readFolder lists a folder's files and their contents.
func readFolder(t *testing.T, dir string) map[string]string {
	t.Helper()
	entries, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	got := map[string]string{}
	for _, e := range entries {
		b, _ := os.ReadFile(filepath.Join(dir, e.Name()))
		got[e.Name()] = string(b)
	}
	return got
}

// assertRun checks that dir holds the outputs of run, whole, and that
// nothing of ours is left beside it.
func assertRun(t *testing.T, dir, run string) {
	t.Helper()
	got := readFolder(t, dir)
	for _, name := range Outputs {
		if got[name] != run+" "+name {
			t.Errorf("%s = %q, want the run %q", name, got[name], run)
		}
	}
	if _, ok := got[MarkerFile]; !ok || len(got) != len(Outputs)+1 {
		t.Errorf("folder holds %v", slices.Sorted(func(yield func(string) bool) {
			for k := range got {
				if !yield(k) {
					return
				}
			}
		}))
	}
	siblings, _ := os.ReadDir(filepath.Dir(dir))
	for _, e := range siblings {
		if strings.HasPrefix(e.Name(), tempPrefix(dir)) || strings.HasPrefix(e.Name(), backupPrefix(dir)) || e.Name() == filepath.Base(lockName(dir)) {
			t.Errorf("%s left beside the report", e.Name())
		}
	}
}

func TestWriteFolderReplacesTheReportWhole(t *testing.T) {
	out := filepath.Join(t.TempDir(), "report")
	if err := WriteFolder(out, outputs("first"), WriteOptions{}); err != nil {
		t.Fatal(err)
	}
	assertRun(t, out, "first")
	// A later run replaces every file; an output the new run does not write
	// goes with the previous folder.
	if err := WriteFolder(out, append(outputs("second"), File{Name: "extra.txt", Data: []byte("x")}), WriteOptions{}); err != nil {
		t.Fatal(err)
	}
	if err := WriteFolder(out, outputs("third"), WriteOptions{}); err != nil {
		t.Fatalf("a folder whose marker lists extra.txt: %v", err)
	}
	assertRun(t, out, "third")
	// An existing empty folder, and one of the earlier writer with its temporaries, are ours.
	empty := t.TempDir()
	if err := WriteFolder(empty, outputs("e"), WriteOptions{}); err != nil {
		t.Fatal(err)
	}
	assertRun(t, empty, "e")
	earlier := filepath.Join(t.TempDir(), "r")
	os.Mkdir(earlier, 0o755)
	os.WriteFile(filepath.Join(earlier, JSONFile), []byte("{}"), 0o644)
	os.WriteFile(filepath.Join(earlier, "."+PDFFile+".123.tmp"), []byte("%PDF"), 0o644)
	if err := WriteFolder(earlier, outputs("f"), WriteOptions{}); err != nil {
		t.Fatal(err)
	}
	assertRun(t, earlier, "f")
}

// A folder holding anything lossline did not write is refused, not replaced.
func TestWriteFolderRefusesAUsersFolder(t *testing.T) {
	out := t.TempDir()
	os.WriteFile(filepath.Join(out, "notes.txt"), []byte("mine"), 0o644)
	os.WriteFile(filepath.Join(out, PDFFile), []byte("old pdf"), 0o644)
	err := WriteFolder(out, outputs("new"), WriteOptions{})
	var refused *OutputRefused
	if !errors.As(err, &refused) || !strings.Contains(err.Error(), "holds notes.txt, which lossline did not write") {
		t.Fatalf("got %v", err)
	}
	if got := readFolder(t, out); len(got) != 2 || got["notes.txt"] != "mine" || got[PDFFile] != "old pdf" {
		t.Errorf("user's folder changed: %v", got)
	}
	sub := t.TempDir()
	os.Mkdir(filepath.Join(sub, "photos"), 0o755)
	if err := WriteFolder(sub, outputs("new"), WriteOptions{}); !errors.As(err, &refused) {
		t.Errorf("a folder holding a folder: %v", err)
	}
	file := filepath.Join(t.TempDir(), "report")
	os.WriteFile(file, []byte("a file"), 0o644)
	if err := WriteFolder(file, outputs("new"), WriteOptions{}); !errors.As(err, &refused) || !strings.Contains(err.Error(), "is a file") {
		t.Errorf("a file in the way: %v", err)
	}
}

// A step that fails leaves the previous report as it was, and nothing beside it.
func TestWriteFolderFailureKeepsThePreviousReport(t *testing.T) {
	out := filepath.Join(t.TempDir(), "report")
	if err := WriteFolder(out, outputs("old"), WriteOptions{}); err != nil {
		t.Fatal(err)
	}
	// Writing fails midway: the third file cannot be created.
	files := outputs("new")
	files = append(files[:2], append([]File{{Name: "sub/x", Data: []byte("y")}}, files[2:]...)...)
	if err := WriteFolder(out, files, WriteOptions{}); err == nil || !strings.Contains(err.Error(), "writing sub/x") {
		t.Fatalf("got %v", err)
	}
	assertRun(t, out, "old")
	// The rename of the new folder into place fails after the previous one
	// was moved aside: the previous one is put back.
	defer func() { rename = os.Rename }()
	calls := 0
	rename = func(from, to string) error {
		calls++
		if calls == 2 {
			return errors.New("simulated failure")
		}
		return os.Rename(from, to)
	}
	if err := WriteFolder(out, outputs("new"), WriteOptions{}); err == nil || !strings.Contains(err.Error(), "simulated failure") {
		t.Fatalf("got %v", err)
	}
	if calls != 3 {
		t.Errorf("%d renames, want 3 (aside, into place, back)", calls)
	}
	assertRun(t, out, "old")
	// Moving the previous folder aside fails (a file held open on Windows).
	calls = 0
	rename = func(string, string) error { calls++; return errors.New("in use") }
	if err := WriteFolder(out, outputs("new"), WriteOptions{}); err == nil || !strings.Contains(err.Error(), "moving the previous report aside: in use") {
		t.Fatalf("got %v", err)
	}
	assertRun(t, out, "old")
}

// What a killed run left beside the folder is cleared by the next run; a
// previous report left aside with no report in its place is put back first.
func TestWriteFolderClearsLeftovers(t *testing.T) {
	parent := t.TempDir()
	out := filepath.Join(parent, "report")
	mk := func(name string, files ...string) string {
		dir := filepath.Join(parent, name)
		os.Mkdir(dir, 0o700)
		for _, f := range files {
			os.WriteFile(filepath.Join(dir, f), []byte("left"), 0o644)
		}
		return dir
	}
	mk(".report.tmp-111", MarkerFile, PDFFile)
	mk(".report.tmp-222") // killed before anything was written
	mk(".report.old-333", MarkerFile, PDFFile, JSONFile)
	foreign := mk(".report.tmp-444", "thesis.docx") // our name, not our files
	other := mk(".other.tmp-555", PDFFile)          // another folder's
	if err := clearLeftovers(out); err != nil {
		t.Fatal(err)
	}
	if got := readFolder(t, out); got[JSONFile] != "left" {
		t.Errorf("the previous report left aside was not put back: %v", got)
	}
	for _, name := range []string{".report.tmp-111", ".report.tmp-222", ".report.old-333"} {
		if _, err := os.Stat(filepath.Join(parent, name)); err == nil {
			t.Errorf("%s not removed", name)
		}
	}
	for _, dir := range []string{foreign, other} {
		if _, err := os.Stat(dir); err != nil {
			t.Errorf("%s removed: %v", dir, err)
		}
	}
	os.RemoveAll(foreign)
	if err := WriteFolder(out, outputs("next"), WriteOptions{}); err != nil {
		t.Fatal(err)
	}
	assertRun(t, out, "next")
}

// A second run waits for the lock, saying so once, and gives up after its wait.
func TestWriteFolderWaitsForTheLock(t *testing.T) {
	out := filepath.Join(t.TempDir(), "report")
	release, busy, err := tryLock(lockName(out))
	if err != nil || busy {
		t.Fatalf("lock: %v %v", busy, err)
	}
	waited := 0
	err = WriteFolder(out, outputs("late"), WriteOptions{Wait: 150 * time.Millisecond, Waiting: func() { waited++ }})
	if err == nil || !strings.Contains(err.Error(), "another lossline run is still writing") || waited != 1 {
		t.Fatalf("locked folder: %v, told %d times", err, waited)
	}
	if _, err := os.Stat(out); err == nil {
		t.Error("written while locked")
	}
	go func() {
		time.Sleep(100 * time.Millisecond)
		release()
	}()
	waited = 0
	if err := WriteFolder(out, outputs("patient"), WriteOptions{Wait: 5 * time.Second, Waiting: func() { waited++ }}); err != nil || waited != 1 {
		t.Fatalf("after the release: %v, told %d times", err, waited)
	}
	assertRun(t, out, "patient")
}

func TestCheckOutputKeepsReportsOutOfInputs(t *testing.T) {
	root := t.TempDir()
	dir := filepath.Join(root, "site-2026")
	old := filepath.Join(root, "site-2022")
	for _, d := range []string{filepath.Join(dir, "photos"), filepath.Join(old, "photos")} {
		os.MkdirAll(d, 0o755)
	}
	s := &survey.Survey{Dir: dir, Previous: []string{"../site-2022"}}
	for _, c := range []struct{ out, want string }{
		{filepath.Join(dir, "report"), ""},
		{filepath.Join(root, "out"), ""},
		{dir, "is the survey folder " + dir + " itself"},
		{filepath.Join(dir, "photos"), "is inside the photos folder " + filepath.Join(dir, "photos") + " of the survey folder " + dir},
		{filepath.Join(dir, "photos", "report"), "is inside the photos folder"},
		{filepath.Join(old, "report"), "is inside the earlier survey folder " + filepath.Join(dir, "../site-2022")},
		{root, "holds the survey folder " + dir},
	} {
		err := CheckOutput(c.out, s)
		if (err == nil) != (c.want == "") || (err != nil && !strings.Contains(err.Error(), c.want)) {
			t.Errorf("-o %s: %v, want %q", c.out, err, c.want)
		}
	}
	link := filepath.Join(root, "shortcut")
	if err := os.Symlink(filepath.Join(dir, "photos"), link); err != nil {
		t.Skip("no symbolic links:", err)
	}
	if err := CheckOutput(filepath.Join(link, "out"), s); err == nil {
		t.Error("a link into photos/: accepted")
	}
	s.Previous = nil
	s.History = &survey.History{Earlier: []*survey.Survey{{Dir: old}}}
	if err := CheckOutput(filepath.Join(old, "x"), s); err == nil {
		t.Error("inside an earlier survey merged by --previous: accepted")
	}
}

// However runs take and release the lock, and remove its file, no two hold it at once.
func TestLockIsExclusive(t *testing.T) {
	out := filepath.Join(t.TempDir(), "report")
	var holders, overlaps atomic.Int32
	var wg sync.WaitGroup
	for range 8 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for range 40 {
				release, err := lockFolder(lockName(out), out, WriteOptions{Wait: 20 * time.Second})
				if err != nil {
					t.Error(err)
					return
				}
				if holders.Add(1) > 1 {
					overlaps.Add(1)
				}
				time.Sleep(100 * time.Microsecond)
				holders.Add(-1)
				release()
			}
		}()
	}
	wg.Wait()
	if overlaps.Load() > 0 {
		t.Errorf("%d times two runs held the lock at once", overlaps.Load())
	}
	if _, err := os.Stat(lockName(out)); err == nil {
		t.Error("lock file left behind")
	}
}
