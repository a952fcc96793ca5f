package kinds

import (
	"testing"
)

const citeBib = `@article{EG87,
  author = {Engle, Robert F. and Granger, C. W. J.},
  title = {Co-Integration and Error Correction},
  journal = {Econometrica}, year = {1987}, volume = {55}, number = {2}, pages = {251--276}}
@article{J91a, author = {Johansen, S{\o}ren}, title = {First}, journal = {Econometrica}, year = 1991}
@article{J91b, author = {Johansen, S{\o}ren}, title = {Second}, journal = {Other}, year = 1991}
`

// TestCitations: natbib's commands in the prose become author-year
// citations linked to a reference list in HTML and Markdown, and natbib
// commands with a thebibliography in LaTeX; two works of one author and
// year get a and b; cite-methods adds the works behind the directives.
func TestCitations(t *testing.T) {
	t.Parallel()
	body := "---\ntitle: T\nbibliography: refs.bib\ncite-methods: true\ndata:\n  grid: data.csv\n---\n\n" +
		"As \\citet{EG87} show, and \\citep[see][p.~3]{J91a,J91b}; \\citeauthor{EG87} in \\citeyear{EG87}.\n\n" +
		fence("engle-granger", "id: eg\ndata: grid\ny: north\nx: [fuel]\nlags: 0\n")
	p := writeProject(t, body, map[string]string{"data.csv": testCSV, "refs.bib": citeBib})
	_, h, tex, md := renderAll(t, p)
	wantIn(t, "HTML", h, `<a href="#ref-EG87">Engle and Granger (1987)</a>`,
		`(see <a href="#ref-J91a">Johansen, 1991a</a>; <a href="#ref-J91b">Johansen, 1991b</a>, p.`+"\u00a0"+`3)`,
		`<p class="ref" id="ref-EG87">Engle, Robert F. and C. W. J. Granger (1987). Co-Integration and Error Correction. <em>Econometrica</em> 55(2), 251–276.</p>`,
		`id="ref-mackinnon-2010"`, `<h2>References</h2>`, `Søren`)
	wantIn(t, "LaTeX", tex, `\citet{EG87}`, `\citep[see][p.~3]{J91a,J91b}`, `\citeauthor{EG87}`, `\citeyear{EG87}`,
		`\begin{thebibliography}{`, `\bibitem[Engle and Granger(1987)]{EG87}`, `\bibitem[Johansen(1991a)]{J91a}`, `\bibitem[MacKinnon(2010)]{mackinnon-2010}`)
	wantIn(t, "Markdown", md, "[Engle and Granger (1987)](#ref-EG87)", `<a id="ref-EG87"></a>`, "## References", "[Engle and Granger](#ref-EG87) in [1987](#ref-EG87)")
}

// TestCitationErrors: an unknown key (with the closest), a missing .bib
// and a malformed entry are errors naming the line.
func TestCitationErrors(t *testing.T) {
	t.Parallel()
	head := "---\ntitle: T\nbibliography: refs.bib\n---\n\n"
	runBad(t, head+"Text \\citep{EG78}.\n", map[string]string{"refs.bib": citeBib},
		`paper.md:6: \citep{EG78}: no work in refs.bib has the key "EG78" (did you mean EG87?)`)
	runBad(t, head+"Text \\citep{EG87}.\n", nil, `paper.md:3: bibliography: file`, "refs.bib does not exist")
	runBad(t, head+"Text \\citep{EG87}.\n", map[string]string{"refs.bib": "@article{EG87,\n  author = {A, B},\n  title = {x\n  year = 1990\n}\n"}, `refs.bib:`, `malformed entry "EG87"`)
	runBad(t, "---\ntitle: T\n---\n\nText \\citet{EG87}.\n", nil, `paper.md:5: \citet{EG87}: no work has the key "EG87": name a BibTeX file in the front matter`)
}
