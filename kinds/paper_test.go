package kinds

import (
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/write/html"
	"github.com/galley-econ/galley/write/latex"
	"github.com/galley-econ/galley/write/markdown"
)

// renderAll builds a manuscript and renders it in the three formats.
func renderAll(t *testing.T, path string) (doc *engine.Document, h, tex, md string) {
	t.Helper()
	doc, err := engine.Parse(path, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	hb, err := html.Write(doc, html.Options{})
	if err != nil {
		t.Fatal(err)
	}
	tb, err := latex.Write(doc, latex.Options{})
	if err != nil {
		t.Fatal(err)
	}
	mb, err := markdown.Write(doc, markdown.Options{})
	if err != nil {
		t.Fatal(err)
	}
	return doc, string(hb), string(tb), string(mb)
}

func wantIn(t *testing.T, what, text string, wants ...string) {
	t.Helper()
	for _, w := range wants {
		if !strings.Contains(text, w) {
			t.Errorf("%s lacks %q", what, w)
		}
	}
}

func wantNotIn(t *testing.T, what, text string, bad ...string) {
	t.Helper()
	for _, b := range bad {
		if strings.Contains(text, b) {
			t.Errorf("%s contains %q", what, b)
		}
	}
}

const paperBody = `
## 1. Introduction {#intro}

The model is
$$
\Delta p_t = \alpha (p_{t-1} - \beta f_{t-1}) + \varepsilon_t \label{ecm}
$$
and $\hat P_u$ has a hat.[^one] {{ecm.label}} is the model; {{results.label}} has
the table, {{apx.label}} more; {{late.label}} is in the appendix, as is {{tab2.label}}.

[^one]: A footnote with $x^2$ in it.

## Results {#results}

$$ y_t = \frac{a}{b} \nonumber $$

` + "```galley summary-stats\nid: tab1\ndata: grid\nseries: [north]\n```\n" + `

\appendix

## Appendix A: more {#apx}

$$ z_t = \operatorname{var}(x) \label{late} $$

` + "```galley summary-stats\nid: tab2\ndata: grid\nseries: [south]\n```\n" + `
### A.1 Detail

Text.
`

// TestEquationsSectionsAppendix: display equations are numbered 1, 2, …
// and A.1 in the appendix, sections 1, 2 and A (an author's own "1." and
// "Appendix A:" are not repeated), appendix tables A.1, and every format
// refers to them with the same numbers.
func TestEquationsSectionsAppendix(t *testing.T) {
	t.Parallel()
	p := writeProject(t, front+paperBody, map[string]string{"data.csv": testCSV})
	_, h, tex, md := renderAll(t, p)
	wantIn(t, "HTML", h,
		`<h2 id="sec-intro"><span class="secnum">1</span> Introduction</h2>`,
		`<span class="secnum">2</span> Results`, `<span class="secnum">A</span> more`, `<span class="secnum">A.1</span> Detail`,
		`<div class="equation" id="eq-ecm"><math`, `<span class="eqno">(1)</span>`, `<span class="eqno">(A.1)</span>`,
		`<a class="xref" href="#eq-ecm">(1)</a>`, `<a class="xref" href="#sec-results">Section 2</a>`,
		`<a class="xref" href="#sec-apx">Appendix A</a>`, `<a class="xref" href="#eq-late">(A.1)</a>`,
		`<a class="xref" href="#tab-tab2">Table A.1</a>`, `Table 1.</span>`, `Table A.1.</span>`,
		`<mover accent="true">`, `class="footnote-ref"`, `A footnote with <math`)
	wantNotIn(t, "HTML", h, `\appendix`, `1. Introduction`, `Appendix A: more`, `[^one]`, `\label`, `(2)`, "http://www.w3.org/1998/Math")
	wantIn(t, "LaTeX", tex,
		`\section{Introduction}\label{sec:intro}`, `\begin{equation}\label{eq:ecm}`, `\[`,
		`\eqref{eq:ecm}`, `Section~\ref{sec:results}`, `Appendix~\ref{sec:apx}`, `\galleyappendix`,
		`\section{more}\label{sec:apx}`, `\subsection{Detail}`, `Table~\ref{tab:tab2}`,
		`\footnote{A footnote with $x^2$ in it.}`, `$\hat P_u$`)
	wantNotIn(t, "LaTeX", tex, `\$\$`, `\textbackslash`, `[\textasciicircum{}`, `1. Introduction`)
	wantIn(t, "Markdown", md, "## 1 Introduction", "## A more", "### A.1 Detail", `\tag{1}`, `\tag{A.1}`,
		"(1) is the model", "Section 2", "Appendix A", "Table A.1", "[^one]: A footnote", "$\\hat P_u$")
	wantNotIn(t, "Markdown", md, `\appendix`, `\label{`, "{#intro}")
}

// TestManuscriptTextErrors: mistakes in the manuscript's own text are
// errors that name the line, before anything runs.
func TestManuscriptTextErrors(t *testing.T) {
	t.Parallel()
	cases := []struct{ name, body, want string }{
		{"equation id twice", "$$ a \\label{e} $$\n\n$$ b \\label{e} $$\n", `paper.md:9: duplicate id "e" (first used on line 7)`},
		{"equation id of a directive", fence("summary-stats", "id: d\ndata: grid\nseries: [north]\n") + "\n$$ a \\label{d} $$\n", `paper.md:13: duplicate id "d" (a directive on line 7 has it)`},
		{"unknown section", "## Data {#data}\n\nSee {{dat.label}}.\n", `paper.md:9: inline value {{dat.label}}: no directive has id "dat", nor any equation or section (did you mean data?)`},
		{"section field", "## Data {#data}\n\nSee {{data.stat}}.\n", `paper.md:9: inline value {{data.stat}}: "data" is a section; refer to it with {{data.label}}`},
		{"input in math", "Text $\\input{/etc/passwd}$.\n", `paper.md:7: \input is not allowed in math`},
		{"write in display", "$$\nx \\immediate\\write18{rm -rf}\n$$\n", `paper.md:7: \immediate is not allowed in math`},
		{"char escape", "$$ ^^5cinput $$\n", `paper.md:7: math may not contain ^^`},
		{"tag", "$$ x \\tag{9} $$\n", `paper.md:7: \tag is not used in galley's math`},
		{"unclosed", "Text.\n\n$$\nx = 1\n", `paper.md:9: display math opened with $$ is not closed`},
		{"control character", "Text \x1b[31m red.\n", `paper.md:7: the manuscript contains the control character U+001B`},
		{"image outside", "![x](../secret.png)\n", `paper.md:7: image "../secret.png": path "../secret.png" leads outside`},
		{"image address", "![x](https://example.org/a.png)\n", `paper.md:7: image "https://example.org/a.png": images must be files`},
		{"label twice", "$$ a \\label{x} \\label{y} $$\n", `paper.md:7: an equation takes one \label{id}`},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p := writeProject(t, front+"\n"+c.body, map[string]string{"data.csv": testCSV})
			doc, err := engine.Parse(p, engine.Options{})
			if err == nil {
				err = doc.Run()
			}
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Fatalf("error %v, want %q", err, c.want)
			}
		})
	}
}

// TestLaTeXFloatPlacement: latex: floats: section (the default) sets a
// section's floats before the next section starts; free leaves them to
// LaTeX; end moves the body's tables after the text (the appendix keeps
// its own); an unknown value is an error naming the front matter's line.
func TestLaTeXFloatPlacement(t *testing.T) {
	t.Parallel()
	frontWith := func(floats string) string {
		return "---\ntitle: T\ndata:\n  grid: data.csv\nlatex:\n  floats: " + floats + "\n---\n"
	}
	flush := "\\galleyflushfloats\n\\section{Results}"
	for _, c := range []struct{ mode, front string }{{"default", front}, {"section", frontWith("section")}} {
		p := writeProject(t, c.front+paperBody, map[string]string{"data.csv": testCSV})
		_, _, tex, _ := renderAll(t, p)
		wantIn(t, "LaTeX ("+c.mode+")", tex, flush)
	}
	p := writeProject(t, frontWith("free")+paperBody, map[string]string{"data.csv": testCSV})
	_, _, tex, _ := renderAll(t, p)
	wantNotIn(t, "LaTeX (free)", tex, flush)

	p = writeProject(t, frontWith("end")+paperBody, map[string]string{"data.csv": testCSV})
	_, _, tex, _ = renderAll(t, p)
	wantNotIn(t, "LaTeX (end)", tex, flush)
	body, apx, ok := strings.Cut(tex, "\n\\galleyappendix\n")
	if !ok {
		t.Fatal("no appendix in the LaTeX")
	}
	tab1, text := strings.Index(body, `\label{tab:tab1}`), strings.Index(body, `\section{Results}`)
	if tab1 < 0 || text < 0 || tab1 < text || !strings.Contains(body[text:tab1], "\\clearpage\n") {
		t.Errorf("floats: end: table 1 (at %d) is not held until after the body's text (Results at %d)", tab1, text)
	}
	if !strings.Contains(apx, `\label{tab:tab2}`) {
		t.Error("floats: end: the appendix's table left the appendix")
	}

	p = writeProject(t, frontWith("bottom")+paperBody, map[string]string{"data.csv": testCSV})
	if _, err := engine.Parse(p, engine.Options{}); err == nil || !strings.Contains(err.Error(), "paper.md:5:") || !strings.Contains(err.Error(), `latex: floats: write section`) {
		t.Fatalf("floats: bottom: %v", err)
	}
}
