package dynamics

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/vardyn"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
)

// sharesSpec is the variance-shares kind: the forecast-error variance
// decomposition, one block of rows (horizons) per series, one column per
// shock, in percent.
type sharesSpec struct {
	engine.Common `yaml:",inline"`
	SourceKeys    `yaml:",inline"`
	Horizons      []int    `yaml:"horizons"`
	Order         []string `yaml:"order"`
	Decimals      *int     `yaml:"decimals"`
}

func (s *sharesSpec) horizons() []int {
	if len(s.Horizons) == 0 {
		return []int{1, 4, 8, 12, 20}
	}
	return s.Horizons
}

func (s *sharesSpec) Check(c *engine.Context) error {
	if err := s.SourceKeys.check(c); err != nil {
		return err
	}
	prev := 0
	for i, h := range s.horizons() {
		if h < 1 || h > 200 {
			return c.ItemErrorf("horizons", i, "horizons: %d is outside 1–200 (the h-step forecast error)", h)
		}
		if h <= prev {
			return c.ItemErrorf("horizons", i, "horizons: list them increasing (%d after %d)", h, prev)
		}
		prev = h
	}
	return nil
}

func (s *sharesSpec) Run(c *engine.Context) (*engine.Result, error) {
	m, err := s.fit(c)
	if err != nil {
		return nil, err
	}
	k := len(m.names)
	var order []int
	if len(s.Order) > 0 {
		if len(s.Order) != k {
			return nil, c.Errorf("order", "order: name all %d series, first the one whose shock moves the others on impact", k)
		}
		if order, err = seriesIndices(c, "order", s.Order, m.names); err != nil {
			return nil, err
		}
	}
	hs := s.horizons()
	hmax := hs[len(hs)-1]
	theta, err := vardyn.Responses{Horizon: hmax - 1, Order: order}.Compute(m.a, m.sigma)
	if err != nil {
		return nil, c.Errorf("", "%v", strings.TrimPrefix(err.Error(), "vardyn: "))
	}
	fe, err := vardyn.FEVD(theta, hmax)
	if err != nil {
		return nil, c.Errorf("", "%v", strings.TrimPrefix(err.Error(), "vardyn: "))
	}
	dec := engine.DecimalsOr(c, s.Decimals)
	if s.Decimals == nil {
		dec = 1
	}
	head := []table.Cell{table.T("Horizon")}
	for _, n := range m.names {
		head = append(head, table.T(n))
	}
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.Empty, table.Span("Share of the forecast-error variance due to a shock in", k)}, head}}
	shares := map[string]any{}
	for i, rn := range m.names {
		title := []table.Cell{table.T(rn)}
		for range m.names {
			title = append(title, table.Empty)
		}
		t.Body = append(t.Body, table.Row{Cells: title, RuleAbove: i > 0})
		byShock := map[string]any{}
		for j, sn := range m.names {
			v := make([]float64, len(hs))
			for a, h := range hs {
				v[a] = fe[h-1][i][j]
			}
			byShock[sn] = v
		}
		shares[rn] = byShock
		for _, h := range hs {
			row := []table.Cell{table.T(strconv.Itoa(h))}
			for j := range m.names {
				row = append(row, table.N(100*fe[h-1][i][j], dec))
			}
			t.Body = append(t.Body, table.Row{Cells: row})
		}
	}
	ord := m.names
	if len(s.Order) > 0 {
		ord = s.Order
	}
	t.Notes = []string{fmt.Sprintf("Forecast-error variance decomposition of %s, from %s: the percentage of the h-step forecast-error variance of each series (blocks) due to orthogonalised shocks in each series (columns), Cholesky ordering %s; each row sums to 100.",
		strings.Join(m.names, ", "), m.desc, strings.Join(ord, ", "))}
	vals := map[string]any{"shares": shares, "horizons": slices.Clone(hs), "series": m.names, "model": m.desc}
	if order != nil {
		vals["order"] = s.Order
	}
	return &engine.Result{Table: t, Values: vals}, nil
}
