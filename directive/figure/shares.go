package figure

import (
	"fmt"
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/figures"
)

// plot: variance-shares — the forecast-error variance decomposition of
// the variance-shares result named by of:, at every horizon 1 … horizon,
// as stacked bars: one panel per series, the shares of the shocks stacked
// to 100%. The decomposition is the upstream's own, computed at the
// figure's horizons (contract.VarianceShareSource, asked for with
// engine.Context.Live).

// sharesKeys are the keys plot variance-shares accepts besides id,
// caption, note and missing.
var sharesKeys = []string{"plot", "of", "horizon", "series", "names", "ylabel", "ylabels", "xlabel", "legend", "width", "height"}

// checkShares returns an error for a key plot variance-shares does not
// take, an of: that names no variance-shares result, a horizon outside
// 1–200 or a legend place other than none.
func (s *figureSpec) checkShares(c *engine.Context) error {
	for _, k := range []string{"data", "panels", "residuals", "relation", "y", "x", "const", "coef", "sample", "shade", "lags", "alpha"} {
		if c.Has(k) {
			return c.Errorf(k, "plot variance-shares draws the decomposition of the result named by of and does not take %s; its keys: %s", k, strings.Join(sharesKeys[1:], ", "))
		}
	}
	if s.Of == "" {
		return c.Errorf("", "plot variance-shares needs of: the id of a variance-shares result")
	}
	up, err := c.Upstream("of", s.Of)
	if err != nil {
		return err
	}
	if _, ok := up.(contract.VarianceShareSource); !ok {
		return c.Errorf("of", "%q is a %s result; plot variance-shares needs the id of a variance-shares result", s.Of, c.RefKind(s.Of))
	}
	if s.Horizon != nil && (*s.Horizon < 1 || *s.Horizon > 200) {
		return c.Errorf("horizon", "horizon: %d is outside 1–200 (the last h-step forecast error drawn)", *s.Horizon)
	}
	if s.Legend != "" && s.Legend != "none" {
		return c.Errorf("legend", "plot variance-shares sets its legend above the panels; legend takes none (no legend), not %q", s.Legend)
	}
	return nil
}

// runShares draws the decomposition of the series asked for (series:, by
// default all) at horizons 1 … horizon (by default the last horizon of
// the upstream's table); the plotted shares go into vals.
func (s *figureSpec) runShares(c *engine.Context, o *figures.Options, vals map[string]any) (*engine.Result, error) {
	if err := s.checkShares(c); err != nil {
		return nil, err
	}
	up, err := c.Live("of", s.Of)
	if err != nil {
		return nil, err
	}
	src, ok := up.(contract.VarianceShareSource)
	if !ok {
		return nil, c.Errorf("of", "%q carries no variance decomposition", s.Of)
	}
	h := src.LastHorizon()
	if s.Horizon != nil {
		h = *s.Horizon
	}
	vs, err := src.VarianceShares(h)
	if err != nil {
		return nil, c.Errorf(c.FirstSet("horizon", "of"), "%s: %v", s.Of, err)
	}
	k := len(vs.Names)
	if len(vs.Shares) != h || len(vs.Order) != k {
		return nil, fmt.Errorf("internal error: %q handed on %d horizons and an ordering of %d for %d series", s.Of, len(vs.Shares), len(vs.Order), k)
	}
	rows, err := c.SeriesIndices("series", s.Series, vs.Names)
	if err != nil {
		return nil, err
	}
	if len(s.Names) > 0 && len(s.Names) != k {
		return nil, c.Errorf("names", "%d names for the %d shocks of %q; give one per series, in its order (%s)", len(s.Names), k, s.Of, strings.Join(vs.Names, ", "))
	}
	if len(rows) > 1 && s.YLabel != "" {
		return nil, c.Errorf("ylabel", "a figure of %d panels takes ylabels (one per panel), not ylabel", len(rows))
	}
	if len(s.YLabels) > 0 && len(s.YLabels) != len(rows) {
		return nil, c.Errorf("ylabels", "%d ylabels for %d panels", len(s.YLabels), len(rows))
	}
	shockName := func(j int) string {
		if len(s.Names) > 0 {
			return s.Names[j]
		}
		return c.TermText(vs.Names[j])
	}
	// The bands, bottom first, in the Cholesky ordering; past the house
	// shades the last ones are drawn together.
	type band struct {
		name   string
		shocks []int
	}
	var bands []band
	for a, j := range vs.Order {
		if a < figures.MaxShareBands-1 || k == figures.MaxShareBands {
			bands = append(bands, band{name: shockName(j), shocks: []int{j}})
			continue
		}
		if a == figures.MaxShareBands-1 {
			bands = append(bands, band{name: fmt.Sprintf("the other %d shocks", k-a)})
		}
		bands[len(bands)-1].shocks = append(bands[len(bands)-1].shocks, j)
	}
	shares := map[string]any{}
	var panels []figures.SharePanel
	for _, i := range rows {
		byShock := map[string]any{}
		for j, sn := range vs.Names {
			v := make([]float64, h)
			for t := range v {
				v[t] = vs.Shares[t][i][j]
			}
			byShock[sn] = v
		}
		shares[vs.Names[i]] = byShock
		pn := figures.SharePanel{Label: c.TermText(vs.Names[i])}
		for _, b := range bands {
			v := make([]float64, h)
			for t := range v {
				for _, j := range b.shocks {
					v[t] += vs.Shares[t][i][j]
				}
			}
			pn.Bands = append(pn.Bands, figures.ShareBand{Name: b.name, Values: v})
		}
		panels = append(panels, pn)
	}
	if o.XLabel == "" {
		o.XLabel = "forecast horizon"
	}
	fig, err := figures.Shares(panels, *o)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	order := make([]string, k)
	for a, j := range vs.Order {
		order[a] = c.TermText(vs.Names[j])
	}
	drawnNames := make([]string, len(rows))
	for a, i := range rows {
		drawnNames[a] = c.TermText(vs.Names[i])
	}
	s.notes = append(s.notes, fmt.Sprintf("The share of the h-step forecast-error variance of %s due to each orthogonalised shock, h = 1 … %d, stacked from the bottom in the Cholesky ordering %s; from %s (the decomposition of %q).",
		strings.Join(drawnNames, ", "), h, strings.Join(order, ", "), vs.Model, s.Of))
	if len(bands) < k {
		s.notes = append(s.notes, fmt.Sprintf("The last %d shocks of the ordering are drawn as one band; the values hold each.", len(bands[len(bands)-1].shocks)))
	}
	vals["of"] = s.Of
	vals["horizon"] = h
	vals["shares"] = shares
	return s.finish(c, fig, vals)
}
