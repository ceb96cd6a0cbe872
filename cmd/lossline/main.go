// Command lossline turns a corrosion thickness survey folder into a PDF
// report and machine-readable results.
package main

import (
	"fmt"
	"io"
	"os"
	"runtime/debug"
	"strings"

	"github.com/lossline/lossline/survey"
)

// version is printed on reports and by --version.
const version = "0.1.0"

// Exit codes.
const (
	exitOK       = 0
	exitBadInput = 1
	exitUsage    = 2
	exitOther    = 3
)

func main() {
	// Decoding 12-megapixel photos makes tens of megabytes of garbage per
	// photo; a soft memory limit makes the collector return it promptly, so
	// peak memory stays flat however many photos a survey has. GOMEMLIMIT
	// set by the user wins.
	if os.Getenv("GOMEMLIMIT") == "" {
		debug.SetMemoryLimit(memoryLimit)
	}
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

// memoryLimit is the soft limit of the Go heap (runtime/debug.SetMemoryLimit).
const memoryLimit = 140 << 20

// run executes the command line and maps its error to an exit code.
func run(args []string, stdout, stderr io.Writer) int {
	root := newRoot(stdout, stderr)
	root.SetArgs(args)
	err := root.Execute()
	if err != nil && isCobraUsage(err) {
		err = usageError{err}
	}
	switch e := err.(type) {
	case nil:
		return exitOK
	case survey.InputError:
		fmt.Fprintln(stderr, e.Error())
		return exitBadInput
	case usageError:
		fmt.Fprintf(stderr, "lossline: %v\nRun 'lossline --help' for usage.\n", e.error)
		return exitUsage
	case badInput:
		fmt.Fprintf(stderr, "%v\n", e.error)
		return exitBadInput
	case silentExit:
		return int(e)
	default:
		fmt.Fprintf(stderr, "lossline: %v\n", err)
		return exitOther
	}
}

// isCobraUsage recognises the usage errors cobra raises itself.
func isCobraUsage(err error) bool {
	msg := err.Error()
	return strings.HasPrefix(msg, "unknown command") || strings.HasPrefix(msg, "unknown flag") ||
		strings.HasPrefix(msg, "unknown shorthand flag")
}

// usageError is a wrong command line (exit 2).
type usageError struct{ error }

// badInput is an input problem that is not a checklist problem (exit 1).
type badInput struct{ error }

// silentExit ends with a code after the command has printed what it had to.
type silentExit int

func (s silentExit) Error() string { return fmt.Sprintf("exit %d", int(s)) }
