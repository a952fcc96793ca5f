package figure

import (
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/figures"
)

// plot: actual-fitted — a regression's dependent variable and its fitted
// values.

// runActualFitted draws the dependent variable of a regression and its
// least-squares fitted values (of: an ols result, or y and x), or those of
// the ecm result named by of:; it returns the figure and what it drew.
func (s *figureSpec) runActualFitted(c *engine.Context, o *figures.Options) (*figures.Figure, drawn, error) {
	if s.Of != "" && c.RefKind(s.Of) == "ecm" {
		return s.ecmActualFitted(c, o)
	}
	ds, err := s.design(c)
	if err != nil {
		return nil, drawn{}, err
	}
	fit, err := ols.Regress(ds.y, ds.x)
	if err != nil {
		return nil, drawn{}, engine.CollinearError(c, "x", err, ds.terms)
	}
	a := series.Series{Name: "actual", Dates: ds.dates, Values: ds.y}
	f := series.Series{Name: "fitted", Dates: ds.dates, Values: fit.Fitted}
	return s.drawActualFitted(c, a, f, ds.yName, o)
}

// ecmActualFitted draws an error-correction model's dependent variable
// (the first difference) and its fitted values, from the ecm result.
func (s *figureSpec) ecmActualFitted(c *engine.Context, o *figures.Options) (*figures.Figure, drawn, error) {
	res, err := c.Result("of", s.Of, "ecm")
	if err != nil {
		return nil, drawn{}, err
	}
	var ss [2]series.Series
	for i, key := range []string{"actual", "fitted"} {
		if ss[i], err = datedField(c, "of", res, key, key); err != nil {
			return nil, drawn{}, err
		}
	}
	y, _ := res.Values["y"].(string)
	return s.drawActualFitted(c, ss[0], ss[1], y, o)
}

// drawActualFitted draws actual a and fitted f in one panel, named by
// names: when given and with ylabel (when o has none) as the axis label;
// it returns the figure and what it drew.
func (s *figureSpec) drawActualFitted(c *engine.Context, a, f series.Series, ylabel string, o *figures.Options) (*figures.Figure, drawn, error) {
	if len(s.Names) == 2 {
		a.Name, f.Name = s.Names[0], s.Names[1]
	} else if len(s.Names) != 0 {
		return nil, drawn{}, c.Errorf("names", "actual-fitted takes two names (actual, fitted); %d are given", len(s.Names))
	}
	dr := drawn{names: []string{a.Name, f.Name}, panel: []int{1, 1}, series: []series.Series{a, f}}
	if o.YLabel == "" {
		o.YLabel = c.TermText(ylabel)
	}
	if err := s.shade(c, dr.series, o); err != nil {
		return nil, dr, err
	}
	fig, err := figures.ActualFitted(a, f, *o)
	if err != nil {
		return nil, dr, c.Errorf("", "%v", err)
	}
	return fig, dr, nil
}
