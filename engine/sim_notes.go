package engine

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/engine/contract"
)

// crit: simulate — the values and note texts of a simulated table.

// Group writes n with thousands separators: 20,000.
func Group(n int) string {
	s := strconv.Itoa(n)
	var b strings.Builder
	for i, ch := range s {
		if i > 0 && (len(s)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(ch)
	}
	return b.String()
}

// SimLevelMap keys a simulated quantity by level: {"1%": …, "2.5%": …}.
func SimLevelMap(r *simulate.Result, x []float64) map[string]any {
	m := map[string]any{}
	for i, l := range r.Levels {
		m[contract.Pct(l)] = x[i]
	}
	return m
}

// SimCritValues are the simulated critical values in the form of the
// tables' (critical.Value by level).
func SimCritValues(r *simulate.Result) []critical.Value {
	out := make([]critical.Value, len(r.Levels))
	for i, l := range r.Levels {
		out[i] = critical.Value{Level: l, Value: r.Values[i]}
	}
	return out
}

// SimAt is the simulated critical value at level.
func SimAt(r *simulate.Result, level float64) float64 {
	for i, l := range r.Levels {
		if math.Abs(l-level) < 1e-9 {
			return r.Values[i]
		}
	}
	return math.NaN()
}

// SimMCSEText lists the Monte Carlo standard errors: "0.021 (1%), …".
func SimMCSEText(r *simulate.Result) string {
	var parts []string
	for i, l := range r.Levels {
		parts = append(parts, strconv.FormatFloat(r.MCSE[i], 'g', 2, 64)+" ("+contract.Pct(l)+")")
	}
	return strings.Join(parts, ", ")
}

// SimSource is the crit_source text of a τ test: "simulated: R
// replications, seed S, T=… …".
func SimSource(r *simulate.Result, what string, chosen bool) string {
	lag := fmt.Sprintf("%d lagged differences", r.Spec.Lags)
	if r.Spec.Lags == 1 {
		lag = "1 lagged difference"
	}
	if chosen {
		lag += " (the order the criterion chose, held fixed in every replication)"
	}
	return fmt.Sprintf("simulated: %s replications, seed %d, T=%d observations in the test regression, %s, %s; Monte Carlo standard errors %s",
		Group(r.Reps), r.Seed, r.NObs, what, lag, SimMCSEText(r))
}

// SimURValues adds the simulated fields to a τ test's values.
func SimURValues(v map[string]any, r *simulate.Result, stat float64) {
	v["crit"] = SimLevelMap(r, r.Values)
	v["crit_mcse"] = SimLevelMap(r, r.MCSE)
	v["pvalue"] = r.PValue(stat)
	v["pvalue_source"] = PSimSource(r)
	v["sim_key"] = r.Key
	v["sim"] = map[string]any{"reps": r.Reps, "seed": int(r.Seed), "t": r.NObs, "lags": r.Spec.Lags, "n": r.Spec.N}
}

// PSimSource returns the pvalue_source text of a simulated p-value.
func PSimSource(r *simulate.Result) string {
	if r.Lower {
		return fmt.Sprintf("simulated, the share of the %s replications at or below the statistic", Group(r.Reps))
	}
	return fmt.Sprintf("simulated, the share of the %s replications at or above the statistic", Group(r.Reps))
}
