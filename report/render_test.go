package report

import (
	"errors"
	"strings"
	"testing"
)

// A panic while rendering is an error naming the stage, in one line.
func TestStageTurnsPanicsIntoErrors(t *testing.T) {
	err := stage(PDFFile, func() error {
		var cells []int
		_ = cells[len(cells)] // index out of range panics
		return nil
	})
	var rp RenderPanic
	if !errors.As(err, &rp) || rp.Stage != PDFFile {
		t.Fatalf("got %v, want a RenderPanic of %s", err, PDFFile)
	}
	if msg := err.Error(); strings.Contains(msg, "\n") || !strings.HasPrefix(msg, "internal error while rendering report.pdf: runtime error: index out of range") {
		t.Errorf("message %q", msg)
	}
	multi := RenderPanic{Stage: "x", Value: "line one\n\tgoroutine 1 [running]:\n" + strings.Repeat("frame ", 200)}
	if msg := multi.Error(); strings.Contains(msg, "\n") || len([]rune(msg)) > 360 {
		t.Errorf("a long multi-line panic value prints as %d characters: %q", len(msg), msg)
	}
	if err := stage("y", func() error { return errors.New("plain") }); err == nil || err.Error() != "plain" {
		t.Errorf("an error without a panic: %v", err)
	}
}
