package survey

import (
	"bytes"
	"strings"
)

// Placeholder marks: `lossline new` writes ⟨…⟩ around every text and example
// value the inspector is to replace, so a survey left untouched cannot pass.
const (
	placeholderOpen  = "⟨"
	placeholderClose = "⟩"
)

// IsPlaceholderMark reports whether r is one of the scaffold's placeholder
// marks, which check refuses wherever they are left.
func IsPlaceholderMark(r rune) bool {
	return string(r) == placeholderOpen || string(r) == placeholderClose
}

// placeholders reports, at its line, every placeholder of the scaffold left in
// src, and returns src without the marks, so the rest of the line reads as the
// example it is and only the placeholder is reported.
func (r *checklistReader) placeholders(src []byte) []byte {
	if !bytes.Contains(src, []byte(placeholderOpen)) {
		return src
	}
	for i, line := range strings.Split(string(src), "\n") {
		var found []string
		rest := line
		for {
			_, after, ok := strings.Cut(rest, placeholderOpen)
			if !ok {
				break
			}
			text, tail, closed := strings.Cut(after, placeholderClose)
			if !closed {
				text = strings.TrimSpace(text) + " …"
			}
			found = append(found, placeholderOpen+text+placeholderClose)
			rest = tail
		}
		if len(found) > 0 {
			r.problems.Errorf(r.file, i+1, "%s %s from lossline new: replace %s with your own text",
				plural(len(found), "placeholder", "placeholders"), strings.Join(found, ", "), plural(len(found), "it", "them"))
		}
	}
	src = bytes.ReplaceAll(src, []byte(placeholderOpen), nil)
	return bytes.ReplaceAll(src, []byte(placeholderClose), nil)
}
