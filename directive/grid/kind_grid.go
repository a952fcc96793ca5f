package grid

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"reflect"
	"slices"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
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

type gridSpec struct {
	engine.Common `yaml:",inline"`
	Of            string `yaml:"of"`
	Show          string `yaml:"show"`
	Max           *int   `yaml:"max"`
	Decimals      *int   `yaml:"decimals"`

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

func (g *gridDirective) spec() *gridSpec { return (*g)[0] }

func (g *gridDirective) Base() *engine.Common { return &g.spec().Common }

// UnmarshalYAML reads the grid's own keys and keeps the node; the target
// kind's keys are checked when the cells are built.
func (g *gridDirective) UnmarshalYAML(n *yaml.Node) error {
	s := g.spec()
	var own struct {
		engine.Common `yaml:",inline"`
		Of            string `yaml:"of"`
		Show          string `yaml:"show"`
		Max           *int   `yaml:"max"`
		Decimals      *int   `yaml:"decimals"`
	}
	if err := n.Decode(&own); err != nil {
		return err
	}
	s.Common, s.Of, s.Show, s.Max, s.Decimals = own.Common, own.Of, own.Show, own.Max, own.Decimals
	s.node = n
	return nil
}

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

// prepare checks the grid's keys and builds one cell per combination.
func (s *gridSpec) prepare(c *engine.Context) error {
	if s.ready {
		return nil
	}
	if s.node == nil {
		return c.Errorf("", "galley grid: the keys \"of\" and \"over\" are required")
	}
	if err := c.Require("of", s.Of == ""); err != nil {
		return err
	}
	if s.Of == "grid" {
		return c.Errorf("of", "a grid cannot repeat another grid; put every varied key in one over:")
	}
	k, err := engine.LookupKind(s.Of)
	if err != nil {
		return c.Wrap("of", err)
	}
	s.kind = k
	keys := kindKeys(k)
	// Keys passed to every cell must be the target kind's.
	for i := 0; i+1 < len(s.node.Content); i += 2 {
		key := s.node.Content[i]
		if slices.Contains(gridKeys, key.Value) || keys == nil || slices.Contains(keys, key.Value) {
			continue
		}
		all := append(slices.Clone(gridKeys), keys...)
		slices.Sort(all)
		return s.at(c, key, "unknown key %q in a grid of %s%s; valid keys: %s", key.Value, k.Name, manuscript.DidYouMean(key.Value, all), strings.Join(all, ", "))
	}
	if err := s.readOver(c, keys); err != nil {
		return err
	}
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
	if s.Show != "" {
		head := strings.SplitN(s.Show, ".", 2)[0]
		if f := k.Fields; f != nil && !slices.Contains(f, head) {
			return c.Errorf("show", "a %s result has no value %q%s; values: %s", k.Name, head, manuscript.DidYouMean(head, f), strings.Join(f, ", "))
		}
	} else if f := k.Fields; f != nil && !slices.Contains(f, "stat") && !slices.Contains(f, "coef") {
		return c.Errorf("", "a grid of %s needs show: to say which value to tabulate; values: %s", k.Name, strings.Join(f, ", "))
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

func (g *gridDirective) Run(c *engine.Context) (*engine.Result, error) {
	s := g.spec()
	if err := s.prepare(c); err != nil {
		return nil, err
	}
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

// shape is the table's size in combinations: rows × columns.
func (s *gridSpec) shape() (rows, cols int) {
	if len(s.over) == 1 {
		return len(s.over[0].values), 1
	}
	cols = len(s.over[len(s.over)-1].values)
	return len(s.cells) / cols, cols
}

// gridShow says which value each cell shows.
type gridShow struct {
	path  string // as written, or the default
	coef  bool   // a coefficient: estimate over its standard error
	term  string // the coefficient's term
	field string // a single field of the coefficient (est, se, t, p); "" = both
	parts []string
	test  bool // the test statistic: stars by the test's own rule
}

// gridShown is one cell's shown value.
type gridShown struct {
	missing bool // the term is not in this cell's regression
	est, se float64
	hasSE   bool
	isInt   bool // an integer value such as a lag count
	stars   int
	testRef string // e.g. "ADF"
}

var coefFields = []string{"est", "se", "t", "p"}

// resolveShow turns show: (or the kind's default) into a gridShow.
func (s *gridSpec) resolveShow(c *engine.Context, results []*engine.Result) (gridShow, error) {
	path := s.Show
	if path == "" {
		_, hasStat := results[0].Values["stat"]
		switch {
		case hasStat:
			path = "stat"
		case results[0].Values["coef"] != nil:
			term := firstTerm(results[0].Values["coef"])
			if term == "" {
				return gridShow{}, c.Errorf("", "a grid of %s needs show: to say which coefficient to tabulate, e.g. show: coef.TERM", s.kind.Name)
			}
			path = "coef." + term
		default:
			return gridShow{}, c.Errorf("", "a grid of %s needs show: to say which value to tabulate; values: %s", s.kind.Name, strings.Join(engine.Keys(results[0].Values), ", "))
		}
	}
	sh := gridShow{path: path}
	if rest, ok := strings.CutPrefix(path, "coef."); ok && rest != "" {
		sh.coef, sh.term = true, rest
		for _, f := range coefFields {
			if t, ok := strings.CutSuffix(rest, "."+f); ok && t != "" && !anyHasTerm(results, rest) {
				sh.term, sh.field = t, f
			}
		}
		if !anyHasTerm(results, sh.term) {
			terms := allTerms(results)
			key := "show"
			if s.Show == "" {
				key = ""
			}
			return sh, c.Errorf(key, "show: no cell has the term %q%s; terms: %s", sh.term, manuscript.DidYouMean(sh.term, terms), strings.Join(terms, ", "))
		}
		return sh, nil
	}
	sh.parts = strings.Split(path, ".")
	sh.test = path == "stat"
	return sh, nil
}

func firstTerm(v any) string {
	list, _ := v.([]map[string]any)
	for _, e := range list {
		if t, _ := e["term"].(string); t != "" && t != "const" {
			return t
		}
	}
	if len(list) > 0 {
		t, _ := list[0]["term"].(string)
		return t
	}
	return ""
}

func termOf(v any, term string) (map[string]any, bool) {
	list, _ := v.([]map[string]any)
	for _, e := range list {
		if t, _ := e["term"].(string); t == term {
			return e, true
		}
	}
	return nil, false
}

func anyHasTerm(results []*engine.Result, term string) bool {
	for _, r := range results {
		if _, ok := termOf(r.Values["coef"], term); ok {
			return true
		}
	}
	return false
}

func allTerms(results []*engine.Result) []string {
	var out []string
	for _, r := range results {
		list, _ := r.Values["coef"].([]map[string]any)
		for _, e := range list {
			if t, _ := e["term"].(string); t != "" && !slices.Contains(out, t) {
				out = append(out, t)
			}
		}
	}
	return out
}

// pick reads the shown value of one cell, with its stars.
func (sh gridShow) pick(c *engine.Context, cell *gridCell, r *engine.Result) (gridShown, error) {
	if sh.coef {
		e, ok := termOf(r.Values["coef"], sh.term)
		if !ok {
			return gridShown{missing: true}, nil
		}
		if sh.field != "" {
			v, _ := toFloat(e[sh.field])
			return gridShown{est: v}, nil
		}
		est, _ := toFloat(e["est"])
		se, okSE := toFloat(e["se"])
		out := gridShown{est: est, se: se, hasSE: okSE}
		if p, ok := toFloat(e["p"]); ok && !math.IsNaN(p) {
			out.stars = c.StarsFor(p)
		}
		return out, nil
	}
	v, err := engine.Lookup(r.Values, sh.parts)
	if err != nil {
		return gridShown{}, cellError(c, cell, c.Errorf("show", "show: %v", err))
	}
	x, ok := toFloat(v)
	if !ok {
		return gridShown{}, c.Errorf("show", "show: %s is %v in cell %s, not a number", sh.path, v, cell.id)
	}
	out := gridShown{est: x, isInt: isInt(v)}
	if sh.test {
		out.stars = testStars(c, r)
		out.testRef, _ = r.Values["test"].(string)
	}
	return out, nil
}

// testStars counts the star levels at which a test rejects, by the test's
// own rule: for the unit-root kinds, Outcome.stars on the cell's
// statistic and critical values; for other tests with two or more
// critical values the same rule, the tail inferred from their order (a
// lower-tail test has its 1% value below its 10% value), which uses the
// critical value at each star level it tabulates and the p-value at the
// others; with fewer, the p-value.
func testStars(c *engine.Context, r *engine.Result) int {
	if r.Test != nil {
		return r.Test.Stars(c.Stars())
	}
	v := r.Values
	stat, ok := toFloat(v["stat"])
	if !ok || math.IsNaN(stat) {
		return 0
	}
	p, hasP := toFloat(v["pvalue"])
	if !hasP {
		p = math.NaN()
	}
	crit := critFromValues(v["crit"])
	if len(crit) >= 2 {
		lo, hi := crit[0], crit[len(crit)-1] // sorted by level
		o := &contract.Outcome{Stat: stat, PValue: p, Crit: crit, Upper: lo.Value > hi.Value}
		return o.Stars(c.Stars())
	}
	if !math.IsNaN(p) {
		return c.StarsFor(p)
	}
	return 0
}

// critFromValues reads a results-file critical-value map ({"5%": -2.9})
// back into values by level.
func critFromValues(v any) []critical.Value {
	m, _ := v.(map[string]any)
	var out []critical.Value
	for k, x := range m {
		f, ok := toFloat(x)
		lev, err := strconv.ParseFloat(strings.TrimSuffix(k, "%"), 64)
		if !ok || err != nil || !strings.HasSuffix(k, "%") {
			continue
		}
		out = append(out, critical.Value{Level: lev / 100, Value: f})
	}
	slices.SortFunc(out, func(a, b critical.Value) int { return cmp.Compare(a.Level, b.Level) })
	return out
}

// toFloat reads a number from a results value.
func toFloat(v any) (float64, bool) {
	switch x := v.(type) {
	case float64:
		return x, true
	case float32:
		return float64(x), true
	case int:
		return float64(x), true
	case int64:
		return float64(x), true
	}
	return 0, false
}

func isInt(v any) bool {
	switch v.(type) {
	case int, int64:
		return true
	}
	return false
}

// table lays the cells out: rows are the combinations of every varied key
// but the last, columns the values of the last; with one varied key, one
// row per value and a single column.
func (s *gridSpec) table(sh gridShow, shown []gridShown, dec int) *table.Table {
	k := len(s.over)
	rows, cols := s.shape()
	t := &table.Table{}
	if k == 1 {
		t.Stub = 1
		t.Head = [][]table.Cell{{table.T(s.over[0].key.Value), table.T(sh.heading(shown))}}
		for r := 0; r < rows; r++ {
			t.Body = append(t.Body, sh.rows([]table.Cell{table.T(s.over[0].labels[r])}, shown[r:r+1], dec, false)...)
		}
		return t
	}
	last := s.over[k-1]
	t.Stub = k - 1
	top := make([]table.Cell, k-1)
	for i := range top {
		top[i] = table.Empty
	}
	top = append(top, table.Span(last.key.Value, cols))
	sub := make([]table.Cell, 0, k-1+cols)
	for _, a := range s.over[:k-1] {
		sub = append(sub, table.T(a.key.Value))
	}
	for _, l := range last.labels {
		sub = append(sub, table.T(l))
	}
	t.Head = [][]table.Cell{top, sub}
	var prev []int
	for r := 0; r < rows; r++ {
		idx := s.cells[r*cols].index
		stub := make([]table.Cell, k-1)
		same := prev != nil
		for a := 0; a < k-1; a++ {
			same = same && prev[a] == idx[a]
			if same {
				stub[a] = table.Empty // the same as the row above: left blank
			} else {
				stub[a] = table.T(s.over[a].labels[idx[a]])
			}
		}
		newBlock := k > 2 && prev != nil && prev[0] != idx[0]
		t.Body = append(t.Body, sh.rows(stub, shown[r*cols:(r+1)*cols], dec, newBlock)...)
		prev = idx
	}
	return t
}

// rows is one combination row: the values, and for coefficients their
// standard errors in parentheses on the row below.
func (sh gridShow) rows(stub []table.Cell, cells []gridShown, dec int, ruleAbove bool) []table.Row {
	main := table.Row{Cells: slices.Clone(stub), RuleAbove: ruleAbove}
	for _, v := range cells {
		switch {
		case v.missing:
			main.Cells = append(main.Cells, table.T(""))
		case v.isInt:
			main.Cells = append(main.Cells, table.I(int(v.est)))
		default:
			main.Cells = append(main.Cells, table.Starred(v.est, dec, v.stars))
		}
	}
	out := []table.Row{main}
	if sh.coef && sh.field == "" {
		se := table.Row{}
		for range stub {
			se.Cells = append(se.Cells, table.Empty)
		}
		for _, v := range cells {
			if v.missing || !v.hasSE {
				se.Cells = append(se.Cells, table.T(""))
			} else {
				se.Cells = append(se.Cells, table.SECell(v.se, dec))
			}
		}
		out = append(out, se)
	}
	return out
}

// heading is the column heading for a one-key grid.
func (sh gridShow) heading(shown []gridShown) string {
	switch {
	case sh.test && len(shown) > 0 && shown[0].testRef != "":
		return shown[0].testRef + " statistic"
	case sh.coef && sh.field == "":
		return sh.term
	case sh.coef:
		return sh.term + " (" + sh.field + ")"
	}
	return sh.path
}

// note explains the table in one paragraph: what each cell is and shows,
// what varies, what is common to every cell (the sentences of the kind's
// own notes that every cell shares), cell-specific warnings, and stars.
func (s *gridSpec) note(c *engine.Context, sh gridShow, shown []gridShown, results []*engine.Result) string {
	var b strings.Builder
	where := "its row and column"
	if len(s.over) == 1 {
		where = "its row"
	}
	fmt.Fprintf(&b, "Each cell is a separate %s directive with the settings of %s.", s.kind.Name, where)
	switch {
	case sh.test:
		name := "the test statistic"
		if len(shown) > 0 && shown[0].testRef != "" {
			name = "the " + shown[0].testRef + " statistic"
		}
		fmt.Fprintf(&b, " Shown: %s.", name)
	case sh.coef && sh.field == "":
		fmt.Fprintf(&b, " Shown: the coefficient on %s, with its standard error in parentheses below.", sh.term)
	case sh.coef:
		fmt.Fprintf(&b, " Shown: the %s of the coefficient on %s.", map[string]string{"est": "estimate", "se": "standard error", "t": "t-ratio", "p": "p-value"}[sh.field], sh.term)
	default:
		fmt.Fprintf(&b, " Shown: %s.", sh.path)
	}
	if slices.ContainsFunc(shown, func(v gridShown) bool { return v.missing }) {
		fmt.Fprintf(&b, " A blank cell: that regression has no term %s.", sh.term)
	}
	axis := func(a gridAxis) string { return a.key.Value + " (" + strings.Join(a.labels, "; ") + ")" }
	if len(s.over) == 1 {
		fmt.Fprintf(&b, " Varying by row: %s.", axis(s.over[0]))
	} else {
		var rowAxes []string
		for _, a := range s.over[:len(s.over)-1] {
			rowAxes = append(rowAxes, axis(a))
		}
		fmt.Fprintf(&b, " Varying by row: %s; by column: %s.", strings.Join(rowAxes, " and "), axis(s.over[len(s.over)-1]))
	}
	starNote := c.StarNote()
	per := make([][]string, len(results))
	for i, r := range results {
		var notes []string
		switch {
		case r.Table != nil:
			notes = r.Table.Notes
		case r.Figure != nil:
			notes = r.Figure.Notes
		}
		for _, n := range notes {
			for _, sen := range sentences(n) {
				if sen != starNote {
					per[i] = append(per[i], sen)
				}
			}
		}
	}
	var common []string
	for _, sen := range per[0] {
		if slices.Contains(common, sen) {
			continue
		}
		all := true
		for _, p := range per[1:] {
			all = all && slices.Contains(p, sen)
		}
		if all {
			common = append(common, sen)
		}
	}
	if len(common) > 0 {
		b.WriteString(" In every cell: " + strings.Join(common, " "))
	}
	for i, p := range per {
		for _, sen := range p {
			if strings.HasPrefix(sen, "Warning:") && !slices.Contains(common, sen) {
				fmt.Fprintf(&b, " Cell %s (%s): %s", s.cells[i].id, s.cells[i].label, sen)
			}
		}
	}
	if slices.ContainsFunc(shown, func(v gridShown) bool { return v.stars > 0 }) || sh.test || (sh.coef && sh.field == "") {
		if sh.test {
			var lv []string
			for i, l := range c.Stars() {
				lv = append(lv, contract.Pct(l)+" ("+strings.Repeat("*", i+1)+")")
			}
			fmt.Fprintf(&b, " Stars: the test rejects its null at %s, by the critical values where tabulated, else by the p-value.", strings.Join(lv, ", "))
		} else {
			b.WriteString(" " + starNote)
		}
	}
	return b.String()
}

// sentences splits a note at sentence ends (". " followed by more text).
func sentences(s string) []string {
	var out []string
	for {
		i := strings.Index(s, ". ")
		if i < 0 {
			if t := strings.TrimSpace(s); t != "" {
				out = append(out, t)
			}
			return out
		}
		out = append(out, strings.TrimSpace(s[:i+1]))
		s = s[i+2:]
	}
}
