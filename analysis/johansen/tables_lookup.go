package johansen

import "fmt"

// SimulatedCriticalValues returns simulated asymptotic 10 %, 5 % and 1 %
// critical values (see Levels) of statistic s in case c for dim = K−r
// non-stationary directions, for all five cases, from simValues (in
// tables_sim.go, which ./gen writes).
//
// They are the upper quantiles of the statistics for H(0) with dim
// independent Gaussian random walks of length T and no lagged
// differences, computed also on the same paths at half the resolution and
// extrapolated to T = ∞ as 2q(T) − q(T/2) (simulate.Asymptotic). In cases
// C and CT the last walk carries a dominating drift (linear, resp.
// quadratic trend), the assumption under which those cases' asymptotic
// distributions are tabulated. All cases and dimensions of one
// replication share their random walks. SimulatedMCSE gives the Monte
// Carlo standard errors (batch means over 20 batches).
func SimulatedCriticalValues(c Case, s Stat, dim int) ([3]float64, error) {
	return simLookup(&simValues, c, s, dim)
}

// SimulatedMCSE returns the Monte Carlo standard errors of
// SimulatedCriticalValues.
func SimulatedMCSE(c Case, s Stat, dim int) ([3]float64, error) {
	return simLookup(&simMCSE, c, s, dim)
}

func simLookup(t *[5][2]cvTable, c Case, s Stat, dim int) ([3]float64, error) {
	if !c.valid() {
		return [3]float64{}, fmt.Errorf("johansen: invalid deterministic case %d", int(c))
	}
	if s != TraceStat && s != MaxEigStat {
		return [3]float64{}, fmt.Errorf("johansen: unknown statistic %d", int(s))
	}
	if dim < 1 || dim > MaxTabulated {
		return [3]float64{}, fmt.Errorf("johansen: simulated critical values cover K−r = 1..%d, not %d", MaxTabulated, dim)
	}
	return t[c][s][dim-1], nil
}
