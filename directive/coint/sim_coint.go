package coint

import (
	"fmt"
	"strings"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
)

// simEG replaces the tabulated critical values and p-value of one
// Engle–Granger row by simulated ones: N independent random walks, the
// static regression with the case's terms, and the residual
// Dickey–Fuller regression with the row's lags at the row's T.
func simEG(c *engine.Context, s *engine.SimSettings, det critical.Case, rule unitroot.LagRule, res *coint.EGResult) (*simulate.Result, error) {
	sp := s.Spec(simulate.EG, det.String(), res.Vars, res.NObs+1+res.Lags, res.Lags)
	r, err := engine.SimCrit(c, "crit", sp)
	if err != nil {
		return nil, err
	}
	res.Crit = engine.SimCritValues(r)
	res.CritSource = engine.SimSource(r, fmt.Sprintf("N=%d variables, case %s of the static regression", res.Vars, det), rule.Select != unitroot.Fixed)
	res.PValue = r.PValue(res.Stat)
	return r, nil
}

// simEGNote is the Engle–Granger note on simulated critical values.
func simEGNote(sims []*simulate.Result, vars []string, deps []int) string {
	var b strings.Builder
	r0 := sims[0]
	fmt.Fprintf(&b, "Critical values: simulated, %s replications with seed %d of %d independent Gaussian random walks, the static regression with the same deterministic terms and the residual Dickey–Fuller regression with the same lags (held fixed when a criterion chose them) at the same T", engine.Group(r0.Reps), r0.Seed, r0.Spec.N)
	var ts []string
	for r, sr := range sims {
		s := fmt.Sprintf("T=%d, %d lags, Monte Carlo standard errors %s", sr.NObs, sr.Spec.Lags, engine.SimMCSEText(sr))
		if len(sims) > 1 {
			s = vars[deps[r]] + ": " + s
		}
		ts = append(ts, s)
	}
	fmt.Fprintf(&b, " (%s); stars by these critical values. p-value: the share of the replications at or below τ.", strings.Join(ts, "; "))
	return b.String()
}
