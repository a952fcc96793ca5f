package engine

import "github.com/galley-econ/galley/engine/contract"

import "github.com/galley-econ/galley/engine/table"

import (
	"errors"
	"sort"
)

// Result is what one directive produced: values for prose and the
// results file, and at most one table or figure for the document.
type Result struct {
	ID     string
	Kind   string
	Line   int            // manuscript line of the opening fence
	Spec   map[string]any // the spec as written
	Values map[string]any // full-precision values, keyed in lower case
	Table  *table.Table
	Figure *Figure
	Text   string // a paragraph of prose (rare)
	// Test is the hypothesis test the result reports, in the form every
	// consumer reads (stars, rejection, critical values); nil for
	// results that are not one test.
	Test *contract.Outcome
	// Series are the dated series the result carries for other
	// directives and figures, by name: "resid" (a regression's or a
	// long-run relation's residuals), "actual" and "fitted"; Relations
	// are estimated cointegrating relations, in order. Each is also in
	// Values in its results-file form (SetSeries keeps the two together).
	// Model is the estimated equation, for results that are one
	// (model tables and estimated equations read it).
	Model     *contract.Model
	Series    map[string]contract.Dated
	Relations []contract.Dated
	// Equation is a display equation the result typesets (an estimated
	// equation); it is numbered with the manuscript's equations.
	Equation *table.Equation
	// Cites are the keys, in galley's reference table (package bib), of
	// the published works behind the result's method and critical
	// values; with cite-methods: true in the front matter they join the
	// reference list.
	Cites  []string
	Number int // table, figure or equation number (1-based; within an appendix section there)
	// Tag is the number as printed: "3", or "A.1" in the appendix.
	Tag string
	// Hidden lists the top-level value keys whose numbers the result's
	// table does not show (nuisance values, such as the coefficients of
	// DOLS's leads and lags). Comparisons report changes among them apart
	// from the conclusions a reader can see. The keys of Series are
	// hidden without being listed.
	Hidden []string
}

// HiddenKeys is Hidden with the keys of Series, sorted, without repeats.
func (r *Result) HiddenKeys() []string {
	seen := map[string]bool{}
	var out []string
	for _, k := range r.Hidden {
		if !seen[k] {
			seen[k] = true
			out = append(out, k)
		}
	}
	for k := range r.Series {
		if !seen[k] {
			seen[k] = true
			out = append(out, k)
		}
	}
	sort.Strings(out)
	return out
}

// Caption is the caption of the result's table or figure ("" if none).
func (r *Result) Caption() string {
	switch {
	case r.Table != nil:
		return r.Table.Caption
	case r.Figure != nil:
		return r.Figure.Caption
	}
	return ""
}

// Label is "Table N", "Figure N" or "(N)" for an equation, or "" when
// there is nothing to refer to.
func (r *Result) Label() string {
	tag := r.Tag
	if tag == "" {
		tag = itoa(r.Number)
	}
	switch {
	case r.Table != nil:
		return "Table " + tag
	case r.Figure != nil:
		return "Figure " + tag
	case r.Equation != nil:
		return "(" + tag + ")"
	}
	return ""
}

// XRef is the target of a cross-reference: what it is ("table",
// "figure", "equation", "section"), its id and its number as printed.
type XRef struct {
	Kind, ID, Number string
}

// XRef is the cross-reference target of a result, or nil when it has
// nothing to refer to.
func (r *Result) XRef() *XRef {
	tag := r.Tag
	if tag == "" {
		tag = itoa(r.Number)
	}
	switch {
	case r.Table != nil:
		return &XRef{"table", r.ID, tag}
	case r.Figure != nil:
		return &XRef{"figure", r.ID, tag}
	case r.Equation != nil:
		return &XRef{"equation", r.ID, tag}
	}
	return nil
}

// Figure is a rendered figure in every format the writers need.
type Figure struct {
	Caption string
	SVG     []byte
	PDF     []byte
	// PNGAt renders the figure as PNG at a resolution in dots per inch
	// (not kept in the result cache).
	PNGAt func(dpi int) ([]byte, error)
	// PNG is the figure rendered at PNGDPI, made while the build runs when
	// PNG output is asked for, so that it survives the cache.
	PNG    []byte
	PNGDPI int
	Width  float64 // inches
	Height float64 // inches
	Notes  []string
}

// RenderPNG renders the figure as PNG at dpi dots per inch.
func (f *Figure) RenderPNG(dpi int) ([]byte, error) {
	if f.PNG != nil && f.PNGDPI == dpi {
		return f.PNG, nil
	}
	if f.PNGAt == nil {
		return nil, errNoPNG
	}
	return f.PNGAt(dpi)
}

var errNoPNG = errors.New("this figure has no PNG renderer")

// FigureFolder is the folder, relative to the output folder, that
// cmd/galley writes figures into as ID.svg, ID.pdf (and ID.png).
const FigureFolder = "figures"

// SetSeries stores a dated series under name, typed in Series and in its
// results-file form in Values.
func (r *Result) SetSeries(name string, s contract.Dated) {
	if r.Series == nil {
		r.Series = map[string]contract.Dated{}
	}
	if r.Values == nil {
		r.Values = map[string]any{}
	}
	r.Series[name] = s
	r.Values[name] = s.ResultsForm()
}

// Renderer draws a figure in a format ("svg", "pdf", "png") at a
// resolution in dots per inch (figures.Figure is one).
type Renderer interface {
	Render(format string, dpi int) ([]byte, error)
}

// DrawnFigure is the result of a figure directive: the figure's size
// (inches) in vals and, unless this is the nested build of another
// vintage (which compares values only and draws nothing), its SVG and PDF
// and their files under FigureFolder, with PNG on demand.
func DrawnFigure(c *Context, r Renderer, w, h float64, vals map[string]any, notes []string) (*Result, error) {
	vals["width"], vals["height"] = w, h
	if c.Nested() {
		return &Result{Values: vals, Figure: &Figure{Width: w, Height: h, Notes: notes}}, nil
	}
	svg, err := r.Render("svg", 0)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	pdf, err := r.Render("pdf", 0)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	id := c.ID()
	vals["files"] = map[string]any{"svg": FigureFolder + "/" + id + ".svg", "pdf": FigureFolder + "/" + id + ".pdf"}
	return &Result{Values: vals, Figure: &Figure{SVG: svg, PDF: pdf, Width: w, Height: h, Notes: notes,
		PNGAt: func(dpi int) ([]byte, error) { return r.Render("png", dpi) }}}, nil
}

// FirstSet is the first of keys the directive's YAML sets, or "".
func (c *Context) FirstSet(keys ...string) string {
	for _, k := range keys {
		if c.Has(k) {
			return k
		}
	}
	return ""
}
