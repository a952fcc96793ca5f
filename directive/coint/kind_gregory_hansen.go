package coint

import (
	"fmt"
	"math"
	"strings"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// gregory-hansen: residual-based tests of no cointegration against
// cointegration with one shift at an unknown date.
type ghSpec struct {
	engine.Common `yaml:",inline"`
	Data          string         `yaml:"data"`
	Y             string         `yaml:"y"`
	X             []string       `yaml:"x"`
	Shift         string         `yaml:"shift"`
	Trim          *float64       `yaml:"trim"`
	Lags          engine.LagSpec `yaml:"lags"`
	Bandwidth     string         `yaml:"bandwidth"`
	Sample        string         `yaml:"sample"`
	Decimals      *int           `yaml:"decimals"`

	engine.SimKeys `yaml:",inline"` // crit: simulate (simcrit.go)
}

var ghFields = []string{"test", "stat", "pvalue", "pvalue_source", "lags", "nobs", "crit", "crit_source", "reject_5",
	"break", "break_index", "adf", "zt", "za", "breaks", "shift", "model", "trim", "candidates", "static", "resid",
	"y", "x", "vars", "sample", "crit_mcse", "sim_key", "sim"}

func init() {
	engine.Register(engine.Kind{
		Name:     "gregory-hansen",
		Simulate: true,
		Summary:  "Gregory–Hansen tests of no cointegration against cointegration with a level, trend or regime shift at an unknown date",
		New:      func() engine.Directive { return &ghSpec{} },
		Fields:   ghFields,
	})
}

// ghShifts are the shift: words and their models.
var ghShifts = map[string]coint.GHModel{"level": coint.GHLevel, "trend": coint.GHLevelTrend, "regime": coint.GHRegime}

var ghShiftText = map[coint.GHModel]string{
	coint.GHLevel:      "a shift in the level (model C)",
	coint.GHLevelTrend: "a shift in the level, with a linear trend (model C/T)",
	coint.GHRegime:     "a shift in the level and in the slopes on every regressor (model C/S)",
}

// Relation says where the long-run relation (with its shift) was
// estimated.
func (s *ghSpec) Relation() contract.LongRun {
	return contract.LongRun{Data: s.Data, Y: s.Y, X: s.X, Sample: s.Sample, Missing: s.Missing}
}

type ghSettings struct {
	model coint.GHModel
	trim  float64
	lags  unitroot.LagRule
	bw    unitroot.Bandwidth
	sim   *engine.SimSettings
}

func (s *ghSpec) settings(c *engine.Context) (ghSettings, error) {
	var st ghSettings
	sh := strings.ToLower(strings.TrimSpace(s.Shift))
	if sh == "" {
		sh = "level"
	}
	m, ok := ghShifts[sh]
	if !ok {
		var err error
		if m, err = coint.ParseGHModel(sh); err != nil {
			return st, c.Errorf("shift", "shift: write level, trend (a level shift with a trend) or regime (level and slopes), not %q", s.Shift)
		}
	}
	st.model = m
	st.trim = coint.DefaultGHTrim
	if s.Trim != nil {
		if !(*s.Trim > 0) || *s.Trim >= 0.5 {
			return st, c.Errorf("trim", "trim: the share cut at each end must lie strictly between 0 and 0.5, not %g", *s.Trim)
		}
		st.trim = *s.Trim
	}
	st.lags = s.Lags.Rule(engine.DefaultLags)
	if st.lags.Select == unitroot.MAIC {
		return st, c.Errorf("lags", "lags: maic applies to GLS-detrended series; use aic, bic, tstat or a number")
	}
	bw := s.Bandwidth
	if bw == "" {
		bw = "rule4"
	}
	var err error
	if st.bw, err = unitroot.ParseBandwidth(bw); err != nil {
		return st, c.Errorf("bandwidth", "%v", err)
	}
	if st.sim, err = s.SimKeys.Settings(c); err != nil {
		return st, err
	}
	return st, nil
}

func (s *ghSpec) Check(c *engine.Context) error {
	if err := c.Require("y", s.Y == ""); err != nil {
		return err
	}
	if len(s.X) == 0 {
		return c.Errorf("", "galley gregory-hansen: the key \"x\" is required (one or more regressors)")
	}
	if n := len(s.X) + 1; n > simulate.MaxVars {
		return c.Errorf("x", "%d variables is more than the Gregory–Hansen test here covers (at most %d)", n, simulate.MaxVars)
	}
	if _, err := s.settings(c); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), append([]string{s.Y}, s.X...), s.Sample)
}

// ghLabels are the three statistics, in the order of the table.
var ghLabels = []string{"ADF*", "Zt*", "Zα*"}

// Run searches the break date for each statistic and returns the table
// (one row a statistic, with its date), the values, the ADF* outcome with
// the breaks, and the residuals at the ADF* date.
func (s *ghSpec) Run(c *engine.Context) (*engine.Result, error) {
	st, err := s.settings(c)
	if err != nil {
		return nil, err
	}
	vars := append([]string{s.Y}, s.X...)
	d, err := c.Data(c.DataAlias(s.Data), vars, s.Sample)
	if err != nil {
		return nil, err
	}
	r, err := coint.GregoryHansen(d.Cols[0], d.Cols[1:], st.model, st.trim, st.lags, st.bw)
	if err != nil {
		return nil, ghError(c, err, d.N())
	}
	labels := ghLabels
	stats := []*coint.GHStat{&r.ADF, &r.Zt, &r.Za}
	var sims [3]*simulate.Result
	if st.sim != nil { // crit: simulate (simcrit.go)
		for i, test := range []string{simulate.GHADF, simulate.GHZt, simulate.GHZa} {
			sp := st.sim.Spec(test, st.model.Code(), len(vars), r.NObs, stats[i].Lags)
			sp.Trim = st.trim
			if sims[i], err = engine.SimCrit(c, "crit", sp); err != nil {
				return nil, err
			}
		}
	}
	outs := ghOutcomes(st, r, stats, sims)
	var breaks []contract.Break
	for i, g := range stats {
		breaks = append(breaks, contract.Break{Label: labels[i], Date: d.Dates[g.Break].String(), Index: g.Break})
	}
	outs[0].Extra[contract.BreaksKey] = breaks
	outs[0].Extra["break"] = breaks[0].Date
	outs[0].Extra["break_index"] = breaks[0].Index

	dec := engine.DecimalsOr(c, s.Decimals)
	t := &table.Table{Stub: 1, Body: ghBody(c, outs, breaks, r.NObs, dec)}
	t.Head = [][]table.Cell{
		{table.Empty, table.Empty, table.Empty, table.Empty, table.Span("Critical values", 3)},
		{table.T("Statistic"), table.T("Value"), table.T("Break"), table.T("Lags"), table.T("1%"), table.T("5%"), table.T("10%")},
	}
	t.Notes = ghNotes(c, s, st, r, outs, sims, d)
	t.Notes = append(t.Notes, c.StarNote()+" "+d.SampleNote())

	vals := s.values(st, r, outs, breaks, sims, d)
	res := &engine.Result{Table: t, Values: vals, Test: outs[0], Cites: []string{"gregory-hansen-1996"}}
	res.SetSeries("resid", contract.ViewDated(d.Dates[:len(r.Resid)], r.Resid))
	return res, nil
}

// ghOutcomes returns the outcomes of ADF*, Zt* and Zα*, with the
// simulated critical values and p-values where crit: simulate gave them.
func ghOutcomes(st ghSettings, r *coint.GHResult, stats []*coint.GHStat, sims [3]*simulate.Result) []*contract.Outcome {
	labels := ghLabels
	outs := make([]*contract.Outcome, 3)
	for i, g := range stats {
		o := &contract.Outcome{Test: "Gregory–Hansen " + labels[i], StatName: labels[i], Stat: g.Stat, PValue: math.NaN(),
			Lags: g.Lags, IsBW: i > 0, NObs: r.NObs, Crit: g.Crit, CritSource: r.CritSource, Null: "no cointegration",
			Extra: map[string]any{}}
		if i == 0 {
			o.MaxLag = r.MaxLag
		}
		if sims[i] != nil {
			o.Crit = engine.SimCritValues(sims[i])
			o.PValue = sims[i].PValue(g.Stat)
			o.PSource = engine.PSimSource(sims[i])
			o.CritSource = ghSimSource(sims[i], labels[i], st.model, i == 0 && st.lags.Select != unitroot.Fixed || i > 0 && st.bw.Auto())
		}
		outs[i] = o
	}
	return outs
}

// ghBody returns the table's rows: each statistic with its stars, break
// date, lags (or bandwidth) and critical values, then N.
func ghBody(c *engine.Context, outs []*contract.Outcome, breaks []contract.Break, nobs, dec int) []table.Row {
	var body []table.Row
	for i, o := range outs {
		cells := []table.Cell{table.T(ghLabels[i]), table.Starred(o.Stat, dec, o.Stars(c.Stars())), table.T(breaks[i].Date), table.I(o.Lags)}
		for _, l := range coint.GHLevels {
			v, ok := contract.CritAt(o.Crit, l)
			if !ok {
				v = math.NaN()
			}
			cells = append(cells, table.N(v, dec))
		}
		body = append(body, table.Row{Cells: cells})
	}
	return append(body, table.Row{Cells: []table.Cell{table.T("N"), table.I(nobs)}, RuleAbove: true})
}

// values returns the result's values: ADF*'s outcome at the top level,
// each statistic under adf, zt and za, the static coefficients at the
// ADF* break, the settings, the candidate dates and the sample.
func (s *ghSpec) values(st ghSettings, r *coint.GHResult, outs []*contract.Outcome, breaks []contract.Break, sims [3]*simulate.Result, d *engine.Data) map[string]any {
	vals := outs[0].Values()
	for i, key := range []string{"adf", "zt", "za"} {
		v := map[string]any{"stat": outs[i].Stat, "break": breaks[i].Date, "break_index": breaks[i].Index,
			"crit": contract.CritMap(outs[i].Crit), "reject_5": outs[i].Rejects(0.05), "pvalue": outs[i].PValue}
		if i == 0 {
			v["lags"] = outs[i].Lags
		} else {
			v["bandwidth"] = outs[i].Lags
		}
		if sims[i] != nil {
			engine.SimURValues(v, sims[i], outs[i].Stat)
		}
		vals[key] = v
	}
	if sims[0] != nil {
		engine.SimURValues(vals, sims[0], outs[0].Stat)
	}
	delete(vals, "bandwidth")
	vals["lags"] = outs[0].Lags
	static := map[string]any{}
	for i, term := range coint.GHTerms(st.model, s.X) {
		static[term] = r.Coef[i]
	}
	vals["static"] = static
	vals["shift"] = map[coint.GHModel]string{coint.GHLevel: "level", coint.GHLevelTrend: "trend", coint.GHRegime: "regime"}[st.model]
	vals["model"] = st.model.String()
	vals["trim"] = st.trim
	vals["candidates"] = map[string]any{"from": d.Dates[r.First].String(), "to": d.Dates[r.Last].String(), "n": r.Last - r.First + 1}
	vals["y"] = s.Y
	vals["x"] = append([]string(nil), s.X...)
	vals["vars"] = 1 + len(s.X)
	vals["sample"] = engine.SampleValues(d)
	return vals
}

// ghError turns an analysis error into a manuscript error at the key
// that can fix it.
func ghError(c *engine.Context, err error, n int) error {
	msg := strings.TrimPrefix(err.Error(), "coint: ")
	switch {
	case strings.Contains(msg, "no candidate break date"):
		return c.Errorf("trim", "Gregory–Hansen: %s", msg)
	case strings.Contains(msg, "too few"):
		return c.Errorf("", "Gregory–Hansen: %s", msg)
	case strings.Contains(msg, "collinear"):
		return c.Errorf("x", "Gregory–Hansen: %s", msg)
	case strings.Contains(msg, "bandwidth"):
		return c.Errorf("bandwidth", "Gregory–Hansen: %s", msg)
	case strings.Contains(msg, "ADF regression"), strings.Contains(msg, "lag"):
		return c.Errorf("lags", "Gregory–Hansen (%d observations): %s", n, msg)
	}
	return c.Errorf("", "Gregory–Hansen: %s", msg)
}

// ghSimSource is the critical-value source of one simulated statistic.
func ghSimSource(r *simulate.Result, label string, m coint.GHModel, chosen bool) string {
	what := "lagged differences"
	if label != "ADF*" {
		what = "Bartlett lags"
	}
	held := ""
	if chosen {
		held = " (the number chosen at the minimising date, held fixed in every replication)"
	}
	return fmt.Sprintf("simulated: %s replications, seed %d, T=%d, %d independent random walks, model %s, trimming %g, %d %s%s; Monte Carlo standard errors %s",
		engine.Group(r.Reps), r.Seed, r.NObs, r.Spec.N, m, r.Spec.Trim, r.Spec.Lags, what, held, engine.SimMCSEText(r))
}

func ghNotes(c *engine.Context, s *ghSpec, st ghSettings, r *coint.GHResult, outs []*contract.Outcome, sims [3]*simulate.Result, d *engine.Data) []string {
	var b strings.Builder
	fmt.Fprintf(&b, "H0: no cointegration among %s; H1: cointegration with %s at an unknown date. ", strings.Join(append([]string{s.Y}, s.X...), ", "), ghShiftText[st.model])
	fmt.Fprintf(&b, "Each statistic is the smallest over the candidate break dates %s to %s (trimming %s at each end); Break is the first date of the new regime at that minimum. ",
		d.Dates[r.First], d.Dates[r.Last], contract.Pct(st.trim))
	fmt.Fprintf(&b, "ADF*: the residual ADF regression has no deterministic terms, its lagged differences %s at each date (%d at the minimum). ", engine.DescribeLags(st.lags, r.MaxLag), r.ADF.Lags)
	var bw string
	switch {
	case st.bw.Auto():
		bw = fmt.Sprintf("chosen at each date by the automatic rule %s", st.bw)
	case st.bw.Rule == unitroot.Given:
		bw = "as given"
	default:
		bw = fmt.Sprintf("by the rule %s of the %d residual autocorrelation terms", st.bw, r.NObs-1)
	}
	fmt.Fprintf(&b, "Zt* and Zα*: Phillips-type statistics of the residuals with Bartlett lags %s (%d and %d at their minima).", bw, r.Zt.Lags, r.Za.Lags)
	notes := []string{b.String()}
	b.Reset()
	if sims[0] != nil {
		fmt.Fprintf(&b, "Critical values: simulated at T = %d with %d independent random walks, the same model, trimming, lags and bandwidth, %s replications, seed %d; Monte Carlo standard errors %s (ADF*), %s (Zt*), %s (Zα*); stars by these critical values. p-values: the share of the replications at or below each statistic.",
			r.NObs, sims[0].Spec.N, engine.Group(sims[0].Reps), sims[0].Seed, engine.SimMCSEText(sims[0]), engine.SimMCSEText(sims[1]), engine.SimMCSEText(sims[2]))
	} else if outs[0].Crit != nil {
		fmt.Fprintf(&b, "Critical values: Gregory and Hansen (1996) Table 1 for m = %d regressors, model %s, asymptotic, trimming 0.15 (ADF* and Zt* share them); T = %d. No p-values are tabulated; stars by the critical values.", r.Regressors, st.model, r.NObs)
		if math.Abs(st.trim-coint.DefaultGHTrim) > 1e-12 {
			fmt.Fprintf(&b, " This test used trimming %g, so the tabulated values are approximate; crit: simulate gives them for this trimming.", st.trim)
		}
	} else {
		fmt.Fprintf(&b, "Critical values: none; Gregory and Hansen (1996) tabulate at most %d regressors, so no stars are shown. crit: simulate gives them at this T.", coint.MaxGHRegressors)
	}
	notes = append(notes, b.String())
	return notes
}
