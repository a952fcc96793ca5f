package atomicfile

import (
	"os"
	"path/filepath"
	"testing"
	"time"
)

// TestSet: staged files appear only at Commit; an unchanged file is not
// rewritten; Abort leaves the old files and no temporary ones.
func TestSet(t *testing.T) {
	dir := t.TempDir()
	a, b := filepath.Join(dir, "a.txt"), filepath.Join(dir, "sub", "b.txt")
	var s Set
	if err := s.Stage(a, []byte("one")); err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat(a); !os.IsNotExist(err) {
		t.Fatal("a staged file is visible before Commit")
	}
	if err := s.Stage(b, []byte("two")); err != nil {
		t.Fatal(err)
	}
	if err := s.Commit(); err != nil {
		t.Fatal(err)
	}
	if got, _ := os.ReadFile(b); string(got) != "two" {
		t.Fatalf("b = %q", got)
	}
	old := time.Now().Add(-time.Hour)
	os.Chtimes(a, old, old)
	var s2 Set
	s2.Stage(a, []byte("one"))   // unchanged
	s2.Stage(b, []byte("three")) // changed
	if err := s2.Commit(); err != nil {
		t.Fatal(err)
	}
	if st, _ := os.Stat(a); !st.ModTime().Equal(old) {
		t.Error("an unchanged file was rewritten")
	}
	if got, _ := os.ReadFile(b); string(got) != "three" {
		t.Fatalf("b = %q", got)
	}
	var s3 Set
	s3.Stage(a, []byte("four"))
	s3.Abort()
	if got, _ := os.ReadFile(a); string(got) != "one" {
		t.Fatalf("Abort changed a: %q", got)
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if filepath.Ext(e.Name()) != ".txt" && e.Name() != "sub" {
			t.Errorf("left behind: %s", e.Name())
		}
	}
}
