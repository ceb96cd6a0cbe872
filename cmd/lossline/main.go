// Command lossline turns a corrosion thickness survey folder into a PDF
// report and machine-readable results.
package main

import (
	"errors"
	"fmt"
	"io"
	"os"

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
	setSoftLimit()
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

// run executes the command line and returns its exit code.
func run(args []string, stdout, stderr io.Writer) int {
	root := newRoot(stdout, stderr)
	root.SetArgs(args)
	return exitCode(root.Execute(), stderr)
}

// exitCode prints err and maps it to an exit code, the one place errors
// become codes. A wrapped error keeps its code.
func exitCode(err error, stderr io.Writer) int {
	var (
		inputErr survey.InputError
		usage    usageError
		bad      badInput
		exit     silentExit
	)
	switch {
	case err == nil:
		return exitOK
	case errors.As(err, &inputErr):
		fmt.Fprintln(stderr, err)
		return exitBadInput
	case errors.As(err, &usage):
		fmt.Fprintf(stderr, "lossline: %v\nRun 'lossline --help' for usage.\n", err)
		return exitUsage
	case errors.As(err, &bad):
		fmt.Fprintln(stderr, err)
		return exitBadInput
	case errors.As(err, &exit):
		return int(exit)
	default:
		fmt.Fprintf(stderr, "lossline: %v\n", err)
		return exitOther
	}
}

// usageError is a wrong command line (exit 2).
type usageError struct{ error }

func (e usageError) Unwrap() error { return e.error }

// badInput is an input problem that is not a checklist problem (exit 1).
type badInput struct{ error }

func (e badInput) Unwrap() error { return e.error }

// silentExit ends with a code after the command has printed what it had to.
type silentExit int

func (s silentExit) Error() string { return fmt.Sprintf("exit %d", int(s)) }
