package figure

import (
	"math"
	"slices"
	"strings"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/analysis/stability"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/figures"
	"github.com/galley-econ/galley/manuscript"
)

// plot: cusum, cusumsq and recursive — the stability diagnostics of a
// regression, from its recursive residuals.

// runStability draws a stability diagnostic of a regression (cusum,
// cusumsq or recursive, from package analysis/stability) and returns the
// figure and what it drew; its values go into vals.
func (s *figureSpec) runStability(c *engine.Context, p string, o *figures.Options, vals map[string]any) (*figures.Figure, drawn, error) {
	ds, err := s.design(c)
	if err != nil {
		return nil, drawn{}, err
	}
	alpha := s.Alpha
	if alpha == 0 {
		alpha = 0.05
	}
	vals["alpha"] = alpha
	rec, err := stability.Compute(ds.y, ds.x)
	if err != nil {
		return nil, drawn{}, c.Errorf(c.FirstSet("of", "x"), "recursive residuals: %v", err)
	}
	if rec.Residuals() < 3 {
		return nil, drawn{}, c.Errorf("", "only %d recursive residuals in %s: too few to draw", rec.Residuals(), ds.d.Range())
	}
	switch p {
	case "cusum":
		return s.cusum(c, ds, rec, alpha, o, vals)
	case "cusumsq":
		return s.cusumSquares(c, ds, rec, alpha, o, vals)
	case "recursive":
		return s.recursive(c, ds, rec, o, vals)
	}
	return nil, drawn{}, nil
}

// dateTexts returns the dates as text, for the values.
func dateTexts(dates []series.Date) []string {
	texts := make([]string, len(dates))
	for i, d := range dates {
		texts[i] = d.String()
	}
	return texts
}

// cusum draws the CUSUM of the recursive residuals with its band at level
// alpha and returns the figure and what it drew; the constant a, the
// plotted values and the points outside the band go into vals.
func (s *figureSpec) cusum(c *engine.Context, ds *design, rec *stability.Recursive, alpha float64, o *figures.Options, vals map[string]any) (*figures.Figure, drawn, error) {
	from := rec.First
	texts := dateTexts(ds.dates[from:])
	stat := rec.CUSUM()
	band, err := rec.CUSUMBand(alpha)
	if err != nil {
		return nil, drawn{}, c.Errorf("alpha", "%v", err)
	}
	a, _ := stability.CUSUMConst(alpha)
	vals["a"] = a
	vals["cusum"] = map[string]any{"dates": texts, "values": slices.Clone(stat[from:]), "band": slices.Clone(band[from:])}
	k, out := outside(texts, stat[from:], func(i int, v float64) bool { return math.Abs(v) > band[from+i] })
	vals["outside"], vals["first_outside"] = k, out
	dr := drawn{names: []string{"CUSUM"}, panel: []int{1}, series: []series.Series{{Name: "CUSUM", Dates: ds.dates, Values: stat}}}
	if err := s.shade(c, dr.series, o); err != nil {
		return nil, dr, err
	}
	fig, err := figures.CUSUM(ds.dates, stat, band, *o)
	if err != nil {
		return nil, dr, c.Errorf("", "%v", err)
	}
	return fig, dr, nil
}

// cusumSquares draws the CUSUM of squares with its lines at level alpha
// and returns the figure and what it drew; c₀, the plotted values and the
// points outside the lines go into vals.
func (s *figureSpec) cusumSquares(c *engine.Context, ds *design, rec *stability.Recursive, alpha float64, o *figures.Options, vals map[string]any) (*figures.Figure, drawn, error) {
	from := rec.First
	texts := dateTexts(ds.dates[from:])
	stat := rec.CUSUMSquares()
	lo, hi, err := rec.CUSUMSquaresBand(alpha)
	if err != nil {
		return nil, drawn{}, c.Errorf("", "CUSUM of squares band: %v", err)
	}
	c0, err := stability.CUSUMSquaresConst(rec.Residuals(), alpha)
	if err != nil {
		return nil, drawn{}, c.Errorf("", "CUSUM of squares band: %v", err)
	}
	vals["c0"] = c0
	vals["cusumsq"] = map[string]any{"dates": texts, "values": slices.Clone(stat[from:]), "lower": slices.Clone(lo[from:]), "upper": slices.Clone(hi[from:])}
	k, out := outside(texts, stat[from:], func(i int, v float64) bool { return v < lo[from+i] || v > hi[from+i] })
	vals["outside"], vals["first_outside"] = k, out
	dr := drawn{names: []string{"CUSUM of squares"}, panel: []int{1}, series: []series.Series{{Name: "CUSUM of squares", Dates: ds.dates, Values: stat}}}
	if err := s.shade(c, dr.series, o); err != nil {
		return nil, dr, err
	}
	fig, err := figures.CUSUMSquares(ds.dates, stat, lo, hi, *o)
	if err != nil {
		return nil, dr, c.Errorf("", "%v", err)
	}
	return fig, dr, nil
}

// recursive draws the recursive estimate of one coefficient (coef:, by
// default the first regressor after the constant) with its pointwise 95%
// band and returns the figure and what it drew; the plotted values go
// into vals.
func (s *figureSpec) recursive(c *engine.Context, ds *design, rec *stability.Recursive, o *figures.Options, vals map[string]any) (*figures.Figure, drawn, error) {
	term := s.Coef
	if term == "" {
		term = ds.terms[0]
		if len(ds.terms) > 1 && term == "const" {
			term = ds.terms[1]
		}
	}
	j := slices.Index(ds.terms, term)
	if j < 0 {
		return nil, drawn{}, c.Errorf("coef", "the regression has no coefficient %q%s; it has: %s", term, manuscript.DidYouMean(term, ds.terms), strings.Join(ds.terms, ", "))
	}
	est, lo, hi, err := rec.CoefBand(j)
	if err != nil {
		return nil, drawn{}, c.Errorf("coef", "%v", err)
	}
	// the band is drawn where the estimate has a standard error
	start := slices.IndexFunc(lo, func(v float64) bool { return !math.IsNaN(v) })
	if start < 0 {
		return nil, drawn{}, c.Errorf("", "the recursive estimate of %s never has a standard error in %s", term, ds.d.Range())
	}
	vals["recursive"] = map[string]any{"term": term, "dates": dateTexts(ds.dates[start:]), "estimate": slices.Clone(est[start:]), "lower": slices.Clone(lo[start:]), "upper": slices.Clone(hi[start:])}
	name := "recursive estimate of " + term
	dr := drawn{names: []string{name}, panel: []int{1}, series: []series.Series{{Name: name, Dates: ds.dates[start:], Values: est[start:]}}}
	if o.YLabel == "" {
		o.YLabel = term
	}
	if err := s.shade(c, dr.series, o); err != nil {
		return nil, dr, err
	}
	fig, err := figures.RecursiveCoef(ds.dates[start:], est[start:], lo[start:], hi[start:], *o)
	if err != nil {
		return nil, dr, c.Errorf("", "%v", err)
	}
	return fig, dr, nil
}

// outside counts the points at which out(i, v) holds and gives the
// first of their dates (nil if there is none).
func outside(dates []string, v []float64, out func(int, float64) bool) (int, any) {
	n := 0
	var first any
	for i, x := range v {
		if out(i, x) {
			if n == 0 {
				first = dates[i]
			}
			n++
		}
	}
	return n, first
}
