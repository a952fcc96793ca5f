package ols

import (
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// ols: a least-squares regression with a choice of standard errors.
type olsSpec struct {
	engine.Common `yaml:",inline"`
	Data          string   `yaml:"data"`
	Y             string   `yaml:"y"`
	X             []string `yaml:"x"`
	SE            string   `yaml:"se"`
	Sample        string   `yaml:"sample"`
	Const         *bool    `yaml:"const"`
	Decimals      *int     `yaml:"decimals"`
}

func init() {
	engine.Register(engine.Kind{
		Name:    "ols",
		Summary: "least-squares regression with OLS, HC1 or Newey–West HAC standard errors",
		New:     func() engine.Directive { return &olsSpec{} },
		Fields:  []string{"coef", "nobs", "r2", "r2_adj", "r2_centred", "r2_uncentred", "dw", "cov", "sigma", "loglik", "sample", "resid"},
		Model:   true,
	})
}

func (s *olsSpec) Check(c *engine.Context) error {
	if err := c.Require("y", s.Y == ""); err != nil {
		return err
	}
	if _, err := ols.ParseCov(s.SE); err != nil {
		return c.Errorf("se", "%v", err)
	}
	if len(s.X) == 0 && s.Const != nil && !*s.Const {
		return c.Errorf("x", "a regression needs at least one regressor: give x, or keep the constant")
	}
	return c.CheckData(c.DataAlias(s.Data), append([]string{s.Y}, s.X...), s.Sample)
}

func (s *olsSpec) Run(c *engine.Context) (*engine.Result, error) {
	cov, _ := ols.ParseCov(s.SE)
	d, err := c.Data(c.DataAlias(s.Data), append([]string{s.Y}, s.X...), s.Sample)
	if err != nil {
		return nil, err
	}
	if err := c.RefuseConstant(d, "", "a regression cannot explain a series that does not vary (its fit would be exact and its t-ratios rounding noise)", 0); err != nil {
		return nil, err
	}
	withConst := s.Const == nil || *s.Const
	terms, x, err := engine.Regressors(c, d, s.X, withConst, 0)
	if err != nil {
		return nil, err
	}
	fit, err := ols.Regress(d.Cols[0], x)
	if err != nil {
		return nil, engine.CollinearError(c, "x", err, terms)
	}
	coefs := fit.Table(cov, false)
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	// With a constant R² is centred; without one it is uncentred,
	// 1 − e'e/Σy² (Davidson and MacKinnon 2004, §3.5), which cannot be
	// negative; the other form is a value either way.
	r2, r2Adj := fit.R2(), fit.R2Adj()
	if !withConst {
		r2, r2Adj = fit.R2Uncentred(), fit.R2AdjUncentred()
	}
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.T(""), c.TermCell(s.Y)}}}
	t.Body = engine.CoefRows(c, terms, coefs, dec, false)
	t.Body = append(t.Body,
		table.Row{Cells: []table.Cell{table.T("N"), table.I(fit.N)}, RuleAbove: true},
		table.Row{Cells: []table.Cell{table.T("R²"), table.N(r2, dec)}},
		table.Row{Cells: []table.Cell{table.T("Adjusted R²"), table.N(r2Adj, dec)}},
		table.Row{Cells: []table.Cell{table.T("Durbin–Watson"), table.N(fit.DW(), dec)}},
	)
	t.Notes = []string{
		fmt.Sprintf("Dependent variable: %s. Least squares; %s in parentheses; p-values from Student's t with %d degrees of freedom.", c.TermText(s.Y), cov.Describe(), fit.DF()),
		c.StarNote() + " " + d.SampleNote(),
	}
	if !withConst {
		c2, neg := table.NumText(table.N(fit.R2(), dec))
		if neg {
			c2 = "−" + c2
		}
		t.Notes = append(t.Notes, fmt.Sprintf("Without a constant, R² is uncentred, 1 − Σe²/Σy², and adjusted R² is 1 − (1 − R²)N/(N − K); the centred R², 1 − Σe²/Σ(y − ȳ)², is %s.", c2))
	}
	if w := engine.CondNote(fit); w != "" {
		t.Notes = append(t.Notes, w)
	}
	vals := map[string]any{
		"coef":   engine.CoefValues(terms, coefs),
		"nobs":   fit.N,
		"r2":     r2,
		"r2_adj": r2Adj,
		// both forms, whichever the table shows
		"r2_centred":   fit.R2(),
		"r2_uncentred": fit.R2Uncentred(),
		"dw":           fit.DW(),
		"cov":          cov.String(),
		"sigma":        math.Sqrt(fit.Sigma2()),
		"loglik":       fit.LogLik(),
		"sample":       engine.SampleValues(d),
	}
	res := &engine.Result{Table: t, Values: vals, Cites: seCites(s.SE)}
	res.SetSeries("resid", contract.ViewDated(d.Dates, fit.Resid))
	res.Model = engine.ModelOf("OLS", s.Y, terms, coefs, vals, false, "")
	return res, nil
}

// RegressionDesign says where the regression was estimated.
func (s *olsSpec) RegressionDesign() contract.Design {
	return contract.Design{Data: s.Data, Y: s.Y, X: s.X, Sample: s.Sample, Missing: s.Missing, Const: s.Const == nil || *s.Const}
}
