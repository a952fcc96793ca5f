package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func demoCopy(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	if err := copyDemo(dir); err != nil {
		t.Fatal(err)
	}
	return dir
}

// copyDemo copies the demo's manuscript, bibliography and data (not its
// cache or outputs) into dir.
func copyDemo(dir string) error {
	data, _ := filepath.Glob(filepath.Join("..", "..", "examples", "gridlink", "data", "*.csv"))
	files := []string{"paper.md", "references.bib"}
	for _, p := range data {
		files = append(files, filepath.Join("data", filepath.Base(p)))
	}
	for _, f := range files {
		b, err := os.ReadFile(filepath.Join("..", "..", "examples", "gridlink", f))
		if err != nil {
			return err
		}
		p := filepath.Join(dir, f)
		os.MkdirAll(filepath.Dir(p), 0o755)
		if err := os.WriteFile(p, b, 0o644); err != nil {
			return err
		}
	}
	return nil
}

// TestBuildDemo builds the demo paper in all three formats and checks the
// outputs exist and the results file carries full-precision values.
func TestBuildDemo(t *testing.T) {
	t.Parallel()
	out := sharedDemo(t) // the demo built to HTML, LaTeX and Markdown
	for _, f := range []string{"paper.html", "paper.tex", "paper.md", "paper.results.json", "tables/static.tex"} {
		if _, err := os.Stat(filepath.Join(out, f)); err != nil {
			t.Errorf("missing output %s", f)
		}
	}
	var rf struct {
		Inputs  []struct{ Path, SHA256 string }
		Results []struct {
			ID     string
			Values map[string]any
		}
	}
	b, _ := os.ReadFile(filepath.Join(out, "paper.results.json"))
	if err := json.Unmarshal(b, &rf); err != nil {
		t.Fatal(err)
	}
	if len(rf.Inputs) != 1 || rf.Inputs[0].Path != "data/gridlink.csv" || len(rf.Inputs[0].SHA256) != 64 {
		t.Errorf("inputs = %+v", rf.Inputs)
	}
	for _, r := range rf.Results {
		if r.ID == "static" {
			r2, _ := r.Values["r2"].(float64)
			if s := strings.TrimRight(strings.Split(jsonNum(r2), ".")[1], "0"); len(s) < 10 {
				t.Errorf("r2 %v is not full precision", r2)
			}
		}
	}
	html, _ := os.ReadFile(filepath.Join(out, "paper.html"))
	if strings.Contains(string(html), "http://") || strings.Contains(string(html), "https://") {
		t.Error("the HTML refers to the network")
	}
}

func jsonNum(f float64) string { b, _ := json.Marshal(f); return string(b) + ".0" }

// TestFailedBuildKeepsOutput: a failing build exits 1 and leaves the
// previous good output untouched; usage errors exit 2.
func TestFailedBuildKeepsOutput(t *testing.T) {
	t.Parallel()
	dir := demoCopy(t)
	out := filepath.Join(dir, "out")
	paper := filepath.Join(dir, "paper.md")
	if code := run([]string{"build", paper, "--out", out}); code != 0 {
		t.Fatalf("first build: exit %d", code)
	}
	good, _ := os.ReadFile(filepath.Join(out, "paper.html"))
	src, _ := os.ReadFile(paper)
	bad := strings.Replace(string(src), "y: log(north)", "y: log(nort)", 1)
	os.WriteFile(paper, []byte(bad), 0o644)
	if code := run([]string{"build", paper, "--out", out}); code != 1 {
		t.Fatalf("bad build: exit %d, want 1", code)
	}
	now, _ := os.ReadFile(filepath.Join(out, "paper.html"))
	if string(now) != string(good) {
		t.Fatal("a failed build changed the previous output")
	}
	entries, _ := os.ReadDir(out)
	for _, e := range entries {
		if strings.Contains(e.Name(), ".tmp-") {
			t.Errorf("temporary file left behind: %s", e.Name())
		}
	}
	if code := run([]string{"build"}); code != 2 {
		t.Errorf("missing argument: exit %d, want 2", code)
	}
	if code := run([]string{"build", paper, "--to", "docx"}); code != 2 {
		t.Errorf("bad format: exit %d, want 2", code)
	}
}

func TestCheckAndInspect(t *testing.T) {
	t.Parallel()
	dir := demoCopy(t)
	if code := run([]string{"check", filepath.Join(dir, "paper.md")}); code != 0 {
		t.Fatalf("check: exit %d", code)
	}
	if code := run([]string{"inspect", filepath.Join(dir, "data", "gridlink.csv")}); code != 0 {
		t.Fatalf("inspect: exit %d", code)
	}
}

// TestCompareExitCodes: comparing a build with itself exits 0; after a
// value is mistyped a million times too large, a conclusion flips and
// compare (and build --against) exit 3 and write the report.
func TestCompareExitCodes(t *testing.T) {
	t.Parallel()
	dir := demoCopy(t)
	paper := filepath.Join(dir, "paper.md")
	out2 := filepath.Join(dir, "out2")
	r1 := filepath.Join(sharedDemo(t), "paper.results.json") // the unchanged demo's results
	if code := run([]string{"compare", r1, r1}); code != 0 {
		t.Fatalf("compare with itself: exit %d", code)
	}
	csv := filepath.Join(dir, "data", "gridlink.csv")
	raw, _ := os.ReadFile(csv)
	lines := strings.Split(string(raw), "\n")
	for i, l := range lines {
		if strings.HasPrefix(l, "2015-06,") {
			f := strings.Split(l, ",")
			f[2] = "75563700"
			lines[i] = strings.Join(f, ",")
		}
	}
	os.WriteFile(csv, []byte(strings.Join(lines, "\n")), 0o644)
	if code := run([]string{"build", paper, "--out", out2, "--against", r1}); code != 3 {
		t.Fatalf("build --against: exit %d, want 3", code)
	}
	rep := filepath.Join(dir, "revision.md")
	if code := run([]string{"compare", r1, filepath.Join(out2, "paper.results.json"), "--report", rep}); code != 3 {
		t.Fatalf("compare: exit %d, want 3", code)
	}
	b, err := os.ReadFile(rep)
	if err != nil || !strings.Contains(string(b), "Conclusions that changed") {
		t.Fatalf("report: %v\n%s", err, b)
	}
	if code := run([]string{"compare", r1, filepath.Join(dir, "nope.json")}); code != 1 {
		t.Errorf("missing file: exit %d, want 1", code)
	}
}

// TestPNGFromCache: PNG figures survive the result cache.
func TestPNGFromCache(t *testing.T) {
	t.Parallel()
	dir := demoCopy(t)
	paper := filepath.Join(dir, "paper.md")
	for i := 0; i < 2; i++ {
		out := filepath.Join(dir, "out"+string(rune('a'+i)))
		if code := run([]string{"build", paper, "--png", "90", "--out", out}); code != 0 {
			t.Fatalf("build %d: exit %d", i+1, code)
		}
		pngs, _ := filepath.Glob(filepath.Join(out, "figures", "*.png"))
		if len(pngs) == 0 {
			t.Fatalf("build %d wrote no PNG", i+1)
		}
	}
}

// TestOutputsAllOrNothing: when one output cannot be put in place (the
// LaTeX file's name is taken by a folder), the build fails, names it, and
// the other outputs of the earlier build stay as they were.
func TestOutputsAllOrNothing(t *testing.T) {
	dir := demoCopy(t)
	out := filepath.Join(dir, "out")
	paper := filepath.Join(dir, "paper.md")
	if code := run([]string{"build", paper, "--to", "html", "--to", "markdown", "--out", out}); code != 0 {
		t.Fatalf("first build: exit %d", code)
	}
	html, _ := os.ReadFile(filepath.Join(out, "paper.html"))
	md, _ := os.ReadFile(filepath.Join(out, "paper.md"))
	os.MkdirAll(filepath.Join(out, "paper.tex", "x"), 0o755)
	src, _ := os.ReadFile(paper)
	os.WriteFile(paper, append(src, []byte("\nA new closing sentence.\n")...), 0o644)
	var code int
	msg := captureStderr(t, func() {
		code = run([]string{"build", paper, "--to", "html", "--to", "latex", "--to", "markdown", "--out", out})
	})
	if code != 1 || !strings.Contains(msg, "paper.tex") {
		t.Fatalf("exit %d, message %q", code, msg)
	}
	if now, _ := os.ReadFile(filepath.Join(out, "paper.html")); string(now) != string(html) {
		t.Error("paper.html was replaced by a build that failed")
	}
	if now, _ := os.ReadFile(filepath.Join(out, "paper.md")); string(now) != string(md) {
		t.Error("paper.md was replaced by a build that failed")
	}
}
