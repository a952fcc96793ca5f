package figure

import (
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/figures"
)

// plot: multipliers — the cumulative dynamic multipliers of a split
// regressor of an asymmetric model, read from the result named by of:
// through contract.MultiplierSource / contract.ReadMultipliers.

// multiplierKeys are the keys plot multipliers accepts besides the common
// ones.
var multiplierKeys = map[string]bool{"plot": true, "of": true, "coef": true, "names": true, "ylabel": true, "xlabel": true,
	"legend": true, "width": true, "height": true, "id": true, "caption": true, "note": true, "missing": true}

func (s *figureSpec) checkMultipliers(c *engine.Context) error {
	for _, k := range []string{"data", "series", "panels", "residuals", "relation", "y", "x", "const", "sample", "shade", "ylabels", "lags", "alpha"} {
		if c.Has(k) && !multiplierKeys[k] {
			return c.Errorf(k, "plot multipliers draws the multipliers of the result named by of; drop %s", k)
		}
	}
	if s.Of == "" {
		return c.Errorf("", "plot multipliers needs of: the id of an ardl result with split regressors")
	}
	up, err := c.Upstream("of", s.Of)
	if err != nil {
		return err
	}
	src, ok := up.(contract.MultiplierSource)
	if !ok {
		return c.Errorf("of", "%q (kind %s) carries no dynamic multipliers: name an ardl result with split regressors", s.Of, c.RefKind(s.Of))
	}
	if !src.HasMultipliers() {
		return c.Errorf("of", "%q splits no regressor, so it has no asymmetric multipliers: give it split: [...]", s.Of)
	}
	if len(s.Names) > 3 {
		return c.Errorf("names", "plot multipliers draws three lines (rise, fall, asymmetry); %d names given", len(s.Names))
	}
	return nil
}

func (s *figureSpec) runMultipliers(c *engine.Context, o *figures.Options, vals map[string]any) (*engine.Result, error) {
	if err := s.checkMultipliers(c); err != nil {
		return nil, err
	}
	r, err := c.Result("of", s.Of)
	if err != nil {
		return nil, err
	}
	ms, err := contract.ReadMultipliers(r.Values)
	if err != nil {
		return nil, c.Errorf("of", "%q: %v", s.Of, err)
	}
	m := ms[0]
	if s.Coef != "" {
		var names []string
		found := false
		for _, e := range ms {
			names = append(names, e.Name)
			if e.Name == s.Coef {
				m, found = e, true
			}
		}
		if !found {
			return nil, c.Errorf("coef", "%q splits %s, not %q", s.Of, strings.Join(names, ", "), s.Coef)
		}
	}
	if o.XLabel == "" {
		o.XLabel = "periods after the change"
	}
	fig, err := figures.Multipliers(m.Pos, m.Neg, m.Asym, m.LongPos, m.LongNeg, s.Names, *o)
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	vals["of"] = s.Of
	vals["coef"] = m.Name
	vals["horizon"] = len(m.Pos) - 1
	return s.finish(c, fig, vals)
}
