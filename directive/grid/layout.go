package grid

import (
	"slices"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
)

// shape is the table's size in combinations: rows × columns.
func (s *gridSpec) shape() (rows, cols int) {
	if len(s.over) == 1 {
		return len(s.over[0].values), 1
	}
	cols = len(s.over[len(s.over)-1].values)
	return len(s.cells) / cols, cols
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
		a := s.over[0]
		t.Head = [][]table.Cell{{table.T(keyHeader(a.key.Value)), table.T(sh.heading(shown))}}
		for r := 0; r < rows; r++ {
			t.Body = append(t.Body, sh.rows([]table.Cell{table.T(a.label(r))}, shown[r:r+1], dec, false)...)
		}
		return t
	}
	last := s.over[k-1]
	t.Stub = k - 1
	top := make([]table.Cell, k-1)
	for i := range top {
		top[i] = table.Empty
	}
	top = append(top, table.Span(keyHeader(last.key.Value), cols))
	sub := make([]table.Cell, 0, k-1+cols)
	for _, a := range s.over[:k-1] {
		sub = append(sub, table.T(keyHeader(a.key.Value)))
	}
	for i := range last.labels {
		sub = append(sub, table.T(last.label(i)))
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
				stub[a] = table.T(s.over[a].label(idx[a]))
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

// label is the header of the axis's i-th value (valueLabel).
func (a gridAxis) label(i int) string { return valueLabel(a.key.Value, a.labels[i]) }

// heading is the column heading for a one-key grid.
func (sh gridShow) heading(shown []gridShown) string {
	switch {
	case sh.test && len(shown) > 0 && shown[0].testRef != "":
		return shown[0].testRef + " statistic"
	case sh.coef && sh.field == "":
		return engine.TermText(sh.term)
	case sh.coef:
		return engine.TermText(sh.term) + " (" + sh.field + ")"
	}
	return showWords(sh.parts)
}
