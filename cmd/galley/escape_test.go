package main

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestEscaping: series names and labels that mean something to HTML or
// LaTeX are shown literally in every format, and the LaTeX still compiles.
func TestEscaping(t *testing.T) {
	names := []string{"<script>", "a_b%c&d#e$f", `\input{x}`, "}", "&amp;&lt;"}
	dir := t.TempDir()
	var csv strings.Builder
	csv.WriteString("date")
	for _, n := range names {
		csv.WriteString("," + n)
	}
	csv.WriteString("\n")
	for i := 0; i < 40; i++ {
		fmt.Fprintf(&csv, "%d-%02d", 2000+i/12, i%12+1)
		for j := range names {
			fmt.Fprintf(&csv, ",%.4f", 10+float64(j)+0.1*float64(i%7)+0.01*float64(i*(j+1)%5))
		}
		csv.WriteString("\n")
	}
	os.WriteFile(filepath.Join(dir, "data.csv"), []byte(csv.String()), 0o644)
	q := func(s string) string { return "\"`" + strings.ReplaceAll(s, `\`, `\\`) + "`\"" }
	doc := "---\ntitle: \"Odd <b>names</b> & 100% {braces}\"\ndata:\n  d: data.csv\n---\n\n" +
		"```galley summary-stats\nid: desc\ndata: d\nseries: [" + q(names[0]) + ", " + q(names[1]) + ", " + q(names[2]) + ", " + q(names[3]) + ", " + q(names[4]) + "]\ncaption: \"Caption with <i>tags</i>, $dollars$, _under_ & \\\\input{x}\"\n```\n\n" +
		"```galley ols\nid: m\ndata: d\ny: " + q(names[0]) + "\nx: [" + q(names[1]) + "]\n```\n\nThe name is {{desc.series.0.name}}.\n"
	paper := filepath.Join(dir, "paper.md")
	os.WriteFile(paper, []byte(doc), 0o644)
	out := filepath.Join(dir, "out")
	msg := captureStderr(t, func() {
		if code := run([]string{"build", paper, "--to", "html", "--to", "latex", "--to", "markdown", "--out", out, "--no-cache"}); code != 0 {
			t.Errorf("build: exit %d", code)
		}
	})
	if t.Failed() {
		t.Fatal(msg)
	}
	html, _ := os.ReadFile(filepath.Join(out, "paper.html"))
	for _, bad := range []string{"<script>", "<b>names", "<i>tags"} {
		if strings.Contains(string(html), bad) {
			t.Errorf("HTML contains %q unescaped", bad)
		}
	}
	for _, want := range []string{"&lt;script&gt;", "a_b%c&amp;d#e$f", `\input{x}`, "&lt;b&gt;names&lt;/b&gt;"} {
		if !strings.Contains(string(html), want) {
			t.Errorf("HTML lacks %q", want)
		}
	}
	tex, _ := os.ReadFile(filepath.Join(out, "paper.tex"))
	for _, want := range []string{`\textless{}script\textgreater{}`, `a\_b\%c\&d\#e\$f`, `\textbackslash{}input\{x\}`, `100\% \{braces\}`} {
		if !strings.Contains(string(tex), want) {
			t.Errorf("LaTeX lacks %q", want)
		}
	}
	if strings.Contains(string(tex), `\input{x}`) {
		t.Error(`LaTeX contains an active \input{x}`)
	}
	md, _ := os.ReadFile(filepath.Join(out, "paper.md"))
	if strings.Contains(string(md), "<script>") {
		t.Error("Markdown contains a raw <script>")
	}
	// An entity in a name stays text: "&amp;&lt;" must not render as "&<".
	if !strings.Contains(string(md), `\&amp;\&lt;`) {
		t.Error(`Markdown leaves the entities in "&amp;&lt;" live`)
	}
	if _, err := os.Stat("/usr/bin/pdflatex"); err == nil || os.Getenv("CI") != "" {
		pdflatex(t, out, "paper.tex")
	}
}
