package figure

import (
	"fmt"
	"math"
	"slices"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/figures"
)

// plot: residuals — one residual series, cointegrating relation or
// expression about zero; the acf plot reads its series here too.

// runOneSeries draws a residual series (or one expression) as a line
// about zero, or its correlogram; it returns the figure and what it drew.
func (s *figureSpec) runOneSeries(c *engine.Context, p string, o *figures.Options, vals map[string]any) (*figures.Figure, drawn, error) {
	ser, err := s.oneSeries(c, vals)
	if err != nil {
		return nil, drawn{}, err
	}
	if len(s.Names) > 0 {
		ser.Name = s.Names[0]
	}
	dr := drawn{names: []string{ser.Name}, panel: []int{1}, series: []series.Series{ser}}
	if p == "residuals" {
		if err := s.shade(c, dr.series, o); err != nil {
			return nil, dr, err
		}
		fig, err := figures.Residuals(ser, *o)
		if err != nil {
			return nil, dr, c.Errorf("", "%v", err)
		}
		return fig, dr, nil
	}
	fig, err := s.correlogram(c, ser, o, vals) // acf.go
	return fig, dr, err
}

// oneSeries returns the series a residuals or acf plot draws: the
// residuals of the result named by residuals: (or a cointegrating relation
// of a johansen or vecm result), within sample, or the one expression.
func (s *figureSpec) oneSeries(c *engine.Context, vals map[string]any) (series.Series, error) {
	var ser series.Series
	var err error
	if s.Residuals == "" {
		e := s.exprs()[0]
		return s.dataSeries(c, e, e)
	}
	r, err := c.Result("residuals", s.Residuals)
	if err != nil {
		return ser, err
	}
	if r.Kind == "johansen" || r.Kind == "vecm" {
		return s.relation(c, r, vals)
	}
	if ser, err = residualSeries(c, "residuals", r); err != nil {
		return ser, err
	}
	ser.Name = "residual of " + s.Residuals
	return restrict(c, ser, s.Sample)
}

// relation is the cointegrating relation of a johansen or vecm result
// that the figure draws (relation: N, default 1), within sample. In the
// cases with an unrestricted constant (c, rt, ct) any shift of the
// relation's level is absorbed by that constant, so the level is not
// identified: the sample mean over the plotted dates is subtracted and the
// zero line is the relation's average. In cases n and rc the level is
// estimated (zero, or the restricted constant) and β'ỹ_t is drawn as it
// is. What was drawn goes into vals["relation"].
func (s *figureSpec) relation(c *engine.Context, r *engine.Result, vals map[string]any) (series.Series, error) {
	n := 1
	if s.Relation != nil {
		n = *s.Relation
	}
	ser, err := relationSeries(c, "residuals", "relation", r, n)
	if err != nil {
		return ser, err
	}
	ser.Name = fmt.Sprintf("relation %d of %s", n, s.Residuals)
	if ser, err = restrict(c, ser, s.Sample); err != nil {
		return ser, err
	}
	ser.Values = slices.Clone(ser.Values)
	var mean float64
	// An unrestricted constant (the constant, restricted-trend and trend
	// cases) leaves the relation's level arbitrary.
	if det, _ := r.Values["det"].(string); det == engine.SystemCaseWords[2] || det == engine.SystemCaseWords[3] || det == engine.SystemCaseWords[4] {
		k := 0
		for _, v := range ser.Values {
			if !math.IsNaN(v) {
				mean += v
				k++
			}
		}
		mean /= float64(max(k, 1))
		for i := range ser.Values {
			ser.Values[i] -= mean
		}
	}
	texts := make([]string, len(ser.Dates))
	for i, d := range ser.Dates {
		texts[i] = d.String()
	}
	vals["relation"] = map[string]any{"number": n, "mean_removed": mean, "dates": texts, "values": slices.Clone(ser.Values)}
	return ser, nil
}
