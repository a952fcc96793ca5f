package kinds

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"slices"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/resultsfile"
	"github.com/galley-econ/galley/revision"
	"github.com/galley-econ/galley/write/html"
)

// copyDemo copies the demo paper and its data into a temporary folder.
func copyDemo(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	src := filepath.Join("..", "examples", "gridlink")
	data, _ := filepath.Glob(filepath.Join(src, "data", "*.csv"))
	files := []string{"paper.md", "references.bib"}
	for _, p := range data {
		files = append(files, filepath.Join("data", filepath.Base(p)))
	}
	for _, f := range files {
		b, err := os.ReadFile(filepath.Join(src, f))
		if err != nil {
			t.Fatal(err)
		}
		p := filepath.Join(dir, f)
		os.MkdirAll(filepath.Dir(p), 0o755)
		if err := os.WriteFile(p, b, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return filepath.Join(dir, "paper.md")
}

func runCached(t *testing.T, path string, c *engine.Cache) (*engine.Document, []byte) {
	t.Helper()
	doc, err := engine.Parse(path, engine.Options{Cache: c})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	b, err := doc.ResultsJSON("test")
	if err != nil {
		t.Fatal(err)
	}
	return doc, b
}

// TestCacheReuse: a second build reuses every result and gives a
// byte-identical results file; a fresh build reruns everything.
func TestCacheReuse(t *testing.T) {
	t.Parallel()
	p := copyDemo(t)
	c := &engine.Cache{Dir: filepath.Join(filepath.Dir(p), ".cache"), Version: "test"}
	d1, r1 := runCached(t, p, c)
	if len(d1.Reused()) != 0 {
		t.Fatalf("cold build reused %v", d1.Reused())
	}
	d2, r2 := runCached(t, p, c)
	if len(d2.Ran()) != 0 || len(d2.Reused()) != d2.Directives() {
		t.Fatalf("warm build ran %v", d2.Ran())
	}
	if !bytes.Equal(r1, r2) {
		t.Fatal("results from the cache differ from the fresh results")
	}
	h1, _ := html.Write(d1, html.Options{})
	h2, _ := html.Write(d2, html.Options{})
	if !bytes.Equal(h1, h2) {
		t.Fatal("HTML from cached results differs")
	}
	d3, _ := runCached(t, p, &engine.Cache{Dir: c.Dir, Version: "test", Fresh: true})
	if len(d3.Reused()) != 0 {
		t.Fatalf("--fresh reused %v", d3.Reused())
	}
	// Another version's entries are foreign: nothing is reused.
	d4, _ := runCached(t, p, &engine.Cache{Dir: c.Dir, Version: "other"})
	if len(d4.Reused()) != 0 {
		t.Fatalf("a foreign version's cache was trusted: %v", d4.Reused())
	}
}

// TestCacheCorruptEntry: a damaged entry is ignored and rebuilt.
func TestCacheCorruptEntry(t *testing.T) {
	t.Parallel()
	p := copyDemo(t)
	c := &engine.Cache{Dir: filepath.Join(filepath.Dir(p), ".cache"), Version: "test"}
	_, want := runCached(t, p, c)
	n := 0
	filepath.Walk(c.Dir, func(path string, info os.FileInfo, err error) error {
		if err == nil && !info.IsDir() {
			b, _ := os.ReadFile(path)
			os.WriteFile(path, b[:len(b)/2], 0o644) // truncate
			n++
		}
		return nil
	})
	if n == 0 {
		t.Fatal("no cache entries written")
	}
	d, got := runCached(t, p, c)
	if len(d.Reused()) != 0 {
		t.Fatalf("corrupt entries were trusted: %v", d.Reused())
	}
	if !bytes.Equal(want, got) {
		t.Fatal("rebuilt results differ")
	}
}

// TestRevisionOfOneValue: the demo is built, one South price is mistyped
// a million times too large (a decimal point lost), and the demo rebuilt. Exactly the results that
// read South rerun; the comparison reports moved numbers and the flip the
// change was designed to cause: a spike that reverts at once makes the
// level of log(south) look mean-reverting, so the ADF test in levels now
// rejects a unit root and the order-of-integration verdict is no longer I(1).
func TestRevisionOfOneValue(t *testing.T) {
	t.Parallel()
	p := copyDemo(t)
	dir := filepath.Dir(p)
	c := &engine.Cache{Dir: filepath.Join(dir, ".cache"), Version: "test"}
	d1, r1 := runCached(t, p, c)

	csvPath := filepath.Join(dir, "data", "gridlink.csv")
	raw, _ := os.ReadFile(csvPath)
	lines := strings.Split(string(raw), "\n")
	for i, l := range lines {
		if strings.HasPrefix(l, "2015-06,") {
			f := strings.Split(l, ",")
			v, _ := strconv.ParseFloat(f[2], 64)
			f[2] = strconv.FormatFloat(v*1e6, 'f', -1, 64)
			lines[i] = strings.Join(f, ",")
		}
	}
	os.WriteFile(csvPath, []byte(strings.Join(lines, "\n")), 0o644)

	d2, r2 := runCached(t, p, c)
	want := dependents(d1, "south")
	got := d2.Ran()
	sort.Strings(want)
	sort.Strings(got)
	if !slices.Equal(got, want) {
		t.Fatalf("reran %v, want exactly %v", got, want)
	}
	if len(d2.Reused()) == 0 {
		t.Fatal("nothing was reused")
	}

	old, new := loadResults(t, r1, "old"), loadResults(t, r2, "new")
	rep := revision.Compare(old, new, revision.Options{})
	if len(rep.InputsChanged) != 1 {
		t.Errorf("inputs changed: %+v", rep.InputsChanged)
	}
	var flips []string
	movedOI := false
	for _, it := range rep.Items {
		for _, f := range it.Flips {
			flips = append(flips, it.ID+": "+f.What+": "+f.Old+" -> "+f.New)
		}
		if it.ID == "oi" && len(it.Moved) > 0 {
			movedOI = true
		}
	}
	if !movedOI {
		t.Error("no moved numbers reported for the unit-root table")
	}
	wantFlips := []string{
		"oi: series log(south) levels adf: rejects its null at 5%: no -> yes",
		"oi: series log(south) order: I(1) -> unclear",
	}
	for _, w := range wantFlips {
		if !slices.Contains(flips, w) {
			t.Errorf("flip %q not reported; flips: %q", w, flips)
		}
	}
	if !rep.HasFlips() {
		t.Error("HasFlips is false")
	}
}

// dependents lists the blocks whose spec mentions word, those that refer
// to them through from:, models: or residuals:, transitively, and the
// revision reports, which read every other result.
func dependents(d *engine.Document, word string) []string {
	in := map[string]bool{}
	for _, r := range d.Results() {
		if r.Kind == "revision" {
			in[r.ID] = true
		}
	}
	for changed := true; changed; {
		changed = false
		for _, r := range d.Results() {
			if in[r.ID] {
				continue
			}
			spec, _ := json.Marshal(r.Spec)
			hit := strings.Contains(string(spec), word)
			for id := range in {
				if strings.Contains(string(spec), `"`+id+`"`) {
					hit = true
				}
			}
			if hit {
				in[r.ID], changed = true, true
			}
		}
	}
	var out []string
	for id := range in {
		out = append(out, id)
	}
	return out
}

func loadResults(t *testing.T, b []byte, name string) *resultsfile.File {
	t.Helper()
	p := filepath.Join(t.TempDir(), name+".results.json")
	os.WriteFile(p, b, 0o644)
	f, err := resultsfile.Load(p)
	if err != nil {
		t.Fatal(err)
	}
	return f
}

// TestRevisionRerunsWhenDirectivesChange: a revision report compares the
// whole build, so adding a directive makes it run again even though its
// own spec and the results it read before are unchanged.
func TestRevisionRerunsWhenDirectivesChange(t *testing.T) {
	t.Parallel()
	p := copyDemo(t)
	c := &engine.Cache{Dir: filepath.Join(filepath.Dir(p), ".cache"), Version: "test"}
	runCached(t, p, c)
	src, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	added := append(src, []byte("\n"+fence("adf", "id: added_late\ndata: grid\nseries: log(north)\n"))...)
	if err := os.WriteFile(p, added, 0o644); err != nil {
		t.Fatal(err)
	}
	d, _ := runCached(t, p, c)
	if !slices.Contains(d.Ran(), "rev") {
		t.Errorf("the revision report was reused after a directive was added (ran %v)", d.Ran())
	}
	if slices.Contains(d.Ran(), "static") {
		t.Errorf("an unrelated result ran again (ran %v)", d.Ran())
	}
}
