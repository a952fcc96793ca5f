package kinds

import (
	"bytes"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
)

// TestCachedResultsFile: the results file kept in the cache is served
// only for the same results — after an edit that moves the directives'
// lines it is rendered again — and a damaged copy is never served.
func TestCachedResultsFile(t *testing.T) {
	t.Parallel()
	p := copyDemo(t)
	c := &engine.Cache{Dir: filepath.Join(filepath.Dir(p), ".cache"), Version: "test"}
	_, first := runCached(t, p, c)
	_, warm := runCached(t, p, c)
	if !bytes.Equal(first, warm) {
		t.Fatal("the results file from the cache differs")
	}
	slots, _ := filepath.Glob(filepath.Join(c.Dir, "results", "*.json"))
	// the paper's: the revision build's results are compared in memory
	// (Document.ResultsFile), never written, so nothing of it is stored
	if len(slots) != 1 {
		t.Fatalf("%d stored results files, want 1", len(slots))
	}
	for _, s := range slots {
		b, _ := os.ReadFile(s)
		b[len(b)-10] ^= 1 // damage the stored copy
		os.WriteFile(s, b, 0o644)
	}
	if _, again := runCached(t, p, c); !bytes.Equal(first, again) {
		t.Fatal("a damaged stored results file was served")
	}
	// two lines of prose above the first heading: every directive's line moves
	src, _ := os.ReadFile(p)
	edited := strings.Replace(string(src), "\n## ", "\nAn added paragraph.\n\n## ", 1)
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

// TestCachePackKeepsUndoneEdit: the cache keeps one file of entries per
// manuscript; an entry whose directive changed is kept beside the new
// one, so that undoing the edit reuses it, and a build where nothing
// ran does not rewrite the file.
func TestCachePackKeepsUndoneEdit(t *testing.T) {
	t.Parallel()
	p := copyDemo(t)
	c := &engine.Cache{Dir: filepath.Join(filepath.Dir(p), ".cache"), Version: "test"}
	runCached(t, p, c)
	src, _ := os.ReadFile(p)
	edited := strings.Replace(string(src), "caption: Summary statistics, logs", "caption: Summary statistics (logs)", 1)
	if edited == string(src) {
		t.Fatal("edit not applied")
	}
	os.WriteFile(p, []byte(edited), 0o644)
	d, _ := runCached(t, p, c)
	// the revision report reads every result, so it runs again too
	if got := d.Ran(); !slices.Equal(got, []string{"desc", "rev"}) {
		t.Fatalf("after the edit ran %v, want [desc rev]", got)
	}
	os.WriteFile(p, src, 0o644)
	d, _ = runCached(t, p, c)
	// desc is reused; the report (one entry per directive: the last
	// one stored) reruns on its upstream's old results
	if got := d.Ran(); !slices.Equal(got, []string{"rev"}) {
		t.Fatalf("after undoing the edit ran %v, want [rev]", got)
	}
	packs, _ := filepath.Glob(filepath.Join(c.Dir, "pack", "*.gob"))
	if len(packs) != 2 { // the paper's and its revision build's
		t.Fatalf("%d pack files, want 2", len(packs))
	}
	st, _ := os.Stat(packs[0])
	runCached(t, p, c)
	if st2, _ := os.Stat(packs[0]); !st2.ModTime().Equal(st.ModTime()) || st2.Size() != st.Size() {
		t.Error("a build where nothing ran rewrote the pack")
	}
}
