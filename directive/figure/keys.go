package figure

import (
	"slices"
	"strings"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/manuscript"
)

// The keys of a figure: Check validates those every plot shares, then
// those of the plot family asked for.

// Check validates the keys every plot shares, then those of the plot
// asked for; it returns the first error, at its key.
func (s *figureSpec) Check(c *engine.Context) error {
	p := s.plotKind()
	if err := s.checkCommon(c, p); err != nil {
		return err
	}
	if p == "multipliers" {
		return s.checkMultipliers(c) // multipliers.go
	}
	if isSystemPlot(p) {
		return s.checkSystem(c, p) // system.go
	}
	if p == "variance-shares" {
		return s.checkShares(c) // shares.go
	}
	if isRegressionPlot(p) {
		return s.checkRegression(c, p)
	}
	return s.checkSeries(c, p)
}

// checkCommon returns an error for an unknown plot or legend place, a size,
// lags or alpha out of range, a shaded window or sample that does not parse.
func (s *figureSpec) checkCommon(c *engine.Context, p string) error {
	if !slices.Contains(plotKinds, p) {
		return c.Errorf("plot", "unknown plot %q%s; plots: %s", p, manuscript.DidYouMean(p, plotKinds), strings.Join(plotKinds, ", "))
	}
	if s.Legend != "" {
		if _, ok := legendPlaces[s.Legend]; !ok {
			return c.Errorf("legend", "unknown legend place %q; use top-left, top-right, bottom-left, bottom-right or none", s.Legend)
		}
	}
	for _, k := range []struct {
		key string
		v   float64
	}{{"width", s.Width}, {"height", s.Height}} {
		if c.Has(k.key) && !(k.v > 0.5 && k.v <= 40) {
			return c.Errorf(k.key, "%s %g in: give a size in inches between 0.5 and 40", k.key, k.v)
		}
	}
	if k := c.FirstSet(systemOnlyKeys...); k != "" && !isSystemPlot(p) {
		return c.Errorf(k, "%s belongs to plot recursive-rank, not to plot %s", k, p)
	}
	if c.Has("horizon") && p != "variance-shares" {
		return c.Errorf("horizon", "horizon belongs to plot variance-shares, not to plot %s", p)
	}
	if c.Has("lags") && s.Lags < 1 {
		return c.Errorf("lags", "lags must be at least 1")
	}
	if c.Has("alpha") && !(s.Alpha > 0 && s.Alpha < 0.5) {
		return c.Errorf("alpha", "alpha %g: give the significance level of the bands, between 0 and 0.5 (e.g. 0.05)", s.Alpha)
	}
	for i, w := range s.Shade {
		if _, _, err := parseShade(w); err != nil {
			return c.ItemErrorf("shade", i, "%v", err)
		}
	}
	if s.Sample != "" {
		if _, err := series.ParseWindow(s.Sample); err != nil {
			return c.Errorf("sample", "sample %q: %v", s.Sample, err)
		}
	}
	return nil
}

// checkRegression validates a regression plot (actual-fitted, cusum,
// cusumsq, recursive): either of: naming an ols (or, for actual-fitted,
// an ecm) result, or y and x written out; it returns the first error.
func (s *figureSpec) checkRegression(c *engine.Context, p string) error {
	if len(s.exprs()) > 0 || s.Residuals != "" || c.Has("relation") {
		return c.Errorf(c.FirstSet("series", "panels", "residuals", "relation"), "plot %s draws a regression: give of (an ols id) or y and x, not series, panels, residuals or relation", p)
	}
	if s.Of != "" {
		if k := c.FirstSet("y", "x", "const", "data", "sample"); k != "" {
			return c.Errorf(k, "with of, the regression (its data, y, x, const and sample) comes from %q; drop %s", s.Of, k)
		}
		if p == "actual-fitted" {
			return c.CheckRef("of", s.Of, "ols", "ecm")
		}
		if c.RefKind(s.Of) == "ecm" {
			return c.Errorf("of", "plot %s needs the regression itself: name an ols result, or give y and x (an ecm result can be drawn as actual-fitted)", p)
		}
		return c.CheckRef("of", s.Of, "ols")
	}
	if s.Y == "" {
		return c.Errorf("", "plot %s has nothing to draw: give of (the id of an ols result) or y and x", p)
	}
	if len(s.X) == 0 && s.Const != nil && !*s.Const {
		return c.Errorf("x", "a regression needs at least one regressor: give x, or keep the constant")
	}
	return c.CheckData(c.DataAlias(s.Data), append([]string{s.Y}, s.X...), s.Sample)
}

// checkSeries validates a plot of series (lines, panels, residuals, acf):
// expressions in series or panels, or residuals naming a result; it
// returns the first error.
func (s *figureSpec) checkSeries(c *engine.Context, p string) error {
	if k := c.FirstSet("of", "y", "x", "const", "coef"); k != "" {
		return c.Errorf(k, "%s belongs to the regression plots (actual-fitted, cusum, cusumsq, recursive), not to plot %s", k, p)
	}
	ex := s.exprs()
	if s.Residuals != "" {
		return s.checkResiduals(c, p, ex)
	}
	if c.Has("relation") {
		return c.Errorf("relation", "relation picks a cointegrating relation of the johansen or vecm result named by residuals; give residuals: ID")
	}
	if len(ex) == 0 {
		return c.Errorf("", "this figure has nothing to draw: give series (expressions), panels, residuals (an id), of (an ols id) or y and x")
	}
	if len(s.Series) > 0 && len(s.Panels) > 0 {
		return c.Errorf("panels", "give either series or panels, not both")
	}
	if (p == "residuals" || p == "acf") && len(ex) != 1 {
		return c.Errorf(c.FirstSet("series", "panels"), "plot %s draws one series; %d are given", p, len(ex))
	}
	if p == "lines" && len(s.Panels) > 0 {
		return c.Errorf("panels", "plot lines draws one panel; use plot panels (or leave plot out) to stack panels")
	}
	if len(s.Names) > 0 && len(s.Names) != len(ex) {
		return c.Errorf("names", "%d names for %d series", len(s.Names), len(ex))
	}
	return c.CheckData(c.DataAlias(s.Data), ex, s.Sample)
}

// checkResiduals validates residuals: ID (with relation: N for a johansen
// or vecm result) for plot residuals or acf, given the series expressions
// ex; it returns the first error.
func (s *figureSpec) checkResiduals(c *engine.Context, p string, ex []string) error {
	if len(ex) > 0 {
		return c.Errorf(c.FirstSet("series", "panels"), "give either residuals or series, not both")
	}
	if p != "residuals" && p != "acf" {
		return c.Errorf("residuals", "residuals can be drawn with plot residuals or acf, not %s", p)
	}
	if err := c.CheckRef("residuals", s.Residuals); err != nil {
		return err
	}
	if k := c.RefKind(s.Residuals); c.Has("relation") && k != "johansen" && k != "vecm" {
		return c.Errorf("relation", "relation picks one cointegrating relation of a johansen or vecm result; %q (kind %s) has none: drop relation", s.Residuals, k)
	}
	if s.Relation != nil && *s.Relation < 1 {
		return c.Errorf("relation", "relation %d: relations are numbered from 1", *s.Relation)
	}
	return nil
}
