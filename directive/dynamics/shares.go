package dynamics

import (
	"errors"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/vardyn"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
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

	live *shareState // the fitted system, once Run has been called in this build
}

// shareState is what a variance-shares directive hands on through
// contract.VarianceShareSource: its fitted system and Cholesky ordering.
type shareState struct {
	m     *model
	order []int // nil: the series' own order
}

// decompose returns the decomposition at horizons 1 … h: [h−1][i][j], the
// share of the h-step forecast-error variance of series i due to the
// orthogonalised shock in series j (analysis/vardyn.FEVD of the Cholesky
// responses Θ_0 … Θ_{h−1}). The table and contract.VarianceShareSource
// both come from here.
func (st *shareState) decompose(h int) ([][][]float64, error) {
	theta, err := vardyn.Responses{Horizon: h - 1, Order: st.order}.Compute(st.m.a, st.m.sigma)
	if err != nil {
		return nil, err
	}
	return vardyn.FEVD(theta, h)
}

var _ contract.VarianceShareSource = (*sharesSpec)(nil)

// VarianceShares implements contract.VarianceShareSource. The engine runs
// the directive in this build before handing it on (engine.Context.Live),
// so its state is there.
func (s *sharesSpec) VarianceShares(h int) (*contract.VarianceShares, error) {
	if s.live == nil {
		return nil, errors.New("internal: the variance-shares directive has not run in this build")
	}
	if h < 1 || h > 200 {
		return nil, fmt.Errorf("horizon %d is outside 1–200", h)
	}
	fe, err := s.live.decompose(h)
	if err != nil {
		return nil, errors.New(strings.TrimPrefix(err.Error(), "vardyn: "))
	}
	order := slices.Clone(s.live.order)
	if order == nil {
		order = make([]int, len(s.live.m.names))
		for i := range order {
			order[i] = i
		}
	}
	return &contract.VarianceShares{Names: slices.Clone(s.live.m.names), Order: order, Shares: fe, Model: s.live.m.desc}, nil
}

// LastHorizon implements contract.VarianceShareSource: the last horizon
// of the table.
func (s *sharesSpec) LastHorizon() int {
	hs := s.horizons()
	return hs[len(hs)-1]
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
		if order, err = c.SeriesIndices("order", s.Order, m.names); err != nil {
			return nil, err
		}
	}
	hs := s.horizons()
	st := &shareState{m: m, order: order}
	fe, err := st.decompose(hs[len(hs)-1])
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
	s.live = st
	return &engine.Result{Table: t, Values: vals}, nil
}
