package survey

import (
	"cmp"
	"fmt"
	"slices"
	"strings"
)

// Severity says whether a problem stops the report.
type Severity int

// Severities.
const (
	Warning Severity = iota
	Error
)

// Problem is something wrong with the input, at a place in a file.
type Problem struct {
	File     string
	Line     int // 0 when the problem is about the whole file
	Severity Severity
	Message  string
}

// String formats the problem as `file:line: message` (warnings say so).
func (p Problem) String() string {
	pos := p.File
	if p.Line > 0 {
		pos = fmt.Sprintf("%s:%d", p.File, p.Line)
	}
	if p.Severity == Warning {
		return pos + ": warning: " + p.Message
	}
	return pos + ": " + p.Message
}

// ProblemList collects problems; it is an error when it holds an Error.
type ProblemList []Problem

func (l *ProblemList) add(sev Severity, file string, line int, format string, args ...any) {
	*l = append(*l, Problem{File: file, Line: line, Severity: sev, Message: fmt.Sprintf(format, args...)})
}

// Errorf records an error at file:line.
func (l *ProblemList) Errorf(file string, line int, format string, args ...any) {
	l.add(Error, file, line, format, args...)
}

// Warnf records a warning at file:line.
func (l *ProblemList) Warnf(file string, line int, format string, args ...any) {
	l.add(Warning, file, line, format, args...)
}

// Sort orders problems by file, then line, keeping the order of equal places.
func (l ProblemList) Sort() {
	if slices.IsSortedFunc(l, comparePlaces) {
		return
	}
	// pdqsort of positions, the position breaking ties: n log n, where a
	// stable sort moves the problems n log² n times.
	order := make([]int, len(l))
	for i := range order {
		order[i] = i
	}
	slices.SortFunc(order, func(i, j int) int {
		if c := comparePlaces(l[i], l[j]); c != 0 {
			return c
		}
		return cmp.Compare(i, j)
	})
	sorted := make(ProblemList, len(l))
	for k, i := range order {
		sorted[k] = l[i]
	}
	copy(l, sorted)
}

// comparePlaces orders problems by file, then line.
func comparePlaces(a, b Problem) int {
	if c := strings.Compare(a.File, b.File); c != 0 {
		return c
	}
	return cmp.Compare(a.Line, b.Line)
}

// HasErrors reports whether any problem is an Error.
func (l ProblemList) HasErrors() bool {
	for _, p := range l {
		if p.Severity == Error {
			return true
		}
	}
	return false
}

// Warnings returns only the warnings.
func (l ProblemList) Warnings() ProblemList {
	var out ProblemList
	for _, p := range l {
		if p.Severity == Warning {
			out = append(out, p)
		}
	}
	return out
}

// Err returns the list as an error when it holds an Error, else nil.
func (l ProblemList) Err() error {
	if !l.HasErrors() {
		return nil
	}
	return InputError{l}
}

// InputError is returned when the survey cannot be read; it lists every problem.
type InputError struct{ Problems ProblemList }

func (e InputError) Error() string {
	var b strings.Builder
	for i, p := range e.Problems {
		if i > 0 {
			b.WriteByte('\n')
		}
		b.WriteString(p.String())
	}
	return b.String()
}
