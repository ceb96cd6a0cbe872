package intake

import (
	"fmt"
	"strings"
)

// lineOp is one line of a change: kept (' '), removed ('-') or added ('+'),
// with its line ending.
type lineOp struct {
	kind byte
	text string
}

// diffContext is how many unchanged lines a hunk shows around a change.
const diffContext = 3

// unifiedDiff writes a change as a unified diff (the format of diff -u and
// patch, as POSIX describes diff -u): hunks of changed lines with three
// lines of context, the lines removed of each run before the lines added.
// The merge knows which line became which, so the diff is the change itself,
// not a search for one.
func unifiedDiff(name string, ops []lineOp) string {
	var changes []int
	for i, op := range ops {
		if op.kind != ' ' {
			changes = append(changes, i)
		}
	}
	if len(changes) == 0 {
		return ""
	}
	var b strings.Builder
	fmt.Fprintf(&b, "--- %s\n+++ %s\n", name, name)
	// oldBefore[i] and newBefore[i] count the lines before ops[i].
	oldBefore, newBefore := make([]int, len(ops)+1), make([]int, len(ops)+1)
	for i, op := range ops {
		oldBefore[i+1], newBefore[i+1] = oldBefore[i], newBefore[i]
		if op.kind != '+' {
			oldBefore[i+1]++
		}
		if op.kind != '-' {
			newBefore[i+1]++
		}
	}
	for k := 0; k < len(changes); {
		from := max(0, changes[k]-diffContext)
		last := changes[k]
		for k++; k < len(changes) && changes[k]-last <= 2*diffContext; k++ {
			last = changes[k]
		}
		to := min(len(ops), last+diffContext+1)
		oldN, newN := oldBefore[to]-oldBefore[from], newBefore[to]-newBefore[from]
		fmt.Fprintf(&b, "@@ -%s +%s @@\n", hunkRange(oldBefore[from], oldN), hunkRange(newBefore[from], newN))
		for i := from; i < to; {
			if ops[i].kind == ' ' {
				writeDiffLine(&b, ' ', ops[i].text)
				i++
				continue
			}
			j := i
			for j < to && ops[j].kind != ' ' {
				j++
			}
			for _, want := range []byte{'-', '+'} {
				for _, op := range ops[i:j] {
					if op.kind == want {
						writeDiffLine(&b, want, op.text)
					}
				}
			}
			i = j
		}
	}
	return b.String()
}

// hunkRange is a hunk's start line and count: an empty range starts at the
// line before it.
func hunkRange(before, n int) string {
	start := before + 1
	if n == 0 {
		start = before
	}
	if n == 1 {
		return fmt.Sprint(start)
	}
	return fmt.Sprintf("%d,%d", start, n)
}

func writeDiffLine(b *strings.Builder, kind byte, text string) {
	b.WriteByte(kind)
	b.WriteString(text)
	if !strings.HasSuffix(text, "\n") {
		b.WriteString("\n\\ No newline at end of file\n")
	}
}
