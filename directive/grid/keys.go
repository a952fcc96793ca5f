package grid

import (
	"fmt"
	"reflect"
	"slices"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/manuscript"
)

// at is an error at a YAML node of the grid's block.
func (s *gridSpec) at(c *engine.Context, n *yaml.Node, format string, args ...any) error {
	return &manuscript.PosError{File: c.File(), Line: c.Line() + n.Line, Msg: fmt.Sprintf(format, args...)}
}

// value is the value node of a top-level key, or nil.
func (s *gridSpec) value(key string) (*yaml.Node, *yaml.Node) {
	for i := 0; i+1 < len(s.node.Content); i += 2 {
		if s.node.Content[i].Value == key {
			return s.node.Content[i], s.node.Content[i+1]
		}
	}
	return nil, nil
}

// prepare checks the grid's keys and builds one cell per combination; it
// returns the first error, at the key concerned.
func (s *gridSpec) prepare(c *engine.Context) error {
	if s.ready {
		return nil
	}
	keys, err := s.readTarget(c)
	if err != nil {
		return err
	}
	if err := s.readOver(c, keys); err != nil {
		return err
	}
	if err := s.checkCount(c); err != nil {
		return err
	}
	if err := s.checkShow(c); err != nil {
		return err
	}
	s.cells = nil
	for i, idx := range combinations(s.over) {
		cell, err := s.newCell(c, i, idx)
		if err != nil {
			return err
		}
		s.cells = append(s.cells, cell)
	}
	s.ready = true
	return nil
}

// readTarget looks up the kind named by of:, sets s.kind, and checks that
// every key passed to the cells is one of that kind's; it returns the
// kind's keys (nil when the kind checks its own).
func (s *gridSpec) readTarget(c *engine.Context) ([]string, error) {
	if s.node == nil {
		return nil, c.Errorf("", "galley grid: the keys \"of\" and \"over\" are required")
	}
	if err := c.Require("of", s.Of == ""); err != nil {
		return nil, err
	}
	if s.Of == "grid" {
		return nil, c.Errorf("of", "a grid cannot repeat another grid; put every varied key in one over:")
	}
	k, err := engine.LookupKind(s.Of)
	if err != nil {
		return nil, c.Wrap("of", err)
	}
	s.kind = k
	keys := kindKeys(k)
	// Keys passed to every cell must be the target kind's.
	for i := 0; i+1 < len(s.node.Content); i += 2 {
		key := s.node.Content[i]
		if slices.Contains(gridKeys, key.Value) || keys == nil || slices.Contains(keys, key.Value) {
			continue
		}
		if now, was := formerKey(k, key.Value); was {
			return nil, s.at(c, key, "the key %q of %s is now called %q", key.Value, k.Name, now)
		}
		all := append(slices.Clone(gridKeys), keys...)
		slices.Sort(all)
		return nil, s.at(c, key, "unknown key %q in a grid of %s%s; valid keys: %s", key.Value, k.Name, manuscript.DidYouMean(key.Value, all), strings.Join(all, ", "))
	}
	return keys, nil
}

// checkCount returns an error when the combinations of over: outnumber
// max: (default gridDefaultMax), giving the count.
func (s *gridSpec) checkCount(c *engine.Context) error {
	limit := gridDefaultMax
	if s.Max != nil {
		if *s.Max < 1 {
			return c.Errorf("max", "max must be at least 1")
		}
		limit = *s.Max
	}
	count, sizes := 1, make([]string, len(s.over))
	for i, a := range s.over {
		count *= len(a.values)
		sizes[i] = strconv.Itoa(len(a.values))
	}
	if count > limit {
		key := "over"
		if s.Max != nil {
			key = "max"
		}
		return c.Errorf(key, "the grid has %d cells (%s), more than the %d allowed; set max: %d or more to run it", count, strings.Join(sizes, " × "), limit, count)
	}
	return nil
}

// checkShow returns an error when show: names a value the target kind
// does not have, or is left out for a kind with neither a statistic nor
// coefficients to show by default.
func (s *gridSpec) checkShow(c *engine.Context) error {
	k := s.kind
	if s.Show != "" {
		head := strings.SplitN(s.Show, ".", 2)[0]
		if f := k.Fields; f != nil && !slices.Contains(f, head) {
			return c.Errorf("show", "a %s result has no value %q%s; values: %s", k.Name, head, manuscript.DidYouMean(head, f), strings.Join(f, ", "))
		}
	} else if f := k.Fields; f != nil && !slices.Contains(f, "stat") && !slices.Contains(f, "coef") {
		return c.Errorf("", "a grid of %s needs show: to say which value to tabulate; values: %s", k.Name, strings.Join(f, ", "))
	}
	return nil
}

// kindKeys lists the YAML keys of a kind's spec, without the common ones;
// nil when the spec is not a struct (then cells check their own keys).
func kindKeys(k *engine.Kind) []string {
	t := reflect.TypeOf(k.New())
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	if t.Kind() != reflect.Struct {
		return nil
	}
	var out []string
	for name := range manuscript.YamlFields(t) {
		if name != "id" && name != "caption" && name != "note" {
			out = append(out, name)
		}
	}
	slices.Sort(out)
	return out
}

// formerKey returns the current name of a retired key of kind k (see
// manuscript.FormerKeys).
func formerKey(k *engine.Kind, key string) (string, bool) {
	now, was := manuscript.FormerKeys(reflect.TypeOf(k.New()))[key]
	return now, was
}

// readOver reads the over: mapping: each key a key of the target kind,
// each value a non-empty list.
func (s *gridSpec) readOver(c *engine.Context, keys []string) error {
	key, n := s.value("over")
	if n == nil {
		return c.Errorf("", "galley grid: the key \"over\" is required: a mapping of keys to lists of values, e.g. over: {lags: [1, 2, 4]}")
	}
	if n.Kind != yaml.MappingNode || len(n.Content) == 0 {
		return s.at(c, key, "over: write a mapping of %s keys to lists of values, e.g. over: {lags: [1, 2, 4]}", s.kind.Name)
	}
	s.over = nil
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		if now, was := formerKey(s.kind, k.Value); was {
			return s.at(c, k, "over: the key %q of %s is now called %q", k.Value, s.kind.Name, now)
		}
		if keys != nil && !slices.Contains(keys, k.Value) {
			return s.at(c, k, "over: a %s directive has no key %q%s; its keys: %s", s.kind.Name, k.Value, manuscript.DidYouMean(k.Value, keys), strings.Join(keys, ", "))
		}
		if slices.Contains(gridKeys, k.Value) {
			return s.at(c, k, "over: %q is a key of the grid itself and cannot vary", k.Value)
		}
		if fk, _ := s.value(k.Value); fk != nil {
			return s.at(c, k, "over: %q is also fixed on line %d; give it in one place", k.Value, c.Line()+fk.Line)
		}
		if v.Kind != yaml.SequenceNode {
			return s.at(c, k, "over: %s: give a list of values, e.g. %s: [%s, ...]", k.Value, k.Value, nodeText(v))
		}
		if len(v.Content) == 0 {
			return s.at(c, k, "over: %s: the list of values is empty", k.Value)
		}
		a := gridAxis{key: k, values: v.Content}
		for _, e := range v.Content {
			a.labels = append(a.labels, nodeText(e))
		}
		for j, l := range a.labels {
			if slices.Index(a.labels, l) != j {
				return s.at(c, v.Content[j], "over: %s: the value %s is listed twice", k.Value, l)
			}
		}
		s.over = append(s.over, a)
	}
	return nil
}
