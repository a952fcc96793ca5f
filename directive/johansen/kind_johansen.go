package johansen

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
)

// This file holds the system-cointegration directives:
//
//	johansen  the trace and maximum-eigenvalue rank tests (one row per rank);
//	vecm      the estimated relations β, loadings α and restriction tests
//	          (show: relations), or the short-run coefficients (show: short-run),
//	          from a johansen result (from: ID) or from the same keys;
//	var-lags  the lag-order table of the VAR in levels (AIC, BIC, HQ).
//
// The pieces: johansen_keys.go (the YAML types and settings),
// johansen_run.go (running a system and its values), kind_vecm.go (vecm
// and var-lags); this file registers the kinds and lays out the rank table.

// SystemKeys are the analysis keys shared by johansen and vecm (exported
// only so that the YAML decoder sees the embedded fields).
type SystemKeys struct {
	Data        string                `yaml:"data"`
	Series      []string              `yaml:"series"`
	Det         string                `yaml:"det"`
	Lags        sysLags               `yaml:"lags"`
	Sample      string                `yaml:"sample"`
	SmallSample bool                  `yaml:"small_sample"`
	Level       *float64              `yaml:"level"`
	Rank        *int                  `yaml:"rank"`
	Normalize   manuscript.NameList   `yaml:"normalize"`
	Restrict    sysHypotheses         `yaml:"restrict"`
	ExogTests   []manuscript.NameList `yaml:"exogeneity_tests"`
	Decimals    *int                  `yaml:"decimals"`
	RankBoot    *RankBootKeys         `yaml:"rank_bootstrap"`

	// Dummies and conditioning regressors (dummies.go).
	Seasonal bool                `yaml:"seasonal"`
	Impulse  manuscript.NameList `yaml:"impulse"`
	Shift    manuscript.NameList `yaml:"shift"`
	Extra    []string            `yaml:"extra"`
	// Exogenous is the old spelling of exogeneity_tests, kept only to be
	// refused with a message that names the new key.
	Exogenous any `yaml:"exogenous"`

	engine.SimKeys `yaml:",inline"` // crit: simulate (simcrit.go)
}

type johansenSpec struct {
	engine.Common `yaml:",inline"`
	SystemKeys    `yaml:",inline"`

	state *sysState // set by Run, read by vecm directives that name this one
}

type vecmSpec struct {
	engine.Common `yaml:",inline"`
	SystemKeys    `yaml:",inline"`
	From          string `yaml:"from"`
	Show          string `yaml:"show"`

	// System residual diagnostics (sysdiag.go).
	Diagnostics []string `yaml:"diagnostics"`

	state *sysState     // its own system (without from:), set by Run
	from  *johansenSpec // the johansen directive named in from:, set by Run
}

type varLagsSpec struct {
	engine.Common `yaml:",inline"`
	Data          string   `yaml:"data"`
	Series        []string `yaml:"series"`
	Det           string   `yaml:"det"`
	Max           *int     `yaml:"max"`
	Sample        string   `yaml:"sample"`
	Decimals      *int     `yaml:"decimals"`
}

var sysFields = []string{"eig", "trace", "maxeig", "crit_trace", "crit_maxeig", "crit_source", "rank", "rank_chosen", "level",
	"small_sample", "factor", "beta", "beta_se", "alpha", "alpha_se", "tests", "nobs", "lags", "lag_choice", "det", "series", "sample",
	"relations", "dummies", "rank_bootstrap", "roots", "unit_roots", "crit_mcse_trace", "crit_mcse_maxeig", "pvalue_trace", "pvalue_maxeig", "sim_key", "sim", // these six with crit: simulate (simcrit.go)
	"bartlett"} // with rank_bootstrap: {bartlett: true} (bartlett.go)

func init() {
	engine.Register(engine.Kind{Name: "johansen", Simulate: true, Summary: "Johansen trace and maximum-eigenvalue tests of the cointegrating rank of a VECM",
		New: func() engine.Directive { return &johansenSpec{} }, Fields: sysFields})
	engine.Register(engine.Kind{Name: "vecm", Simulate: true, Summary: "vector error-correction model: cointegrating relations, loadings, restriction tests or short-run coefficients",
		New: func() engine.Directive { return &vecmSpec{} }, Fields: append(slices.Clone(sysFields), "short", "show", "diagnostics")})
	engine.Register(engine.Kind{Name: "var-lags", Summary: "lag-order criteria (AIC, BIC, HQ) of the VAR in levels behind a VECM",
		New: func() engine.Directive { return &varLagsSpec{} }, Fields: []string{"rows", "aic", "bic", "hq", "nobs", "max", "det", "series", "sample"}})
}

func (s *johansenSpec) Check(c *engine.Context) error {
	if err := c.Require("series", len(s.Series) == 0); err != nil {
		return err
	}
	if _, err := s.settings(c); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), s.Series, s.Sample)
}

func (s *johansenSpec) Run(c *engine.Context) (*engine.Result, error) {
	st, err := s.run(c)
	if err != nil {
		return nil, err
	}
	s.state = st
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	r := st.res
	// Critical-value columns run 1%, 5%, 10%, as in every galley table.
	traceHead := []table.Cell{table.T("Statistic"), table.T("1%"), table.T("5%"), table.T("10%")}
	if st.boot != nil {
		traceHead = append(traceHead, table.T("Bootstrap p"))
	}
	if st.bart != nil {
		traceHead = append(traceHead, table.T("Bartlett-corrected"))
	}
	t := &table.Table{Stub: 1, Head: [][]table.Cell{
		{table.Empty, table.Empty, table.Span("Trace", len(traceHead)), table.Span("Maximum eigenvalue", 4)},
		append(append([]table.Cell{table.T("Rank r"), table.T("Eigenvalue")}, traceHead...), table.T("Statistic"), table.T("1%"), table.T("5%"), table.T("10%")),
	}}
	stars := func(stat float64, cv [3]float64) int {
		n := 0
		for _, v := range cv {
			if stat > v {
				n++
			}
		}
		return n
	}
	for i := 0; i < r.K; i++ {
		row := []table.Cell{table.T(strconv.Itoa(i)), table.N(r.Eigenvalues[i], dec), table.Starred(st.trace[i], 2, stars(st.trace[i], st.crT[i]))}
		for j := 2; j >= 0; j-- { // crT holds 10%, 5%, 1%
			row = append(row, table.N(st.crT[i][j], 2))
		}
		if st.boot != nil {
			row = append(row, table.N(st.boot.PValue[i], 3))
		}
		if st.bart != nil {
			row = append(row, st.bartlettCell(i, stars))
		}
		row = append(row, table.Starred(st.max[i], 2, stars(st.max[i], st.crM[i])))
		for j := 2; j >= 0; j-- {
			row = append(row, table.N(st.crM[i][j], 2))
		}
		t.Body = append(t.Body, table.Row{Cells: row})
	}
	t.Notes = []string{sysNote(st, s.Lags.Select)}
	t.Notes = append(t.Notes, st.ex.notes...)
	if st.sim != nil { // crit: simulate (simcrit.go)
		t.Notes = append(t.Notes, st.sim.mcseNote())
	}
	if st.boot != nil {
		t.Notes = append(t.Notes, st.bootNote())
	}
	if st.bart != nil {
		t.Notes = append(t.Notes, st.bartlettNote())
	}
	if s.SmallSample {
		t.Notes = append(t.Notes, fmt.Sprintf("Statistics are multiplied by the Reinsel–Ahn small-sample factor (T − K(k+1))/T = %.3f.", r.SmallSampleFactor()))
	}
	t.Notes = append(t.Notes, "*, **, ***: the statistic exceeds its 10%, 5%, 1% critical value. "+st.d.SampleNote())
	res := &engine.Result{Table: t, Values: st.values(), Cites: []string{"johansen-1991", "mhm-1999"}}
	if st.boot != nil {
		res.Cites = append(res.Cites, "crt-2012")
	}
	if st.bart != nil {
		res.Cites = append(res.Cites, "bartlett-1937", "rocke-1989", "doornik-1998")
	}
	if len(s.Shift) > 0 {
		res.Cites = append(res.Cites, "jmn-2000")
	}
	if st.vecm != nil {
		res.Relations = st.relations()
	}
	return res, nil
}

// sysNote is the main note under the rank-test table.
func sysNote(st *sysState, sel string) string {
	r := st.res
	var b strings.Builder
	fmt.Fprintf(&b, "VECM in %s with %s (the %s case) and %s; T = %d observations (%s–%s). ",
		strings.Join(st.st.Names, ", "), sysCaseText[r.Case], engine.SystemCaseWords[r.Case], st.lagPhrase(sel), r.T,
		st.d.Dates[r.Lags+1], st.d.Dates[st.d.N()-1])
	fmt.Fprintf(&b, "The trace statistic tests rank r against %d, the maximum-eigenvalue statistic r against r + 1; critical values: %s. ", r.K, st.critText()) // critText: simcrit.go
	fmt.Fprintf(&b, "Testing r = 0, 1, … in turn with the trace statistic at %s gives rank %d", contract.Pct(st.st.Level), st.chosen)
	if st.rank != st.chosen && st.rank > 0 {
		fmt.Fprintf(&b, "; the estimates use rank %d as set by the author", st.rank)
	}
	b.WriteString(".")
	return b.String()
}
