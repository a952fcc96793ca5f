package revision

import (
	"strings"
	"testing"

	"github.com/galley-econ/galley/resultsfile"
)

// TestBoundsVerdictFlip: a bounds-test verdict that changes between two
// builds is a flipped conclusion.
func TestBoundsVerdictFlip(t *testing.T) {
	bounds := func(v string) map[string]any {
		return map[string]any{"bounds": map[string]any{"f": map[string]any{"stat": 5.0, "verdict": v}}}
	}
	old := file("paper.md", resultsfile.Record{ID: "b", Kind: "ardl", Values: bounds("level relation")})
	same := file("paper.md", resultsfile.Record{ID: "b", Kind: "ardl", Values: bounds("level relation")})
	new := file("paper.md", resultsfile.Record{ID: "b", Kind: "ardl", Values: bounds("inconclusive")})
	if r := Compare(old, same, Options{}); r.Flips() != 0 {
		t.Errorf("unchanged verdict counted as a flip")
	}
	r := Compare(old, new, Options{})
	if r.Flips() != 1 {
		t.Fatalf("%d flips, want 1", r.Flips())
	}
	f := r.Items[0].Flips[0]
	if !strings.Contains(f.What, "verdict") || f.Old != "level relation" || f.New != "inconclusive" {
		t.Errorf("flip %+v", f)
	}
}
