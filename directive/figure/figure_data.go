package figure

import (
	"fmt"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// This file gathers what a figure draws: dated series from expressions,
// a residual series from another directive's result, and a regression
// design (for the fit and stability plots) from y/x keys or from an ols
// directive named by "of".

// residualSeries is the residual series of another result (ols,
// engle-granger, dols, fmols carry one in Result.Series["resid"]).
func residualSeries(c *engine.Context, key string, r *engine.Result) (series.Series, error) {
	s, err := datedField(c, key, r, "resid", "residual")
	s.Name = "residual"
	return s, err
}

// relationSeries is cointegrating relation n (1-based) of a johansen or
// vecm result, β_n'ỹ_t (Result.Relations). The errors are at the line of
// key (for a result without relations) or of relKey (for n out of range).
func relationSeries(c *engine.Context, key, relKey string, r *engine.Result, n int) (series.Series, error) {
	k := len(r.Relations)
	if k == 0 {
		return series.Series{}, c.Errorf(key, "%q (a %s result, line %d) estimates no cointegrating relation: its rank is %v (the sequential trace tests chose %v), so there is no relation to plot; set rank: (1 … K−1) on it",
			r.ID, r.Kind, r.Line, r.Values["rank"], r.Values["rank_chosen"])
	}
	if n < 1 || n > k {
		return series.Series{}, c.Errorf(relKey, "relation %d: %q (a %s result, line %d) has %d cointegrating relation%s (rank %d); give relation: 1%s",
			n, r.ID, r.Kind, r.Line, k, plural(k), k, map[bool]string{true: "", false: fmt.Sprintf(" … %d", k)}[k == 1])
	}
	z := r.Relations[n-1]
	return series.Series{Name: fmt.Sprintf("relation %d", n), Dates: z.Dates, Values: z.Values}, nil
}

// plural returns "s" unless n is 1.
func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}

// datedField is the dated series a result carries under field (what
// names it in messages).
func datedField(c *engine.Context, key string, r *engine.Result, field, what string) (series.Series, error) {
	z, ok := r.Series[field]
	if !ok {
		return series.Series{}, c.Errorf(key, "%q (a %s result, line %d) has no %s series to plot", r.ID, r.Kind, r.Line, what)
	}
	return series.Series{Name: what, Dates: z.Dates, Values: z.Values}, nil
}

// restrict applies a sample window (already checked to parse) to s.
func restrict(c *engine.Context, s series.Series, sample string) (series.Series, error) {
	if sample == "" {
		return s, nil
	}
	w, err := series.ParseWindow(sample)
	if err != nil {
		return s, c.Errorf("sample", "sample %q: %v", sample, err)
	}
	r, err := w.Apply(&s)
	if err != nil {
		return s, c.Errorf("sample", "%v", err)
	}
	return *r, nil
}

// design is a regression for the fit and stability plots.
type design struct {
	dates []series.Date
	y     []float64
	x     *mat.Dense
	terms []string
	yName string
	d     *engine.Data
}

// regressionSpec is where the regression comes from: the figure's own
// keys, or the ols directive that "of" names.
type regressionSpec struct {
	data, y, sample string
	x               []string
	withConst       bool
	missing         string // "" for the figure's own rule
}

// regressionOf resolves the regression for the fit and stability plots.
func (s *figureSpec) regressionOf(c *engine.Context) (regressionSpec, error) {
	if s.Of == "" {
		return regressionSpec{data: c.DataAlias(s.Data), y: s.Y, x: s.X, sample: s.Sample, withConst: s.Const == nil || *s.Const}, nil
	}
	if _, err := c.Result("of", s.Of, "ols"); err != nil {
		return regressionSpec{}, err
	}
	up, err := c.Upstream("of", s.Of, "ols")
	if err != nil {
		return regressionSpec{}, err
	}
	src, ok := up.(contract.DesignSource)
	if !ok {
		return regressionSpec{}, c.Errorf("of", "%q is not a single-equation regression", s.Of)
	}
	o := src.RegressionDesign()
	return regressionSpec{data: c.DataAlias(o.Data), y: o.Y, x: o.X, sample: o.Sample, withConst: o.Const, missing: o.Missing}, nil
}

// buildDesign evaluates the regression's series and returns its design,
// X formed by engine.Regressors as the ols directive forms it.
func buildDesign(c *engine.Context, r regressionSpec) (*design, error) {
	missing := r.missing
	if missing == "" {
		missing = c.Missing()
	}
	d, err := c.DataUsing(r.data, append([]string{r.y}, r.x...), r.sample, missing)
	if err != nil {
		return nil, err
	}
	terms, x, err := engine.Regressors(c, d, r.x, r.withConst, 1)
	if err != nil {
		return nil, err
	}
	return &design{dates: d.Dates, y: d.Cols[0], x: x, terms: terms, yName: r.y, d: d}, nil
}

// design returns the regression a fit or stability plot examines (of: an
// ols result, or the figure's own y and x), evaluated on its data.
func (s *figureSpec) design(c *engine.Context) (*design, error) {
	rs, err := s.regressionOf(c)
	if err != nil {
		return nil, err
	}
	return buildDesign(c, rs)
}
