package dynamics

import (
	"fmt"
	"strings"

	"github.com/galley-econ/galley/analysis/vardyn"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
)

// causalitySpec is the causality kind: one row per ordered pair (causing
// → caused). For a VAR of its own, the Wald test on the lags of the
// causing series in the caused equation, with χ² and F p-values, or the
// Toda–Yamamoto version (test: toda-yamamoto, dmax); for a VECM (from:),
// the short-run, long-run and strong tests.
type causalitySpec struct {
	engine.Common `yaml:",inline"`
	SourceKeys    `yaml:",inline"`
	Test          string `yaml:"test"`
	Dmax          *int   `yaml:"dmax"`
	Decimals      *int   `yaml:"decimals"`
}

func (s *causalitySpec) test() string {
	if s.Test == "" {
		return "wald"
	}
	return strings.ToLower(s.Test)
}

func (s *causalitySpec) Check(c *engine.Context) error {
	if err := s.SourceKeys.check(c); err != nil {
		return err
	}
	switch s.test() {
	case "wald":
		if s.Dmax != nil {
			return c.Errorf("dmax", "dmax: belongs to test: toda-yamamoto")
		}
	case "toda-yamamoto":
		if s.From != "" {
			return c.Errorf("test", "test: toda-yamamoto fits a VAR in levels of its own; give series, lags and det instead of from:")
		}
		if s.Differences {
			return c.Errorf("differences", "differences: the Toda–Yamamoto test is run on the levels")
		}
		if s.Dmax != nil && (*s.Dmax < 1 || *s.Dmax > 2) {
			return c.Errorf("dmax", "dmax: the highest order of integration, 1 or 2, not %d", *s.Dmax)
		}
	default:
		return c.Errorf("test", "test: write wald (the default) or toda-yamamoto, not %q", s.Test)
	}
	return nil
}

// Run fits the VAR (with dmax extra lags for Toda–Yamamoto) or reads the
// VECM and returns the table of every ordered pair's tests and its values.
func (s *causalitySpec) Run(c *engine.Context) (*engine.Result, error) {
	dmax := 1
	if s.Dmax != nil {
		dmax = *s.Dmax
	}
	keys := s.SourceKeys
	if s.test() == "toda-yamamoto" {
		l := *s.Lags + dmax
		keys.Lags = &l
	}
	m, err := keys.fit(c)
	if err != nil {
		return nil, err
	}
	dec := engine.DecimalsOr(c, s.Decimals)
	k := len(m.names)
	var pairs []map[string]any
	t := causalityTable(m)
	for i := 0; i < k; i++ {
		for j := 0; j < k; j++ {
			if i == j {
				continue
			}
			row, e, err := s.pair(c, m, i, j, dec)
			if err != nil {
				return nil, err
			}
			pairs = append(pairs, e)
			t.Body = append(t.Body, table.Row{Cells: row})
		}
	}
	t.Notes = []string{s.note(m, dmax), c.StarNote()}
	vals := map[string]any{"pairs": pairs, "test": s.test(), "series": m.names, "model": m.desc}
	if s.test() == "toda-yamamoto" {
		vals["dmax"] = dmax
	}
	if m.vecm != nil {
		vals["test"] = "vecm"
	}
	cites := []string{"granger-1969"}
	if s.test() == "toda-yamamoto" {
		cites = append(cites, "toda-yamamoto-1995")
	}
	return &engine.Result{Table: t, Values: vals, Cites: cites}, nil
}

// causalityTable returns the table with its heading and no rows: three
// tests (short run, long run, strong) for a VECM, one for a VAR.
func causalityTable(m *model) *table.Table {
	if m.vecm != nil {
		return &table.Table{Stub: 1, Head: [][]table.Cell{
			{table.Empty, table.Span("Short run (Γ)", 2), table.Span("Long run (α)", 2), table.Span("Strong", 2)},
			{table.T("Causing → caused"), table.T("χ² [df]"), table.T("p"), table.T("χ² [df]"), table.T("p"), table.T("χ² [df]"), table.T("p")}}}
	}
	return &table.Table{Stub: 1, Head: [][]table.Cell{{table.T("Causing → caused"), table.T("χ² [df]"), table.T("p (χ²)"), table.T("p (F)")}}}
}

// pair returns the table row and the values entry of the tests that
// series j does not cause series i.
func (s *causalitySpec) pair(c *engine.Context, m *model, i, j, dec int) ([]table.Cell, map[string]any, error) {
	row := []table.Cell{table.T(m.names[j] + " → " + m.names[i])}
	e := map[string]any{"name": norm(m.names[j]) + "->" + norm(m.names[i]), "caused": m.names[i], "causing": m.names[j]}
	if m.vecm != nil {
		for _, kind := range []struct {
			name string
			k    vardyn.CausalityKind
		}{{"short", vardyn.ShortRun}, {"long", vardyn.LongRun}, {"strong", vardyn.Strong}} {
			w, err := vardyn.VECMCausality(m.vecm, i, []int{j}, kind.k)
			if err != nil {
				if kind.k == vardyn.ShortRun || kind.k == vardyn.Strong {
					row = append(row, table.T("–"), table.T("–"))
					continue
				}
				return nil, nil, c.Errorf("", "%v", strings.TrimPrefix(err.Error(), "vardyn: "))
			}
			row = append(row, waldCells(c, w, dec, false)...)
			e[kind.name] = waldVals(w)
		}
		return row, e, nil
	}
	w, err := m.varm.Granger([]int{i}, []int{j}, *s.Lags)
	if err != nil {
		return nil, nil, c.Errorf("", "%v", strings.TrimPrefix(err.Error(), "vardyn: "))
	}
	row = append(row, waldCells(c, w, dec, true)...)
	for key, v := range waldVals(w) {
		e[key] = v
	}
	return row, e, nil
}

// waldCells returns the cells of one Wald test: χ² with its stars and
// degrees of freedom, its p-value, and (withF) the p-value of the F form.
func waldCells(c *engine.Context, w vardyn.Wald, dec int, withF bool) []table.Cell {
	st := table.Starred(w.Stat, dec, c.StarsFor(w.P))
	st.Suffix = fmt.Sprintf(" [%d]", w.DF)
	out := []table.Cell{st, table.N(w.P, dec)}
	if withF {
		out = append(out, table.N(w.PF, dec))
	}
	return out
}

// waldVals returns the values of one Wald test.
func waldVals(w vardyn.Wald) map[string]any {
	return map[string]any{"stat": w.Stat, "df": w.DF, "p": w.P, "f": w.F, "df2": w.DF2, "pf": w.PF}
}

// note returns the table's note: what the tests are, for a VECM, a
// Toda–Yamamoto VAR or a VAR.
func (s *causalitySpec) note(m *model, dmax int) string {
	switch {
	case m.vecm != nil:
		return fmt.Sprintf("Granger causality in %s. Wald tests in the caused series' equation, given β, with least-squares standard errors: short run, the lagged differences of the causing series are zero; long run, the caused series' loadings α are zero (it does not adjust to the relations); strong, both. χ² p-values; degrees of freedom in brackets.", m.desc)
	case s.test() == "toda-yamamoto":
		return fmt.Sprintf("Toda–Yamamoto (1995) tests: %s, of which only the first %d lags of the causing series are restricted (dmax = %d extra lags keep the Wald statistic χ² whatever the integration and cointegration of the series). p (F): W/q against F(q, K(T − Kp − d)).", m.desc, *s.Lags, dmax)
	default:
		return fmt.Sprintf("Granger causality in %s: Wald tests that the %d lags of the causing series are zero in the caused series' equation; p (F): W/q against F(q, K(T − Kp − d)).", m.desc, *s.Lags)
	}
}
