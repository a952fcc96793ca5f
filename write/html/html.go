package html

import (
	"bytes"
	"errors"
	"fmt"
	"html"
	"html/template"
	"regexp"
	"strings"

	"github.com/yuin/goldmark/ast"
	"github.com/yuin/goldmark/renderer"
	"github.com/yuin/goldmark/util"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
	"github.com/galley-econ/galley/templates"
)

// Options tune the HTML writer.
type Options struct {
	Version string
	// Script is extra HTML placed before </body> (the live preview's
	// reload hook); empty for files.
	Script template.HTML
	// Error, if set, is shown in a banner at the top (live preview).
	Error string
}

// Write renders the document as one self-contained HTML file: the style
// sheet is inlined, figures are inline SVG, math is typeset with HTML.
func Write(d *engine.Document, o Options) ([]byte, error) {
	md := manuscript.NewMarkdown()
	md.Renderer().AddOptions(renderer.WithNodeRenderers(util.Prioritized(&htmlNodes{doc: d}, 100)))
	var body bytes.Buffer
	if err := md.Renderer().Render(&body, d.Body, d.Root); err != nil {
		return nil, err
	}
	if o.Error != "" {
		body.WriteString(`<div class="build-error">` + html.EscapeString(o.Error) + `</div>`)
	}
	t, err := template.New("page").Parse(templates.PageHTML)
	if err != nil {
		return nil, err
	}
	// The body goes in after the template has run: passed through
	// html/template, the demo's 1.5 MB body cost 2–3 ms of copying.
	var page bytes.Buffer
	err = t.Execute(&page, map[string]any{
		"Version":     o.Version,
		"Title":       d.Meta.Title,
		"People":      d.Meta.People(),
		"Thanks":      d.Meta.Thanks,
		"VersionLine": d.Meta.Version,
		"Keywords":    strings.Join(d.Meta.Keywords, "; "),
		"JEL":         strings.Join(d.Meta.JEL, ", "),
		"Date":        d.Meta.Date,
		"Abstract":    d.Meta.Abstract,
		"CSS":         template.CSS(templates.StyleCSS),
		"Body":        template.HTML(bodyMark),
		"Script":      o.Script,
	})
	if err != nil {
		return nil, err
	}
	// The mark is the template's own: text from the manuscript reaches
	// the page escaped, so it cannot spell it.
	head, tail, ok := bytes.Cut(page.Bytes(), []byte(bodyMark))
	if !ok || bytes.Contains(tail, []byte(bodyMark)) {
		return nil, errors.New("html: the page template must hold the body exactly once")
	}
	out := make([]byte, 0, len(head)+body.Len()+len(tail))
	out = append(append(append(out, head...), body.Bytes()...), tail...)
	return out, nil
}

// bodyMark stands for the body while the page template runs.
const bodyMark = "<!--galley:body-->"

type htmlNodes struct{ doc *engine.Document }

func (h *htmlNodes) RegisterFuncs(reg renderer.NodeRendererFuncRegisterer) {
	reg.Register(ast.KindFencedCodeBlock, h.fenced)
	reg.Register(manuscript.KindRef, h.ref)
	reg.Register(manuscript.KindMath, h.math)
	reg.Register(manuscript.KindMathBlock, h.mathBlock)
	reg.Register(ast.KindHeading, h.heading)
	reg.Register(manuscript.KindCite, h.cite)
	reg.Register(manuscript.KindReferences, h.references)
}

func (h *htmlNodes) cite(w util.BufWriter, src []byte, node ast.Node, entering bool) (ast.WalkStatus, error) {
	if !entering {
		return ast.WalkContinue, nil
	}
	n := node.(*manuscript.CiteNode)
	entries, err := h.doc.Cite(n)
	if err != nil {
		return ast.WalkStop, err
	}
	open, parts, close := manuscript.FormatCite(n, entries)
	w.WriteString(`<span class="cite">` + html.EscapeString(open))
	for i, p := range parts {
		if i > 0 {
			w.WriteString(html.EscapeString(manuscript.CiteSeparator(n.Cmd)))
		}
		w.WriteString(`<a href="#ref-` + html.EscapeString(p.Key) + `">` + html.EscapeString(p.Text) + `</a>`)
	}
	w.WriteString(html.EscapeString(close) + `</span>`)
	return ast.WalkContinue, nil
}

func (h *htmlNodes) references(w util.BufWriter, src []byte, node ast.Node, entering bool) (ast.WalkStatus, error) {
	refs := h.doc.References()
	if !entering || len(refs) == 0 {
		return ast.WalkContinue, nil
	}
	w.WriteString(`<section class="references" id="references">` + "\n<h2>References</h2>\n")
	for _, e := range refs {
		w.WriteString(`<p class="ref" id="ref-` + html.EscapeString(e.Key) + `">`)
		for _, sp := range e.Reference() {
			if sp.Italic {
				w.WriteString("<em>" + html.EscapeString(sp.Text) + "</em>")
			} else {
				w.WriteString(html.EscapeString(sp.Text))
			}
		}
		w.WriteString("</p>\n")
	}
	w.WriteString("</section>\n")
	return ast.WalkContinue, nil
}

func (h *htmlNodes) mathBlock(w util.BufWriter, src []byte, node ast.Node, entering bool) (ast.WalkStatus, error) {
	if !entering {
		return ast.WalkSkipChildren, nil
	}
	n := node.(*manuscript.MathBlock)
	id := ""
	if n.ID != "" {
		id = ` id="eq-` + html.EscapeString(n.ID) + `"`
	}
	h.writeEquation(w, id, n.TeX, h.doc.EquationNumber(n))
	return ast.WalkSkipChildren, nil
}

// writeEquation writes a display equation with its number at the right.
func (h *htmlNodes) writeEquation(w util.BufWriter, id, tex, number string) {
	w.WriteString(`<div class="equation"` + id + `>` + h.mathML(tex, true))
	if number != "" {
		w.WriteString(`<span class="eqno">(` + html.EscapeString(number) + `)</span>`)
	}
	w.WriteString("</div>\n")
}

func (h *htmlNodes) heading(w util.BufWriter, src []byte, node ast.Node, entering bool) (ast.WalkStatus, error) {
	n := node.(*ast.Heading)
	tag := "h" + string(rune('0'+n.Level))
	if !entering {
		w.WriteString("</" + tag + ">\n")
		return ast.WalkContinue, nil
	}
	s := h.doc.Section(n)
	w.WriteString("<" + tag)
	if s != nil && s.ID != "" {
		w.WriteString(` id="sec-` + html.EscapeString(s.ID) + `"`)
	}
	w.WriteString(">")
	if s != nil && s.Number != "" {
		w.WriteString(`<span class="secnum">` + html.EscapeString(s.Number) + `</span> `)
	}
	return ast.WalkContinue, nil
}

func (h *htmlNodes) fenced(w util.BufWriter, src []byte, node ast.Node, entering bool) (ast.WalkStatus, error) {
	n := node.(*ast.FencedCodeBlock)
	res, ok, err := h.doc.ResultAt(n)
	if !ok { // an ordinary code block
		if entering {
			w.WriteString("<pre><code")
			if lang := n.Language(src); lang != nil {
				w.WriteString(` class="language-` + html.EscapeString(string(lang)) + `"`)
			}
			w.WriteString(">")
			for i := 0; i < n.Lines().Len(); i++ {
				seg := n.Lines().At(i)
				w.WriteString(html.EscapeString(string(seg.Value(src))))
			}
		} else {
			w.WriteString("</code></pre>\n")
		}
		return ast.WalkContinue, nil
	}
	if !entering {
		return ast.WalkContinue, nil
	}
	if err != nil {
		return ast.WalkSkipChildren, err
	}
	h.writeHTMLResult(w, res)
	return ast.WalkSkipChildren, nil
}

func (h *htmlNodes) ref(w util.BufWriter, src []byte, node ast.Node, entering bool) (ast.WalkStatus, error) {
	if !entering {
		return ast.WalkContinue, nil
	}
	t, err := h.doc.Inline(node.(*manuscript.RefNode))
	if err != nil {
		return ast.WalkStop, err
	}
	switch {
	case t.XRef != nil:
		fmt.Fprintf(w, `<a class="xref" href="#%s">%s</a>`, html.EscapeString(xrefAnchor(t.XRef)), html.EscapeString(t.Text))
	case t.Numeric:
		w.WriteString(html.EscapeString(htmlMinus(t.Text)))
	default:
		w.WriteString(html.EscapeString(t.Text))
	}
	return ast.WalkContinue, nil
}

func (h *htmlNodes) math(w util.BufWriter, src []byte, node ast.Node, entering bool) (ast.WalkStatus, error) {
	if entering {
		n := node.(*manuscript.MathNode)
		if n.Display {
			w.WriteString(`<span class="math-display">` + h.mathML(n.TeX, true) + `</span>`)
		} else {
			w.WriteString(h.mathML(n.TeX, false))
		}
	}
	return ast.WalkContinue, nil
}

// htmlMinus replaces a leading hyphen-minus with a true minus sign.
func htmlMinus(s string) string {
	if strings.HasPrefix(s, "-") {
		return "−" + s[1:]
	}
	return s
}

func anchor(r *engine.Result) string {
	if x := r.XRef(); x != nil {
		return xrefAnchor(x)
	}
	return "res-" + r.ID
}

// xrefAnchor is the element id of a cross-reference target.
func xrefAnchor(x *engine.XRef) string {
	switch x.Kind {
	case "figure":
		return "fig-" + x.ID
	case "equation":
		return "eq-" + x.ID
	case "section":
		return "sec-" + x.ID
	}
	return "tab-" + x.ID
}

func (h *htmlNodes) writeHTMLResult(w util.BufWriter, r *engine.Result) {
	switch {
	case r.Table != nil:
		fmt.Fprintf(w, `<div class="result table" id="%s">`+"\n", html.EscapeString(anchor(r)))
		writeHTMLCaption(w, r.Label(), r.Table.Caption)
		writeHTMLTable(w, r.Table)
		writeHTMLNotes(w, r.Table.Notes)
		w.WriteString("</div>\n")
	case r.Figure != nil:
		// A figure takes the share of the column that it takes of the
		// LaTeX text block (6.5 in), so that its lettering is the same
		// size whatever width it was drawn at.
		share := 100.0
		if wi := r.Figure.Width; wi > 0 && wi < textBlockInches {
			share = 100 * wi / textBlockInches
		}
		fmt.Fprintf(w, `<figure class="result" id="%s" style="--figure-width: %.1f%%">`+"\n", html.EscapeString(anchor(r)), share)
		writeHTMLCaption(w, r.Label(), r.Figure.Caption)
		w.Write(inlineSVG(r.Figure.SVG))
		writeHTMLNotes(w, r.Figure.Notes)
		w.WriteString("</figure>\n")
	case r.Equation != nil:
		w.WriteString(`<div class="result estimated">` + "\n")
		h.writeEquation(w, ` id="`+html.EscapeString(anchor(r))+`"`, r.Equation.TeX(), r.Tag)
		if r.Equation.Stats != "" {
			w.WriteString(`<p class="eqstats">` + h.mathML(r.Equation.Stats, false) + `</p>`)
		}
		writeHTMLNotes(w, r.Equation.Notes)
		w.WriteString("</div>\n")
	case r.Text != "":
		w.WriteString("<p>" + html.EscapeString(r.Text) + "</p>\n")
	}
}

func writeHTMLCaption(w util.BufWriter, label, caption string) {
	w.WriteString(`<p class="caption"><span class="label">` + html.EscapeString(label) + `.</span>`)
	if caption != "" {
		w.WriteString(" " + html.EscapeString(caption))
	}
	w.WriteString("</p>\n")
}

func writeHTMLNotes(w util.BufWriter, notes []string) {
	if len(notes) == 0 {
		return
	}
	w.WriteString(`<div class="notes">`)
	for i, n := range notes {
		if i == 0 {
			w.WriteString("<p><em>Notes:</em> " + html.EscapeString(n) + "</p>")
		} else {
			w.WriteString("<p>" + html.EscapeString(n) + "</p>")
		}
	}
	w.WriteString("</div>\n")
}

func writeHTMLTable(w util.BufWriter, t *table.Table) {
	w.WriteString(`<table class="results">` + "\n<thead>\n")
	for _, row := range t.Head {
		w.WriteString("<tr>")
		col := 0
		for _, c := range row {
			cls := ""
			if col < t.Stub {
				cls = ` class="stub"`
			}
			span := ""
			if c.Span > 1 {
				span = fmt.Sprintf(` colspan="%d"`, c.Span)
			}
			w.WriteString("<th" + cls + span + ">" + htmlCell(c) + "</th>")
			col += max(c.Span, 1)
		}
		w.WriteString("</tr>\n")
	}
	w.WriteString("</thead>\n<tbody>\n")
	for _, row := range t.Body {
		if row.RuleAbove {
			w.WriteString(`<tr class="block">`)
		} else {
			w.WriteString("<tr>")
		}
		col := 0
		for _, c := range row.Cells {
			cls := "text"
			switch {
			case col < t.Stub:
				cls = "stub"
			case c.IsNum:
				cls = "num"
			}
			span := ""
			if c.Span > 1 {
				span = fmt.Sprintf(` colspan="%d"`, c.Span)
			}
			w.WriteString(`<td class="` + cls + `"` + span + ">" + htmlCell(c) + "</td>")
			col += max(c.Span, 1)
		}
		w.WriteString("</tr>\n")
	}
	w.WriteString("</tbody>\n</table>\n")
}

// htmlCell renders a cell. Numbers get a true minus and fixed-width
// trailing boxes — one for stars or the closing parenthesis, one for a
// bracketed suffix such as a lag count — so that right alignment lines
// the decimal points up within a column.
func htmlCell(c table.Cell) string {
	if !c.IsNum {
		if c.Sub != "" {
			return html.EscapeString(c.Text) + "<sub>" + html.EscapeString(c.Sub) + "</sub>"
		}
		return html.EscapeString(c.Text)
	}
	s, neg := table.NumText(c)
	if neg {
		s = "−" + s
	}
	var trail string
	if c.Paren {
		s = "(" + s
		trail = ")"
	}
	trail += table.Stars(c.Stars)
	out := html.EscapeString(s) + `<span class="stars">` + html.EscapeString(trail) + `</span>`
	if sfx := strings.TrimSpace(c.Suffix); sfx != "" {
		out += `<span class="sfx">` + html.EscapeString(sfx) + `</span>`
	}
	return out
}

// inlineSVG prepares a standalone SVG file for inlining in HTML: it drops
// the XML declaration and any comments before the root element, and the
// root's namespace declarations (xmlns, xmlns:xlink), which HTML's parser
// supplies itself for an inline <svg> and which would otherwise put
// http:// addresses into a page that uses no network.
func inlineSVG(b []byte) []byte {
	b = stripXMLProlog(b)
	for bytes.HasPrefix(b, []byte("<!--")) {
		i := bytes.Index(b, []byte("-->"))
		if i < 0 {
			break
		}
		b = bytes.TrimSpace(b[i+3:])
	}
	if !bytes.HasPrefix(b, []byte("<svg")) {
		return b
	}
	end := bytes.IndexByte(b, '>')
	if end < 0 {
		return b
	}
	tag := svgNamespaceAttr.ReplaceAll(b[:end], nil)
	return append(tag, b[end:]...)
}

var svgNamespaceAttr = regexp.MustCompile(`\s+xmlns(:xlink)?="[^"]*"`)

// stripXMLProlog drops an <?xml …?> declaration so that SVG can be inlined.
func stripXMLProlog(b []byte) []byte {
	if bytes.HasPrefix(b, []byte("<?xml")) {
		if i := bytes.Index(b, []byte("?>")); i >= 0 {
			return bytes.TrimSpace(b[i+2:])
		}
	}
	return b
}

// textBlockInches is the width of the LaTeX output's text block, the
// width a full-column figure is drawn at.
const textBlockInches = 6.5
