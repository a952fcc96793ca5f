package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// TestBuildRecord: a build that would write what is already there stops
// early, and every change that could alter an output makes a full build:
// an edit of the manuscript, of a data file or of the bibliography, an
// output edited by hand or deleted, other formats, --fresh, a corrupt
// record. The outputs after each build are those of a build without a
// record (--no-cache) on the same files.
func TestBuildRecord(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "paper.md")
	data := filepath.Join(dir, "data.csv")
	bib := filepath.Join(dir, "refs.bib")
	out := filepath.Join(dir, "out")
	text := func(s string) string {
		m := strings.Replace(watchManuscript(s+` As in \citet{dg}.`), "data:\n  grid: data.csv\n",
			"bibliography: refs.bib\ndata:\n  grid:\n    path: data.csv\n    vintage:\n      first: first.csv\n", 1)
		return m + "\n```galley revision\nid: rev\nagainst: first\n```\n\n```galley figure\nid: fig\ndata: grid\npanels:\n  - [north, fuel]\n```\n"
	}
	first := filepath.Join(dir, "first.csv")
	writeFile(t, first, strings.Replace(watchCSV, "2004-08,65,106", "2004-08,64,105", 1))
	writeFile(t, p, text("Draft."))
	writeFile(t, data, watchCSV)
	writeFile(t, bib, "@article{dg,\n  author = {Doe, Jane},\n  title = {A Test},\n  journal = {J},\n  year = {2001}\n}\n")
	build := func(extra ...string) (bool, string) {
		t.Helper()
		var code int
		msg := captureStderr(t, func() {
			code = run(append([]string{"build", p, "--out", out, "-v"}, extra...))
		})
		if code != 0 {
			t.Fatalf("build %v: exit %d: %s", extra, code, msg)
		}
		return strings.Contains(msg, "nothing changed"), msg
	}
	// want checks the outputs against a build of the same files that
	// keeps no record.
	want := func(what string) {
		t.Helper()
		ref := filepath.Join(t.TempDir(), "ref")
		if code := run([]string{"build", p, "--out", ref, "--no-cache"}); code != 0 {
			t.Fatalf("reference build: exit %d", code)
		}
		// every file, the figure's PDF and SVG included
		_ = filepath.WalkDir(ref, func(path string, e os.DirEntry, err error) error {
			if err != nil || e.IsDir() {
				return err
			}
			rel, _ := filepath.Rel(ref, path)
			a, _ := os.ReadFile(filepath.Join(out, rel))
			b, _ := os.ReadFile(path)
			if len(a) == 0 || string(a) != string(b) {
				t.Errorf("%s: %s differs from a build without a record", what, rel)
			}
			return nil
		})
	}
	step := func(what string, skip bool, extra ...string) {
		t.Helper()
		if got, msg := build(extra...); got != skip {
			t.Errorf("%s: skipped = %v, want %v (%q)", what, got, skip, msg)
		}
	}

	step("first build", false)
	step("nothing changed", true)
	want("nothing changed")

	writeFile(t, p, text("Second draft."))
	step("manuscript edited", false)
	want("manuscript edited")
	step("nothing changed after the edit", true)

	writeFile(t, data, watchCSV+"2004-09,66,107\n")
	step("data file revised", false)
	want("data file revised")
	if b, _ := os.ReadFile(filepath.Join(out, "paper.html")); !strings.Contains(string(b), "The sample has 9 months.") {
		t.Error("the revised data did not reach the page")
	}

	writeFile(t, first, strings.Replace(watchCSV, "2004-08,65,106", "2004-08,63,104", 1))
	step("earlier vintage revised", false)
	want("earlier vintage revised")

	writeFile(t, bib, strings.Replace(readFile(t, bib), "A Test", "Another Test", 1))
	step("bibliography edited", false)
	want("bibliography edited")
	if b, _ := os.ReadFile(filepath.Join(out, "paper.html")); !strings.Contains(string(b), "Another Test") {
		t.Error("the edited reference did not reach the page")
	}

	html := filepath.Join(out, "paper.html")
	good := readFile(t, html)
	writeFile(t, html, strings.Replace(good, "Second draft.", "Hand-edited draft.", 1))
	step("output edited by hand", false)
	if readFile(t, html) != good {
		t.Error("the hand-edited output was not rebuilt")
	}
	os.Remove(filepath.Join(out, "paper.results.json"))
	step("output deleted", false)
	want("output deleted")

	step("other formats", false, "--to", "markdown")
	step("same other formats", true, "--to", "markdown")
	step("first formats again", false)
	step("--fresh", false, "--fresh")
	step("after --fresh", true)

	recs, _ := filepath.Glob(filepath.Join(dir, ".galley-cache", "builds", "*"))
	if len(recs) != 1 {
		t.Fatalf("records: %v, want one for this manuscript and folder", recs)
	}
	for _, bad := range []string{"", "galley-build-record-1\n", readFile(t, recs[0]) + "in zz /x\n", strings.Replace(readFile(t, recs[0]), " out ", " out", 1) + "out x 1\n"} {
		writeFile(t, recs[0], bad)
		step("corrupt record", false)
	}
	step("repaired record", true)
}

func readFile(t *testing.T, p string) string {
	t.Helper()
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// TestRecordTrustsUntouchedOutputs: an output the last build put in
// place and nobody touched since is known to hold its bytes without
// being read (holds, and current for a build that changed nothing), but
// not while it is "racy" (recorded within racyWindow of its last
// change), and never after a write of the same size or a copy over it.
func TestRecordTrustsUntouchedOutputs(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "paper.md")
	writeFile(t, p, watchManuscript("Draft."))
	writeFile(t, filepath.Join(dir, "data.csv"), watchCSV)
	out := filepath.Join(dir, "out")
	b := &buildCmd{Manuscript: p, Out: out, To: []string{"html"}}
	cache := cacheFor(p, false)
	if code := run([]string{"build", p, "--out", out}); code != 0 {
		t.Fatalf("build: exit %d", code)
	}
	html := filepath.Join(out, "paper.html")
	data, _ := os.ReadFile(html)
	// just built: racy, so not vouched for
	if rec := b.recordFor(cache); rec == nil || rec.holds(html, data) {
		t.Fatal("a file changed within the racy window was vouched for")
	}
	// a later build that changes nothing reads the racy outputs, finds
	// them intact and renews the record, which then vouches for them
	time.Sleep(3 * time.Duration(racyWindow))
	if code := run([]string{"build", p, "--out", out}); code != 0 {
		t.Fatalf("build: exit %d", code)
	}
	if rec := b.recordFor(cache); !rec.holds(html, data) {
		t.Fatal("the record was not renewed after the outputs were read")
	}
	old := racyWindow
	racyWindow = 0
	defer func() { racyWindow = old }()
	time.Sleep(30 * time.Millisecond) // past the kernel's clock tick
	rec := b.recordFor(cache)
	if !rec.holds(html, data) || !rec.current() {
		t.Fatal("an untouched output was not vouched for")
	}
	if rec.holds(html, append([]byte("x"), data[1:]...)) {
		t.Error("vouched for other bytes")
	}
	// a write of the same size changes the ctime
	edited := append([]byte{}, data...)
	i := strings.Index(string(edited), "Draft.")
	copy(edited[i:], "DRAFT.")
	writeFile(t, html, string(edited))
	if rec.holds(html, data) || rec.current() {
		t.Error("an output written over with the same size was vouched for")
	}
	// a copy of the right bytes put in its place: not the recorded file,
	// but equal by content
	writeFile(t, html+".new", string(data))
	os.Rename(html+".new", html)
	if rec.holds(html, data) {
		t.Error("a different file (inode) was vouched for")
	}
	if !rec.current() {
		t.Error("equal content was not recognised")
	}
}

// BenchmarkRecordCheck: the whole of a demo rebuild in which nothing
// changed, in process — reading the build record, hashing the inputs and
// vouching for the outputs (go test -run '^$' -bench RecordCheck
// ./cmd/galley/).
func BenchmarkRecordCheck(b *testing.B) {
	dir := b.TempDir()
	if err := copyDemo(dir); err != nil {
		b.Fatal(err)
	}
	p := filepath.Join(dir, "paper.md")
	if code := run([]string{"build", p}); code != 0 {
		b.Fatalf("build: exit %d", code)
	}
	time.Sleep(3 * time.Duration(racyWindow)) // past the racy window
	if code := run([]string{"build", p}); code != 0 {
		b.Fatalf("build: exit %d", code)
	}
	cmd := &buildCmd{Manuscript: p, To: []string{"html"}}
	cache := cacheFor(p, false)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if rec := cmd.recordFor(cache); rec == nil || !rec.current() {
			b.Fatal("the record does not vouch for an unchanged build")
		}
	}
}
