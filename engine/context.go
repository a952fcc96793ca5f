package engine

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/manuscript"
)

// Context is what a directive sees while it is checked or run: its own
// position in the manuscript, the document's defaults, the data, and the
// results of other directives.
type Context struct {
	doc *Document
	b   *block
}

// File is the manuscript path.
func (c *Context) File() string { return c.doc.File }

// ID is the directive's id.
func (c *Context) ID() string { return c.b.id }

// Errorf is an error at the line of key in this directive's YAML (or at
// the fence when key is "" or absent).
func (c *Context) Errorf(key, format string, args ...any) error {
	line := c.b.line
	if key != "" {
		line = c.doc.keyLine(c.b, key)
	}
	return &manuscript.PosError{File: c.doc.File, Line: line, Msg: fmt.Sprintf(format, args...)}
}

// Wrap attaches the line of key to err (unless err already has a position).
func (c *Context) Wrap(key string, err error) error {
	if err == nil {
		return nil
	}
	var pe *manuscript.PosError
	if errors.As(err, &pe) {
		return err
	}
	return &manuscript.PosError{File: c.doc.File, Line: c.doc.keyLine(c.b, key), Err: err}
}

// Has reports whether the directive's YAML sets key.
func (c *Context) Has(key string) bool {
	if c.b.node == nil {
		return false
	}
	for i := 0; i+1 < len(c.b.node.Content); i += 2 {
		if c.b.node.Content[i].Value == key {
			return true
		}
	}
	return false
}

// Require returns an error at the fence when a required key is empty.
func (c *Context) Require(key string, empty bool) error {
	if empty {
		return c.Errorf("", "galley %s: the key %q is required", c.b.kind.Name, key)
	}
	return nil
}

// Stars are the significance thresholds, largest first (default 10%, 5%, 1%).
func (c *Context) Stars() []float64 {
	if s := c.doc.Meta.Stars; len(s) > 0 {
		out := slices.Clone(s)
		slices.Sort(out)
		slices.Reverse(out)
		return out
	}
	return []float64{0.10, 0.05, 0.01}
}

// StarsFor is the number of stars for a p-value.
func (c *Context) StarsFor(p float64) int {
	n := 0
	for _, t := range c.Stars() {
		if p < t {
			n++
		}
	}
	return n
}

// StarNote is the table note that explains the stars.
func (c *Context) StarNote() string {
	var parts []string
	for i, t := range c.Stars() {
		parts = append(parts, fmt.Sprintf("%s p < %s", strings.Repeat("*", i+1), contract.Pct(t)))
	}
	return strings.Join(parts, ", ") + "."
}

// Decimals is the document's default number of decimals (3).
func (c *Context) Decimals() int {
	if c.doc.Meta.Decimals != nil {
		return *c.doc.Meta.Decimals
	}
	return 3
}

// Result returns the result of the directive with the given id, running it
// first if needed. If kinds are given, the target must be one of them.
func (c *Context) Result(key, id string, kinds ...string) (*Result, error) {
	b, err := c.refBlock(key, id, kinds...)
	if err != nil {
		return nil, err
	}
	c.b.deps.up(id)
	res, err := c.doc.run(b)
	if err != nil {
		return nil, &manuscript.PosError{File: c.doc.File, Line: c.doc.keyLine(c.b, key), Msg: fmt.Sprintf("%q could not be computed (see the error on line %d)", id, b.line), Err: errUpstream}
	}
	return res, nil
}

// Upstream returns the directive with the given id without running it,
// for reading what it declares through a contract interface (such as
// RelationSource). If kinds are given, the target must be one of them.
func (c *Context) Upstream(key, id string, kinds ...string) (Directive, error) {
	b, err := c.refBlock(key, id, kinds...)
	if err != nil {
		return nil, err
	}
	return b.dir, nil
}

// CheckRefWhere validates a reference to a directive whose kind
// satisfies ok (a capability its registration declares, such as
// Kind.Model), without running it; the error names the kinds that do.
func (c *Context) CheckRefWhere(key, id string, ok func(*Kind) bool) error {
	b, err := c.refBlock(key, id)
	if err != nil {
		return err
	}
	if !ok(b.kind) {
		var names []string
		for _, k := range Kinds() {
			if ok(k) {
				names = append(names, k.Name)
			}
		}
		return c.Errorf(key, "%q is a %s result (line %d); this needs %s", id, b.kind.Name, b.line, strings.Join(names, " or "))
	}
	return nil
}

// CheckRef validates a reference to another directive without running it.
func (c *Context) CheckRef(key, id string, kinds ...string) error {
	_, err := c.refBlock(key, id, kinds...)
	return err
}

// RefKind is the kind of the directive with the given id ("" if none).
func (c *Context) RefKind(id string) string {
	if b, ok := c.doc.byID[id]; ok {
		return b.kind.Name
	}
	return ""
}

func (c *Context) refBlock(key, id string, kinds ...string) (*block, error) {
	if id == "" {
		return nil, c.Errorf(key, "galley %s: the key %q is required", c.b.kind.Name, key)
	}
	b, ok := c.doc.byID[id]
	if !ok {
		return nil, c.Errorf(key, "no directive has id %q%s", id, manuscript.DidYouMean(id, c.doc.ids()))
	}
	if b == c.b {
		return nil, c.Errorf(key, "a directive cannot refer to itself")
	}
	if len(kinds) > 0 && !slices.Contains(kinds, b.kind.Name) {
		return nil, c.Errorf(key, "%q is a %s result (line %d); this needs %s", id, b.kind.Name, b.line, strings.Join(kinds, " or "))
	}
	return b, nil
}

func (d *Document) ids() []string {
	var out []string
	for _, b := range d.blocks {
		out = append(out, b.id)
	}
	return out
}

// Line is the manuscript line of the directive's opening fence.
func (c *Context) Line() int { return c.b.line }

// Missing is the directive's missing-value rule ("", "error" or "drop").
func (c *Context) Missing() string { return c.b.dir.Base().Missing }

// RunSafely runs dir in this context, turning a panic inside the
// analysis into an error at the directive's line.
func (c *Context) RunSafely(dir Directive) (*Result, error) { return safeRun(dir, c) }

// Variant is a directive decoded from YAML that the engine built rather
// than the manuscript (a grid cell): it runs in the place of the
// directive that made it, with that directive's line and dependencies.
type Variant struct{ b *block }

// Dir is the variant's decoded directive.
func (v *Variant) Dir() Directive { return v.b.dir }

// Raw is the variant's spec as a plain map (for the results file).
func (v *Variant) Raw() map[string]any { return v.b.raw }

// NewVariant decodes n strictly as a directive of kind k with the given id.
// The error is a YAML or key error without a position.
func (c *Context) NewVariant(k *Kind, id string, n *yaml.Node) (*Variant, error) {
	dir := k.New()
	if err := manuscript.CheckKeys(n, dir); err != nil {
		return nil, err
	}
	if err := n.Decode(dir); err != nil {
		return nil, err
	}
	var raw map[string]any
	if err := n.Decode(&raw); err != nil {
		return nil, err
	}
	// The variant is this directive's own block with the variant's kind,
	// id, YAML and spec; everything else (the position, and whatever a
	// build records about a block while it runs) stays this directive's:
	// see InVariant.
	cb := *c.b
	cb.kind, cb.id, cb.node, cb.raw, cb.dir = k, id, n, raw, dir
	cb.result, cb.err = nil, nil
	return &Variant{b: &cb}, nil
}

// InVariant runs f with a Context for v. Whatever the build records on
// the block while f runs (such as the data it read) is carried back to
// this directive's block, so that it depends on everything its variants
// use.
func (c *Context) InVariant(v *Variant, f func(*Context) error) error {
	own := c.b
	cb := *own
	cb.kind, cb.id, cb.node, cb.raw, cb.dir = v.b.kind, v.b.id, v.b.node, v.b.raw, v.b.dir
	cb.result, cb.err = nil, nil
	cc := *c
	cc.b = &cb
	err := f(&cc)
	kept := *own
	*own = cb
	own.kind, own.id, own.node, own.raw, own.dir = kept.kind, kept.id, kept.node, kept.raw, kept.dir
	own.result, own.err, own.running = kept.result, kept.err, kept.running
	return err
}

// ItemLine is the manuscript line of entry i of the list under key
// (the key's own line if there is no such entry).
func (c *Context) ItemLine(key string, i int) int {
	line := c.doc.keyLine(c.b, key)
	n := c.b.node
	if n == nil {
		return line
	}
	for j := 0; j+1 < len(n.Content); j += 2 {
		if n.Content[j].Value == key {
			v := n.Content[j+1]
			if v.Kind == yaml.SequenceNode && i < len(v.Content) {
				return c.b.line + v.Content[i].Line
			}
		}
	}
	return line
}

// ItemErrorf is an error at entry i of the list under key.
func (c *Context) ItemErrorf(key string, i int, format string, args ...any) error {
	return &manuscript.PosError{File: c.doc.File, Line: c.ItemLine(key, i), Msg: fmt.Sprintf(format, args...)}
}

// Kind is the directive's kind name.
func (c *Context) Kind() string { return c.b.kind.Name }

// Nested reports whether this build is the nested build of another data
// vintage made by a revision directive (figures are not drawn there).
func (c *Context) Nested() bool { return c.doc.opts.nested }

// HasVintage reports whether some data alias names the vintage.
func (c *Context) HasVintage(name string) bool {
	for _, ref := range c.doc.Meta.Data {
		if _, ok := ref.Vintage[name]; ok {
			return true
		}
	}
	return false
}

// Live returns the directive with the given id once it has run in this
// build. A result reused from the cache leaves its directive without the
// working state (an estimated system, say) that a contract interface such
// as contract.SystemSource hands on, so Live runs it once more when its
// result was reused; its values are those already cached, only the state
// is wanted. If kinds are given, the target must be one of them.
func (c *Context) Live(key, id string, kinds ...string) (Directive, error) {
	if _, err := c.Result(key, id, kinds...); err != nil {
		return nil, err
	}
	b := c.doc.byID[id]
	if b.reused && !b.live {
		if _, err := safeRun(b.dir, &Context{doc: c.doc, b: b}); err != nil {
			return nil, &manuscript.PosError{File: c.doc.File, Line: c.doc.keyLine(c.b, key), Msg: fmt.Sprintf("%q could not be computed again", id), Err: err}
		}
		b.live = true
	}
	return b.dir, nil
}

// RunAllExcept runs every directive not of the given kind first and makes
// this directive depend on all of them (a report that compares the whole
// build). The error names the line of the first that failed.
func (c *Context) RunAllExcept(kind string) error {
	c.b.deps.col(directivesDep, "")
	for _, b := range c.doc.blocks {
		if b.kind.Name == kind {
			continue
		}
		c.b.deps.up(b.id)
		if _, err := c.doc.run(b); err != nil {
			return c.Errorf("", "the paper must build before it can be compared (see line %d)", b.line)
		}
	}
	return nil
}

// ParseVintage reads the manuscript again for another data vintage, as a
// nested build (no progress, no PNG, figures not drawn; Run builds it),
// and makes this directive depend on that vintage's files.
func (c *Context) ParseVintage(vintage string) (*Document, error) {
	d := c.doc
	for _, ref := range d.Meta.Data {
		if p, ok := ref.Vintage[vintage]; ok {
			c.b.deps.col("file:"+p, "")
		}
	}
	opts := d.opts
	opts.Vintage, opts.nested, opts.Progress, opts.PNG = vintage, true, nil, 0
	return ParseBytes(d.File, d.src, opts)
}

// Vintage is the data vintage this document was built on ("" = default).
func (d *Document) Vintage() string { return d.opts.Vintage }

// Document is the document being built.
func (c *Context) Document() *Document { return c.doc }
