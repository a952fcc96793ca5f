package main

import (
	"bytes"
	"fmt"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"sync"
	"testing"
	"time"
)

// need returns the path of a program the test needs; in CI its absence is
// a failure (.ci/run installs it), elsewhere the test is skipped.
func need(t *testing.T, prog string) string {
	t.Helper()
	p, err := exec.LookPath(prog)
	if err != nil {
		if os.Getenv("CI") != "" {
			t.Fatalf("%s is not installed; .ci/run must install it", prog)
		}
		t.Skipf("%s is not installed", prog)
	}
	return p
}

func buildDemoTo(t *testing.T, format string) string {
	t.Helper()
	dir := demoCopy(t)
	out := filepath.Join(dir, "out")
	if code := run([]string{"build", filepath.Join(dir, "paper.md"), "--to", format, "--out", out, "--no-cache"}); code != 0 {
		t.Fatalf("build: exit %d", code)
	}
	return out
}

// The demo built once to HTML, LaTeX and Markdown for the checks that
// only read it and add files of their own names beside it; TestMain
// removes it.
var (
	sharedOnce sync.Once
	sharedDir  string
	sharedErr  error
)

func sharedDemo(t *testing.T) string {
	t.Helper()
	sharedOnce.Do(func() {
		if sharedDir, sharedErr = os.MkdirTemp("", "galley-demo-"); sharedErr != nil {
			return
		}
		if sharedErr = copyDemo(filepath.Join(sharedDir, "src")); sharedErr != nil {
			return
		}
		if code := run([]string{"build", filepath.Join(sharedDir, "src", "paper.md"), "--to", "html", "--to", "latex", "--to", "markdown", "--out", filepath.Join(sharedDir, "out"), "--no-cache"}); code != 0 {
			sharedErr = fmt.Errorf("build: exit %d", code)
		}
	})
	if sharedErr != nil {
		t.Fatal(sharedErr)
	}
	return filepath.Join(sharedDir, "out")
}

var texErrorLine = regexp.MustCompile(`(?m)^! .*$`)

// pdflatex compiles file in dir twice (for cross-references) and fails
// the test with the log's first error.
func pdflatex(t *testing.T, dir, file string) {
	t.Helper()
	bin := need(t, "pdflatex")
	for pass := 0; pass < 2; pass++ {
		cmd := exec.Command(bin, "-interaction=nonstopmode", "-halt-on-error", file)
		cmd.Dir = dir
		out, err := cmd.CombinedOutput()
		if err != nil {
			first := texErrorLine.Find(out)
			i := bytes.Index(out, first)
			ctx := out[i:min(len(out), i+400)]
			t.Fatalf("pdflatex %s failed: %s\n%s", file, first, ctx)
		}
	}
}

// inkFraction is the share of pixels darker than light grey in a PNG.
func inkFraction(t *testing.T, path string) float64 {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	b := img.Bounds()
	dark, all := 0, 0
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			if (r+g+bl)/3 < 0xC000 {
				dark++
			}
			all++
		}
	}
	return float64(dark) / float64(all)
}

// firstPageInked renders page 1 of dir/pdf with pdftoppm and fails the
// test if it is blank.
func firstPageInked(t *testing.T, dir, pdf string) {
	t.Helper()
	cmd := exec.Command(need(t, "pdftoppm"), "-png", "-r", "40", "-f", "1", "-l", "1", pdf, "page")
	cmd.Dir = dir
	if b, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("pdftoppm: %v\n%s", err, b)
	}
	pages, _ := filepath.Glob(filepath.Join(dir, "page*.png"))
	if len(pages) != 1 {
		t.Fatalf("pdftoppm pages: %v", pages)
	}
	if ink := inkFraction(t, pages[0]); ink < 0.005 {
		t.Fatalf("page 1 is blank (ink %.4f)", ink)
	}
}

// TestTableFragmentCompiles: a standalone table fragment can be \input
// into a minimal article with the packages its header names (longtable
// and pdflscape included, for the long and the wide).
func TestTableFragmentCompiles(t *testing.T) {
	t.Parallel() // external programs; run alongside the other toolchain checks
	out := sharedDemo(t)
	frags, _ := filepath.Glob(filepath.Join(out, "tables", "*.tex"))
	if len(frags) == 0 {
		t.Fatal("no table fragments written")
	}
	var inputs strings.Builder
	for _, f := range frags {
		inputs.WriteString("\\input{tables/" + filepath.Base(f) + "}\n")
	}
	doc := "\\documentclass{article}\n\\usepackage{booktabs,dcolumn,graphicx,amsmath,longtable,caption,pdflscape}\n\\newcolumntype{d}{D{.}{.}{-1}}\n\\begin{document}\n" + inputs.String() + "\\end{document}\n"
	if err := os.WriteFile(filepath.Join(out, "host.tex"), []byte(doc), 0o644); err != nil {
		t.Fatal(err)
	}
	pdflatex(t, out, "host.tex")
}

// TestHTMLInChromium: the demo HTML opens in headless Chromium, the page
// fetches nothing (its resource-timing list, read back from the DOM, is
// empty, and no src, href or url() in it points anywhere), every table
// and figure is in the DOM, every display equation has a laid-out box
// (checkEquationBoxes), and the screenshot is not blank.
func TestHTMLInChromium(t *testing.T) {
	t.Parallel() // external programs; run alongside the other toolchain checks
	bin := need(t, "chromium")
	out := sharedDemo(t)
	page := filepath.Join(out, "paper.html")
	html, err := os.ReadFile(page)
	if err != nil {
		t.Fatal(err)
	}
	if m := externalRef.FindAll(html, -1); len(m) > 0 {
		t.Fatalf("the page refers to outside resources: %q", m)
	}
	// A copy of the page that records what it fetched into the DOM.
	probe := filepath.Join(out, "probe.html")
	rec := `<script>window.addEventListener("load",function(){var r=performance.getEntriesByType("resource").map(function(e){return e.name});document.body.setAttribute("data-fetched",String(r.length));document.body.setAttribute("data-urls",r.join(" "));var q=[];document.querySelectorAll(".equation math").forEach(function(m){var b=m.getBoundingClientRect();q.push(Math.round(b.width)+"x"+Math.round(b.height))});document.body.setAttribute("data-eq",q.join(" "))})</script></body>`
	os.WriteFile(probe, bytes.Replace(html, []byte("</body>"), []byte(rec), 1), 0o644)

	chrome := func(target string, extra ...string) []byte {
		args := append([]string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
			"--disable-component-update", "--disable-sync", "--no-first-run", "--disable-quic",
			"--disable-features=NetworkTimeServiceQuerying,OptimizationHints,MediaRouter",
			"--user-data-dir=" + t.TempDir(), "--window-size=1100,2200", "--virtual-time-budget=3000"}, extra...)
		args = append(args, "file://"+target)
		cmd := exec.Command(bin, args...)
		done := make(chan struct{})
		var b []byte
		var err error
		go func() { b, err = cmd.Output(); close(done) }()
		select {
		case <-done:
		case <-time.After(90 * time.Second):
			cmd.Process.Kill()
			t.Fatal("chromium did not finish")
		}
		if err != nil {
			t.Fatalf("chromium: %v", err)
		}
		return b
	}
	// One launch both dumps the DOM and takes the screenshot (of the
	// probe, which looks the same as the page).
	shot := filepath.Join(out, "shot.png")
	dom := string(chrome(probe, "--dump-dom", "--screenshot="+shot))
	if !strings.Contains(dom, `data-fetched="0"`) {
		i := strings.Index(dom, "data-fetched")
		t.Fatalf("the page fetched resources: %s", dom[max(i, 0):min(len(dom), max(i, 0)+300)])
	}
	wantTables := strings.Count(string(html), `<div class="result table"`)
	wantFigures := strings.Count(string(html), `<figure class="result"`)
	if wantTables == 0 {
		t.Fatal("the demo HTML has no tables")
	}
	if got := strings.Count(dom, `class="result table"`); got != wantTables {
		t.Errorf("tables in the DOM: %d, want %d", got, wantTables)
	}
	if got := strings.Count(dom, `<figure class="result"`); got != wantFigures {
		t.Errorf("figures in the DOM: %d, want %d", got, wantFigures)
	}
	checkEquationBoxes(t, string(html), dom)
	if ink := inkFraction(t, shot); ink < 0.002 {
		t.Errorf("screenshot is blank (ink %.4f)", ink)
	}
}

// externalRef finds attributes and CSS that would fetch from elsewhere.
var externalRef = regexp.MustCompile(`(?i)(src|href)\s*=\s*"(https?:|//)[^"]*"|url\(\s*['"]?(https?:|//)[^)]*\)|@import`)
