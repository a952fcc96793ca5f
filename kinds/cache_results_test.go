package kinds

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// TestCachedResultsFile: the results file kept in the cache is served
// only for the same results — after an edit that moves the directives'
// lines it is rendered again — and a damaged copy is never served.
func TestCachedResultsFile(t *testing.T) {
	p := copyDemo(t)
	c := &engine.Cache{Dir: filepath.Join(filepath.Dir(p), ".cache"), Version: "test"}
	_, first := runCached(t, p, c)
	_, warm := runCached(t, p, c)
	if !bytes.Equal(first, warm) {
		t.Fatal("the results file from the cache differs")
	}
	slots, _ := filepath.Glob(filepath.Join(c.Dir, "results", "*.json"))
	if len(slots) != 2 { // the paper's and its revision build's
		t.Fatalf("%d stored results files, want 2", len(slots))
	}
	for _, s := range slots {
		b, _ := os.ReadFile(s)
		b[len(b)-10] ^= 1 // damage the stored copy
		os.WriteFile(s, b, 0o644)
	}
	if _, again := runCached(t, p, c); !bytes.Equal(first, again) {
		t.Fatal("a damaged stored results file was served")
	}
	// two lines of prose above every directive: every line number moves
	src, _ := os.ReadFile(p)
	edited := strings.Replace(string(src), "## Data\n", "## Data\n\nAn added paragraph.\n", 1)
	if edited == string(src) {
		t.Fatal("edit not applied")
	}
	os.WriteFile(p, []byte(edited), 0o644)
	_, moved := runCached(t, p, c)
	_, plain := runCached(t, p, nil)
	if !bytes.Equal(moved, plain) || bytes.Equal(moved, first) {
		t.Fatal("after an edit the results file is not the one a build without the cache writes")
	}
}
