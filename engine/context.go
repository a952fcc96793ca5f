package engine

import (
	"errors"
	"fmt"
	"slices"
	"strings"
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
	return &PosError{File: c.doc.File, Line: line, Msg: fmt.Sprintf(format, args...)}
}

// Wrap attaches the line of key to err (unless err already has a position).
func (c *Context) Wrap(key string, err error) error {
	if err == nil {
		return nil
	}
	var pe *PosError
	if errors.As(err, &pe) {
		return err
	}
	return &PosError{File: c.doc.File, Line: c.doc.keyLine(c.b, key), Err: err}
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
		parts = append(parts, fmt.Sprintf("%s p < %s", strings.Repeat("*", i+1), pct(t)))
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
		return nil, &PosError{File: c.doc.File, Line: c.doc.keyLine(c.b, key), Msg: fmt.Sprintf("%q could not be computed (see the error on line %d)", id, b.line), Err: errUpstream}
	}
	return res, nil
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
		return nil, c.Errorf(key, "no directive has id %q%s", id, didYouMean(id, c.doc.ids()))
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

// pct formats a probability as a percentage: 0.05 → "5%", 0.025 → "2.5%".
func pct(p float64) string {
	return strings.TrimSuffix(strings.TrimRight(fmt.Sprintf("%.4f", p*100), "0"), ".") + "%"
}
