package grid

import (
	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/engine"
)

// grid: one directive of another kind repeated over every combination of
// a few of its settings, laid out as one robustness table.
//
//	of: adf
//	series: log(realgdp)
//	over: {lags: [1, 2, 4], det: [c, ct]}
//
// Each combination becomes a cell: the grid's YAML without the grid's own
// keys, with the varied keys set, decoded strictly into the target kind's
// spec and run through that kind's own Check and Run.

// gridKeys are the keys the grid keeps for itself; every other key is
// passed to each cell.
var gridKeys = []string{"id", "caption", "note", "of", "over", "show", "max", "decimals"}

// gridDefaultMax is the default largest number of cells.
const gridDefaultMax = 50

// gridDirective is the grid's Directive. It is a one-element slice on
// purpose rather than a struct: the parser's key check compares a
// struct's YAML fields with a block's keys, and most of a grid's keys
// belong to the kind it repeats. The grid checks those keys itself,
// against that kind (see gridSpec.prepare).
type gridDirective []*gridSpec

// ownKeys are the grid's own keys that it decodes (over: is read from the
// node); the rest of its block belongs to the kind it repeats.
type ownKeys struct {
	engine.Common `yaml:",inline"`
	Of            string `yaml:"of"`
	Show          string `yaml:"show"`
	Max           *int   `yaml:"max"`
	Decimals      *int   `yaml:"decimals"`
}

type gridSpec struct {
	ownKeys

	node  *yaml.Node // the block's YAML mapping
	over  []gridAxis
	cells []*gridCell
	kind  *engine.Kind
	ready bool
}

// gridAxis is one varied key and its values, as written.
type gridAxis struct {
	key    *yaml.Node
	values []*yaml.Node
	labels []string
}

// gridCell is one combination.
type gridCell struct {
	id    string
	index []int // position along each axis
	over  map[string]any
	label string          // "lags: 2, det: ct"
	v     *engine.Variant // the cell as a directive of the target kind
}

func init() {
	engine.Register(engine.Kind{
		Name:    "grid",
		Summary: "one directive repeated over combinations of its settings, as one robustness table",
		New:     func() engine.Directive { return &gridDirective{&gridSpec{}} },
		Fields:  []string{"cells", "shape", "of", "show"},
	})
}

// spec returns the grid's one spec.
func (g *gridDirective) spec() *gridSpec { return (*g)[0] }

// Base returns the grid's common keys.
func (g *gridDirective) Base() *engine.Common { return &g.spec().Common }

// UnmarshalYAML reads the grid's own keys and keeps the node; the target
// kind's keys are checked when the cells are built.
func (g *gridDirective) UnmarshalYAML(n *yaml.Node) error {
	s := g.spec()
	var own ownKeys
	if err := n.Decode(&own); err != nil {
		return err
	}
	s.ownKeys = own
	s.node = n
	return nil
}

// Check builds the cells and returns the first error of any cell's own
// Check, naming the cell.
func (g *gridDirective) Check(c *engine.Context) error {
	s := g.spec()
	if err := s.prepare(c); err != nil {
		return err
	}
	for _, cell := range s.cells {
		err := c.InVariant(cell.v, func(cc *engine.Context) error { return cell.v.Dir().Check(cc) })
		if err != nil {
			return cellError(c, cell, err)
		}
	}
	return nil
}

// Run runs every cell and returns the grid's table (one shown value a
// cell, with its note) and values (every cell's full values).
func (g *gridDirective) Run(c *engine.Context) (*engine.Result, error) {
	s := g.spec()
	if err := s.prepare(c); err != nil {
		return nil, err
	}
	results, err := s.runCells(c)
	if err != nil {
		return nil, err
	}
	show, err := s.resolveShow(c, results)
	if err != nil {
		return nil, err
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	shown := make([]gridShown, len(s.cells))
	for i, cell := range s.cells {
		if shown[i], err = show.pick(c, cell, results[i]); err != nil {
			return nil, err
		}
	}
	t := s.table(show, shown, dec)
	t.Notes = []string{s.note(c, show, shown, results)}
	cells := make([]map[string]any, len(s.cells))
	for i, cell := range s.cells {
		cells[i] = map[string]any{"over": cell.over, "values": results[i].Values}
	}
	rows, cols := s.shape()
	vals := map[string]any{
		"of":    s.kind.Name,
		"show":  show.path,
		"shape": map[string]any{"rows": rows, "cols": cols},
		"cells": cells,
	}
	return &engine.Result{Table: t, Values: vals}, nil
}

// runCells runs each cell as a directive of the target kind and returns
// the results in cell order, each with the cell's id, kind, line and spec.
func (s *gridSpec) runCells(c *engine.Context) ([]*engine.Result, error) {
	results := make([]*engine.Result, len(s.cells))
	for i, cell := range s.cells {
		var res *engine.Result
		err := c.InVariant(cell.v, func(cc *engine.Context) error {
			var err error
			res, err = cc.RunSafely(cell.v.Dir())
			return err
		})
		if err != nil {
			return nil, cellError(c, cell, err)
		}
		res.ID, res.Kind, res.Line, res.Spec = cell.id, s.kind.Name, c.Line(), cell.v.Raw()
		if res.Values == nil {
			res.Values = map[string]any{}
		}
		results[i] = res
	}
	return results, nil
}
