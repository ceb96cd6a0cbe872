package intake

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/lossline/lossline/survey"
)

// Every CSV example in README.md reads without a problem, in the shape its
// paragraph names.
func TestReadmeExamples(t *testing.T) {
	readme, err := os.ReadFile(filepath.Join("..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"long shape", "wide shape", "grid shape"}
	parts := strings.Split(string(readme), "```csv\n")[1:]
	if len(parts) != len(want) {
		t.Fatalf("%d CSV examples in README, want %d", len(parts), len(want))
	}
	for i, part := range parts {
		example, _, _ := strings.Cut(part, "```")
		f, problems := Read("example.csv", []byte(example), Options{Units: survey.MM, Date: visitDate("2026-11-18")})
		if len(problems) > 0 || len(f.Readings) == 0 {
			t.Errorf("README example\n%s: %v", example, problems.Err())
			continue
		}
		if notes := strings.Join(f.Notes, "; "); !strings.Contains(notes, want[i]) {
			t.Errorf("README example %d: %s, want %s", i+1, notes, want[i])
		}
	}
}
