package kinds

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/write/html"
	"github.com/galley-econ/galley/write/latex"
	"github.com/galley-econ/galley/write/markdown"
)

// FuzzManuscript: any manuscript text, with a small data file beside it,
// parses, checks and runs to a result or an error — never a panic — and
// every error names the manuscript or the data file.
func FuzzManuscript(f *testing.F) {
	dir := f.TempDir()
	os.WriteFile(filepath.Join(dir, "data.csv"), []byte(testCSV), 0o644)
	path := filepath.Join(dir, "paper.md")
	for _, s := range []string{
		front + "\n" + fence("ols", "id: m\ndata: grid\ny: north\nx: [fuel]\nse: hac(2)\n") + "\nR² is {{m.r2 %.2f}}; {{m.label}}.\n",
		front + "\n" + fence("adf", "id: a\nseries: log(north)\nlags: {select: aic, max: 2}\n"),
		front + "\n" + fence("summary-stats", "series: [north, dlog(fuel)]\nsample: 2004-02..\n") + "$\\alpha_1$ and $$x^2$$\n",
		"---\ntitle: [unclosed\n---\n",
		"```galley\n```\n",
		"{{}} {{a.}} {{.b}} {{x.y %q}}",
		front + fence("unitroot-table", "series: [north]\ntests: [adf, kpss]\n"),
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		doc, err := engine.ParseBytes(path, []byte(src), engine.Options{})
		if err == nil {
			err = doc.Run()
			if err == nil {
				if _, err := html.Write(doc, html.Options{}); err != nil {
					t.Fatalf("HTML after a good run: %v", err)
				}
				if _, err := latex.Write(doc, latex.Options{}); err != nil {
					t.Fatalf("LaTeX after a good run: %v", err)
				}
				if _, err := markdown.Write(doc, markdown.Options{}); err != nil {
					t.Fatalf("Markdown after a good run: %v", err)
				}
				return
			}
		}
		for _, line := range strings.Split(err.Error(), "\n") {
			if !strings.Contains(line, "paper.md") && !strings.Contains(line, "data.csv") {
				t.Fatalf("an error line names no file: %q", line)
			}
		}
	})
}
