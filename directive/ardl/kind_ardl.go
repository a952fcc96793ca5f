// Package ardl is the directive family of autoregressive distributed-lag
// models: the kind ardl, the bounds test of a level relationship and,
// with split:, the asymmetric (nonlinear) model with its symmetry tests
// and cumulative dynamic multipliers.
package ardl

import (
	"fmt"
	"slices"
	"strings"

	"github.com/galley-econ/galley/analysis/ardl"
	"github.com/galley-econ/galley/analysis/ecm"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// ardlSpec: an ARDL model in its conditional error-correction form with
// the bounds tests (see docs/directives.md, section ardl).
type ardlSpec struct {
	engine.Common  `yaml:",inline"`
	Data           string           `yaml:"data"`
	Y              string           `yaml:"y"`
	X              []string         `yaml:"x"`
	Split          []string         `yaml:"split"`
	Threshold      *float64         `yaml:"threshold"`
	Det            string           `yaml:"det"`
	Lags           lagsKey          `yaml:"lags"`
	Tables         string           `yaml:"tables"`
	Horizon        *int             `yaml:"horizon"`
	Show           string           `yaml:"show"`
	Extra          []string         `yaml:"extra"`
	Sample         string           `yaml:"sample"`
	Decimals       *int             `yaml:"decimals"`
	engine.SimKeys `yaml:",inline"` // crit: simulate (simcrit.go)
}

func init() {
	engine.Register(engine.Kind{
		Name:     "ardl",
		Simulate: true,
		Summary:  "ARDL model in error-correction form with the bounds tests of a level relationship; with split, the asymmetric ARDL and its dynamic multipliers",
		New:      func() engine.Directive { return &ardlSpec{} },
		Fields: []string{"coef", "longrun", "alpha", "alpha_se", "halflife", "halflife_se", "error_corrects", "bounds",
			"lags", "selection", "symmetry", "multipliers", "ecm", "nobs", "r2", "r2_adj", "sigma", "det", "case",
			"y", "x", "split", "threshold", "sample", "resid", "show"},
		Model: true,
	})
}

// HasMultipliers: the result carries multiplier paths when a regressor
// is split (contract.MultiplierSource).
func (s *ardlSpec) HasMultipliers() bool { return len(s.Split) > 0 }

// exprs returns the expressions to read: y, x, then extra.
func (s *ardlSpec) exprs() []string {
	return append(append([]string{s.Y}, s.X...), s.Extra...)
}

// Check validates the keys and the expressions against the data.
func (s *ardlSpec) Check(c *engine.Context) error {
	if _, err := s.settings(c); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), s.exprs(), s.Sample)
}

// posName and negName name the partial sums of a split regressor.
// posName and negName return the names of the positive and negative
// partial sums of x.
func posName(x string) string { return "pos:" + x }
func negName(x string) string { return "neg:" + x }

// Run estimates the model and returns its table (long run, adjustment,
// bounds test, symmetry; or the error-correction form), values, bounds
// outcome, residuals and model.
func (s *ardlSpec) Run(c *engine.Context) (*engine.Result, error) {
	st, err := s.settings(c)
	if err != nil {
		return nil, err
	}
	d, err := c.Data(c.DataAlias(s.Data), s.exprs(), s.Sample)
	if err != nil {
		return nil, err
	}
	tau := 0.0
	if s.Threshold != nil {
		tau = *s.Threshold
	}
	in, pairs, err := s.input(c, d, tau)
	if err != nil {
		return nil, err
	}
	m, err := ardl.Estimate(in, st.spec)
	if err != nil {
		return nil, s.estimateError(c, err, d)
	}
	b, err := s.bounds(c, st, m)
	if err != nil {
		return nil, err
	}
	sd := &engine.Data{Dates: d.Dates[m.First : m.Last+1]}
	// Symmetry tests and multipliers.
	h := st.horizon
	if h == 0 {
		h = defaultHorizon(d.Freq)
	}
	asym, err := asymmetry(c, m, in.XNames, pairs, h)
	if err != nil {
		return nil, err
	}

	unit := engine.PeriodUnit(d.Freq)
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.T(""), c.TermCell(ecm.DiffName(s.Y, 0))}}}
	t.Body = s.body(c, st, m, b, asym.rows, unit)
	t.Notes = s.notes(c, st, m, b, pairs, tau, unit, sd)
	if w := engine.CondNote(m.Fit); w != "" {
		t.Notes = append(t.Notes, w)
	}

	vals := s.values(st, m, b, sd)
	if len(pairs) > 0 {
		vals["split"] = s.Split
		vals["threshold"] = tau
		vals["symmetry"] = asym.values
		vals["multipliers"] = contract.MultiplierValues(asym.mults)
	}
	cites := []string{"pss-2001"}
	if strings.HasPrefix(b.source, "Narayan") {
		cites = append(cites, "narayan-2005")
	}
	if len(pairs) > 0 {
		cites = append(cites, "sygn-2014")
	}
	res := &engine.Result{Table: t, Values: vals, Test: b.outcome(), Cites: cites}
	res.SetSeries("resid", contract.ViewDated(d.Dates, m.ECT))
	res.Model = engine.ModelOf("ARDL", s.Y, m.Names, m.Coef, vals, false, "")
	return res, nil
}

// input returns the estimation input from the data (y, the regressors,
// each split one as its positive and negative partial sums about tau, and
// the extra regressors) and the split pairs.
func (s *ardlSpec) input(c *engine.Context, d *engine.Data, tau float64) (ardl.Input, []ardl.Pair, error) {
	nx := len(s.X)
	in := ardl.Input{Y: d.Cols[0], YName: s.Y, Extra: d.Cols[1+nx:], ExtraNames: slices.Clone(s.Extra)}
	var pairs []ardl.Pair
	for j, x := range s.X {
		col := d.Cols[1+j]
		if i := slices.Index(s.Split, x); i >= 0 {
			pos, neg, _, _, err := ardl.PartialSums(col, tau)
			if err != nil {
				return in, nil, c.ItemErrorf("split", i, "split %s: %s in the sample %s", x, strings.TrimPrefix(err.Error(), "ardl: "), d.Range())
			}
			pairs = append(pairs, ardl.Pair{Name: x, Pos: len(in.X), Neg: len(in.X) + 1})
			in.X = append(in.X, pos, neg)
			in.XNames = append(in.XNames, posName(x), negName(x))
			in.Group = append(in.Group, j, j)
			continue
		}
		in.X = append(in.X, col)
		in.XNames = append(in.XNames, x)
		in.Group = append(in.Group, j)
	}
	return in, pairs, nil
}

// estimateError returns the estimation error err at the key most likely
// concerned (x or extra for collinearity; lags, sample or x for too few
// observations; lags otherwise), with the sample.
func (s *ardlSpec) estimateError(c *engine.Context, err error, d *engine.Data) error {
	msg := strings.TrimPrefix(err.Error(), "ardl: ")
	key := "lags"
	switch {
	case strings.Contains(msg, "collinear"):
		key = c.FirstSet("x", "extra")
	case strings.Contains(msg, "observations") || strings.Contains(msg, "beyond"):
		key = c.FirstSet("lags", "sample", "x")
	}
	if !c.Has(key) {
		key = ""
	}
	return c.Errorf(key, "ARDL of %s: %s (sample %s, %d observations)", s.Y, msg, d.Range(), d.N())
}

// asymmetric is what the split regressors add: their symmetry tests as
// table rows and as values, and their cumulative multipliers.
type asymmetric struct {
	rows   []symRow
	values []map[string]any
	mults  []contract.Multiplier
}

// asymmetry returns the symmetry tests and the multipliers over h periods
// of each split pair, or an error at split: or horizon:.
func asymmetry(c *engine.Context, m *ardl.Model, xNames []string, pairs []ardl.Pair, h int) (asymmetric, error) {
	var out asymmetric
	for _, p := range pairs {
		lr, sr, err := m.SymmetryTests(xNames, p)
		if err != nil {
			return out, c.Errorf("split", "%v", err)
		}
		out.rows = append(out.rows, symRow{p.Name, lr, sr})
		out.values = append(out.values, map[string]any{"name": p.Name, "longrun": fValues(lr), "shortrun": fValues(sr)})
		mu, err := m.Multipliers(p, h)
		if err != nil {
			return out, c.Errorf("horizon", "%v", err)
		}
		out.mults = append(out.mults, contract.Multiplier{Name: p.Name, Pos: mu.Pos, Neg: mu.Neg, Asym: mu.Asym, LongPos: mu.LongPos, LongNeg: mu.LongNeg})
	}
	return out, nil
}

// fValues returns the values of an F test.
func fValues(f ardl.FTest) map[string]any {
	return map[string]any{"stat": f.Stat, "df1": f.DF1, "df2": f.DF2, "pvalue": f.PValue}
}

// longrunValues returns the long-run coefficients as values, one map a
// term.
func longrunValues(m *ardl.Model) []map[string]any {
	out := make([]map[string]any, len(m.LongRun))
	for i, t := range m.LongRun {
		out[i] = map[string]any{"term": t.Name, "est": t.Est, "se": t.SE, "t": t.T, "p": t.P}
	}
	return out
}

// defaultHorizon is three years of periods for monthly and quarterly
// data, twelve periods otherwise.
func defaultHorizon(f series.Freq) int {
	switch f {
	case series.Monthly:
		return 36
	case series.Quarterly:
		return 12
	}
	return 12
}

// notes are the table notes.
func (s *ardlSpec) notes(c *engine.Context, st *settings, m *ardl.Model, b *boundsResult, pairs []ardl.Pair, tau float64, unit string, sd *engine.Data) []string {
	var ns []string
	orders := fmt.Sprintf("ARDL(%s)", m.Orders)
	var choice string
	if m.Selection != nil {
		choice = fmt.Sprintf("%s for %s, chosen by %s over p = 1…%d and q = 0…%d for each regressor (%d models compared on a common sample of %d observations) and re-estimated on its own sample", orders, s.Y, m.Selection.Crit, m.Selection.MaxP, m.Selection.MaxQ, m.Selection.Models, m.Selection.NObs)
	} else {
		choice = fmt.Sprintf("%s for %s (orders as given)", orders, s.Y)
	}
	var zero []string
	for j, q := range m.Orders.Q {
		if q == 0 {
			zero = append(zero, s.X[j])
		}
	}
	z := ""
	if len(zero) > 0 {
		z = fmt.Sprintf(" The error-correction form always holds the current difference of each regressor (the conditional model of Pesaran, Shin and Smith 2001), so %s, with q = 0, enter%s as with q = 1.", strings.Join(zero, ", "), map[bool]string{true: "s", false: ""}[len(zero) == 1])
	}
	if st.show == "ecm" {
		ns = append(ns, fmt.Sprintf("Restricted error-correction model of an %s; dependent variable %s. %s is the equilibrium error %s − θ'x with the long-run coefficients of the conditional model, lagged one period; least squares with conventional standard errors, the error-correction term taken as given. Deterministic terms: case %s (%s).%s", choice, c.TermText(ecm.DiffName(s.Y, 0)), c.TermText(ardl.ECTName), s.Y, st.det.Roman(), st.det.Describe(), z))
	} else {
		ns = append(ns, fmt.Sprintf("Conditional error-correction form of an %s; least squares with conventional standard errors. Deterministic terms: case %s (%s).%s", choice, st.det.Roman(), st.det.Describe(), z))
		ns = append(ns, fmt.Sprintf("Long run: θ = −π_x/π_y, the coefficients of the lagged levels of the regressors over minus that of %s, with delta-method standard errors; p-values from the standard normal. Adjustment: the coefficient α of %s in the restricted error-correction model (equal to π_y), with the half-life ln 0.5 / ln|1 + α| in %s.", c.TermText(ardl.LevelName(s.Y)), c.TermText(ardl.ECTName), unit))
		ns = append(ns, b.note())
	}
	if len(pairs) > 0 {
		var names []string
		for _, p := range pairs {
			names = append(names, p.Name)
		}
		thr := "above zero and at or below zero (rises and falls)"
		if tau != 0 {
			thr = fmt.Sprintf("above %g and at or below %g", tau, tau)
		}
		ns = append(ns, fmt.Sprintf("Asymmetric ARDL (Shin, Yu and Greenwood-Nimmo 2014): %s enter%s as pos:X and neg:X, the partial sums of the changes %s, sharing one lag order; k counts each partial sum as a regressor. Symmetry: Wald F tests (p-values from F(1, N − K) beneath) of equal long-run coefficients (π of pos:X = π of neg:X, equivalent to equal θ) and of equal sums of the short-run coefficients of the differences.", strings.Join(names, ", "), map[bool]string{true: "s", false: ""}[len(names) == 1], thr))
	}
	ns = append(ns, c.StarNote()+" "+sd.SampleNote())
	return ns
}
