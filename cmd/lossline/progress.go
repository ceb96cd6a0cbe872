package main

import (
	"fmt"
	"io"
	"os"
	"strings"

	"golang.org/x/term"
)

// progressBar returns a callback that draws "photos 12/300 [#####     ]" on
// stderr when it is a terminal, and nil (no output) otherwise.
func progressBar(w io.Writer, label string) func(done, total int) {
	f, ok := w.(*os.File)
	if !ok || !term.IsTerminal(int(f.Fd())) {
		return nil
	}
	return func(done, total int) {
		const width = 30
		n := width * done / max(total, 1)
		fmt.Fprintf(w, "\r%s %d/%d [%s%s]", label, done, total, strings.Repeat("#", n), strings.Repeat(" ", width-n))
		if done == total {
			fmt.Fprintln(w)
		}
	}
}
