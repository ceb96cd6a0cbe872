package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// FuzzReadSettingsFile: any bytes in a settings file give values and
// problems, never a panic or a hang; every problem is at a line of the file,
// and every value accepted reads back as itself from the text it is listed as.
func FuzzReadSettingsFile(f *testing.F) {
	if demo, err := os.ReadFile(filepath.Join("..", "..", "testdata", "demo", SettingsFile)); err == nil {
		f.Add(demo)
	}
	for _, s := range []string{
		"budget: 1e30\n", "budget: .inf\n", "budget: -.inf\n", "budget: .nan\n", "budget: 50 000\n", "budget: 100.001\n",
		"budget-per-year: 45\u2009000.50\nplan-years: 2\n", "unit-costs:\n  pipe-m: 950\n  recoat-m2: 1e30\n",
		"unit-costs:\n  pipe-m: -5\n", "unit-costs: 950\n", "budget: [1, 2]\n", "budget:\n", "budget: 1\nbudget: 2\n",
		"a: &x 5\nbudget: *x\n", "budget: &x\n  - *x\n", "gauge-tolerance-mm: 0,28\n", "rate-model: fastest\n",
		"templates: ../../templates\n", strings.Repeat("[", 5000), strings.Repeat("- ", 5000) + "x\n", "\xef\xbb\xbfbudget: 5\n",
	} {
		f.Add([]byte(s))
	}
	dir := f.TempDir()
	f.Fuzz(func(t *testing.T, data []byte) {
		path := filepath.Join(dir, SettingsFile)
		if err := os.WriteFile(path, data, 0o644); err != nil {
			t.Fatal(err)
		}
		type result struct {
			read     fileSettings
			problems settingProblems
		}
		done := make(chan result, 1)
		go func() {
			read, problems := readSettingsFile(path)
			done <- result{read, problems}
		}()
		var r result
		select {
		case r = <-done:
		case <-time.After(10 * time.Second):
			t.Fatalf("readSettingsFile still reading after 10 s: %q", data)
		}
		lines := yamlLines(data)
		for _, p := range r.problems {
			if p.Line < 0 || p.Line > lines {
				t.Fatalf("problem at line %d of a %d-line file: %v", p.Line, lines, p)
			}
		}
		for name, v := range r.read.Values {
			k, ok := lookupSetting(name)
			if !ok {
				t.Fatalf("value of unknown setting %q", name)
			}
			if k.Kind.fileOnly() || k.Kind == kindFolder {
				continue
			}
			back, why := k.read(formatValue(v), "")
			if why != "" || back != v {
				t.Fatalf("%s = %#v is listed as %q, which reads back as %#v (%s)", name, v, formatValue(v), back, why)
			}
		}
	})
}

// A settings file is read only when its size and type say reading ends.
func TestSettingsFileCheckedBeforeReading(t *testing.T) {
	big := filepath.Join(t.TempDir(), "big.yaml")
	if err := os.WriteFile(big, []byte("# "+strings.Repeat("x", maxSettingsBytes)+"\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ path, want string }{
		{big, big + ": settings file is 1048579 bytes, more than the 1 MiB lossline reads"},
		{t.TempDir(), ": settings file cannot be read: not a regular file"},
	} {
		code, out, errOut := runCLI(t, "check", "../../testdata/demo", "--config", c.path)
		if code != exitBadInput || !strings.Contains(errOut, c.want) {
			t.Errorf("--config %s: exit %d, stderr lacks %q:\n%s%s", c.path, code, c.want, out, errOut)
		}
	}
}
