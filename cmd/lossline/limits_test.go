package main

import (
	"bytes"
	"context"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"sync"
	"testing"
	"time"
)

// Limits every hostile-input case runs under: the 4 GB address space
// and a wall-clock bound well above what a correct run needs.
const (
	limitAddressSpaceKB = 4 << 20 // 4 GiB, ulimit -v counts KiB
	limitWall           = 60 * time.Second
)

var (
	builtOnce sync.Once
	builtBin  string
	builtErr  error
)

// binary builds lossline once per test run.
func binary(t *testing.T) string {
	t.Helper()
	builtOnce.Do(func() {
		dir, err := os.MkdirTemp("", "lossline-bin-")
		if err != nil {
			builtErr = err
			return
		}
		builtBin = filepath.Join(dir, "lossline")
		if out, err := exec.Command("go", "build", "-o", builtBin, ".").CombinedOutput(); err != nil {
			builtErr = errors.New(string(out))
		}
	})
	if builtErr != nil {
		t.Fatalf("build: %v", builtErr)
	}
	return builtBin
}

// limitedRun is the outcome of the binary run under limits.
type limitedRun struct {
	Code           int // exit status; -1 when killed at the time limit
	Stdout, Stderr string
	Took           time.Duration
}

// runLimited runs the built binary with args under a 4 GB address-space
// limit (ulimit -v) and a wall-clock limit, with its own photo cache. A run
// that hits the time limit fails the test.
func runLimited(t *testing.T, args ...string) limitedRun {
	t.Helper()
	return runUnder(t, "", args...)
}

// runUnder is runLimited with further ulimit options in front of the
// command, such as "-f 100" (file size, in 512-byte blocks).
func runUnder(t *testing.T, ulimits string, args ...string) limitedRun {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), limitWall)
	defer cancel()
	cmd := limitedCommand(ctx, t, ulimits, args...)
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	start := time.Now()
	err := cmd.Run()
	r := limitedRun{Stdout: out.String(), Stderr: errb.String(), Took: time.Since(start)}
	var exit *exec.ExitError
	switch {
	case ctx.Err() != nil:
		t.Fatalf("lossline %v still running after %v (killed)", args, limitWall)
	case errors.As(err, &exit):
		r.Code = exit.ExitCode()
	case err != nil:
		t.Fatalf("lossline %v: %v", args, err)
	}
	return r
}

// limitedCommand is the command runLimited runs: the built binary under the
// address-space limit and any further ulimit options, with its own photo
// cache.
func limitedCommand(ctx context.Context, t *testing.T, ulimits string, args ...string) *exec.Cmd {
	t.Helper()
	bin := binary(t)
	script := "ulimit -v " + strconv.Itoa(limitAddressSpaceKB) + " && "
	if ulimits != "" {
		script += "ulimit " + ulimits + " && "
	}
	script += "exec \"$0\" \"$@\""
	cmd := exec.CommandContext(ctx, "sh", append([]string{"-c", script, bin}, args...)...)
	cmd.Env = append(os.Environ(), "XDG_CACHE_HOME="+t.TempDir())
	return cmd
}

// The limits themselves work: the demo reports within them.
func TestRunLimitedDemo(t *testing.T) {
	r := runLimited(t, "check", "../../testdata/demo")
	if r.Code != 0 {
		t.Fatalf("check demo: exit %d\n%s", r.Code, r.Stderr)
	}
}
