package johansen

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
)

// sysSim holds the simulated tables of a Johansen rank test: for rank r
// (row r) the null distributions of the trace and maximum-eigenvalue
// statistics for H(0) in a system of K−r independent Gaussian random
// walks, with the same case, lags and T (asymptotically the null
// distribution of the test of rank r in K series; Johansen 1995, ch. 11),
// and the model's dummies and extra regressors at the same observations,
// restricted or unrestricted as estimated (design).
type sysSim struct {
	trace, maxeig []*simulate.Result
	pT, pM        []float64 // simulated p-values of the statistics
	chosenLag     bool
	design        string // what the simulated systems include beyond the case ("" for nothing)
}

// simDesign returns the model's dummies and extra regressors as the
// columns of a simulation design (nil when there are none): each column
// has one value per observation of the levels, the restricted ones
// entering lagged once, as johansen.TestExtra takes them. Extra
// regressors are held fixed at their observed values in every
// replication: the simulated systems are conditioned on them as the
// estimated one is.
func simDesign(x johansen.Extra) *simulate.Design {
	cols := func(m *mat.Dense) [][]float64 {
		if m == nil {
			return nil
		}
		_, n := m.Dims()
		out := make([][]float64, n)
		for j := range out {
			out[j] = mat.Col(nil, j, m)
		}
		return out
	}
	d := &simulate.Design{Unrestricted: cols(x.Unrestricted), Restricted: cols(x.Restricted)}
	if len(d.Unrestricted)+len(d.Restricted) == 0 {
		return nil
	}
	return d
}

// simJohansen fills the critical values of s from simulations and
// chooses the rank with them by the sequential trace procedure (the
// first r whose trace statistic does not exceed its critical value at
// the level, as johansen.Result.Rank does with the tables).
func simJohansen(c *engine.Context, set *engine.SimSettings, s *sysState) (*sysSim, error) {
	r := s.res
	out := &sysSim{chosenLag: s.lags != nil}
	var design *simulate.Design
	if s.ex != nil {
		design = simDesign(s.ex.x)
		out.design = s.ex.simText()
	}
	s.crT, s.crM = make([][3]float64, r.K), make([][3]float64, r.K)
	for i := 0; i < r.K; i++ {
		for _, stat := range []string{simulate.JohansenTrace, simulate.JohansenMaxEig} {
			sp := set.Spec(stat, r.Case.String(), r.K-i, r.T+r.Lags+1, r.Lags)
			sp.Design = design
			sr, err := engine.SimCrit(c, "crit", sp)
			if err != nil {
				return nil, err
			}
			var cv [3]float64
			for j, l := range johansen.Levels {
				cv[j] = engine.SimAt(sr, l)
			}
			if stat == simulate.JohansenTrace {
				out.trace, s.crT[i] = append(out.trace, sr), cv
				out.pT = append(out.pT, sr.PValue(s.trace[i]))
			} else {
				out.maxeig, s.crM[i] = append(out.maxeig, sr), cv
				out.pM = append(out.pM, sr.PValue(s.max[i]))
			}
		}
	}
	li := slices.Index(johansen.Levels[:], s.st.Level)
	if li < 0 {
		return nil, c.Errorf("level", "level must be 0.10, 0.05 or 0.01, not %g", s.st.Level)
	}
	s.chosen = r.K
	for i := 0; i < r.K; i++ {
		if s.trace[i] <= s.crT[i][li] {
			s.chosen = i
			break
		}
	}
	return out, nil
}

// critText names the source of a rank test's critical values.
func (s *sysState) critText() string {
	if s.sim == nil {
		return critSource(s.res.Case)
	}
	r0 := s.sim.trace[0]
	lag := fmt.Sprintf("%d lagged differences", r0.Spec.Lags)
	if s.sim.chosenLag {
		lag += " (the order the criterion chose, held fixed in every replication)"
	}
	txt := fmt.Sprintf("simulated: %s replications, seed %d, T=%d, %s, the %s case; for rank r the statistics for rank 0 in K − r independent Gaussian random walks",
		engine.Group(r0.Reps), r0.Seed, r0.NObs, lag, engine.SystemCaseWords[s.res.Case])
	if s.sim.design != "" {
		txt += ", with the model's dummies at the same observations, entering as estimated"
	}
	return txt
}

// mcseNote lists the Monte Carlo standard errors of the simulated
// critical values, in the order of the table's columns.
func (s *sysSim) mcseNote() string {
	row := func(rs []*simulate.Result) string {
		var parts []string
		for i, r := range rs {
			var e []string
			for _, l := range johansen.Levels {
				e = append(e, strconv.FormatFloat(r.MCSE[slices.Index(r.Levels, l)], 'g', 2, 64))
			}
			parts = append(parts, fmt.Sprintf("r=%d: %s", i, strings.Join(e, "/")))
		}
		return strings.Join(parts, "; ")
	}
	return fmt.Sprintf("Monte Carlo standard errors of the simulated critical values (10%%/5%%/1%%): trace %s; maximum eigenvalue %s. Simulated p-values are in the results file.",
		row(s.trace), row(s.maxeig))
}

// values adds the simulated fields to a rank test's values.
func (s *sysSim) values(v map[string]any) {
	mcse := func(rs []*simulate.Result) []map[string]any {
		out := make([]map[string]any, len(rs))
		for i, r := range rs {
			out[i] = map[string]any{}
			for _, l := range johansen.Levels {
				out[i][contract.Pct(l)] = r.MCSE[slices.Index(r.Levels, l)]
			}
		}
		return out
	}
	keys := func(rs []*simulate.Result) []string {
		out := make([]string, len(rs))
		for i, r := range rs {
			out[i] = r.Key
		}
		return out
	}
	r0 := s.trace[0]
	v["crit_source"] = fmt.Sprintf("simulated: %s replications, seed %d, T=%d, %d lagged differences", engine.Group(r0.Reps), r0.Seed, r0.NObs, r0.Spec.Lags)
	v["crit_mcse_trace"], v["crit_mcse_maxeig"] = mcse(s.trace), mcse(s.maxeig)
	v["pvalue_trace"], v["pvalue_maxeig"] = slices.Clone(s.pT), slices.Clone(s.pM)
	v["sim_key"] = map[string]any{"trace": keys(s.trace), "maxeig": keys(s.maxeig)}
	v["sim"] = map[string]any{"reps": r0.Reps, "seed": int(r0.Seed), "t": r0.NObs, "lags": r0.Spec.Lags}
	if s.design != "" {
		v["sim"].(map[string]any)["design"] = s.design
	}
}
