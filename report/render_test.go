package report

import (
	"errors"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey"
)

// A panic while rendering is an error naming the stage, in one line.
func TestStageTurnsPanicsIntoErrors(t *testing.T) {
	err := stage(PDFFile, func() error {
		var m map[string]int
		m["x"] = 1 // assignment to a nil map panics
		return nil
	})
	var rp RenderPanic
	if !errors.As(err, &rp) || rp.Stage != PDFFile {
		t.Fatalf("got %v, want a RenderPanic of %s", err, PDFFile)
	}
	if msg := err.Error(); strings.Contains(msg, "\n") || !strings.HasPrefix(msg, "internal error while rendering report.pdf: assignment to entry in nil map") {
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

// A panic in a photo worker goroutine reaches the caller as an error instead
// of ending the process.
func TestPhotoWorkerPanicIsRecovered(t *testing.T) {
	used := 0
	err := stage(PDFFile, func() error {
		preparePhotos([]*survey.Photo{nil}, PhotoSettings{LongSide: 200, Quality: 80}, func(int, photoResult) { used++ })
		return nil
	})
	var rp RenderPanic
	if !errors.As(err, &rp) || used != 0 {
		t.Fatalf("got %v after %d photos used, want a RenderPanic and none used", err, used)
	}
}
