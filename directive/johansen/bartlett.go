package johansen

import (
	"fmt"
	"slices"
	"strings"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// rank_bootstrap: {bartlett: true}: the trace statistic with a bootstrap
// Bartlett correction, from the same wild bootstrap replications as the
// bootstrap p-values (analysis/johansen.BartlettTrace).

// bartlettSource names the asymptotic means in notes and values.
const bartlettSource = "Doornik (1998), response surface for the mean of the asymptotic trace distribution"

// checkBartlett validates rank_bootstrap: {bartlett: true}: the corrected
// statistic is referred to the asymptotic distribution, so it does not go
// with crit: simulate (critical values for this T already), and its
// asymptotic mean is known only without step dummies (with them it
// depends on the break dates).
func (k *SystemKeys) checkBartlett(c *engine.Context) error {
	if k.RankBoot == nil || !k.RankBoot.Bartlett {
		return nil
	}
	if strings.EqualFold(strings.TrimSpace(k.Crit), "simulate") {
		return c.Errorf("rank_bootstrap", "rank_bootstrap: bartlett corrects the trace statistic towards its asymptotic distribution, while crit: simulate already gives critical values at this sample size; use one or the other")
	}
	if len(k.Shift) > 0 {
		return c.Errorf("rank_bootstrap", "rank_bootstrap: bartlett needs the mean of the asymptotic trace distribution, which step dummies (shift:) change in a way that depends on the break dates; drop bartlett or the shift")
	}
	return nil
}

// bartlett computes the corrected statistics from the bootstrap means
// (s.boot must be set).
func (k *SystemKeys) bartlett(c *engine.Context, s *sysState) error {
	if k.RankBoot == nil || !k.RankBoot.Bartlett || s.boot == nil {
		return nil
	}
	b, err := johansen.BartlettTrace(s.res.Trace, s.boot.Mean, s.res.Case)
	if err != nil {
		return c.Errorf("rank_bootstrap", "%v", strings.TrimPrefix(err.Error(), "johansen: "))
	}
	s.bart = b
	return nil
}

// bartlettRank is the sequential choice at level with the corrected
// statistics against the asymptotic critical values.
func (s *sysState) bartlettRank() int {
	li := slices.Index(johansen.Levels[:], s.st.Level)
	if li < 0 {
		li = 1
	}
	return s.bart.Rank(s.crT, li)
}

// bartlettValues is the results-file form: the corrected statistics, the
// factors, the two means, the sequential rank and the source of the
// asymptotic means.
func (s *sysState) bartlettValues() map[string]any {
	b := s.bart
	return map[string]any{
		"trace": slices.Clone(b.Trace), "factor": slices.Clone(b.Factor),
		"boot_mean": slices.Clone(b.BootMean), "asymptotic_mean": slices.Clone(b.Asymptotic),
		"rank": s.bartlettRank(), "level": s.st.Level, "source": bartlettSource,
	}
}

// bartlettCell is the corrected statistic of rank r with its stars
// against the asymptotic critical values.
func (s *sysState) bartlettCell(r int, stars func(float64, [3]float64) int) table.Cell {
	return table.Starred(s.bart.Trace[r], 2, stars(s.bart.Trace[r], s.crT[r]))
}

// bartlettNote says exactly what the corrected column holds.
func (s *sysState) bartlettNote() string {
	b := s.bart
	fs := make([]string, len(b.Factor))
	for r, f := range b.Factor {
		fs[r] = fmt.Sprintf("%.3f", f)
	}
	return fmt.Sprintf("Bartlett-corrected: the trace statistic for rank r multiplied by m∞/m̂, where m̂ is the mean of the same %d wild bootstrap trace statistics computed under rank r (those behind Bootstrap p) and m∞ the mean of the statistic's asymptotic distribution for K − r non-stationary directions in this case, from Doornik's (1998) response surface; the correction makes the statistic's finite-sample mean match the asymptotic one (Bartlett 1937; the bootstrap estimate of the mean as in Rocke 1989) and the statistic is compared with the asymptotic critical values. The factors m∞/m̂ for r = 0, 1, … are %s. Testing r = 0, 1, … in turn with the corrected statistics at %s gives rank %d.",
		s.boot.Reps[0]+s.boot.Failed[0], strings.Join(fs, ", "), contract.Pct(s.st.Level), s.bartlettRank())
}
