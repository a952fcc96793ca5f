package ecm

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"github.com/galley-econ/galley/analysis/ecm"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// ecm: a single-equation error-correction model around the long-run
// relation of an engle-granger, dols, fmols or ccr result.
type ecmSpec struct {
	engine.Common `yaml:",inline"`
	From          string   `yaml:"from"`
	Lags          *int     `yaml:"lags"`
	YLags         *int     `yaml:"ylags"`
	XLags         *int     `yaml:"xlags"`
	SE            string   `yaml:"se"`
	Extra         []string `yaml:"extra"`
	Sample        string   `yaml:"sample"`
	Diagnostics   []string `yaml:"diagnostics"`
	Decimals      *int     `yaml:"decimals"`
}

// ecmFrom are the kinds whose long-run relation an ecm can use.
var ecmFrom = []string{"engle-granger", "dols", "fmols", "ccr"}

func init() {
	engine.Register(engine.Kind{
		Name:    "ecm",
		Summary: "error-correction model around an estimated long-run relation, with residual diagnostics",
		New:     func() engine.Directive { return &ecmSpec{} },
		Fields: []string{"coef", "alpha", "alpha_se", "halflife", "halflife_se", "error_corrects", "diagnostics", "nobs", "r2", "r2_adj",
			"sigma", "cov", "se_desc", "ylags", "xlags", "from", "y", "sample", "actual", "fitted"},
		Model: true,
	})
}

// source is the directive named by from: and the relation it estimated.
func (s *ecmSpec) source(c *engine.Context) (contract.LongRun, error) {
	up, err := c.Upstream("from", s.From, ecmFrom...)
	if err != nil {
		return contract.LongRun{}, err
	}
	src, ok := up.(contract.RelationSource)
	if !ok {
		return contract.LongRun{}, c.Errorf("from", "%q holds no long-run relation", s.From)
	}
	rel := src.Relation()
	rel.Data = c.DataAlias(rel.Data)
	return rel, nil
}

func (s *ecmSpec) lagOrders(c *engine.Context) (p, q int, err error) {
	p, q = 1, 1
	if s.Lags != nil {
		if s.YLags != nil || s.XLags != nil {
			return 0, 0, c.Errorf("lags", "write lags (both orders) or ylags and xlags, not both")
		}
		p, q = *s.Lags, *s.Lags
	}
	if s.YLags != nil {
		p = *s.YLags
	}
	if s.XLags != nil {
		q = *s.XLags
	}
	for _, k := range []struct {
		key string
		v   int
	}{{"lags", p}, {"ylags", p}, {"xlags", q}} {
		if k.v < 0 && c.Has(k.key) {
			return 0, 0, c.Errorf(k.key, "%s must be zero or more", k.key)
		}
	}
	return p, q, nil
}

func (s *ecmSpec) settings(c *engine.Context) (contract.LongRun, int, int, ols.CovSpec, []engine.DiagItem, error) {
	var cov ols.CovSpec
	if s.From == "" {
		return contract.LongRun{}, 0, 0, cov, nil, c.Errorf("", "galley ecm: the key \"from\" is required: the id of an engle-granger, dols, fmols or ccr result")
	}
	rel, err := s.source(c)
	if err != nil {
		return rel, 0, 0, cov, nil, err
	}
	p, q, err := s.lagOrders(c)
	if err != nil {
		return rel, 0, 0, cov, nil, err
	}
	if cov, err = ols.ParseCov(s.SE); err != nil {
		return rel, 0, 0, cov, nil, c.Errorf("se", "%v", err)
	}
	ds, err := engine.ParseDiagnostics(c, "diagnostics", s.Diagnostics, c.Has("diagnostics"))
	return rel, p, q, cov, ds, err
}

func (s *ecmSpec) Check(c *engine.Context) error {
	rel, _, _, _, _, err := s.settings(c)
	if err != nil {
		return err
	}
	sample := rel.Sample
	if s.Sample != "" {
		sample = s.Sample
	}
	exprs := append(append([]string{rel.Y}, rel.X...), s.Extra...)
	return c.CheckData(rel.Data, exprs, sample)
}

// Run estimates the error-correction model on the equilibrium error of the
// relation named by from: and returns its table, values, actual and fitted
// series, and model.
func (s *ecmSpec) Run(c *engine.Context) (*engine.Result, error) {
	rel, p, q, cov, items, err := s.settings(c)
	if err != nil {
		return nil, err
	}
	up, err := c.Result("from", s.From, ecmFrom...)
	if err != nil {
		return nil, err
	}
	d, in, err := s.input(c, rel, up)
	if err != nil {
		return nil, err
	}
	m, err := ecm.Estimate(in, ecm.Spec{YLags: p, XLags: q, Cov: cov})
	if err != nil {
		return nil, s.estimateError(c, rel, err)
	}
	diags, err := engine.RunDiagnostics(m.Fit, items, d.Freq, c.DwNull)
	if err != nil {
		return nil, c.Errorf("diagnostics", "%v", err)
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	unit := engine.PeriodUnit(d.Freq)
	adj := m.Adjust
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.T(""), c.TermCell(ecm.DiffName(rel.Y, 0))}}}
	t.Body = body(c, m, engine.DiagRows(diags, dec), dec, unit)
	sd := estimationSample(d, m)
	t.Notes = []string{
		fmt.Sprintf("Dependent variable: %s, the first difference of %s. Least squares; %s in parentheses; t-ratios compared with the standard normal distribution, since every regressor is stationary when the variables cointegrate.", c.TermText(ecm.DiffName(rel.Y, 0)), c.TermText(rel.Y), cov.Describe()),
		fmt.Sprintf("%s is the equilibrium error of %q (%s) lagged one period; Δvₜ₋ⱼ is the first difference of v lagged j periods. Lags of %s: %d; differences of the regressors at lags 0 to %d.", c.TermText(ecm.ECTName), s.From, fromDesc(up.Kind), c.TermText(ecm.DiffName(rel.Y, 0)), p, q),
		halfLifeNote(adj, unit),
	}
	if n := engine.DiagNote(diags); n != "" {
		t.Notes = append(t.Notes, n)
	}
	t.Notes = append(t.Notes, c.StarNote()+" "+sd.SampleNote())
	if w := engine.CondNote(m.Fit); w != "" {
		t.Notes = append(t.Notes, w)
	}
	vals := map[string]any{
		"coef": engine.CoefValues(m.Names, m.Coef), "alpha": adj.Alpha, "alpha_se": adj.SE,
		"halflife": nil, "halflife_se": nil, "error_corrects": adj.HasHalfLife,
		"diagnostics": engine.DiagValues(diags), "nobs": m.Fit.N, "r2": m.Fit.R2(), "r2_adj": m.Fit.R2Adj(),
		"sigma": math.Sqrt(m.Fit.Sigma2()), "cov": cov.String(), "se_desc": cov.Describe(),
		"ylags": p, "xlags": q, "from": s.From, "y": ecm.DiffName(rel.Y, 0),
		"sample": engine.SampleValues(sd),
	}
	if adj.HasHalfLife {
		vals["halflife"], vals["halflife_se"] = adj.HalfLife, adj.HalfLifeSE
	}
	// The dependent variable and its fitted values, for actual-vs-fitted figures.
	actual := make([]float64, m.Fit.N)
	for i := range actual {
		actual[i] = m.Fit.Fitted[i] + m.Fit.Resid[i]
	}
	res := &engine.Result{Table: t, Values: vals, Cites: []string{"engle-granger-1987"}}
	res.SetSeries("actual", contract.ViewDated(sd.Dates, actual))
	res.SetSeries("fitted", contract.ViewDated(sd.Dates, m.Fit.Fitted))
	res.Model = engine.ModelOf("ECM", ecm.DiffName(rel.Y, 0), m.Names, m.Coef, vals, true, "")
	return res, nil
}

// input returns the data of the relation rel over the sample (its own, or
// sample:) and the estimation input: y, x, the extra regressors, and the
// equilibrium error of the upstream result up at each date (NaN where it
// has none).
func (s *ecmSpec) input(c *engine.Context, rel contract.LongRun, up *engine.Result) (*engine.Data, ecm.Input, error) {
	resid, ok := up.Series["resid"]
	if !ok {
		return nil, ecm.Input{}, c.Errorf("from", "%q: the %s result has no residual series", s.From, up.Kind)
	}
	ectVals := resid.At()
	sample := rel.Sample
	if s.Sample != "" {
		sample = s.Sample
	}
	d, err := c.DataUsing(rel.Data, append([]string{rel.Y}, rel.X...), sample, rel.Missing)
	if err != nil {
		return nil, ecm.Input{}, err
	}
	if err := c.RefuseConstant(d, "from", "its differences are all zero, so there is nothing to error-correct", 0); err != nil {
		return nil, ecm.Input{}, err
	}
	extra, err := readExtras(c, rel, s.Extra, sample, d)
	if err != nil {
		return nil, ecm.Input{}, err
	}
	ect := make([]float64, d.N())
	for i, dt := range d.Dates {
		ect[i] = math.NaN()
		if v, ok := ectVals[dt.String()]; ok {
			ect[i] = v
		}
	}
	nx := len(rel.X)
	in := ecm.Input{
		Y: d.Cols[0], YName: rel.Y, X: d.Cols[1 : 1+nx], XNames: rel.X, ECT: ect,
		Extra: extra, ExtraNames: append([]string{}, s.Extra...),
	}
	return d, in, nil
}

// estimateError returns the estimation error err at the key most likely
// concerned: lags for too few observations, extra for collinearity, else
// sample or from.
func (s *ecmSpec) estimateError(c *engine.Context, rel contract.LongRun, err error) error {
	key := "from"
	switch {
	case c.Has("lags") && strings.Contains(err.Error(), "observations"):
		key = "lags"
	case len(s.Extra) > 0 && strings.Contains(err.Error(), "collinear"):
		key = "extra"
	case c.Has("sample"):
		key = "sample"
	}
	return c.Errorf(key, "error-correction model of %s: %v", rel.Y, err)
}

// body returns the table's rows: the coefficients with the half-life
// under the adjustment coefficient, N, the R², then the diagnostics' rows.
func body(c *engine.Context, m *ecm.Model, diagRows []table.Row, dec int, unit string) []table.Row {
	adj := m.Adjust
	rows := engine.CoefRows(c, m.Names, m.Coef, dec, false)
	// The half-life goes right under the adjustment coefficient (term 1:
	// rows 2 and 3 are its estimate and standard error).
	var hl []table.Row
	if adj.HasHalfLife {
		hl = []table.Row{{Cells: []table.Cell{table.T("    half-life, " + unit), table.N(adj.HalfLife, dec)}}, {Cells: []table.Cell{table.Empty, table.SECell(adj.HalfLifeSE, dec)}}}
	} else {
		hl = []table.Row{{Cells: []table.Cell{table.T("    half-life"), table.T("none: no error correction")}}}
	}
	body := append([]table.Row{}, rows[:4]...)
	body = append(body, hl...)
	body = append(body, rows[4:]...)
	body = append(body,
		table.Row{Cells: []table.Cell{table.T("N"), table.I(m.Fit.N)}, RuleAbove: true},
		table.Row{Cells: []table.Cell{table.T("R²"), table.N(m.Fit.R2(), dec)}},
		table.Row{Cells: []table.Cell{table.T("Adjusted R²"), table.N(m.Fit.R2Adj(), dec)}},
	)
	return append(body, diagRows...)
}

// estimationSample returns the dates the model was estimated on, with the
// dates left out for missing values inside that span.
func estimationSample(d *engine.Data, m *ecm.Model) *engine.Data {
	sd := &engine.Data{Dates: d.Dates[m.First : m.Last+1]}
	for _, dt := range d.Dropped { // left out for missing values inside the estimation span
		if sd.Dates[0].Before(dt) && dt.Before(sd.Dates[len(sd.Dates)-1]) {
			sd.Dropped = append(sd.Dropped, dt)
		}
	}
	return sd
}

// readExtras reads the extra regressors apart from the levels and puts
// them on the levels' dates (NaN where an extra has no value). Each
// extra enters at time t, so a value it lacks at the start (the first
// difference of a level, say) removes only the observations that need
// it. Read together with the levels, the extras would cut the levels'
// span to their own, and the differences of the levels would then lose
// one more observation at the start. With missing: drop, the dates an
// extra leaves out inside the sample are left out of the levels too,
// as one reading of all the series would.
func readExtras(c *engine.Context, rel contract.LongRun, exprs []string, sample string, d *engine.Data) ([][]float64, error) {
	if len(exprs) == 0 {
		return nil, nil
	}
	e, err := c.DataUsing(rel.Data, exprs, sample, rel.Missing)
	if err != nil {
		return nil, err
	}
	if len(e.Dropped) > 0 {
		gone := map[string]bool{}
		for _, dt := range e.Dropped {
			gone[dt.String()] = true
		}
		keep := d.Dates[:0:0]
		cols := make([][]float64, len(d.Cols))
		for i, dt := range d.Dates {
			if gone[dt.String()] {
				d.Dropped = append(d.Dropped, dt)
				continue
			}
			keep = append(keep, dt)
			for j := range cols {
				cols[j] = append(cols[j], d.Cols[j][i])
			}
		}
		d.Dates, d.Cols = keep, cols
		sort.Slice(d.Dropped, func(i, j int) bool { return d.Dropped[i].Before(d.Dropped[j]) })
	}
	at := make(map[string]int, e.N())
	for i, dt := range e.Dates {
		at[dt.String()] = i
	}
	out := make([][]float64, len(exprs))
	for k := range exprs {
		out[k] = make([]float64, d.N())
		for i, dt := range d.Dates {
			out[k][i] = math.NaN()
			if j, ok := at[dt.String()]; ok {
				out[k][i] = e.Cols[k][j]
			}
		}
	}
	return out, nil
}

func fromDesc(kind string) string {
	switch kind {
	case "engle-granger":
		return "the residual of the Engle–Granger static regression"
	case "dols":
		return "the residual of the DOLS long-run relation"
	case "fmols":
		return "the residual of the FMOLS long-run relation"
	case "ccr":
		return "the residual of the CCR long-run relation"
	}
	return kind
}

func halfLifeNote(a ecm.Adjustment, unit string) string {
	if !a.HasHalfLife {
		if a.Alpha >= 0 {
			return fmt.Sprintf("The adjustment coefficient α = %.3g is not negative: deviations from the long-run relation do not die out, so the model does not error-correct and no half-life is given.", a.Alpha)
		}
		return fmt.Sprintf("The adjustment coefficient α = %.3g is −2 or below: deviations overshoot with growing amplitude, so the model does not error-correct and no half-life is given.", a.Alpha)
	}
	s := fmt.Sprintf("Half-life of a deviation from the long-run relation, ln 0.5 / ln|1 + α|, in %s, with its delta-method standard error beneath.", unit)
	if a.Alpha < -1 {
		s += " With α below −1 the deviation overshoots; the half-life is that of its amplitude."
	}
	return s
}
