package longrun

import (
	"fmt"
	"strings"

	"github.com/galley-econ/galley/analysis/longrun"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// ccr: Park's (1992) canonical cointegrating regression, with the keys of
// fmols (the same kernels and bandwidths) and the same Wald tests.
type ccrSpec struct {
	engine.Common `yaml:",inline"`
	Data          string   `yaml:"data"`
	Y             string   `yaml:"y"`
	X             []string `yaml:"x"`
	Det           string   `yaml:"det"`
	Sample        string   `yaml:"sample"`
	Kernel        string   `yaml:"kernel"`
	Bandwidth     string   `yaml:"bandwidth"`
	Restrict      []string `yaml:"restrict"`
	Decimals      *int     `yaml:"decimals"`
}

// ccrFields adds to the shared values the bandwidth and kernel, the
// conditional long-run variance and the first-stage OLS coefficients.
var ccrFields = append([]string{"bandwidth", "kernel", "lrvar", "first_stage"}, longrunFields...)

func init() {
	engine.Register(engine.Kind{Name: "ccr", Summary: "canonical cointegrating regression (Park 1992) of a cointegrating relation, with Wald tests", Fields: ccrFields, Model: true,
		New: func() engine.Directive { return &ccrSpec{} }})
}

// Relation says where the long-run relation was estimated.
func (s *ccrSpec) Relation() contract.LongRun {
	return contract.LongRun{Data: s.Data, Y: s.Y, X: s.X, Sample: s.Sample, Missing: s.Missing}
}

func (s *ccrSpec) settings(c *engine.Context) (longrun.CCRSpec, error) {
	det, err := engine.ParseDet(c, s.Det)
	if err != nil {
		return longrun.CCRSpec{}, err
	}
	k, b, err := kernelBandwidth(c, s.Kernel, s.Bandwidth)
	return longrun.CCRSpec{Det: det, Kernel: k, Bandwidth: b}, err
}

func (s *ccrSpec) Check(c *engine.Context) error {
	if err := checkRelation(c, "ccr", s.Data, s.Y, s.X, s.Det, s.Sample, s.Restrict); err != nil {
		return err
	}
	_, err := s.settings(c)
	return err
}

// Run estimates the canonical cointegrating regression and returns its
// table (the long-run coefficients, the deterministic terms, N, the
// bandwidth, the Wald tests), values, relation residuals and model.
func (s *ccrSpec) Run(c *engine.Context) (*engine.Result, error) {
	sp, err := s.settings(c)
	if err != nil {
		return nil, err
	}
	d, err := c.Data(c.DataAlias(s.Data), append([]string{s.Y}, s.X...), s.Sample)
	if err != nil {
		return nil, err
	}
	restr, _ := parseRestrictions(c, s.Restrict, s.X)
	r, err := longrun.CCR(d.Cols[0], d.Cols[1:], s.X, sp)
	if err != nil {
		return nil, relationError(c, "CCR", s.Y, s.X, err)
	}
	nd := sp.Det.Deterministics()
	walds, err := runWald(c, restr, r.LongRun)
	if err != nil {
		return nil, err
	}
	dec := engine.DecimalsOr(c, s.Decimals)
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.T(""), table.T(s.Y)}}}
	t.Body = longRunRows(c, r.Names, r.Table, nd, dec)
	t.Body = append(t.Body,
		table.Row{Cells: []table.Cell{table.T("N"), table.I(r.N)}, RuleAbove: true},
		table.Row{Cells: []table.Cell{table.T("Bandwidth"), table.N(r.Bandwidth, 2)}},
	)
	t.Body = append(t.Body, waldRows(walds, dec)...)
	sd := &engine.Data{Dates: d.Dates[r.First:]}
	kname := kernelName(sp.Kernel)
	seDesc := fmt.Sprintf("CCR, from the long-run variance of the equilibrium error given the regressors' innovations (%s kernel, %s)", kname, bandwidthText(r.Bandwidth, sp.Bandwidth))
	t.Notes = []string{
		fmt.Sprintf("Canonical cointegrating regression of %s on %s: least squares on data transformed with the estimated long-run covariances, so that the usual t-ratios and Wald statistics are valid. Deterministic terms: %s (not transformed). Standard errors in parentheses: %s; t-ratios and Wald statistics compared with the standard normal and χ² distributions.",
			s.Y, strings.Join(s.X, ", "), contract.DetNames[sp.Det], seDesc),
	}
	if w := waldNote(walds); w != "" {
		t.Notes = append(t.Notes, w)
	}
	t.Notes = append(t.Notes, c.StarNote()+" "+sd.SampleNote())
	var first []map[string]any
	for j, name := range r.Names {
		first = append(first, map[string]any{"term": name, "est": r.Static.Coef[j]})
	}
	vals := map[string]any{
		"coef": engine.CoefValues(r.Names, r.Table), "nobs": r.N, "wald": waldValues(walds),
		"bandwidth": r.Bandwidth, "kernel": strings.ToLower(kname), "cov": "ccr", "se_desc": seDesc, "det": sp.Det.String(),
		"lrvar": r.Omega11_2, "first_stage": first,
		"y": s.Y, "x": append([]string(nil), s.X...),
		"sample": engine.SampleValues(sd),
	}
	// ω̂₁·₂ and the static first stage are working values no table shows.
	res := &engine.Result{Table: t, Values: vals, Hidden: []string{"lrvar", "first_stage"}, Cites: []string{"park-1992"}}
	res.SetSeries("resid", contract.NewDated(d.Dates, longrun.RelationResid(d.Cols[0], d.Cols[1:], sp.Det, r.Coef)))
	res.Model = engine.ModelOf("CCR", s.Y, r.Names, r.Table, vals, true, "")
	return res, nil
}
