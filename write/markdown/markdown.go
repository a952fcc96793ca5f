package markdown

import (
	"bytes"
	"fmt"
	"sort"
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
)

// Options tune the Markdown writer.
type Options struct {
	FigureDir string // folder of the SVG figures, relative to the .md file
}

// Write renders the document as CommonMark with pipe tables: the
// author's text is kept byte for byte, each directive block is replaced
// by its table or figure, and each inline value by its text.
func Write(d *engine.Document, o Options) ([]byte, error) {
	if o.FigureDir == "" {
		o.FigureDir = "figures"
	}
	type repl struct {
		start, end int
		text       string
	}
	var rs []repl
	spans, err := d.Spans()
	if err != nil {
		return nil, err
	}
	for _, sp := range spans {
		rs = append(rs, repl{sp.Start, sp.End, mdResult(sp.Result, o.FigureDir)})
	}
	for _, n := range d.InlineNodes() {
		t, err := d.Inline(n)
		if err != nil {
			return nil, err
		}
		s := mdEscape(t.Text)
		if t.XRef != nil {
			s = t.Text
		}
		rs = append(rs, repl{n.Offset, n.End, s})
	}
	// Display equations keep $$ … $$ with galley's number as \tag, which
	// downstream math renderers show; sections get galley's numbers; the
	// appendix marker goes.
	for _, m := range d.Outline.Equations {
		tex := "$$\n" + m.TeX
		if num := d.EquationNumber(m); num != "" {
			tex += " \\tag{" + num + "}"
		}
		rs = append(rs, repl{m.Offset, m.End, tex + "\n$$\n"})
	}
	for _, s := range d.Outline.Sections {
		end := s.TextEnd
		if nl := bytes.IndexByte(d.Body[end:], '\n'); nl >= 0 {
			end += nl
		} else {
			end = len(d.Body)
		}
		title := strings.TrimSpace(string(d.Body[s.TextStart+leading(d.Body[s.TextStart:s.TextEnd])+s.Skip : s.TextEnd]))
		if s.Number != "" {
			title = s.Number + " " + title
		}
		rs = append(rs, repl{s.TextStart, end, title})
	}
	for _, n := range d.Cites() {
		entries, err := d.Cite(n)
		if err != nil {
			return nil, err
		}
		open, parts, close := manuscript.FormatCite(n, entries)
		var b strings.Builder
		b.WriteString(mdEscape(open))
		for i, p := range parts {
			if i > 0 {
				b.WriteString(mdEscape(manuscript.CiteSeparator(n.Cmd)))
			}
			b.WriteString("[" + mdEscape(p.Text) + "](#ref-" + p.Key + ")")
		}
		b.WriteString(mdEscape(close))
		rs = append(rs, repl{n.Offset, n.End, b.String()})
	}
	if refs := mdReferences(d); refs != "" {
		at := len(d.Body)
		if d.Outline.AppendixAt >= 0 {
			at = d.Outline.AppendixAt
		}
		rs = append(rs, repl{at, at, refs})
	}
	if o := d.Outline; o.AppendixAt >= 0 && o.AppendixMarker != nil {
		end := o.MarkerEnd
		if end < len(d.Body) && d.Body[end-1] != '\n' {
			end++
		}
		rs = append(rs, repl{o.AppendixAt, end, ""})
	}
	sort.SliceStable(rs, func(i, j int) bool { return rs[i].start < rs[j].start })
	var out bytes.Buffer
	if d.Meta.Title != "" {
		out.WriteString("# " + mdEscape(d.Meta.Title) + "\n\n")
	}
	for _, a := range d.Meta.People() {
		line := "**" + mdEscape(a.Name) + "**"
		if a.Affiliation != "" {
			line += ", " + mdEscape(a.Affiliation)
		}
		if a.Email != "" {
			line += ", " + mdEscape(a.Email)
		}
		out.WriteString(line + "  \n")
	}
	if len(d.Meta.People()) > 0 {
		out.WriteString("\n")
	}
	if d.Meta.Date != "" {
		out.WriteString(mdEscape(d.Meta.Date) + "\n\n")
	}
	if d.Meta.Version != "" {
		out.WriteString("*" + mdEscape(d.Meta.Version) + "*\n\n")
	}
	if d.Meta.Abstract != "" {
		out.WriteString("**Abstract.** " + mdEscape(d.Meta.Abstract) + "\n\n")
	}
	if len(d.Meta.Keywords) > 0 {
		out.WriteString("**Keywords:** " + mdEscape(strings.Join(d.Meta.Keywords, "; ")) + "\n\n")
	}
	if len(d.Meta.JEL) > 0 {
		out.WriteString("**JEL classification:** " + mdEscape(strings.Join(d.Meta.JEL, ", ")) + "\n\n")
	}
	if d.Meta.Thanks != "" {
		out.WriteString("*" + mdEscape(d.Meta.Thanks) + "*\n\n")
	}
	pos := 0
	for _, r := range rs {
		if r.start < pos {
			continue // nested (cannot happen for well-formed input)
		}
		out.Write(d.Body[pos:r.start])
		out.WriteString(r.text)
		pos = r.end
	}
	out.Write(d.Body[pos:])
	return out.Bytes(), nil
}

func mdResult(r *engine.Result, figDir string) string {
	var b strings.Builder
	switch {
	case r.Table != nil:
		t := r.Table
		b.WriteString(mdCaption(r.Label(), t.Caption) + "\n\n")
		cols := t.Cols()
		head := mdHeader(t, cols)
		b.WriteString("| " + strings.Join(head, " | ") + " |\n|")
		for i := 0; i < cols; i++ {
			if i < t.Stub {
				b.WriteString(":---|")
			} else {
				b.WriteString("---:|")
			}
		}
		b.WriteString("\n")
		for _, row := range t.Body {
			cells := make([]string, 0, cols)
			for _, c := range row.Cells {
				cells = append(cells, mdCell(c))
				for k := 1; k < c.Span; k++ {
					cells = append(cells, "")
				}
			}
			for len(cells) < cols {
				cells = append(cells, "")
			}
			b.WriteString("| " + strings.Join(cells, " | ") + " |\n")
		}
		for _, n := range t.Notes {
			b.WriteString("\n*" + mdEscape(n) + "*\n")
		}
		b.WriteString("\n")
	case r.Figure != nil:
		fmt.Fprintf(&b, "![%s. %s](%s/%s.svg)\n\n", r.Label(), mdEscape(r.Figure.Caption), figDir, r.ID)
		b.WriteString(mdCaption(r.Label(), r.Figure.Caption) + "\n")
		for _, n := range r.Figure.Notes {
			b.WriteString("\n*" + mdEscape(n) + "*\n")
		}
		b.WriteString("\n")
	case r.Equation != nil:
		b.WriteString("$$\n" + r.Equation.TeX() + " \\tag{" + r.Tag + "}\n$$\n\n")
		if r.Equation.Stats != "" {
			b.WriteString("$" + r.Equation.Stats + "$\n\n")
		}
		for _, n := range r.Equation.Notes {
			b.WriteString("*" + mdEscape(n) + "*\n\n")
		}
	case r.Text != "":
		b.WriteString(mdEscape(r.Text) + "\n\n")
	}
	return b.String()
}

// mdReferences is the reference list, each entry with an anchor that
// the citations link to.
func mdReferences(d *engine.Document) string {
	refs := d.References()
	if len(refs) == 0 {
		return ""
	}
	var b strings.Builder
	b.WriteString("\n## References\n\n")
	for _, e := range refs {
		b.WriteString(`<a id="ref-` + e.Key + `"></a>`)
		for _, sp := range e.Reference() {
			if sp.Italic {
				b.WriteString("*" + mdEscape(sp.Text) + "*")
			} else {
				b.WriteString(mdEscape(sp.Text))
			}
		}
		b.WriteString("\n\n")
	}
	return b.String()
}

func leading(b []byte) int { return len(b) - len(bytes.TrimLeft(b, " \t")) }

// mdHeader flattens the header rows into one row of labels: a spanning
// group label is prefixed to each column it covers.
func mdHeader(t *table.Table, cols int) []string {
	out := make([]string, cols)
	for _, row := range t.Head {
		col := 0
		for _, c := range row {
			span := max(c.Span, 1)
			for k := 0; k < span && col+k < cols; k++ {
				if txt := mdEscape(c.Text); txt != "" {
					if out[col+k] != "" {
						out[col+k] += " "
					}
					out[col+k] += txt
				}
			}
			col += span
		}
	}
	return out
}

func mdCell(c table.Cell) string {
	if !c.IsNum {
		return mdEscape(c.Text) + table.UnicodeSub(c.Sub)
	}
	s, neg := table.NumText(c)
	if neg {
		s = "-" + s
	}
	if c.Paren {
		s = "(" + s + ")"
	}
	return s + strings.Repeat(`\*`, c.Stars) + mdEscape(c.Suffix)
}

var mdReplacer = strings.NewReplacer(`\`, `\\`, "&", `\&`, "*", `\*`, "_", `\_`, "|", `\|`, "`", "\\`",
	"<", `\<`, ">", `\>`, "[", `\[`, "]", `\]`, "#", `\#`, "$", `\$`, "{", `\{`, "}", `\}`)

// mdEscape makes literal text safe in CommonMark inline context.
func mdEscape(s string) string { return mdReplacer.Replace(s) }

// mdCaption is "**Table 3.** Caption", or "**Table 3**" alone for a table
// or figure without a caption (no dangling period).
func mdCaption(label, caption string) string {
	if caption == "" {
		return "**" + label + "**"
	}
	return "**" + label + ".** " + mdEscape(caption)
}
