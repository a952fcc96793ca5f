package engine

import (
	"os"
	"path/filepath"
	"testing"
)

// TestMemo: a memo made in one build is read by the next with the same
// galley (the computation is not run again), not by another galley or
// a --fresh build or after damage; a build keeps only the entries it
// used; without a cache the computation always runs.
func TestMemo(t *testing.T) {
	dir := t.TempDir()
	src := []byte("---\ntitle: t\n---\n\nText.\n")
	build := func(version string, fresh bool, keys ...string) (computed []string) {
		t.Helper()
		c := &Cache{Dir: filepath.Join(dir, ".galley-cache"), Version: version, Fresh: fresh}
		d, err := ParseBytes(filepath.Join(dir, "paper.md"), src, Options{Cache: c})
		if err != nil {
			t.Fatal(err)
		}
		for _, k := range keys {
			got := d.Memo("ns", k, func() string { computed = append(computed, k); return "<" + k + ">" })
			if got != "<"+k+">" {
				t.Fatalf("%s: %q", k, got)
			}
		}
		d.Wait()
		return computed
	}
	if got := build("v1", false, "a", "b"); len(got) != 2 {
		t.Fatalf("first build computed %v", got)
	}
	if got := build("v1", false, "a", "b", "c"); len(got) != 1 || got[0] != "c" {
		t.Fatalf("second build computed %v, want only c", got)
	}
	if got := build("v1", false, "c"); len(got) != 0 {
		t.Fatalf("third build computed %v", got)
	}
	// the third build used only c: a and b are gone
	if got := build("v1", false, "a", "c"); len(got) != 1 || got[0] != "a" {
		t.Fatalf("after a build that used only c: computed %v, want a", got)
	}
	if got := build("v2", false, "a"); len(got) != 1 {
		t.Fatalf("another galley reused a memo: %v", got)
	}
	if got := build("v2", true, "a"); len(got) != 1 {
		t.Fatalf("--fresh reused a memo: %v", got)
	}
	files, _ := filepath.Glob(filepath.Join(dir, ".galley-cache", "memo", "*"))
	if len(files) != 1 {
		t.Fatalf("memo files %v", files)
	}
	raw, _ := os.ReadFile(files[0])
	for cut := 0; cut < len(raw); cut++ {
		if m := decodeMemo(raw[:cut], "v2"); m != nil {
			t.Fatalf("a memo cut at %d of %d bytes was read", cut, len(raw))
		}
	}
	if m := decodeMemo(raw, "v2"); len(m) != 1 || m["a"] != "<a>" {
		t.Fatalf("decoded %v", m)
	}
	os.WriteFile(files[0], raw[:len(raw)-1], 0o644)
	if got := build("v2", false, "a"); len(got) != 1 {
		t.Fatalf("a damaged memo was used: %v", got)
	}
	d, _ := ParseBytes(filepath.Join(dir, "paper.md"), src, Options{})
	n := 0
	d.Memo("ns", "a", func() string { n++; return "" })
	d.Memo("ns", "a", func() string { n++; return "" })
	if n != 2 {
		t.Errorf("without a cache the computation ran %d times, want every time", n)
	}
	d.Wait()
}
