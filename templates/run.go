package templates

import (
	"bytes"
	"errors"
	"fmt"
	"net/url"
	"text/template"
	"time"
)

// Limits of filling one template: a template that loops or explodes ends in
// an error naming its file instead of taking the run's time or memory.
const (
	// MaxOutputBytes is the most text one template may produce.
	MaxOutputBytes = 1 << 20
	// MaxRunTime is how long one template may take to fill.
	MaxRunTime = 2 * time.Second
)

var errTooLong = fmt.Errorf("writes more than %d KiB (does it loop?)", MaxOutputBytes>>10)

// run parses src and fills it with data. The text functions that can make
// strings (print, printf, println, html, js, urlquery) share one budget of
// MaxOutputBytes, so no string held in a variable grows without bound
// either. A template still running after MaxRunTime is abandoned: its
// goroutine cannot be stopped, but the command ends with the error.
func run(file string, src []byte, data any) (string, error) {
	budget := MaxOutputBytes
	charge := func(s string) (string, error) {
		if budget -= len(s); budget < 0 {
			return "", errTooLong
		}
		return s, nil
	}
	funcs := template.FuncMap{
		"print":    func(args ...any) (string, error) { return charge(fmt.Sprint(args...)) },
		"printf":   func(f string, args ...any) (string, error) { return charge(fmt.Sprintf(f, args...)) },
		"println":  func(args ...any) (string, error) { return charge(fmt.Sprintln(args...)) },
		"html":     func(args ...any) (string, error) { return charge(template.HTMLEscaper(args...)) },
		"js":       func(args ...any) (string, error) { return charge(template.JSEscaper(args...)) },
		"urlquery": func(args ...any) (string, error) { return charge(url.QueryEscape(fmt.Sprint(args...))) },
	}
	t, err := template.New(file).Option("missingkey=error").Funcs(funcs).Parse(string(src))
	if err != nil {
		return "", &Error{File: file, Err: err}
	}
	type result struct {
		text string
		err  error
	}
	done := make(chan result, 1)
	go func() {
		defer func() {
			if v := recover(); v != nil {
				done <- result{err: fmt.Errorf("failed: %v", v)}
			}
		}()
		w := &cappedBuffer{limit: MaxOutputBytes}
		err := t.Execute(w, data)
		done <- result{w.String(), err}
	}()
	timer := time.NewTimer(MaxRunTime)
	defer timer.Stop()
	select {
	case r := <-done:
		if errors.Is(r.err, errTooLong) {
			return "", &Error{File: file, Err: errTooLong}
		}
		if r.err != nil {
			return "", &Error{File: file, Err: r.err}
		}
		return r.text, nil
	case <-timer.C:
		return "", &Error{File: file, Err: fmt.Errorf("still running after %v (does it loop?)", MaxRunTime)}
	}
}

// cappedBuffer is a buffer that refuses to grow past its limit.
type cappedBuffer struct {
	bytes.Buffer
	limit int
}

func (b *cappedBuffer) Write(p []byte) (int, error) {
	if b.Len()+len(p) > b.limit {
		return 0, errTooLong
	}
	return b.Buffer.Write(p)
}
