package engine

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
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
		front + "\n" + fence("descriptives", "series: [north, dlog(fuel)]\nsample: 2004-02..\n") + "$\\alpha_1$ and $$x^2$$\n",
		"---\ntitle: [unclosed\n---\n",
		"```galley\n```\n",
		"{{}} {{a.}} {{.b}} {{x.y %q}}",
		front + fence("unitroot-table", "series: [north]\ntests: [adf, kpss]\n"),
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		doc, err := ParseBytes(path, []byte(src), Options{})
		if err == nil {
			err = doc.Run()
			if err == nil {
				if _, err := doc.HTML(HTMLOptions{}); err != nil {
					t.Fatalf("HTML after a good run: %v", err)
				}
				if _, err := doc.LaTeX(LaTeXOptions{}); err != nil {
					t.Fatalf("LaTeX after a good run: %v", err)
				}
				if _, err := doc.Markdown(MarkdownOptions{}); err != nil {
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

// FuzzInlineRef: parsing and resolving any inline reference never panics.
func FuzzInlineRef(f *testing.F) {
	for _, s := range []string{"m.r2", "m.coef.x.est %.3f", "a.crit.5%", "m.coef.0.p %d", "m", "m..x", "m.r2 %s %d"} {
		f.Add(s)
	}
	vals := map[string]any{
		"r2":   0.5,
		"nobs": 10,
		"coef": []map[string]any{{"term": "x", "est": 1.5, "p": 0.01}},
		"crit": map[string]any{"5%": -2.9},
		"list": []float64{1, 2},
		"name": "text",
	}
	f.Fuzz(func(t *testing.T, s string) {
		r, err := parseRef(s)
		if err != nil {
			return
		}
		v, err := lookup(vals, r.path)
		if err != nil {
			return
		}
		formatValue(v, r.verb, 3)
	})
}
