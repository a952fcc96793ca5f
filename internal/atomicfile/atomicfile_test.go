package atomicfile

import (
	"os"
	"path/filepath"
	"strings"
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

// TestCommitAllOrNothing: a target that is a folder stops the commit
// before any file is replaced; a rename that fails midway puts the
// earlier files back; temporary files a killed build left are removed by
// the next write of the same target.
func TestCommitAllOrNothing(t *testing.T) {
	dir := t.TempDir()
	a, b, c := filepath.Join(dir, "a.html"), filepath.Join(dir, "b.tex"), filepath.Join(dir, "c.md")
	for _, p := range []string{a, c} {
		os.WriteFile(p, []byte("old"), 0o644)
	}
	os.MkdirAll(filepath.Join(b, "inside"), 0o755) // b.tex is a non-empty folder
	var s Set
	for _, p := range []string{a, b, c} {
		if err := s.Stage(p, []byte("new")); err != nil {
			t.Fatal(err)
		}
	}
	err := s.Commit()
	if err == nil || !strings.Contains(err.Error(), "b.tex") || !strings.Contains(err.Error(), "not a regular file") {
		t.Fatalf("Commit over a folder: %v", err)
	}
	for _, p := range []string{a, c} {
		if got, _ := os.ReadFile(p); string(got) != "old" {
			t.Errorf("%s was replaced: %q", filepath.Base(p), got)
		}
	}
	// A rename that fails after the check (the folder appears late):
	// the files renamed before it get their old contents back.
	os.RemoveAll(b)
	var s2 Set
	for _, p := range []string{a, b, c} {
		if err := s2.Stage(p, []byte("newer")); err != nil {
			t.Fatal(err)
		}
	}
	if len(s2.files) != 3 {
		t.Fatalf("%d files staged", len(s2.files))
	}
	n := 0
	rename = func(from, to string) error { // the third rename fails
		if n++; n == 3 {
			return os.ErrPermission
		}
		return os.Rename(from, to)
	}
	defer func() { rename = os.Rename }()
	if err := s2.Commit(); err == nil {
		t.Fatal("a failed rename was not reported")
	}
	if got, _ := os.ReadFile(a); string(got) != "old" {
		t.Errorf("a.html not restored: %q", got)
	}
	if _, err := os.Stat(b); !os.IsNotExist(err) {
		t.Errorf("b.tex, new in the failed commit, was left: %v", err)
	}
	// A killed build's leftovers go with the next write.
	stale := filepath.Join(dir, ".a.html.tmp-12345")
	os.WriteFile(stale, []byte("x"), 0o644)
	if err := Write(a, []byte("fresh"), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat(stale); !os.IsNotExist(err) {
		t.Error("a stale temporary file was left")
	}
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.Contains(e.Name(), ".tmp-") {
			t.Errorf("left behind: %s", e.Name())
		}
	}
}

// TestSameContent: a file equals data only byte for byte, across the
// comparison's blocks.
func TestSameContent(t *testing.T) {
	dir := t.TempDir()
	big := make([]byte, 200_003)
	for i := range big {
		big[i] = byte(i * 7)
	}
	p := filepath.Join(dir, "f")
	if err := os.WriteFile(p, big, 0o644); err != nil {
		t.Fatal(err)
	}
	if !sameContent(p, big) {
		t.Error("equal content not seen")
	}
	for _, at := range []int{0, 65535, 65536, 65537, 200_002} {
		d := append([]byte(nil), big...)
		d[at]++
		if sameContent(p, d) {
			t.Errorf("a change at byte %d not seen", at)
		}
	}
	if sameContent(p, big[:len(big)-1]) || sameContent(p, append(append([]byte(nil), big...), 0)) {
		t.Error("a different length not seen")
	}
	if sameContent(filepath.Join(dir, "missing"), nil) || sameContent(dir, nil) {
		t.Error("a missing file or a folder matched")
	}
	e := filepath.Join(dir, "empty")
	os.WriteFile(e, nil, 0o644)
	if !sameContent(e, nil) || sameContent(e, []byte{0}) {
		t.Error("empty file")
	}
}

// TestStageAll: many files staged at once behave as one Stage each: an
// unchanged file is left alone, the others appear only at Commit; a
// failure (a target whose folder is a file) removes every staged file
// and names the path.
func TestStageAll(t *testing.T) {
	dir := t.TempDir()
	files := map[string][]byte{}
	for i := 0; i < 40; i++ {
		files[filepath.Join(dir, "f", string(rune('a'+i%26))+strings.Repeat("x", i/26)+".txt")] = []byte(strings.Repeat("v", i))
	}
	var s Set
	if err := s.StageAll("", files, nil); err != nil {
		t.Fatal(err)
	}
	if err := s.Commit(); err != nil {
		t.Fatal(err)
	}
	old := time.Now().Add(-time.Hour)
	for p, b := range files {
		if got, _ := os.ReadFile(p); string(got) != string(b) {
			t.Fatalf("%s = %q", p, got)
		}
		os.Chtimes(p, old, old)
	}
	changed := filepath.Join(dir, "f", "c.txt")
	files[changed] = []byte("new")
	var s2 Set
	if err := s2.StageAll("", files, nil); err != nil {
		t.Fatal(err)
	}
	if got, _ := os.ReadFile(changed); string(got) != "vv" {
		t.Fatal("a staged file is visible before Commit")
	}
	if err := s2.Commit(); err != nil {
		t.Fatal(err)
	}
	for p, b := range files {
		st, _ := os.Stat(p)
		if got, _ := os.ReadFile(p); string(got) != string(b) {
			t.Errorf("%s = %q", p, got)
		}
		if p != changed && !st.ModTime().Equal(old) {
			t.Errorf("unchanged %s was rewritten", p)
		}
	}
	os.WriteFile(filepath.Join(dir, "blocker"), nil, 0o644)
	bad := filepath.Join(dir, "blocker", "x.txt")
	files[bad] = []byte("x")
	files[changed] = []byte("newer")
	var s3 Set
	if err := s3.StageAll("", files, nil); err == nil || !strings.Contains(err.Error(), "blocker") {
		t.Fatalf("error %v, want one naming the blocked path", err)
	}
	if len(s3.files) != 0 {
		t.Error("files left staged after a failure")
	}
	entries, _ := os.ReadDir(filepath.Join(dir, "f"))
	for _, e := range entries {
		if strings.Contains(e.Name(), ".tmp-") {
			t.Errorf("left behind: %s", e.Name())
		}
	}
}
