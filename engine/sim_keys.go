package engine

import (
	"strings"

	"github.com/galley-econ/galley/analysis/simulate"
)

// crit: simulate — the keys crit:, replications: and seed: and their
// defaults. replications: was called reps: before; that spelling is
// refused with an error naming the new one (the formerly tag, read by
// manuscript.CheckKeys). crit: and seed: keep their names: "critical
// value" and "seed" are the trade's words, shared by every program that
// simulates.

// Defaults of crit: simulate.
//
// DefaultSimReps = 20,000: the Monte Carlo standard error of a quantile
// falls as 1/√R; at 20,000 replications the 5% critical value of the ADF
// τ (case c, T = 200) has an MCSE of about 0.01, below the two decimals
// a table prints, and the 1% value about 0.02, while one such run takes
// well under a second on two cores. Larger systems cost more per
// replication (Johansen with 6 series at T = 10,000 takes minutes), and
// their authors can lower replications: or accept the one-off cost, since the
// table is stored.
//
// DefaultSimSeed = 1: a fixed seed, so that a build is reproducible and
// two directives with the same experiment share one stored table.
const (
	DefaultSimReps = 20_000
	DefaultSimSeed = 1
)

// SimKeys are the crit:, replications: and seed: keys (exported only so
// that the YAML decoder sees the embedded fields).
type SimKeys struct {
	Crit         string `yaml:"crit"`
	Replications *int   `yaml:"replications" formerly:"reps"`
	Seed         *int64 `yaml:"seed"`
}

// SimSettings is a validated crit: simulate.
type SimSettings struct {
	Reps int
	Seed uint64
}

// simulated reports whether the keys ask for simulated critical values
// (only meaningful after settings accepted them).
func (k *SimKeys) simulated() bool { return strings.EqualFold(strings.TrimSpace(k.Crit), "simulate") }

// Settings validates the keys for a directive of kind; it returns nil
// (and no error) when the critical values come from the tables.
func (k *SimKeys) Settings(c *Context) (*SimSettings, error) {
	switch strings.ToLower(strings.TrimSpace(k.Crit)) {
	case "", "table":
		if c.Has("replications") {
			return nil, c.Errorf("replications", "replications applies only with crit: simulate")
		}
		if c.Has("seed") {
			return nil, c.Errorf("seed", "seed applies only with crit: simulate")
		}
		return nil, nil
	case "simulate":
	default:
		return nil, c.Errorf("crit", "crit: write simulate (Monte Carlo critical values at this sample size) or table (the published tables, the default), not %q", k.Crit)
	}
	if !c.b.kind.Simulate {
		var can []string
		for _, k := range Kinds() {
			if k.Simulate {
				can = append(can, k.Name)
			}
		}
		return nil, c.Errorf("crit", "crit: simulate is available for %s, not for %s", strings.Join(can, ", "), c.b.kind.Name)
	}
	s := &SimSettings{Reps: DefaultSimReps, Seed: DefaultSimSeed}
	if k.Replications != nil {
		if r := *k.Replications; r < simulate.MinReps || r > simulate.MaxReps {
			return nil, c.Errorf("replications", "replications must be %d..%d, not %d", simulate.MinReps, simulate.MaxReps, r)
		}
		s.Reps = *k.Replications
	}
	if k.Seed != nil {
		if *k.Seed < 0 {
			return nil, c.Errorf("seed", "seed must be zero or more, not %d", *k.Seed)
		}
		s.Seed = uint64(*k.Seed)
	}
	return s, nil
}

// Spec is the experiment for one statistic.
func (s *SimSettings) Spec(test, cs string, n, t, lags int) simulate.Spec {
	return simulate.Spec{Test: test, Case: cs, N: n, T: t, Lags: lags, Reps: s.Reps, Seed: s.Seed}
}
