package engine

import (
	"fmt"
	"net/url"
	"sort"
	"strings"

	"github.com/yuin/goldmark/ast"

	"github.com/galley-econ/galley/manuscript"
)

// Anchor is something in the manuscript's own text that prose can refer
// to by id: a display equation (\label{id}) or a section ({#id}).
type Anchor struct {
	Kind   string // "equation" or "section"
	ID     string
	Line   int
	Number string // "3", "A.1"; "" for an unnumbered heading
	// Appendix: a top-level appendix section (its label is "Appendix A").
	Appendix bool
	Math     *manuscript.MathBlock
	Section  *manuscript.Section
}

// Label is how prose refers to the anchor: "(3)", "Section 2",
// "Section 2.1", "Appendix A".
func (a *Anchor) Label() string {
	switch {
	case a.Kind == "equation":
		return "(" + a.Number + ")"
	case a.Appendix:
		return "Appendix " + a.Number
	}
	return "Section " + a.Number
}

// XRef is the anchor as a cross-reference target.
func (a *Anchor) XRef() *XRef { return &XRef{a.Kind, a.ID, a.Number} }

// EquationNumber is the number of a display equation as printed ("" if
// it is unnumbered), after Run.
func (d *Document) EquationNumber(m *manuscript.MathBlock) string { return d.eqNumbers[m] }

// Section is galley's numbering of a heading node (nil for another node).
func (d *Document) Section(h ast.Node) *manuscript.Section { return d.Outline.SectionOf(h) }

// scanText checks the manuscript's own text while it is parsed: math
// that could reach outside the formula, display-equation and section
// ids, citations, and image paths. It fills d.anchors and d.cites.
func (d *Document) scanText() []error {
	var errs []error
	d.Outline = manuscript.BuildOutline(d.Root, d.Body)
	d.anchors = map[string]*Anchor{}
	addAnchor := func(a *Anchor) {
		if !ValidID(a.ID) {
			errs = append(errs, manuscript.ErrAt(d.File, a.Line, "id %q: use letters, digits, '_' and '-', starting with a letter", a.ID))
			return
		}
		if prev, dup := d.anchors[a.ID]; dup {
			errs = append(errs, manuscript.ErrAt(d.File, a.Line, "duplicate id %q (first used on line %d)", a.ID, prev.Line))
			return
		}
		d.anchors[a.ID] = a
	}
	for _, s := range d.Outline.Sections {
		if s.ID != "" {
			addAnchor(&Anchor{Kind: "section", ID: s.ID, Line: d.LineOf(s.Offset), Number: s.Number, Appendix: s.Appendix && s.Level == 1, Section: s})
		}
	}
	_ = ast.Walk(d.Root, func(n ast.Node, entering bool) (ast.WalkStatus, error) {
		if !entering {
			return ast.WalkContinue, nil
		}
		switch n := n.(type) {
		case *manuscript.MathNode:
			if err := manuscript.CheckTeX(n.TeX); err != nil {
				errs = append(errs, manuscript.ErrAt(d.File, d.LineOf(n.Offset), "%v", err))
			}
		case *manuscript.MathBlock:
			line := d.LineOf(n.Offset)
			switch {
			case !n.Closed:
				errs = append(errs, manuscript.ErrAt(d.File, line, "display math opened with $$ is not closed; end it with a line that ends in $$"))
			case n.LabelErr != "":
				errs = append(errs, manuscript.ErrAt(d.File, line, "%s", n.LabelErr))
			case strings.TrimSpace(n.TeX) == "":
				errs = append(errs, manuscript.ErrAt(d.File, line, "display math between $$ lines is empty"))
			}
			if err := manuscript.CheckTeX(n.TeX); err != nil {
				errs = append(errs, manuscript.ErrAt(d.File, line, "%v", err))
			}
			if n.ID != "" {
				addAnchor(&Anchor{Kind: "equation", ID: n.ID, Line: line, Math: n})
			}
		case *manuscript.CiteNode:
			d.cites = append(d.cites, n)
		case *ast.Image:
			if err := d.checkImage(string(n.Destination)); err != nil {
				errs = append(errs, manuscript.ErrAt(d.File, d.lineOfNode(n), "image %q: %v", n.Destination, err))
			}
		}
		return ast.WalkContinue, nil
	})
	for id, a := range d.anchors {
		if b, ok := d.byID[id]; ok {
			errs = append(errs, manuscript.ErrAt(d.File, a.Line, "duplicate id %q (a directive on line %d has it)", id, b.line))
		}
	}
	sort.SliceStable(errs, func(i, j int) bool { return errLine(errs[i]) < errLine(errs[j]) })
	return errs
}

func errLine(err error) int {
	if pe, ok := err.(*manuscript.PosError); ok {
		return pe.Line
	}
	return 0
}

// lineOfNode is the file line of an inline node: that of the first line
// of the block holding it.
func (d *Document) lineOfNode(n ast.Node) int {
	for p := n; p != nil; p = p.Parent() {
		if p.Type() == ast.TypeBlock && p.Lines().Len() > 0 {
			return d.LineOf(p.Lines().At(0).Start)
		}
	}
	return d.BodyLine
}

// checkImage confines an image to the manuscript's folder tree like a
// data path: no address on the network (the page must not fetch), no
// absolute path, nothing outside the folder.
func (d *Document) checkImage(dest string) error {
	if u, err := url.Parse(dest); err == nil && (u.Scheme != "" || u.Host != "") {
		return fmt.Errorf("images must be files in the manuscript's folder, not addresses (%s:)", u.Scheme)
	}
	if strings.ContainsAny(dest, "\\{}%#$&~^") {
		return fmt.Errorf("an image path may not contain \\ { } %% # $ & ~ ^")
	}
	_, err := confine(d.Dir, dest, d.opts.AllowOutside)
	return err
}

// number numbers tables, figures and equations in document order: 1, 2,
// … in the body, and A.1, A.2, … within each appendix section.
func (d *Document) number() {
	type item struct {
		off int
		b   *block
		m   *manuscript.MathBlock
	}
	var items []item
	for _, b := range d.blocks {
		items = append(items, item{off: b.startOff, b: b})
	}
	for _, m := range d.Outline.Equations {
		if m.Numbered {
			items = append(items, item{off: m.Offset, m: m})
		}
	}
	sort.SliceStable(items, func(i, j int) bool { return items[i].off < items[j].off })
	counts := map[string]int{} // by kind and appendix section
	next := func(kind string, off int) (int, string) {
		sec := d.Outline.AppendixSection(off)
		counts[kind+"/"+sec]++
		n := counts[kind+"/"+sec]
		if sec != "" {
			return n, sec + "." + itoa(n)
		}
		return n, itoa(n)
	}
	d.eqNumbers = map[*manuscript.MathBlock]string{}
	for _, it := range items {
		if it.m != nil {
			_, tag := next("equation", it.off)
			d.eqNumbers[it.m] = tag
			if it.m.ID != "" {
				d.anchors[it.m.ID].Number = tag
			}
			continue
		}
		r := it.b.result
		if r == nil {
			continue
		}
		switch {
		case r.Table != nil:
			r.Number, r.Tag = next("table", it.off)
		case r.Figure != nil:
			r.Number, r.Tag = next("figure", it.off)
			r.Values["number"] = r.Number
		case r.Equation != nil:
			r.Number, r.Tag = next("equation", it.off)
		}
	}
}

// refIDs lists every id prose can refer to: directives, equations and
// sections.
func (d *Document) refIDs() []string {
	out := d.ids()
	for id := range d.anchors {
		out = append(out, id)
	}
	sort.Strings(out)
	return out
}
