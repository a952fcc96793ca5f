package unitroot

import (
	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// simADF replaces the tabulated critical values and p-value of an ADF
// outcome by simulated ones at its regression's T and lags (the chosen
// order when a criterion chose it). T of the simulated series is NObs +
// 1 + lags, so that its Dickey–Fuller regression has NObs observations.
func simADF(c *engine.Context, s *engine.SimSettings, u urTest, o *contract.Outcome) (*simulate.Result, error) {
	sp := s.Spec(simulate.ADF, u.Det.String(), 1, o.NObs+1+o.Lags, o.Lags)
	r, err := engine.SimCrit(c, "crit", sp)
	if err != nil {
		return nil, err
	}
	o.Crit = engine.SimCritValues(r)
	o.CritSource = engine.SimSource(r, "case "+u.Det.String(), u.Lags.Select != unitroot.Fixed)
	o.PValue, o.PClipped = r.PValue(o.Stat), false
	o.PSource = engine.PSimSource(r)
	if o.Extra == nil {
		o.Extra = map[string]any{}
	}
	o.Extra["crit_mcse"] = engine.SimLevelMap(r, r.MCSE)
	o.Extra["sim_key"] = r.Key
	o.Extra["sim"] = map[string]any{"reps": r.Reps, "seed": int(r.Seed), "t": r.NObs, "lags": r.Spec.Lags, "n": 1}
	return r, nil
}
