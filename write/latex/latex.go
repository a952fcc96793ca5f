package latex

import (
	"bytes"
	"fmt"
	"regexp"
	"strings"
	"text/template"

	"github.com/yuin/goldmark/ast"
	east "github.com/yuin/goldmark/extension/ast"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
	"github.com/galley-econ/galley/templates"
)

// Options tune the LaTeX writer.
type Options struct {
	Version string
	// FigureDir is the folder (relative to the .tex file) holding figures.
	FigureDir string
}

// Write renders the document as a complete article that compiles with
// pdflatex using standard packages (booktabs, dcolumn, amsmath,
// graphicx, hyperref). Figures are included as PDF from FigureDir.
func Write(d *engine.Document, o Options) ([]byte, error) {
	if o.FigureDir == "" {
		o.FigureDir = "figures"
	}
	var out bytes.Buffer
	t, err := template.New("preamble").Parse(templates.PreambleTeX)
	if err != nil {
		return nil, err
	}
	m := d.Meta
	class, opts := "article", "11pt"
	if m.LaTeX.Class != "" {
		class = m.LaTeX.Class
	}
	if len(m.LaTeX.Options) > 0 {
		opts = strings.Join(m.LaTeX.Options, ",")
	}
	date := texEscape(m.Date)
	if m.Version != "" {
		if date != "" {
			date += "\\\\ "
		}
		date += "\\small " + texEscape(m.Version)
	}
	err = t.Execute(&out, map[string]string{
		"Version":          o.Version,
		"Class":            class,
		"ClassOptions":     opts,
		"UserPreamble":     string(d.Preamble),
		"UserPreambleFile": m.LaTeX.Preamble,
		"Title":            texEscape(m.Title),
		"Thanks":           texEscape(m.Thanks),
		"Authors":          texAuthors(m.People()),
		"Date":             date,
		"Abstract":         texEscape(m.Abstract),
		"Keywords":         texEscape(strings.Join(m.Keywords, "; ")),
		"JEL":              texEscape(strings.Join(m.JEL, ", ")),
	})
	if err != nil {
		return nil, err
	}
	mode, err := m.LaTeX.FloatMode()
	if err != nil {
		return nil, err
	}
	w := &texWriter{doc: d, out: &out, figDir: o.FigureDir, top: topHeading(d.Root), notes: footnotes(d.Root), floats: mode}
	if err := w.blocks(d.Root); err != nil {
		return nil, err
	}
	w.releaseFloats()
	out.WriteString("\n\\end{document}\n")
	return out.Bytes(), nil
}

// Fragment renders one table result as a standalone fragment that an
// existing paper can \input (it needs booktabs and dcolumn, and the
// column type d defined as D{.}{.}{-1}).
func Fragment(r *engine.Result) []byte {
	var b bytes.Buffer
	b.WriteString("% galley table fragment: needs \\usepackage{booktabs,dcolumn,graphicx,amsmath} (and longtable\n")
	b.WriteString("% for a table longer than a page, pdflscape for one wider than the text, caption\n")
	b.WriteString("% for a table without a caption) and\n")
	b.WriteString("% \\newcolumntype{d}{D{.}{.}{-1}} in the preamble.\n")
	b.WriteString("\\providecommand{\\galleyfit}[1]{\\resizebox{\\ifdim\\width>\\linewidth\\linewidth\\else\\width\\fi}{!}{#1}}\n")
	writeTeXTable(&b, r)
	return b.Bytes()
}

type texWriter struct {
	doc      *engine.Document
	out      *bytes.Buffer
	figDir   string
	top      int // the highest heading level used, typeset as \section
	notes    map[int]*east.Footnote
	appendix bool         // \appendix has been written
	floats   string       // latex: floats: (manuscript.FloatsSection, …)
	held     bytes.Buffer // with floats: end, the body's floats, set after the references
}

// footnotes maps each footnote's index to its text.
func footnotes(root ast.Node) map[int]*east.Footnote {
	out := map[int]*east.Footnote{}
	_ = ast.Walk(root, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if f, ok := n.(*east.Footnote); ok && entering {
			out[f.Index] = f
		}
		return ast.WalkContinue, nil
	})
	return out
}

// topHeading is the smallest heading level in the document (1 if none),
// so that a paper whose sections are "##" (the title being in the front
// matter) gets \section, not \subsection.
func topHeading(root ast.Node) int {
	top := 6
	for n := root.FirstChild(); n != nil; n = n.NextSibling() {
		if h, ok := n.(*ast.Heading); ok && h.Level < top {
			top = h.Level
		}
	}
	if top == 6 {
		return 1
	}
	return top
}

func texAuthors(people []manuscript.Author) string {
	esc := make([]string, len(people))
	for i, p := range people {
		esc[i] = texEscape(p.Name)
		if p.Affiliation != "" {
			esc[i] += "\\\\ \\small " + texEscape(p.Affiliation)
		}
		if p.Email != "" {
			esc[i] += "\\\\ \\small\\texttt{" + texEscape(p.Email) + "}"
		}
	}
	return strings.Join(esc, " \\and ")
}

func (w *texWriter) blocks(parent ast.Node) error {
	for n := parent.FirstChild(); n != nil; n = n.NextSibling() {
		if parent == w.doc.Root && !w.appendix && w.doc.Outline.AppendixAt >= 0 && startOf(n) >= w.doc.Outline.AppendixAt {
			w.releaseFloats()
			w.appendix = true
			w.out.WriteString("\n\\galleyappendix\n")
		}
		if err := w.block(n); err != nil {
			return err
		}
	}
	return nil
}

var texSections = []string{"section", "subsection", "subsubsection", "paragraph", "subparagraph", "subparagraph"}

func (w *texWriter) block(n ast.Node) error {
	src := w.doc.Body
	o := w.out
	if n.Type() == ast.TypeBlock && n.Lines().Len() > 0 {
		fmt.Fprintf(o, "%% galley:line %d\n", w.doc.LineOf(n.Lines().At(0).Start))
	}
	switch n := n.(type) {
	case *ast.Heading:
		sec := w.doc.Section(n)
		level := min(max(n.Level-w.top, 0), 5)
		if level == 0 && w.floats == manuscript.FloatsSection {
			// the floats of a section are set before the next one starts
			o.WriteString("\n\\galleyflushfloats")
		}
		o.WriteString("\n\\" + texSections[level])
		if sec == nil || sec.Number == "" {
			o.WriteString("*")
		}
		o.WriteString("{")
		if err := w.inlines(n); err != nil {
			return err
		}
		o.WriteString("}")
		if sec != nil && sec.ID != "" {
			o.WriteString("\\label{sec:" + sec.ID + "}")
		}
		o.WriteString("\n")
	case *manuscript.MathBlock:
		if !n.Numbered {
			o.WriteString("\\[\n" + n.TeX + "\n\\]\n")
			return nil
		}
		o.WriteString("\\begin{equation}")
		if n.ID != "" {
			o.WriteString("\\label{eq:" + n.ID + "}")
		}
		o.WriteString("\n" + n.TeX + "\n\\end{equation}\n")
	case *manuscript.ReferencesNode:
		w.bibliography()
	case *east.FootnoteList:
		// each footnote is written where it is referred to
	case *ast.Paragraph, *ast.TextBlock:
		o.WriteString("\n")
		if err := w.inlines(n); err != nil {
			return err
		}
		o.WriteString("\n")
	case *ast.ThematicBreak:
		o.WriteString("\n\\medskip\\noindent\\rule{\\linewidth}{0.4pt}\\medskip\n")
	case *ast.Blockquote:
		o.WriteString("\n\\begin{quote}")
		if err := w.blocks(n); err != nil {
			return err
		}
		o.WriteString("\\end{quote}\n")
	case *ast.List:
		env := "itemize"
		if n.IsOrdered() {
			env = "enumerate"
		}
		o.WriteString("\n\\begin{" + env + "}\\tightlist\n")
		for it := n.FirstChild(); it != nil; it = it.NextSibling() {
			o.WriteString("\\item ")
			if err := w.blocks(it); err != nil {
				return err
			}
		}
		o.WriteString("\\end{" + env + "}\n")
	case *ast.FencedCodeBlock:
		if res, ok, err := w.doc.ResultAt(n); ok {
			if err != nil {
				return err
			}
			w.result(res)
			return nil
		}
		w.verbatim(n, src)
	case *ast.CodeBlock:
		w.verbatim(n, src)
	case *ast.HTMLBlock:
		// raw HTML has no LaTeX meaning; it is left out
	case *east.Table:
		w.mdTable(n)
	default:
		return w.blocks(n)
	}
	return nil
}

func (w *texWriter) verbatim(n ast.Node, src []byte) {
	w.out.WriteString("\n\\begin{verbatim}\n")
	for i := 0; i < n.Lines().Len(); i++ {
		seg := n.Lines().At(i)
		line := string(seg.Value(src))
		w.out.WriteString(strings.ReplaceAll(line, `\end{verbatim}`, `\end {verbatim}`))
	}
	w.out.WriteString("\\end{verbatim}\n")
}

func (w *texWriter) mdTable(t *east.Table) {
	cols := len(t.Alignments)
	w.out.WriteString("\n\\begin{center}\n\\begin{tabular}{" + strings.Repeat("l", cols) + "}\n\\toprule\n")
	for row := t.FirstChild(); row != nil; row = row.NextSibling() {
		first := true
		for cell := row.FirstChild(); cell != nil; cell = cell.NextSibling() {
			if !first {
				w.out.WriteString(" & ")
			}
			first = false
			_ = w.inlines(cell)
		}
		w.out.WriteString(" \\\\\n")
		if _, ok := row.(*east.TableHeader); ok {
			w.out.WriteString("\\midrule\n")
		}
	}
	w.out.WriteString("\\bottomrule\n\\end{tabular}\n\\end{center}\n")
}

func (w *texWriter) inlines(parent ast.Node) error {
	for n := parent.FirstChild(); n != nil; n = n.NextSibling() {
		if err := w.inline(n); err != nil {
			return err
		}
	}
	return nil
}

func (w *texWriter) inline(n ast.Node) error {
	src := w.doc.Body
	o := w.out
	switch n := n.(type) {
	case *ast.Text:
		o.WriteString(texEscape(string(n.Segment.Value(src))))
		if n.HardLineBreak() {
			o.WriteString("\\\\\n")
		} else if n.SoftLineBreak() {
			o.WriteString("\n")
		}
	case *ast.String:
		o.WriteString(texEscape(string(n.Value)))
	case *ast.Emphasis:
		cmd := "\\emph{"
		if n.Level >= 2 {
			cmd = "\\textbf{"
		}
		o.WriteString(cmd)
		if err := w.inlines(n); err != nil {
			return err
		}
		o.WriteString("}")
	case *ast.CodeSpan:
		var b strings.Builder
		for c := n.FirstChild(); c != nil; c = c.NextSibling() {
			if t, ok := c.(*ast.Text); ok {
				b.Write(t.Segment.Value(src))
			}
		}
		o.WriteString("\\texttt{" + texEscape(b.String()) + "}")
	case *ast.Link:
		o.WriteString("\\href{" + texURL(string(n.Destination)) + "}{")
		if err := w.inlines(n); err != nil {
			return err
		}
		o.WriteString("}")
	case *ast.AutoLink:
		o.WriteString("\\url{" + texURL(string(n.URL(src))) + "}")
	case *ast.Image:
		o.WriteString("\\includegraphics[width=\\linewidth]{" + texURL(string(n.Destination)) + "}")
	case *ast.RawHTML:
		// left out
	case *east.Strikethrough:
		return w.inlines(n)
	case *manuscript.MathNode:
		if n.Display {
			o.WriteString("\\[" + n.TeX + "\\]")
		} else {
			o.WriteString("$" + n.TeX + "$")
		}
	case *east.FootnoteLink:
		f := w.notes[n.Index]
		if f == nil {
			return nil
		}
		o.WriteString("\\footnote{")
		for c := f.FirstChild(); c != nil; c = c.NextSibling() {
			if c != f.FirstChild() {
				o.WriteString("\\par ")
			}
			if err := w.inlines(c); err != nil {
				return err
			}
		}
		o.WriteString("}")
	case *manuscript.CiteNode:
		if _, err := w.doc.Cite(n); err != nil {
			return err
		}
		o.WriteString("\\" + n.Cmd)
		if n.Pre != "" {
			o.WriteString("[" + texEscape(manuscript.Detex(n.Pre)) + "]")
		}
		if n.Pre != "" || n.Post != "" {
			o.WriteString("[" + texEscape(manuscript.Detex(n.Post)) + "]")
		}
		o.WriteString("{" + strings.Join(n.Keys, ",") + "}")
	case *east.FootnoteBacklink:
		// the footnote mark is LaTeX's own
	case *manuscript.RefNode:
		t, err := w.doc.Inline(n)
		if err != nil {
			return err
		}
		switch {
		case t.XRef != nil:
			o.WriteString(texXRef(t))
		case t.Numeric:
			o.WriteString(texNumber(t.Text))
		default:
			o.WriteString(texEscape(t.Text))
		}
	default:
		return w.inlines(n)
	}
	return nil
}

func texLabel(r *engine.Result) string {
	switch {
	case r.Figure != nil:
		return "fig:" + r.ID
	case r.Equation != nil:
		return "eq:" + r.ID
	}
	return "tab:" + r.ID
}

// texXRef writes a cross-reference with LaTeX's own \ref, so that the
// number printed is the one LaTeX gave the target (galley's numbering
// and LaTeX's agree; the text before it is galley's).
func texXRef(t engine.InlineValue) string {
	x := t.XRef
	switch x.Kind {
	case "figure":
		return "Figure~\\ref{fig:" + x.ID + "}"
	case "equation":
		return "\\eqref{eq:" + x.ID + "}"
	case "section":
		word, _, _ := strings.Cut(t.Text, " ")
		return texEscape(word) + "~\\ref{sec:" + x.ID + "}"
	}
	return "Table~\\ref{tab:" + x.ID + "}"
}

// bibliography writes the reference list as natbib reads it, so that
// one pdflatex run (two for cross-references) needs no BibTeX step:
// \bibitem[Engle and Granger(1987)]{key} and galley's formatting of the
// entry.
func (w *texWriter) bibliography() {
	refs := w.doc.References()
	if len(refs) == 0 {
		return
	}
	fmt.Fprintf(w.out, "\n\\galleyflushfloats\n\\begin{thebibliography}{%d}\n", len(refs))
	for _, e := range refs {
		fmt.Fprintf(w.out, "\\bibitem[%s(%s)]{%s}\n", strings.ReplaceAll(texEscape(e.AuthorText()), "et al.", "et~al."), texEscape(e.YearText()), e.Key)
		for _, sp := range e.Reference() {
			if sp.Italic {
				w.out.WriteString("\\emph{" + texEscape(sp.Text) + "}")
			} else {
				w.out.WriteString(texEscape(sp.Text))
			}
		}
		w.out.WriteString("\n")
	}
	w.out.WriteString("\\end{thebibliography}\n")
	w.releaseFloats()
}

// releaseFloats writes the floats held back by floats: end, after the
// reference list (or, without one, at the end of the body), each set on
// a page of floats.
func (w *texWriter) releaseFloats() {
	if w.held.Len() == 0 {
		return
	}
	w.out.WriteString("\n\\clearpage\n")
	w.held.WriteTo(w.out)
}

// startOf is the body offset where a block starts (-1 if unknown).
func startOf(n ast.Node) int {
	if m, ok := n.(*manuscript.MathBlock); ok {
		return m.Offset
	}
	if n.Type() == ast.TypeBlock && n.Lines().Len() > 0 {
		return n.Lines().At(0).Start
	}
	if f, ok := n.(*ast.FencedCodeBlock); ok && f.Info != nil {
		return f.Info.Segment.Start
	}
	for c := n.FirstChild(); c != nil; c = c.NextSibling() {
		if s := startOf(c); s >= 0 {
			return s
		}
	}
	return -1
}

// texNumber puts a number in math mode when it has a sign, so that the
// minus is a true minus.
func texNumber(s string) string {
	if strings.HasPrefix(s, "-") {
		return "$-" + s[1:] + "$"
	}
	return texEscape(s)
}

func (w *texWriter) result(r *engine.Result) {
	dst := w.out
	if w.floats == manuscript.FloatsEnd && !w.appendix && (r.Table != nil || r.Figure != nil) {
		dst = &w.held
	}
	switch {
	case r.Table != nil:
		dst.WriteString("\n")
		writeTeXTable(dst, r)
	case r.Figure != nil:
		fmt.Fprintf(dst, "\n\\begin{figure}[!tbp]\n\\centering\n\\includegraphics[width=%.2fin]{%s/%s.pdf}\n", r.Figure.Width, w.figDir, r.ID)
		fmt.Fprintf(dst, "\\caption{%s}\\label{%s}\n", texEscape(r.Figure.Caption), texLabel(r))
		writeTeXNotes(dst, r.Figure.Notes)
		dst.WriteString("\\end{figure}\n")
	case r.Equation != nil:
		below := r.Equation.Stats != "" || len(r.Equation.Notes) > 0
		if below {
			// no page break between the equation and its statistics line
			w.out.WriteString("\\begingroup\\postdisplaypenalty=10000\n")
		}
		fmt.Fprintf(w.out, "\\begin{equation}\\label{%s}\n%s\n\\end{equation}\n", texLabel(r), r.Equation.TeX())
		if below {
			w.out.WriteString("{\\centering\\footnotesize ")
			if r.Equation.Stats != "" {
				w.out.WriteString("$" + r.Equation.Stats + "$")
			}
			for _, n := range r.Equation.Notes {
				w.out.WriteString("\\\\\n" + texEscape(n))
			}
			w.out.WriteString("\\par}\\endgroup\n")
		}
	case r.Text != "":
		w.out.WriteString("\n" + texEscape(r.Text) + "\n")
	}
}

// Page-layout limits for tables: a table taller than longRows rows is
// set as a longtable that breaks across pages, with its notes after its
// last row; one whose estimated width at \scriptsize still exceeds the
// text block is set on a landscape page.
const (
	longRows      = 44
	textWidthPt   = 468.0 // 6.5in, the text block of the default geometry
	scriptCharPt  = 3.6   // an average character at \scriptsize (7pt)
	scriptColSep  = 7.0   // 2 × \tabcolsep at \scriptsize after galley's tightening
	landscapeNote = "wider than the text block even at 7pt: set on a landscape page"
)

// estimatedWidth is a rough width of the table at \scriptsize, in points.
func estimatedWidth(t *table.Table) float64 {
	cols := t.Cols()
	widths := make([]int, cols)
	measure := func(cells []table.Cell) {
		col := 0
		for _, c := range cells {
			span := max(c.Span, 1)
			n := len([]rune(c.Text))
			if c.IsNum {
				s, _ := table.NumText(c)
				n = len(s) + c.Stars + len(c.Suffix) + 2
			}
			if span == 1 && col < cols && n > widths[col] {
				widths[col] = n
			}
			col += span
		}
	}
	for _, h := range t.Head {
		measure(h)
	}
	for _, r := range t.Body {
		measure(r.Cells)
	}
	w := 0.0
	for _, n := range widths {
		w += float64(n)*scriptCharPt + scriptColSep
	}
	return w
}

func writeTeXTable(b *bytes.Buffer, r *engine.Result) {
	t := r.Table
	cols := t.Cols()
	spec := strings.Repeat("l", t.Stub) + strings.Repeat("d", max(cols-t.Stub, 0))
	landscape := estimatedWidth(t) > textWidthPt
	if landscape {
		b.WriteString("\\begin{landscape}\n")
	}
	rows := len(t.Head) + len(t.Body)
	if rows > longRows {
		writeLongTable(b, r, spec)
	} else {
		fmt.Fprintf(b, "\\begin{table}[!tbp]\n\\centering\n\\caption{%s}\\label{%s}\n", texEscape(t.Caption), texLabel(r))
		if cols > 7 {
			b.WriteString("\\setlength{\\tabcolsep}{3.5pt}\n")
		}
		// the largest size at which the table fits the line (galleyfit)
		b.WriteString("\\galleyfit{%\n\\begin{tabular}{" + spec + "}\n")
		writeTeXHead(b, t)
		writeTeXBody(b, t)
		b.WriteString("\\bottomrule\n\\end{tabular}}\n")
		writeTeXNotes(b, t.Notes)
		b.WriteString("\\end{table}\n")
	}
	if landscape {
		b.WriteString("\\end{landscape}\n")
	}
}

// writeTeXHead writes a table's header rows between its top rule and
// the rule under them.
func writeTeXHead(b *bytes.Buffer, t *table.Table) {
	b.WriteString("\\toprule\n")
	for _, row := range t.Head {
		writeTeXRow(b, row, t.Stub, true)
	}
	b.WriteString("\\midrule\n")
}

// writeTeXBody writes a table's body rows, with a rule above those that
// open a block.
func writeTeXBody(b *bytes.Buffer, t *table.Table) {
	for _, row := range t.Body {
		if row.RuleAbove {
			b.WriteString("\\midrule\n")
		}
		writeTeXRow(b, row.Cells, t.Stub, false)
	}
}

// writeLongTable sets a table that breaks across pages: the header
// repeats on each page, "continued" lines say where it goes on, and the
// notes follow its last row in the text block.
func writeLongTable(b *bytes.Buffer, r *engine.Result, spec string) {
	t := r.Table
	cols := t.Cols()
	b.WriteString("\\begingroup\\small\n")
	if cols > 7 {
		b.WriteString("\\setlength{\\tabcolsep}{3.5pt}\n")
	}
	fmt.Fprintf(b, "\\begin{longtable}{%s}\n\\caption{%s}\\label{%s}\\\\\n", spec, texEscape(t.Caption), texLabel(r))
	writeTeXHead(b, t)
	b.WriteString("\\endfirsthead\n")
	fmt.Fprintf(b, "\\multicolumn{%d}{l}{\\emph{\\tablename~\\thetable, continued}}\\\\\n", cols)
	writeTeXHead(b, t)
	b.WriteString("\\endhead\n")
	fmt.Fprintf(b, "\\midrule\n\\multicolumn{%d}{r}{\\emph{continued on the next page}}\\\\\n\\endfoot\n\\bottomrule\n\\endlastfoot\n", cols)
	writeTeXBody(b, t)
	b.WriteString("\\end{longtable}\n")
	writeTeXNotes(b, t.Notes)
	b.WriteString("\\endgroup\n")
}

func writeTeXNotes(b *bytes.Buffer, notes []string) {
	if len(notes) == 0 {
		return
	}
	b.WriteString("\\par\\smallskip\\noindent\\begin{minipage}{\\linewidth}\\footnotesize\n")
	for i, n := range notes {
		if i == 0 {
			b.WriteString("\\emph{Notes:} ")
		}
		b.WriteString(texEscape(n) + "\\par\n")
	}
	b.WriteString("\\end{minipage}\n")
}

func writeTeXRow(b *bytes.Buffer, cells []table.Cell, stub int, head bool) {
	col := 0
	for i, c := range cells {
		if i > 0 {
			b.WriteString(" & ")
		}
		span := max(c.Span, 1)
		switch {
		case c.IsNum && col >= stub:
			b.WriteString(texNumCell(c))
		case col < stub && span == 1:
			b.WriteString(texText(c))
		default:
			align := "c"
			if col < stub {
				align = "l"
			}
			fmt.Fprintf(b, "\\multicolumn{%d}{%s}{%s}", span, align, texText(c))
		}
		col += span
	}
	b.WriteString(" \\\\\n")
	if head && hasSpan(cells) {
		// a spanning header row gets a short rule under its groups
		col = 0
		for _, c := range cells {
			span := max(c.Span, 1)
			if span > 1 && c.Text != "" {
				fmt.Fprintf(b, "\\cmidrule(lr){%d-%d}", col+1, col+span)
			}
			col += span
		}
		b.WriteString("\n")
	}
}

// texNumCell writes a number for a dcolumn D column (math mode): the
// minus is a true minus, stars are superscripts.
func texNumCell(c table.Cell) string {
	s, neg := table.NumText(c)
	if s == "n/a" || s == "∞" {
		return "\\multicolumn{1}{c}{" + texEscape(s) + "}"
	}
	if neg {
		s = "-" + s
	}
	if c.Paren {
		s = "(" + s + ")"
	}
	if c.Stars > 0 {
		s += "^{" + table.Stars(c.Stars) + "}"
	}
	if c.Suffix != "" {
		s += "\\,{\\scriptstyle\\text{" + texEscape(strings.TrimSpace(c.Suffix)) + "}}"
	}
	return s
}

// texReplacer escapes LaTeX's special characters and maps the Unicode
// that tables and prose use to commands pdflatex knows.
var texReplacer = strings.NewReplacer(
	`\`, `\textbackslash{}`, `{`, `\{`, `}`, `\}`, `$`, `\$`, `&`, `\&`, `#`, `\#`,
	`^`, `\textasciicircum{}`, `_`, `\_`, `~`, `\textasciitilde{}`, `%`, `\%`,
	`<`, `\textless{}`, `>`, `\textgreater{}`, `|`, `\textbar{}`,
	"−", `\ensuremath{-}`, "–", "--", "—", "---", "…", `\ldots{}`, "·", `\ensuremath{\cdot}`,
	"×", `\ensuremath{\times}`, "±", `\ensuremath{\pm}`, "≤", `\ensuremath{\leq}`, "≥", `\ensuremath{\geq}`,
	"≠", `\ensuremath{\neq}`, "≈", `\ensuremath{\approx}`, "√", `\ensuremath{\surd}`, "∞", `\ensuremath{\infty}`,
	"²", `\ensuremath{^2}`, "³", `\ensuremath{^3}`, "¹", `\ensuremath{^1}`,
	"α", `\ensuremath{\alpha}`, "β", `\ensuremath{\beta}`, "γ", `\ensuremath{\gamma}`, "δ", `\ensuremath{\delta}`,
	"ε", `\ensuremath{\varepsilon}`, "ϵ", `\ensuremath{\epsilon}`, "θ", `\ensuremath{\theta}`, "λ", `\ensuremath{\lambda}`,
	"μ", `\ensuremath{\mu}`, "π", `\ensuremath{\pi}`, "ρ", `\ensuremath{\rho}`, "σ", `\ensuremath{\sigma}`,
	"τ", `\ensuremath{\tau}`, "φ", `\ensuremath{\varphi}`, "ϕ", `\ensuremath{\phi}`, "χ", `\ensuremath{\chi}`,
	"ψ", `\ensuremath{\psi}`, "ω", `\ensuremath{\omega}`, "Γ", `\ensuremath{\Gamma}`, "Δ", `\ensuremath{\Delta}`,
	"Λ", `\ensuremath{\Lambda}`, "Π", `\ensuremath{\Pi}`, "Σ", `\ensuremath{\Sigma}`, "Φ", `\ensuremath{\Phi}`,
	"Ω", `\ensuremath{\Omega}`, "η", `\ensuremath{\eta}`, "κ", `\ensuremath{\kappa}`, "ν", `\ensuremath{\nu}`, "ξ", `\ensuremath{\xi}`, "ζ", `\ensuremath{\zeta}`,
	"⌊", `\ensuremath{\lfloor}`, "⌋", `\ensuremath{\rfloor}`, "⌈", `\ensuremath{\lceil}`, "⌉", `\ensuremath{\rceil}`,
	"¼", `\ensuremath{\tfrac14}`, "½", `\ensuremath{\tfrac12}`, "∑", `\ensuremath{\sum}`, "∈", `\ensuremath{\in}`,
	"→", `\ensuremath{\to}`, "⇒", `\ensuremath{\Rightarrow}`, "∼", `\ensuremath{\sim}`, "≡", `\ensuremath{\equiv}`,
	"∂", `\ensuremath{\partial}`, "∏", `\ensuremath{\prod}`, "∣", `\ensuremath{\mid}`, "⊥", `\ensuremath{\perp}`,
	"₀", `\ensuremath{_0}`, "₁", `\ensuremath{_1}`, "₂", `\ensuremath{_2}`, "₃", `\ensuremath{_3}`, "₄", `\ensuremath{_4}`,
	"₅", `\ensuremath{_5}`, "₆", `\ensuremath{_6}`, "₇", `\ensuremath{_7}`, "₈", `\ensuremath{_8}`, "₉", `\ensuremath{_9}`,
	"⁰", `\ensuremath{^0}`, "⁴", `\ensuremath{^4}`, "⁵", `\ensuremath{^5}`, "⁶", `\ensuremath{^6}`, "⁷", `\ensuremath{^7}`,
	"⁸", `\ensuremath{^8}`, "⁹", `\ensuremath{^9}`, "⁻", `\ensuremath{^-}`, "ᵀ", `\ensuremath{^\top}`, "′", `\ensuremath{'}`,
	"\u0302", "", "\u0303", "", "\u0304", "", "\u2009", `\,`, "\u00a0", "~", "\u2005", " ", "\u2003", `\quad{}`,
)

// combiningAccent is a letter with a combining hat, tilde or bar (d̂),
// which LaTeX sets as math (\hat{d}).
var combiningAccent = regexp.MustCompile(`(\pL)([\x{0302}\x{0303}\x{0304}])`)

var accentCmd = map[string]string{"\u0302": `\hat`, "\u0303": `\tilde`, "\u0304": `\bar`}

// texEscape makes literal text safe in LaTeX's text mode; control
// characters are dropped.
func texEscape(s string) string {
	// every subscript rune is encoded E2 82 xx, but for ⱼ (E2 B1 BC), so
	// a string without either needs no regular expression
	if !strings.Contains(s, "\xe2\x82") && !strings.Contains(s, "ⱼ") || !subscriptRun.MatchString(s) {
		return texEscapeText(s)
	}
	// A run of Unicode subscript characters (a time index such as ₜ₋₁) is
	// one subscript in math mode.
	var b strings.Builder
	last := 0
	for _, m := range subscriptRun.FindAllStringIndex(s, -1) {
		b.WriteString(texEscapeText(s[last:m[0]]))
		b.WriteString(`\ensuremath{_{` + subscriptTeX.Replace(s[m[0]:m[1]]) + `}}`)
		last = m[1]
	}
	b.WriteString(texEscapeText(s[last:]))
	return b.String()
}

// subscriptRun matches Unicode subscript letters, digits and signs.
var subscriptRun = regexp.MustCompile(`[ₜⱼ₊₋₀-₉]+`)

var subscriptTeX = strings.NewReplacer("ₜ", "t", "ⱼ", "j", "₊", "+", "₋", "-",
	"₀", "0", "₁", "1", "₂", "2", "₃", "3", "₄", "4", "₅", "5", "₆", "6", "₇", "7", "₈", "8", "₉", "9")

// texEscapeText escapes text that holds no subscript run.
func texEscapeText(s string) string {
	s = strings.Map(func(r rune) rune {
		if r < 0x20 && r != '\n' && r != '\t' || r == 0x7f || r >= 0x80 && r < 0xa0 {
			return -1
		}
		return r
	}, s)
	// U+0302..U+0304 are encoded 0xCC 0x82..0x84
	if strings.IndexByte(s, 0xcc) < 0 || !combiningAccent.MatchString(s) {
		return texReplacer.Replace(s)
	}
	var b strings.Builder
	last := 0
	for _, m := range combiningAccent.FindAllStringSubmatchIndex(s, -1) {
		b.WriteString(texReplacer.Replace(s[last:m[0]]))
		letter := texReplacer.Replace(s[m[2]:m[3]])
		b.WriteString(`\ensuremath{` + accentCmd[s[m[4]:m[5]]] + `{` + letter + `}}`)
		last = m[1]
	}
	b.WriteString(texReplacer.Replace(s[last:]))
	return b.String()
}

// texURL escapes the characters that break \href and \url arguments.
func texURL(s string) string {
	return strings.NewReplacer(`\`, `/`, `%`, `\%`, `#`, `\#`, `{`, `%7B`, `}`, `%7D`).Replace(s)
}

func hasSpan(cells []table.Cell) bool {
	for _, c := range cells {
		if c.Span > 1 && c.Text != "" {
			return true
		}
	}
	return false
}

// texText is a text cell in LaTeX: its text escaped, and its subscript
// (a time index such as t−1) set in math mode.
func texText(c table.Cell) string {
	if c.Sub == "" {
		return texEscape(c.Text)
	}
	return texEscape(c.Text) + `\ensuremath{_{` + strings.NewReplacer("−", "-").Replace(c.Sub) + `}}`
}
