package johansen

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// The vecm directive (relations, loadings and tests, or the short-run
// table) and the var-lags directive (the VAR lag-order table).

// ownKeys lists the system keys set on a vecm directive.
func (s *vecmSpec) ownKeys(c *engine.Context) []string {
	var out []string
	for _, k := range []string{"data", "series", "det", "lags", "sample", "small_sample", "level", "rank", "normalize", "restrict", "exogeneity_tests", "seasonal", "impulse", "shift", "extra", "crit", "replications", "seed", "rank_bootstrap"} {
		if c.Has(k) {
			out = append(out, k)
		}
	}
	return out
}

func (s *vecmSpec) show() string {
	if s.Show == "" {
		return "relations"
	}
	return s.Show
}

func (s *vecmSpec) Check(c *engine.Context) error {
	if sh := s.show(); sh != "relations" && sh != "short-run" {
		return c.Errorf("show", "show: write relations (β, α and the restriction tests) or short-run (Γ and the deterministic terms), not %q", s.Show)
	}
	if _, err := parseSysDiag(c, s.Diagnostics); err != nil {
		return err
	}
	if s.From != "" {
		if own := s.ownKeys(c); len(own) > 0 {
			return c.Errorf(own[0], "with from: the system is that of %q; %s cannot be set here as well", s.From, own[0])
		}
		return c.CheckRef("from", s.From, "johansen")
	}
	if len(s.Series) == 0 {
		return c.Errorf("", "galley vecm: give from: (the id of a johansen result) or the system's keys (series, lags, …)")
	}
	if _, err := s.settings(c); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), s.Series, s.Sample)
}

func (s *vecmSpec) Run(c *engine.Context) (*engine.Result, error) {
	var st *sysState
	sel := s.Lags.Select
	if s.From != "" {
		up, err := c.Live("from", s.From, "johansen")
		if err != nil {
			return nil, err
		}
		s.from = up.(*johansenSpec)
		st, sel = s.from.state, s.from.Lags.Select
	} else {
		var err error
		if st, err = s.run(c); err != nil {
			return nil, err
		}
		s.state = st
	}
	if st.vecm == nil {
		return nil, c.Errorf("", "the sequential trace tests at %s choose rank %d, so there is no error-correction model to show; set rank: (1..%d)", contract.Pct(st.st.Level), st.chosen, st.res.K-1)
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	vals := st.values()
	vals["show"] = s.show()
	vals["short"] = shortValues(st)
	var t *table.Table
	var hidden []string
	if s.show() == "relations" {
		t = relationsTable(st, dec)
		hidden = []string{"short"} // the short-run coefficients are not in this table
	} else {
		t = shortRunTable(st, dec)
	}
	t.Notes = append(t.Notes, fmt.Sprintf("VECM of rank %d in %s with %s (the %s case) and %s; T = %d.",
		st.rank, strings.Join(st.st.Names, ", "), sysCaseText[st.res.Case], engine.SystemCaseWords[st.res.Case], st.lagPhrase(sel), st.res.T))
	cites, err := s.addSysDiag(c, st, t, vals, dec)
	if err != nil {
		return nil, err
	}
	return &engine.Result{Table: t, Values: vals, Relations: st.relations(), Hidden: hidden, Cites: cites}, nil
}

// relationsTable shows β and α side by side for each relation, then the
// likelihood-ratio tests.
func relationsTable(st *sysState, dec int) *table.Table {
	m := st.vecm
	r := st.rank
	cols := 1 + 2*r
	head1, head2 := []table.Cell{table.Empty}, []table.Cell{table.Empty}
	for j := 0; j < r; j++ {
		head1 = append(head1, table.Span(fmt.Sprintf("Relation %d", j+1), 2))
		head2 = append(head2, table.T("β"), table.T("α"))
	}
	t := &table.Table{Stub: 1, Head: [][]table.Cell{head1, head2}}
	for i, name := range st.st.Coefs {
		est, se := []table.Cell{table.T(name)}, []table.Cell{table.Empty}
		for j := 0; j < r; j++ {
			est = append(est, table.N(m.Beta.At(i, j), dec))
			if slices.Contains(st.norm, i) {
				se = append(se, table.Empty)
			} else {
				se = append(se, table.SECell(m.BetaSE.At(i, j), dec))
			}
			if i < st.res.K {
				est = append(est, table.N(m.Alpha.At(i, j), dec))
				se = append(se, table.SECell(m.AlphaSE.At(i, j), dec))
			} else {
				est, se = append(est, table.Empty), append(se, table.Empty)
			}
		}
		t.Body = append(t.Body, table.Row{Cells: est}, table.Row{Cells: se})
	}
	for i, ts := range st.tests {
		row := []table.Cell{table.T(fmt.Sprintf("LR %s: %s", ts.Name, ts.Hyp)), table.N(ts.LR.Stat, dec)}
		row[1].Suffix = fmt.Sprintf(" [%d]", ts.LR.DF)
		row = append(row, table.N(ts.LR.P, dec))
		for len(row) < cols {
			row = append(row, table.Empty)
		}
		t.Body = append(t.Body, table.Row{Cells: row, RuleAbove: i == 0})
	}
	var norm []string
	for j, i := range st.norm {
		norm = append(norm, fmt.Sprintf("relation %d on %s", j+1, st.st.Names[i]))
	}
	t.Notes = append(t.Notes, "β normalised with "+strings.Join(norm, ", ")+
		"; standard errors in parentheses (β: Johansen's asymptotic; α: least squares given β).")
	if len(st.tests) > 0 {
		t.Notes = append(t.Notes, "LR rows: the likelihood-ratio statistic with its degrees of freedom in brackets, then its χ² p-value.")
	}
	return t
}

// shortRunTerm names a short-run regressor for tables and values.
func shortRunTerm(tm johansen.Term, names []string, ex *sysExtra) (label, key string) {
	switch tm.Kind {
	case johansen.Constant:
		return "Constant", "const"
	case johansen.Trend:
		return "Trend", "trend"
	case johansen.ExtraTerm:
		return ex.labels[tm.Series], ex.keys[tm.Series]
	}
	n := names[tm.Series]
	return fmt.Sprintf("Δ%s, lag %d", n, tm.Lag), fmt.Sprintf("lag%d:%s", tm.Lag, normName(n))
}

// shortRunTable has one column per equation: the loadings on each
// relation, then the Γ_i and the unrestricted deterministic terms.
func shortRunTable(st *sysState, dec int) *table.Table {
	m := st.vecm
	head := []table.Cell{table.Empty}
	for _, n := range st.st.Names {
		head = append(head, table.T("Δ"+n))
	}
	t := &table.Table{Stub: 1, Head: [][]table.Cell{head}}
	add := func(label string, est, se func(eq int) float64, rule bool) {
		e, s := []table.Cell{table.T(label)}, []table.Cell{table.Empty}
		for eq := range st.st.Names {
			e, s = append(e, table.N(est(eq), dec)), append(s, table.SECell(se(eq), dec))
		}
		t.Body = append(t.Body, table.Row{Cells: e, RuleAbove: rule}, table.Row{Cells: s})
	}
	for j := 0; j < st.rank; j++ {
		add(fmt.Sprintf("Relation %d (α)", j+1), func(eq int) float64 { return m.Alpha.At(eq, j) }, func(eq int) float64 { return m.AlphaSE.At(eq, j) }, false)
	}
	for k, tm := range m.Terms {
		label, _ := shortRunTerm(tm, st.st.Names, st.ex)
		add(label, func(eq int) float64 { return m.Short.At(eq, k) }, func(eq int) float64 { return m.ShortSE.At(eq, k) }, k == 0)
	}
	t.Notes = append(t.Notes, "Columns are equations. Given β, each equation is fitted by least squares; standard errors in parentheses.")
	return t
}

// shortValues is the results-file form of the short-run coefficients:
// one entry per regressor, each with {est, se} per equation.
func shortValues(st *sysState) []map[string]any {
	m := st.vecm
	out := []map[string]any{}
	for k, tm := range m.Terms {
		_, key := shortRunTerm(tm, st.st.Names, st.ex)
		e := map[string]any{"term": key}
		for eq, n := range st.st.Names {
			e[n] = map[string]any{"est": m.Short.At(eq, k), "se": m.ShortSE.At(eq, k)}
		}
		out = append(out, e)
	}
	return out
}

func (s *varLagsSpec) Check(c *engine.Context) error {
	if err := c.Require("series", len(s.Series) == 0); err != nil {
		return err
	}
	if _, err := s.cse(c); err != nil {
		return err
	}
	if s.Max != nil && *s.Max < 0 {
		return c.Errorf("max", "max must be zero or more")
	}
	return c.CheckData(c.DataAlias(s.Data), s.Series, s.Sample)
}

func (s *varLagsSpec) cse(c *engine.Context) (johansen.Case, error) {
	cs, err := engine.SystemCase(c, s.Det, int(johansen.C))
	return johansen.Case(cs), err
}

func (s *varLagsSpec) Run(c *engine.Context) (*engine.Result, error) {
	cs, err := s.cse(c)
	if err != nil {
		return nil, err
	}
	d, err := c.Data(c.DataAlias(s.Data), s.Series, s.Sample)
	if err != nil {
		return nil, err
	}
	maxL := defaultMaxLags(d.N(), len(s.Series), cs)
	if s.Max != nil {
		maxL = *s.Max
	}
	if maxL < 0 {
		return nil, c.Errorf("series", "too few observations: %d in the sample %s cannot fit a VAR in levels for %d series", d.N(), d.Range(), len(s.Series))
	}
	lt, err := johansen.LagOrder(levelsMatrix(d), cs, maxL)
	if err != nil {
		key := "series"
		if strings.Contains(err.Error(), "too few") {
			key = "max"
		}
		return nil, c.Errorf(key, "%d observations in the sample %s: %v", d.N(), d.Range(), nameSeries(err, s.Series))
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.T("Lagged differences"), table.T("Coefficients"), table.T("ln det Σ"), table.T("AIC"), table.T("BIC"), table.T("HQ")}}}
	var rows []map[string]any
	for _, r := range lt.Rows {
		t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T(strconv.Itoa(r.Lags)), table.I(r.Params), table.N(r.LogDet, dec), table.N(r.AIC, dec), table.N(r.BIC, dec), table.N(r.HQ, dec)}})
		rows = append(rows, map[string]any{"lags": r.Lags, "params": r.Params, "logdet": r.LogDet, "aic": r.AIC, "bic": r.BIC, "hq": r.HQ})
	}
	t.Body = append(t.Body, table.Row{Cells: []table.Cell{table.T("Minimum at"), table.Empty, table.Empty, table.I(lt.AIC), table.I(lt.BIC), table.I(lt.HQ)}, RuleAbove: true})
	det := map[johansen.Case]string{johansen.N: "no deterministic terms", johansen.RC: "a constant", johansen.C: "a constant",
		johansen.RT: "a constant and trend", johansen.CT: "a constant and trend"}[cs]
	t.Notes = []string{fmt.Sprintf("VAR in the levels of %s with %s (for the %s case), fitted by least squares with k + 1 lags for k = 0–%d lagged differences on the common sample of T = %d observations; Σ is the residual covariance, and the criteria are ln det Σ plus a penalty per coefficient (2/T, ln T/T, 2 ln ln T/T).",
		strings.Join(s.Series, ", "), det, engine.SystemCaseWords[cs], maxL, lt.T), d.SampleNote()}
	vals := map[string]any{"rows": rows, "aic": lt.AIC, "bic": lt.BIC, "hq": lt.HQ, "nobs": lt.T, "max": maxL,
		"det": engine.SystemCaseWords[cs], "series": slices.Clone(s.Series), "sample": engine.SampleValues(d)}
	return &engine.Result{Table: t, Values: vals}, nil
}
