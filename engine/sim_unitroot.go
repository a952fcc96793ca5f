package engine

import (
	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/analysis/unitroot"
)

// simADF replaces the tabulated critical values and p-value of an ADF
// outcome by simulated ones at its regression's T and lags (the chosen
// order when a criterion chose it). T of the simulated series is NObs +
// 1 + lags, so that its Dickey–Fuller regression has NObs observations.
func simADF(c *Context, s *simSettings, u urTest, o *Outcome) (*simulate.Result, error) {
	sp := s.spec(simulate.ADF, u.Det.String(), 1, o.NObs+1+o.Lags, o.Lags)
	r, err := simCrit(c, "crit", sp)
	if err != nil {
		return nil, err
	}
	o.Crit = simCritValues(r)
	o.CritSource = simSource(r, "case "+u.Det.String(), u.Lags.Select != unitroot.Fixed)
	o.PValue, o.PClipped = r.PValue(o.Stat), false
	o.PSource = pSimSource(r)
	if o.Extra == nil {
		o.Extra = map[string]any{}
	}
	o.Extra["crit_mcse"] = simLevelMap(r, r.MCSE)
	o.Extra["sim_key"] = r.Key
	o.Extra["sim"] = map[string]any{"reps": r.Reps, "seed": int(r.Seed), "t": r.NObs, "lags": r.Spec.Lags, "n": 1}
	return r, nil
}
