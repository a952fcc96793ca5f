package main

import (
	"bytes"
	"html"
	"os"
	"strconv"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/write/latex"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// TestDemoPDF: --to pdf builds the demo paper; its text (pdftotext)
// shows numbered equations, author-year citations, the reference list,
// appendix tables, footnote text and no TeX or Markdown leaking through;
// and each table or figure is set at most two pages after its first
// reference and never after the start of the next section (the page
// breaks are pdftotext's form feeds). pdflatex
// compiles the LaTeX galley writes (--to pdf runs it on paper.tex and its
// figures in a temporary folder) and the first page is not blank.
func TestDemoPDF(t *testing.T) {
	t.Parallel() // external programs; run alongside the other toolchain checks
	need(t, "pdflatex")
	out := buildDemoTo(t, "pdf")
	firstPageInked(t, out, "paper.pdf")
	// pdfTeX was given a fixed date, so the file does not change with the
	// time of the build (unless the environment names a SOURCE_DATE_EPOCH).
	if pdf, _ := os.ReadFile(filepath.Join(out, "paper.pdf")); os.Getenv("SOURCE_DATE_EPOCH") == "" && !bytes.Contains(pdf, []byte("/CreationDate (D:20000101000000Z)")) {
		t.Error("the PDF carries the time of the build")
	}
	cmd := exec.Command(need(t, "pdftotext"), "-layout", "paper.pdf", "paper.txt")
	cmd.Dir = out
	if b, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("pdftotext: %v\n%s", err, b)
	}
	raw, err := os.ReadFile(filepath.Join(out, "paper.txt"))
	if err != nil {
		t.Fatal(err)
	}
	text := string(raw)
	flat := strings.Join(strings.Fields(text), " ")
	for _, want := range []string{"(1)", "(2)", "(3)", "(Engle and Granger, 1987)", "Dickey and Fuller (1979)",
		"References", "Engle, Robert F. and C. W. J. Granger (1987). Co-Integration and Error Correction",
		"MacKinnon, James G. (2010)", "Table A.1", "Table A.2", "A Robustness", "B The data revision",
		"Because the data are simulated with known parameters", "JEL classification: C22, C32, Q41",
		"Department of Economics, University of Nowhere"} {
		if !strings.Contains(flat, want) {
			t.Errorf("the PDF's text lacks %q", want)
		}
	}
	for _, bad := range []string{`\textbackslash`, "$$", "[@", "[^", `\cite`, "et~al", "??"} {
		if strings.Contains(text, bad) {
			t.Errorf("the PDF's text contains %q", bad)
		}
	}
	// The text as one stream of words, with the page of every offset.
	var flatText strings.Builder
	var pageAt []int // pageAt[i]: the page of the i-th page's start offset
	for i, p := range strings.Split(text, "\f") {
		pageAt = append(pageAt, flatText.Len())
		_ = i
		flatText.WriteString(strings.Join(strings.Fields(p), " ") + " ")
	}
	stream := flatText.String()
	pageOf := func(off int) int {
		pg := 0
		for i, start := range pageAt {
			if start <= off {
				pg = i
			}
		}
		return pg
	}
	first, placed := map[string]int{}, map[string]int{}
	ref := regexp.MustCompile(`(Table|Figure) ([0-9]+|[A-Z]\.[0-9]+)(:?)`)
	for _, m := range ref.FindAllStringSubmatchIndex(stream, -1) {
		key := stream[m[2]:m[3]] + " " + stream[m[4]:m[5]]
		if m[7] > m[6] {
			if _, ok := placed[key]; !ok {
				placed[key] = m[0]
			}
		} else if _, ok := first[key]; !ok {
			first[key] = m[0]
		}
	}
	if len(placed) < 20 {
		t.Fatalf("found %d captions in the PDF text, expected every table and figure", len(placed))
	}
	heads := sectionStarts(t, stream)
	for key, at := range placed {
		r, ok := first[key]
		if !ok {
			continue
		}
		if d := pageOf(at) - pageOf(r); d > 2 {
			t.Errorf("%s is set on page %d, %d pages after its first reference (page %d)", key, pageOf(at)+1, d, pageOf(r)+1)
		}
		for _, h := range heads {
			if h.at > r && at > h.at && pageOf(at) != pageOf(h.at) {
				t.Errorf("%s, first referred to on page %d, is set on page %d, after section %q starts (page %d)", key, pageOf(r)+1, pageOf(at)+1, h.title, pageOf(h.at)+1)
				break
			}
		}
	}
}

type sectionStart struct {
	title string
	at    int // offset in the PDF's text stream
}

// sectionStarts finds the demo's top-level section headings in the PDF's
// text stream, in order, as galley numbers them (1, 2, … in the body; A,
// B, … after \appendix).
func sectionStarts(t *testing.T, stream string) []sectionStart {
	t.Helper()
	src, err := os.ReadFile(filepath.Join("..", "..", "examples", "gridlink", "paper.md"))
	if err != nil {
		t.Fatal(err)
	}
	var out []sectionStart
	n, apx, from := 0, false, 0
	for _, line := range strings.Split(string(src), "\n") {
		if strings.TrimSpace(line) == `\appendix` {
			apx, n = true, 0
			continue
		}
		title, ok := strings.CutPrefix(line, "## ")
		if !ok {
			continue
		}
		title = strings.TrimSpace(regexp.MustCompile(`\{#[^}]*\}`).ReplaceAllString(title, ""))
		n++
		num := strconv.Itoa(n)
		if apx {
			num = string(rune('A' + n - 1))
		}
		words := strings.Fields(title) // a long heading may break, hyphenated, across lines
		i := strings.Index(stream[from:], num+" "+strings.Join(words[:min(3, len(words))], " "))
		if i < 0 {
			t.Fatalf("section %q (%s) not found in the PDF's text", title, num)
		}
		from += i
		out = append(out, sectionStart{title: title, at: from})
	}
	if len(out) < 8 {
		t.Fatalf("found %d sections in the demo", len(out))
	}
	return out
}

// checkEquationBoxes: every display equation of the page has a laid-out
// box of non-zero width and height in headless Chromium (MathML rendered
// natively), as recorded in the DOM by TestHTMLInChromium's probe.
func checkEquationBoxes(t *testing.T, page, dom string) {
	t.Helper()
	want := strings.Count(page, `<div class="equation"`)
	if want < 3 {
		t.Fatalf("the demo has %d display equations", want)
	}
	m := regexp.MustCompile(`data-eq="([^"]*)"`).FindStringSubmatch(dom)
	if m == nil {
		t.Fatal("the equation probe did not run")
	}
	boxes := strings.Fields(m[1])
	if len(boxes) != want {
		t.Fatalf("%d equation boxes laid out, want %d", len(boxes), want)
	}
	for i, b := range boxes {
		if strings.HasPrefix(b, "0x") || strings.HasSuffix(b, "x0") {
			t.Errorf("display equation %d has an empty box (%s)", i+1, b)
		}
	}
}

// TestPDFErrors: a LaTeX error is reported at the manuscript line that
// produced it; without pdflatex, --to pdf is a clear error.
func TestPDFErrors(t *testing.T) {
	need(t, "pdflatex")
	dir := t.TempDir()
	p := filepath.Join(dir, "paper.md")
	os.WriteFile(p, []byte("---\ntitle: T\n---\n\n## One\n\nFine text.\n\nBad math $\\nosuchcommand x$ here.\n"), 0o644)
	doc, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	tex, err := latex.Write(doc, latex.Options{})
	if err != nil {
		t.Fatal(err)
	}
	_, err = compilePDF(doc, tex)
	if err == nil || !strings.Contains(err.Error(), "paper.md:9: LaTeX error") || !strings.Contains(err.Error(), "Undefined control sequence") {
		t.Fatalf("error %v, want one at paper.md:9", err)
	}
	t.Setenv("PATH", t.TempDir())
	if _, err := compilePDF(doc, tex); err == nil || !strings.Contains(err.Error(), "needs pdflatex on the PATH") {
		t.Fatalf("without pdflatex: %v", err)
	}
}

var (
	htmlTable = regexp.MustCompile(`(?s)<table.*?</table>`)
	htmlRow   = regexp.MustCompile(`(?s)<tr.*?</tr>`)
	htmlCell  = regexp.MustCompile(`(?s)<t[hd][^>]*>(.*?)</t[hd]>`)
	htmlTag   = regexp.MustCompile(`<[^>]+>`)
	spaces    = regexp.MustCompile(`\s+`)
)

// TestHTMLPrintKeepsColumns: the demo's HTML printed to PDF by headless
// Chromium (its print stylesheet, US Letter) keeps every table column on
// the page: the text of the last cell of every row of every table is in
// the printed text as often as the tables hold it (a cut-off column
// loses it; a table forced wider than the page fails this check), and no
// word of the print lies beyond the page's right edge.
func TestHTMLPrintKeepsColumns(t *testing.T) {
	t.Parallel() // external programs; run alongside the other toolchain checks
	bin := need(t, "chromium")
	out := sharedDemo(t)
	page, err := os.ReadFile(filepath.Join(out, "paper.html"))
	if err != nil {
		t.Fatal(err)
	}
	pdf := filepath.Join(out, "print.pdf")
	cmd := exec.Command(bin, "--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
		"--disable-component-update", "--disable-sync", "--no-first-run", "--user-data-dir="+t.TempDir(),
		"--no-pdf-header-footer", "--print-to-pdf="+pdf, "file://"+filepath.Join(out, "paper.html"))
	if b, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("chromium print: %v\n%s", err, b)
	}
	text, err := exec.Command(need(t, "pdftotext"), pdf, "-").Output()
	if err != nil {
		t.Fatalf("pdftotext: %v", err)
	}
	printed := spaces.ReplaceAllString(string(text), "")
	want := map[string]int{}
	for _, tab := range htmlTable.FindAllString(string(page), -1) {
		for _, row := range htmlRow.FindAllString(tab, -1) {
			cells := htmlCell.FindAllStringSubmatch(row, -1)
			if len(cells) == 0 {
				continue
			}
			if s := spaces.ReplaceAllString(html.UnescapeString(htmlTag.ReplaceAllString(cells[len(cells)-1][1], "")), ""); s != "" {
				want[s]++
			}
		}
	}
	if len(want) < 50 {
		t.Fatalf("found %d distinct last-column cells in the HTML's tables", len(want))
	}
	for s, n := range want {
		if got := strings.Count(printed, s); got < n {
			t.Errorf("last-column text %q: %d times in the tables, %d in the printed page", s, n, got)
		}
	}
	bbox, err := exec.Command(need(t, "pdftotext"), "-bbox", pdf, "-").Output()
	if err != nil {
		t.Fatalf("pdftotext -bbox: %v", err)
	}
	pageW := regexp.MustCompile(`<page width="([0-9.]+)"`).FindSubmatch(bbox)
	if pageW == nil {
		t.Fatal("no page size in pdftotext -bbox output")
	}
	w, _ := strconv.ParseFloat(string(pageW[1]), 64)
	for _, m := range regexp.MustCompile(`xMax="([0-9.]+)"[^>]*>([^<]*)<`).FindAllSubmatch(bbox, -1) {
		if x, _ := strconv.ParseFloat(string(m[1]), 64); x > w {
			t.Errorf("printed word %q ends at x = %.0f, beyond the page width %.0f", m[2], x, w)
		}
	}
}
