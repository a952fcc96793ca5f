package grid

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/manuscript"
)

// combinations lists every position along the axes, the last axis
// varying fastest (so that cell r·cols + j is row r, column j).
func combinations(axes []gridAxis) [][]int {
	var out [][]int
	idx := make([]int, len(axes))
	for {
		out = append(out, slices.Clone(idx))
		a := len(axes) - 1
		for ; a >= 0; a-- {
			idx[a]++
			if idx[a] < len(axes[a].values) {
				break
			}
			idx[a] = 0
		}
		if a < 0 {
			return out
		}
	}
}

// newCell builds the YAML of one combination and decodes it strictly.
func (s *gridSpec) newCell(c *engine.Context, i int, idx []int) (*gridCell, error) {
	gridID := c.ID()
	n := &yaml.Node{Kind: yaml.MappingNode, Tag: "!!map", Line: s.node.Line, Column: s.node.Column}
	for j := 0; j+1 < len(s.node.Content); j += 2 {
		if slices.Contains(gridKeys, s.node.Content[j].Value) {
			continue
		}
		n.Content = append(n.Content, s.node.Content[j], s.node.Content[j+1])
	}
	cell := &gridCell{id: fmt.Sprintf("%s[%d]", gridID, i), index: idx, over: map[string]any{}}
	var parts []string
	for a, ax := range s.over {
		key := *ax.key
		n.Content = append(n.Content, &key, ax.values[idx[a]])
		var v any
		if err := ax.values[idx[a]].Decode(&v); err != nil {
			return nil, manuscript.YamlError(c.File(), c.Line()+1, err)
		}
		cell.over[ax.key.Value] = v
		parts = append(parts, ax.key.Value+": "+ax.labels[idx[a]])
	}
	cell.label = strings.Join(parts, ", ")
	v, err := c.NewVariant(s.kind, cell.id, n)
	if err != nil {
		return nil, cellError(c, cell, manuscript.YamlError(c.File(), c.Line()+1, err))
	}
	cell.v = v
	return cell, nil
}

// cellError names the cell in an error, keeping its manuscript line.
func cellError(c *engine.Context, cell *gridCell, err error) error {
	prefix := fmt.Sprintf("grid cell %s (%s)", cell.id, cell.label)
	var pe *manuscript.PosError
	if errors.As(err, &pe) {
		msg := prefix
		if pe.Msg != "" {
			msg += ": " + pe.Msg
		}
		return &manuscript.PosError{File: pe.File, Line: pe.Line, Msg: msg, Err: pe.Err}
	}
	return &manuscript.PosError{File: c.File(), Line: c.Line(), Msg: prefix, Err: err}
}

// nodeText is a YAML value as a short label: scalars as written, lists
// joined with commas, mappings as "key: value" pairs.
func nodeText(n *yaml.Node) string {
	switch n.Kind {
	case yaml.ScalarNode:
		return n.Value
	case yaml.SequenceNode:
		var parts []string
		for _, e := range n.Content {
			t := nodeText(e)
			if e.Kind == yaml.SequenceNode {
				t = "[" + t + "]"
			}
			parts = append(parts, t)
		}
		return strings.Join(parts, ", ")
	case yaml.MappingNode:
		var parts []string
		for i := 0; i+1 < len(n.Content); i += 2 {
			parts = append(parts, n.Content[i].Value+": "+nodeText(n.Content[i+1]))
		}
		return strings.Join(parts, ", ")
	case yaml.AliasNode:
		if n.Alias != nil {
			return nodeText(n.Alias)
		}
	}
	return n.Value
}
