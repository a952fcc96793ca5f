package coint

import (
	"fmt"
	"math"
	"strings"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// po: the Phillips–Ouliaris residual-based tests P̂u and P̂z.
type poSpec struct {
	engine.Common `yaml:",inline"`
	Data          string   `yaml:"data"`
	Y             string   `yaml:"y"`
	X             []string `yaml:"x"`
	Det           string   `yaml:"det"`
	Bandwidth     string   `yaml:"bandwidth"`
	Sample        string   `yaml:"sample"`
	Decimals      *int     `yaml:"decimals"`
}

func init() {
	engine.Register(engine.Kind{
		Name:    "po",
		Summary: "Phillips–Ouliaris variance-ratio (Pu) and trace (Pz) tests of no cointegration",
		New:     func() engine.Directive { return &poSpec{} },
		Fields:  []string{"pu", "pz", "crit_pu", "crit_pz", "crit_source", "reject_pu_5", "reject_pz_5", "bandwidth", "nobs", "det", "y", "x", "static", "sample"},
	})
}

func (s *poSpec) settings(c *engine.Context) (critical.Case, unitroot.Bandwidth, error) {
	det, err := engine.ParseDet(c, s.Det)
	if err != nil {
		return det, unitroot.Bandwidth{}, err
	}
	if det == critical.ConstTrendSq {
		return det, unitroot.Bandwidth{}, c.Errorf("det", "the Phillips–Ouliaris tables cover det n, c and ct only")
	}
	bw := s.Bandwidth
	if bw == "" {
		bw = "rule4"
	}
	b, err := unitroot.ParseBandwidth(bw)
	if err != nil {
		return det, b, c.Errorf("bandwidth", "%v", err)
	}
	if b.Rule == unitroot.AutoNeweyWest || b.Rule == unitroot.AutoHobijn {
		return det, b, c.Errorf("bandwidth", "po takes a fixed bandwidth rule or a number of Bartlett lags; the automatic bandwidths (%s) are for pp and kpss", bw)
	}
	return det, b, nil
}

func (s *poSpec) Check(c *engine.Context) error {
	if err := c.Require("y", s.Y == ""); err != nil {
		return err
	}
	if len(s.X) == 0 {
		return c.Errorf("", "galley po: the key \"x\" is required (one or more regressors)")
	}
	if len(s.X) > coint.POMaxRegressors {
		return c.Errorf("x", "%d regressors is beyond the Phillips–Ouliaris (1990) tables (at most %d); use engle-granger, which takes up to 11 regressors and offers simulated critical values (crit: simulate)", len(s.X), coint.POMaxRegressors)
	}
	if _, _, err := s.settings(c); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), append([]string{s.Y}, s.X...), s.Sample)
}

func (s *poSpec) Run(c *engine.Context) (*engine.Result, error) {
	det, bw, err := s.settings(c)
	if err != nil {
		return nil, err
	}
	d, err := c.Data(c.DataAlias(s.Data), append([]string{s.Y}, s.X...), s.Sample)
	if err != nil {
		return nil, err
	}
	if err := c.RefuseConstant(d, "", "a cointegration test needs series that vary (the residuals of a constant would be rounding noise)"); err != nil {
		return nil, err
	}
	if d.N() < 3 {
		return nil, c.Errorf("", "too few observations: %d in the sample %s", d.N(), d.Range())
	}
	lags, err := bw.Resolve(d.N() - 1)
	if err != nil {
		return nil, c.Errorf("bandwidth", "%v", err)
	}
	r, err := coint.PhillipsOuliaris(d.Cols[0], d.Cols[1:], det, lags)
	if err != nil {
		return nil, c.Errorf("x", "Phillips–Ouliaris: %v", err)
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	pu := &contract.Outcome{Stat: r.Pu, PValue: math.NaN(), Crit: r.CritPu, Upper: true}
	pz := &contract.Outcome{Stat: r.Pz, PValue: math.NaN(), Crit: r.CritPz, Upper: true}
	t := &table.Table{Stub: 1, Head: [][]table.Cell{
		{table.Empty, table.Empty, table.Span("Critical values", 3)},
		{table.T(""), table.T("Statistic"), table.T("1%"), table.T("5%"), table.T("10%")},
	}}
	for _, row := range []struct {
		label string
		o     *contract.Outcome
	}{{"Variance ratio P̂u (" + s.Y + " dependent)", pu}, {"Trace P̂z", pz}} {
		cells := []table.Cell{table.T(row.label), table.Starred(row.o.Stat, dec, row.o.Stars(c.Stars()))}
		for _, l := range coint.POLevels {
			v, ok := contract.CritAt(row.o.Crit, l)
			if !ok {
				v = math.NaN()
			}
			cells = append(cells, table.N(v, dec))
		}
		t.Body = append(t.Body, table.Row{Cells: cells})
	}
	t.Body = append(t.Body,
		table.Row{Cells: []table.Cell{table.T("Bandwidth (Bartlett lags)"), table.I(r.Lags)}, RuleAbove: true},
		table.Row{Cells: []table.Cell{table.T("Observations (T − 1)"), table.I(r.NObs)}},
	)
	vars := append([]string{s.Y}, s.X...)
	letter := string(rune('a' + int(det)))
	t.Notes = []string{
		fmt.Sprintf("H0: no cointegration among %s; both tests reject for large values. Deterministic terms: %s. P̂u depends on which variable is the dependent (here %s); P̂z does not. Newey–West long-run variance of the VAR(1) residuals with %d Bartlett lags (%s).",
			strings.Join(vars, ", "), contract.DetNames[det], s.Y, r.Lags, bw),
		fmt.Sprintf("Critical values: asymptotic, Phillips and Ouliaris (1990), Table I%s (P̂u) and Table II%s (P̂z), for k = %d regressors, case %s; no finite-sample adjustment, so they do not depend on T (here T = %d). Stars by these critical values; no p-values are tabulated.",
			letter, letter, len(s.X), det, d.N()),
		c.StarNote() + " " + d.SampleNote(),
	}
	static := map[string]any{}
	for i, n := range append(detTerms(det), s.X...) {
		static[n] = r.Coef[i]
	}
	vals := map[string]any{
		"pu": r.Pu, "pz": r.Pz, "crit_pu": contract.CritMap(r.CritPu), "crit_pz": contract.CritMap(r.CritPz),
		"crit_source": r.CritSource, "reject_pu_5": pu.Rejects(0.05), "reject_pz_5": pz.Rejects(0.05),
		"bandwidth": r.Lags, "nobs": r.NObs, "det": det.String(), "y": s.Y, "x": append([]string(nil), s.X...),
		"static": static, "sample": engine.SampleValues(d),
	}
	return &engine.Result{Table: t, Values: vals, Cites: []string{"phillips-ouliaris-1990"}}, nil
}
