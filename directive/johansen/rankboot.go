package johansen

import (
	"fmt"
	"slices"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// rank_bootstrap: the wild bootstrap p-values of the trace tests beside
// the asymptotic ones (analysis/johansen.WildBootstrapRank).

// RankBootKeys is the rank_bootstrap: mapping (exported only so that the
// YAML decoder sees the fields).
type RankBootKeys struct {
	Reps     *int    `yaml:"replications" formerly:"reps"`
	Seed     *uint64 `yaml:"seed"`
	Bartlett bool    `yaml:"bartlett"` // the Bartlett-corrected trace column (bartlett.go)
}

// Defaults of rank_bootstrap: 999 replications (B + 1 a multiple of 20 and
// 100, so that a p-value of 5% or 1% falls on the grid of attainable
// values, common practice), seed 1.
const (
	defaultBootReps = 999
	defaultBootSeed = 1
)

func (k *RankBootKeys) reps() int {
	if k.Reps == nil {
		return defaultBootReps
	}
	return *k.Reps
}

func (k *RankBootKeys) seed() uint64 {
	if k.Seed == nil {
		return defaultBootSeed
	}
	return *k.Seed
}

// checkRankBoot validates rank_bootstrap:.
func (k *SystemKeys) checkRankBoot(c *engine.Context) error {
	if k.RankBoot == nil {
		return nil
	}
	if n := k.RankBoot.reps(); n < 99 || n > 100000 {
		return c.Errorf("rank_bootstrap", "rank_bootstrap: replications must be 99–100,000 replications, not %d", n)
	}
	return k.checkBartlett(c)
}

// rankBoot runs the wild bootstrap of the rank tests when rank_bootstrap:
// asks for it (s.boot stays nil otherwise).
func (k *SystemKeys) rankBoot(c *engine.Context, s *sysState) error {
	if k.RankBoot == nil {
		return nil
	}
	var err error
	s.boot, err = s.res.WildBootstrapRank(s.y, s.ex.x, johansen.RankBootSpec{Reps: k.RankBoot.reps(), Seed: k.RankBoot.seed()})
	if err != nil {
		return c.Errorf("rank_bootstrap", "%v", nameSeries(err, s.st.Names))
	}
	s.bootSeed = k.RankBoot.seed()
	return k.bartlett(c, s)
}

// bootValues is the results-file form of the bootstrap: p-values,
// replications used and failed, the root check, and the sequential rank.
func (s *sysState) bootValues() map[string]any {
	b := s.boot
	return map[string]any{
		"pvalue": slices.Clone(b.PValue), "reps": slices.Clone(b.Reps), "failed": slices.Clone(b.Failed),
		"roots_ok": slices.Clone(b.RootsOK), "max_root": slices.Clone(b.MaxRoot),
		"rank": b.Rank(s.st.Level), "level": s.st.Level, "seed": s.bootSeed,
	}
}

// bootNote says how the bootstrap p-values were computed and which rank
// they choose.
func (s *sysState) bootNote() string {
	b := s.boot
	n := fmt.Sprintf("Bootstrap p: the share of %d wild bootstrap trace statistics above the observed one (Cavaliere, Rahbek and Taylor 2012): for each rank r the VECM is estimated under rank r, its residuals multiplied by Rademacher weights (±1), samples built recursively from the first %s with the estimates (deterministic terms and dummies included) and the statistic recomputed; seed %d. Testing r = 0, 1, … in turn at %s with these p-values gives rank %d.",
		b.Reps[0]+b.Failed[0], firstObs(s.res.Lags+1), s.bootSeed, contract.Pct(s.st.Level), b.Rank(s.st.Level))
	var bad []string
	for r, ok := range b.RootsOK {
		if !ok {
			bad = append(bad, fmt.Sprint(r))
		}
	}
	if len(bad) > 0 {
		n += fmt.Sprintf(" The model estimated under rank %v has a root on or outside the unit circle beyond the unit roots the rank imposes, so its bootstrap samples may explode: read those p-values with care.", bad)
	}
	failed := 0
	for _, f := range b.Failed {
		failed += f
	}
	if failed > 0 {
		n += fmt.Sprintf(" %d bootstrap samples could not be analysed and are left out.", failed)
	}
	return n
}

// firstObs names the n starting values of a recursion.
func firstObs(n int) string {
	if n == 1 {
		return "observation"
	}
	return fmt.Sprintf("%d observations", n)
}
