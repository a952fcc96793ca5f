package figure

import (
	"fmt"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// This file gathers what a figure draws: dated series from expressions,
// a residual series from another directive's result, and a regression
// design (for the fit and stability plots) from y/x keys or from an ols
// directive named by "of".

// residualSeries reads the residual series of another result. The result
// must carry Values["resid"] = {"dates": [...], "values": [...]}, dates
// as text in the canonical form of series.Date.String (ols and
// engle-granger results do).
func residualSeries(c *engine.Context, key string, r *engine.Result) (series.Series, error) {
	s, err := datedField(c, key, r, "resid", "residual")
	s.Name = "residual"
	return s, err
}

// relationSeries reads cointegrating relation n (1-based) of a johansen
// or vecm result: Values["relations"][n−1] = {"dates", "values"}, β_n'ỹ_t
// as kind_johansen.go stores it. The errors are at the line of key (for a
// result without relations) or of relKey (for n out of range).
func relationSeries(c *engine.Context, key, relKey string, r *engine.Result, n int) (series.Series, error) {
	raw, ok := r.Values["relations"]
	if !ok && numberValue(r.Values["rank"]) >= 1 {
		return series.Series{}, c.Errorf(key, "%q (a %s result, line %d) carries no relation series; it was probably cached by an earlier galley: build with --no-cache", r.ID, r.Kind, r.Line)
	}
	if !ok {
		return series.Series{}, c.Errorf(key, "%q (a %s result, line %d) estimates no cointegrating relation: its rank is %v (the sequential trace tests chose %v), so there is no relation to plot; set rank: (1 … K−1) on it",
			r.ID, r.Kind, r.Line, r.Values["rank"], r.Values["rank_chosen"])
	}
	var list []any
	switch x := raw.(type) {
	case []map[string]any:
		for _, e := range x {
			list = append(list, e)
		}
	case []any:
		list = x
	default:
		return series.Series{}, c.Errorf(key, "%q: its relations are not a list of dated series (got %T)", r.ID, raw)
	}
	if n < 1 || n > len(list) {
		return series.Series{}, c.Errorf(relKey, "relation %d: %q (a %s result, line %d) has %d cointegrating relation%s (rank %d); give relation: 1%s",
			n, r.ID, r.Kind, r.Line, len(list), plural(len(list)), len(list), map[bool]string{true: "", false: fmt.Sprintf(" … %d", len(list))}[len(list) == 1])
	}
	return datedValue(c, key, r, list[n-1], fmt.Sprintf("relation %d", n))
}

// numberValue reads a count from values (an int in memory, a float64
// after the results file or the cache); −1 if it is not a number.
func numberValue(v any) float64 {
	switch x := v.(type) {
	case int:
		return float64(x)
	case float64:
		return x
	}
	return -1
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}

// datedField reads a dated series {"dates": [...], "values": [...]} that
// a result stores under field (what names it in messages).
func datedField(c *engine.Context, key string, r *engine.Result, field, what string) (series.Series, error) {
	raw, ok := r.Values[field]
	if !ok {
		return series.Series{}, c.Errorf(key, "%q (a %s result, line %d) has no %s series to plot", r.ID, r.Kind, r.Line, what)
	}
	return datedValue(c, key, r, raw, what)
}

// datedValue reads raw, a dated series {"dates": [...], "values": [...]}
// taken from r's values.
func datedValue(c *engine.Context, key string, r *engine.Result, raw any, what string) (series.Series, error) {
	m, ok := raw.(map[string]any)
	if !ok {
		return series.Series{}, c.Errorf(key, "%q: its %s values are not a dated series (got %T)", r.ID, what, raw)
	}
	texts, err := stringList(m["dates"])
	if err != nil {
		return series.Series{}, c.Errorf(key, "%q: %s dates: %v", r.ID, what, err)
	}
	vals, err := floatList(m["values"])
	if err != nil {
		return series.Series{}, c.Errorf(key, "%q: %s values: %v", r.ID, what, err)
	}
	if len(texts) != len(vals) {
		return series.Series{}, c.Errorf(key, "%q: %d %s dates for %d values", r.ID, len(texts), what, len(vals))
	}
	s := series.Series{Name: what, Dates: make([]series.Date, len(texts)), Values: vals}
	for i, t := range texts {
		d, err := dateFromText(t)
		if err != nil {
			return series.Series{}, c.Errorf(key, "%q: %s date %d: %v", r.ID, what, i+1, err)
		}
		s.Dates[i] = d
	}
	return s, nil
}

// dateFromText parses a canonical date, or an observation number for
// undated data.
func dateFromText(s string) (series.Date, error) {
	if d, err := series.ParseDate(s); err == nil {
		return d, nil
	}
	if n, err := strconv.Atoi(strings.TrimSpace(s)); err == nil && n >= 1 {
		return series.Date{Freq: series.Undated, Sub: n}, nil
	}
	return series.ParseDate(s)
}

func stringList(v any) ([]string, error) {
	switch x := v.(type) {
	case []string:
		return x, nil
	case []any:
		out := make([]string, len(x))
		for i, e := range x {
			s, ok := e.(string)
			if !ok {
				return nil, fmt.Errorf("entry %d is %T, not text", i+1, e)
			}
			out[i] = s
		}
		return out, nil
	}
	return nil, fmt.Errorf("expected a list of dates, got %T", v)
}

func floatList(v any) ([]float64, error) {
	switch x := v.(type) {
	case []float64:
		return x, nil
	case []any:
		out := make([]float64, len(x))
		for i, e := range x {
			switch f := e.(type) {
			case float64:
				out[i] = f
			case int:
				out[i] = float64(f)
			case nil:
				out[i] = nan()
			default:
				return nil, fmt.Errorf("entry %d is %T, not a number", i+1, e)
			}
		}
		return out, nil
	}
	return nil, fmt.Errorf("expected a list of numbers, got %T", v)
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

// buildDesign evaluates the regression's series and forms X.
func buildDesign(c *engine.Context, r regressionSpec) (*design, error) {
	missing := r.missing
	if missing == "" {
		missing = c.Missing()
	}
	d, err := c.DataUsing(r.data, append([]string{r.y}, r.x...), r.sample, missing)
	if err != nil {
		return nil, err
	}
	var terms []string
	if r.withConst {
		terms = append(terms, "const")
	}
	terms = append(terms, r.x...)
	n, k := d.N(), len(terms)
	if n <= k+1 {
		return nil, c.Errorf("", "too few observations: %d in the sample %s for %d coefficients", n, d.Range(), k)
	}
	x := mat.NewDense(n, k, nil)
	for i := 0; i < n; i++ {
		j := 0
		if r.withConst {
			x.Set(i, 0, 1)
			j = 1
		}
		for l := range r.x {
			x.Set(i, j+l, d.Cols[1+l][i])
		}
	}
	return &design{dates: d.Dates, y: d.Cols[0], x: x, terms: terms, yName: r.y, d: d}, nil
}
