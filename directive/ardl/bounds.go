package ardl

import (
	"fmt"
	"math"
	"strings"

	"github.com/galley-econ/galley/analysis/ardl"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// boundsResult is one bounds test (F, and t where defined) with its
// critical-value bounds and verdicts.
type boundsResult struct {
	f, t    float64
	hasT    bool
	k, n    int
	det     ardl.Case
	fb, tb  []ardl.Bound
	source  string // for notes and values
	tsource string
	fp, tp  [2]float64 // simulated p-values under I(0) and I(1) (NaN from tables)
	sims    []*simulate.Result
	simLags int
	restr   int
}

// verdictLevel is the level of the verdict the table states.
const verdictLevel = 0.05

func (s *ardlSpec) bounds(c *engine.Context, st *settings, m *ardl.Model) (*boundsResult, error) {
	b := &boundsResult{f: m.F, t: m.T, hasT: st.det.HasT(), k: m.K, n: m.Fit.N, det: st.det, restr: m.FRestr,
		fp: [2]float64{math.NaN(), math.NaN()}, tp: [2]float64{math.NaN(), math.NaN()}}
	if st.sim != nil {
		return b, b.simulate(c, st, m)
	}
	useNarayan := false
	switch st.tables {
	case "narayan":
		useNarayan = true
	case "auto":
		hi := 80
		if st.det == ardl.RestTrend {
			hi = 77
		}
		useNarayan = st.det != ardl.NoDet && b.k <= ardl.NarayanMaxK && b.n >= 30 && b.n <= hi
	}
	var err error
	if useNarayan {
		var tab int
		b.fb, tab, err = ardl.NarayanF(st.det, b.k, b.n)
		if err != nil {
			return nil, c.Errorf(tableKey(c), "%s", strings.TrimPrefix(err.Error(), "ardl: "))
		}
		b.source = fmt.Sprintf("Narayan (2005) finite-sample bounds, case %s, k = %d, the table for T = %d (nearest to the regression's T = %d)", st.det.Roman(), b.k, tab, b.n)
	} else {
		b.fb, err = ardl.PSSF(st.det, b.k)
		if err != nil {
			return nil, c.Errorf(tableKey(c), "%s; with more regressors use crit: simulate", strings.TrimPrefix(err.Error(), "ardl: "))
		}
		b.source = fmt.Sprintf("Pesaran, Shin and Smith (2001) asymptotic bounds, Table CI(%s), case %s, k = %d (the regression's T = %d)", strings.ToLower(st.det.Roman()), st.det.Roman(), b.k, b.n)
	}
	if b.hasT {
		b.tb, err = ardl.PSST(st.det, b.k)
		if err != nil {
			return nil, c.Errorf(tableKey(c), "%s", strings.TrimPrefix(err.Error(), "ardl: "))
		}
		b.tsource = fmt.Sprintf("Pesaran, Shin and Smith (2001) asymptotic bounds, Table CII(%s), k = %d", strings.ToLower(st.det.Roman()), b.k)
	}
	return b, nil
}

func tableKey(c *engine.Context) string {
	if c.Has("tables") {
		return "tables"
	}
	return "x"
}

// simulate replaces the tabulated bounds by Monte Carlo bounds at the
// regression's T, k and case (analysis/simulate, kernel ardl).
func (b *boundsResult) simulate(c *engine.Context, st *settings, m *ardl.Model) error {
	lags := m.Orders.P - 1
	for _, q := range m.QStar {
		lags = max(lags, q-1)
	}
	b.simLags = lags
	T := b.n + 1 + lags
	get := func(test string) (*simulate.Result, error) {
		return engine.SimCrit(c, "crit", st.sim.Spec(test, st.det.String(), b.k, T, lags))
	}
	f0, err := get(simulate.ARDLF0)
	if err != nil {
		return err
	}
	f1, err := get(simulate.ARDLF1)
	if err != nil {
		return err
	}
	b.sims = []*simulate.Result{f0, f1}
	b.fb = simBounds(f0, f1)
	b.fp = [2]float64{f0.PValue(b.f), f1.PValue(b.f)}
	b.source = fmt.Sprintf("simulated at T = %d, k = %d, case %s", f0.NObs, b.k, st.det.Roman())
	if b.hasT {
		t0, err := get(simulate.ARDLT0)
		if err != nil {
			return err
		}
		t1, err := get(simulate.ARDLT1)
		if err != nil {
			return err
		}
		b.sims = append(b.sims, t0, t1)
		b.tb = simBounds(t0, t1)
		b.tp = [2]float64{t0.PValue(b.t), t1.PValue(b.t)}
		b.tsource = b.source
	}
	return nil
}

func simBounds(r0, r1 *simulate.Result) []ardl.Bound {
	// simulate.Levels run 1%, 2.5%, 5%, 10%; the tables 10% first.
	out := make([]ardl.Bound, len(r0.Levels))
	for i := range r0.Levels {
		j := len(r0.Levels) - 1 - i
		out[i] = ardl.Bound{Level: r0.Levels[j], I0: r0.Values[j], I1: r1.Values[j]}
	}
	return out
}

func boundAt(bs []ardl.Bound, level float64) (ardl.Bound, bool) {
	for _, x := range bs {
		if math.Abs(x.Level-level) < 1e-9 {
			return x, true
		}
	}
	return ardl.Bound{}, false
}

func (b *boundsResult) verdictF() string {
	if x, ok := boundAt(b.fb, verdictLevel); ok {
		return ardl.VerdictF(b.f, x).String()
	}
	return ""
}

func (b *boundsResult) verdictT() string {
	if x, ok := boundAt(b.tb, verdictLevel); ok {
		return ardl.VerdictT(b.t, x).String()
	}
	return ""
}

// rows lay out the bounds test: each statistic, its bounds at every
// level ("I(0) bound – I(1) bound"), and the verdict at 5%.
func (b *boundsResult) rows(dec int) []table.Row {
	var rows []table.Row
	add := func(label string, stat float64, bs []ardl.Bound, verdict string) {
		rows = append(rows, table.Row{Cells: []table.Cell{table.T(label), table.N(stat, dec)}})
		for i := len(bs) - 1; i >= 0; i-- { // 1% first, as every galley table lists critical values
			x := bs[i]
			rows = append(rows, table.Row{Cells: []table.Cell{table.T("    bounds at " + contract.Pct(x.Level)), table.T(fmt.Sprintf("%s – %s", fmtNum(x.I0, 2), fmtNum(x.I1, 2)))}})
		}
		rows = append(rows, table.Row{Cells: []table.Cell{table.T("    verdict at 5%"), table.T(verdict)}})
	}
	add(fmt.Sprintf("F (%d restrictions)", b.restr), b.f, b.fb, b.verdictF())
	if b.hasT {
		add("t", b.t, b.tb, b.verdictT())
	}
	return rows
}

// fmtNum is v with dec decimals and a true minus sign (U+2212), for a
// number written inside a text cell.
func fmtNum(v float64, dec int) string {
	return strings.Replace(table.FixNegZero(fmt.Sprintf("%.*f", dec, v)), "-", "−", 1)
}

func (b *boundsResult) note() string {
	var sb strings.Builder
	fmt.Fprintf(&sb, "Bounds tests of the null of no level relationship (Pesaran, Shin and Smith 2001): F is the Wald statistic over its %d restrictions that the lagged levels", b.restr)
	switch b.det {
	case ardl.RestConst:
		sb.WriteString(" and the restricted intercept")
	case ardl.RestTrend:
		sb.WriteString(" and the restricted trend")
	}
	sb.WriteString(" have zero coefficients")
	if b.hasT {
		sb.WriteString("; t is the t-ratio of the lagged level of the dependent variable")
	} else {
		sb.WriteString(" (the t test is not defined in this case)")
	}
	fmt.Fprintf(&sb, ". Each is compared with an I(0) bound (every regressor stationary) and an I(1) bound (every regressor integrated of order one), shown as I(0) – I(1): beyond the I(1) bound, a level relation; on the near side of the I(0) bound, no level relation; between them, inconclusive. k = %d, case %s, T = %d. ", b.k, b.det.Roman(), b.n)
	if len(b.sims) > 0 {
		r := b.sims[0]
		fmt.Fprintf(&sb, "Critical values: simulated, %s replications with seed %d of the conditional error-correction regression under the null (the dependent variable a Gaussian random walk; the %d regressors independent Gaussian random walks for the I(1) bound, white noise for the I(0) bound) with the same deterministic terms and %d lagged differences of every variable, at T = %d; Monte Carlo standard errors: F %s (I(0)), %s (I(1))",
			engine.Group(r.Reps), r.Seed, b.k, b.simLags, r.NObs, engine.SimMCSEText(b.sims[0]), engine.SimMCSEText(b.sims[1]))
		if len(b.sims) == 4 {
			fmt.Fprintf(&sb, "; t %s (I(0)), %s (I(1))", engine.SimMCSEText(b.sims[2]), engine.SimMCSEText(b.sims[3]))
		}
		fmt.Fprintf(&sb, ". Simulated p-values of F: %s under I(0), %s under I(1).", fmtNum(b.fp[0], 3), fmtNum(b.fp[1], 3))
		return sb.String()
	}
	fmt.Fprintf(&sb, "Critical values of F: %s.", b.source)
	if b.hasT {
		fmt.Fprintf(&sb, " Of t: %s.", b.tsource)
	}
	return sb.String()
}

func boundsValues(bs []ardl.Bound) map[string]any {
	m := map[string]any{}
	for _, x := range bs {
		m[contract.Pct(x.Level)] = map[string]any{"i0": x.I0, "i1": x.I1}
	}
	return m
}

func (b *boundsResult) values() map[string]any {
	verdicts := func(stat float64, bs []ardl.Bound, f bool) map[string]any {
		m := map[string]any{}
		for _, x := range bs {
			if f {
				m[contract.Pct(x.Level)] = ardl.VerdictF(stat, x).String()
			} else {
				m[contract.Pct(x.Level)] = ardl.VerdictT(stat, x).String()
			}
		}
		return m
	}
	v := map[string]any{
		"k": b.k, "nobs": b.n, "case": b.det.Roman(), "det": engine.SystemCaseWords[b.det],
		"f": map[string]any{"stat": b.f, "restrictions": b.restr, "crit": boundsValues(b.fb), "verdict": b.verdictF(),
			"by_level": verdicts(b.f, b.fb, true), "crit_source": b.source},
	}
	if b.hasT {
		v["t"] = map[string]any{"stat": b.t, "crit": boundsValues(b.tb), "verdict": b.verdictT(),
			"by_level": verdicts(b.t, b.tb, false), "crit_source": b.tsource}
	}
	if len(b.sims) > 0 {
		f := v["f"].(map[string]any)
		f["pvalue_i0"], f["pvalue_i1"] = b.fp[0], b.fp[1]
		f["crit_mcse"] = map[string]any{"i0": engine.SimLevelMap(b.sims[0], b.sims[0].MCSE), "i1": engine.SimLevelMap(b.sims[1], b.sims[1].MCSE)}
		if b.hasT {
			t := v["t"].(map[string]any)
			t["pvalue_i0"], t["pvalue_i1"] = b.tp[0], b.tp[1]
			t["crit_mcse"] = map[string]any{"i0": engine.SimLevelMap(b.sims[2], b.sims[2].MCSE), "i1": engine.SimLevelMap(b.sims[3], b.sims[3].MCSE)}
		}
		v["sim"] = map[string]any{"reps": b.sims[0].Reps, "seed": int(b.sims[0].Seed), "t": b.sims[0].NObs, "lags": b.simLags}
	}
	return v
}

// outcome is the F test in the form other directives read (grid stars,
// rejection): rejected where F exceeds the I(1) bound.
func (b *boundsResult) outcome() *contract.Outcome {
	var cv []critical.Value
	for _, x := range b.fb {
		cv = append(cv, critical.Value{Level: x.Level, Value: x.I1})
	}
	return &contract.Outcome{Test: "bounds F", StatName: "F", Stat: b.f, PValue: b.fp[1], NObs: b.n, Crit: cv,
		CritSource: b.source + " (I(1) bounds)", Upper: true, Null: "no level relationship"}
}
