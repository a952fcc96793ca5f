package coint

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/longrun"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/simulate"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
)

// engle-granger: the two-step residual-based test of no cointegration.
type egSpec struct {
	engine.Common `yaml:",inline"`
	Data          string         `yaml:"data"`
	Y             string         `yaml:"y"`
	X             []string       `yaml:"x"`
	Det           string         `yaml:"det"`
	Lags          engine.LagSpec `yaml:"lags"`
	Sample        string         `yaml:"sample"`
	Normalize     string         `yaml:"normalize"`
	Decimals      *int           `yaml:"decimals"`

	engine.SimKeys `yaml:",inline"` // crit: simulate (simcrit.go)
}

var egFields = []string{"stat", "pvalue", "pvalue_source", "lags", "nobs", "crit", "crit_source", "static", "reject_5",
	"resid", "det", "y", "x", "vars", "sample", "each",
	"crit_mcse", "sim_key", "sim"} // the last three with crit: simulate (simcrit.go)

func init() {
	engine.Register(engine.Kind{
		Name:     "engle-granger",
		Simulate: true,
		Summary:  "Engle–Granger residual-based ADF test of no cointegration, with the static long-run relation",
		New:      func() engine.Directive { return &egSpec{} },
		Fields:   egFields,
	})
}

// Relation says where the long-run relation was estimated.
func (s *egSpec) Relation() contract.LongRun {
	return contract.LongRun{Data: s.Data, Y: s.Y, X: s.X, Sample: s.Sample, Missing: s.Missing}
}

func (s *egSpec) Check(c *engine.Context) error {
	if err := c.Require("y", s.Y == ""); err != nil {
		return err
	}
	if len(s.X) == 0 {
		return c.Errorf("", "galley engle-granger: the key \"x\" is required (one or more regressors)")
	}
	if _, err := engine.ParseDet(c, s.Det); err != nil {
		return err
	}
	switch strings.ToLower(s.Normalize) {
	case "", "y", "all":
	default:
		return c.Errorf("normalize", "normalize: write all (each variable as the dependent in turn) or leave it out (y on x)")
	}
	if _, err := s.SimKeys.Settings(c); err != nil { // crit: simulate (simcrit.go)
		return err
	}
	if n := len(s.X) + 1; n > critical.MaxTauN {
		return c.Errorf("x", "%d variables is beyond the MacKinnon (2010) critical-value tables and beyond what crit: simulate covers (at most %d)", n, critical.MaxTauN)
	}
	return c.CheckData(c.DataAlias(s.Data), append([]string{s.Y}, s.X...), s.Sample)
}

// detTerms names the deterministic terms of a case.
func detTerms(d critical.Case) []string {
	return []string{longrun.ConstName, longrun.TrendName, longrun.TrendSqName}[:d.Deterministics()]
}

// Run tests each normalisation asked for and returns the table (one row a
// dependent variable), the first row's values and test, and its residuals.
func (s *egSpec) Run(c *engine.Context) (*engine.Result, error) {
	det, err := engine.ParseDet(c, s.Det)
	if err != nil {
		return nil, err
	}
	rule := s.Lags.Rule(engine.DefaultLags)
	vars := append([]string{s.Y}, s.X...)
	d, err := c.Data(c.DataAlias(s.Data), vars, s.Sample)
	if err != nil {
		return nil, err
	}
	if err := c.RefuseConstant(d, "", "a cointegration test needs series that vary (the residuals of a constant would be rounding noise)"); err != nil {
		return nil, err
	}
	all := strings.EqualFold(s.Normalize, "all")
	deps := []int{0}
	if all {
		deps = deps[:0]
		for i := range vars {
			deps = append(deps, i)
		}
	}
	rows, err := egRows(c, d, vars, deps, det, rule)
	if err != nil {
		return nil, err
	}
	// crit: simulate (simcrit.go): simulated critical values and p-values, row by row.
	sim, err := s.SimKeys.Settings(c)
	if err != nil {
		return nil, err
	}
	sims := make([]*simulate.Result, len(rows))
	if sim != nil {
		for r, res := range rows {
			if sims[r], err = simEG(c, sim, det, rule, res); err != nil {
				return nil, err
			}
		}
	}
	dec := c.Decimals()
	if s.Decimals != nil {
		dec = *s.Decimals
	}
	terms := s.staticTerms(det, vars, all)
	t := &table.Table{Stub: 1, Head: egHead(terms)}
	each := make([]map[string]any, len(rows))
	var first *contract.Outcome // the test of the first row: the result's Test
	for r, res := range rows {
		dep := vars[deps[r]]
		o := egOutcome(res)
		if r == 0 {
			first = o
		}
		static := staticMap(res, det, vars, deps[r])
		t.Body = append(t.Body, table.Row{Cells: egCells(c, res, o, static, terms, dep, dec)})
		each[r] = egValues(res, o, static, d, dep)
		each[r]["name"] = dep
		if sims[r] != nil { // crit: simulate (simcrit.go)
			engine.SimURValues(each[r], sims[r], res.Stat)
		}
	}
	t.Notes = egNotes(c, rows, vars, deps, det, rule, all)
	if sim != nil { // crit: simulate (simcrit.go): the note on critical values
		t.Notes[1] = simEGNote(sims, vars, deps)
	}
	t.Notes = append(t.Notes, c.StarNote()+" "+d.SampleNote())
	res := &engine.Result{Table: t, Values: s.values(each, det, len(vars), d, all), Test: first, Cites: []string{"engle-granger-1987", "mackinnon-2010", "mackinnon-1994"}}
	res.SetSeries("resid", contract.ViewDated(d.Dates[:len(rows[0].Resid)], rows[0].Resid))
	return res, nil
}

// egRows returns the test with each of deps (indices into vars) as the
// dependent variable and the other variables as regressors.
func egRows(c *engine.Context, d *engine.Data, vars []string, deps []int, det critical.Case, rule unitroot.LagRule) ([]*coint.EGResult, error) {
	rows := make([]*coint.EGResult, len(deps))
	for r, i := range deps {
		var x [][]float64
		for j := range vars {
			if j != i {
				x = append(x, d.Cols[j])
			}
		}
		res, err := coint.EngleGranger(d.Cols[i], x, det, rule)
		if err != nil {
			return nil, egError(c, err, vars, i, det)
		}
		rows[r] = res
	}
	return rows, nil
}

// staticTerms returns the columns of the static block: the deterministic
// terms, then the variables (all of them with normalize: all, where the
// dependent's cell is a dash; else x).
func (s *egSpec) staticTerms(det critical.Case, vars []string, all bool) []string {
	terms := detTerms(det)
	if all {
		return append(terms, vars...)
	}
	return append(terms, s.X...)
}

// egHead returns the table's two heading rows.
func egHead(terms []string) [][]table.Cell {
	return [][]table.Cell{
		{table.Empty, table.Empty, table.Empty, table.Empty, table.Empty, table.Span("Critical values", 3), table.Span("Static relation", len(terms))},
		append([]table.Cell{table.T("Dependent variable"), table.T("ADF τ"), table.T("p-value"), table.T("Lags"), table.T("N"), table.T("1%"), table.T("5%"), table.T("10%")}, textCells(terms)...),
	}
}

// egCells returns one row's cells: the dependent variable, τ with its
// stars, the p-value, lags, N, the 1%, 5% and 10% critical values, and
// the static coefficients on terms (a dash for the dependent).
func egCells(c *engine.Context, res *coint.EGResult, o *contract.Outcome, static map[string]any, terms []string, dep string, dec int) []table.Cell {
	cells := []table.Cell{table.T(dep), table.Starred(res.Stat, dec, o.Stars(c.Stars())), table.N(res.PValue, dec), table.I(res.Lags), table.I(res.NObs)}
	for _, l := range critical.MacKinnonLevels {
		v, ok := contract.CritAt(res.Crit, l)
		if !ok {
			v = math.NaN()
		}
		cells = append(cells, table.N(v, dec))
	}
	for _, term := range terms {
		if term == dep {
			cells = append(cells, table.T("—"))
			continue
		}
		cells = append(cells, table.N(static[term].(float64), dec))
	}
	return cells
}

// egError turns an analysis error into a manuscript error.
func egError(c *engine.Context, err error, vars []string, dep int, det critical.Case) error {
	var ce *ols.CollinearError
	if errors.As(err, &ce) {
		others := make([]string, 0, len(vars)-1)
		for j := range vars {
			if j != dep {
				others = append(others, vars[j])
			}
		}
		col := ce.Col - det.Deterministics()
		if col >= 0 && col < len(others) {
			return c.Errorf("x", "Engle–Granger static regression: %q is perfectly collinear with the deterministic terms and %v in this sample; drop one of them", others[col], others[:col])
		}
		return c.Errorf("det", "Engle–Granger static regression: a deterministic term is collinear in this sample")
	}
	if len(vars) > critical.MaxTauN {
		return c.Errorf("x", "Engle–Granger: %v", err)
	}
	return c.Errorf("x", "Engle–Granger with %s as the dependent variable: %v", vars[dep], err)
}

// egOutcome puts a result into the unit-root form that decides stars.
func egOutcome(r *coint.EGResult) *contract.Outcome {
	return &contract.Outcome{Stat: r.Stat, PValue: r.PValue, Crit: r.Crit}
}

// staticMap names the static coefficients: deterministic terms, then
// the variables other than the dependent, in their order.
func staticMap(r *coint.EGResult, det critical.Case, vars []string, dep int) map[string]any {
	m := map[string]any{}
	names := detTerms(det)
	for j, v := range vars {
		if j != dep {
			names = append(names, v)
		}
	}
	for i, n := range names {
		m[n] = r.Coef[i]
	}
	return m
}

func egValues(r *coint.EGResult, o *contract.Outcome, static map[string]any, d *engine.Data, dep string) map[string]any {
	v := map[string]any{
		"stat": r.Stat, "pvalue": r.PValue, "lags": r.Lags, "nobs": r.NObs,
		"crit": contract.CritMap(r.Crit), "crit_source": r.CritSource, "static": static,
		"reject_5": o.Rejects(0.05), "resid": contract.ViewDated(d.Dates[:len(r.Resid)], r.Resid).ResultsForm(),
	}
	if !math.IsNaN(r.PValue) {
		v["pvalue_source"] = "MacKinnon (1994)"
	}
	return v
}

func textCells(s []string) []table.Cell {
	out := make([]table.Cell, len(s))
	for i, x := range s {
		out[i] = table.T(x)
	}
	return out
}

func egNotes(c *engine.Context, rows []*coint.EGResult, vars []string, deps []int, det critical.Case, rule unitroot.LagRule, all bool) []string {
	var b strings.Builder
	fmt.Fprintf(&b, "H0: no cointegration among %s. τ is the ADF t-ratio of the residuals of the static regression of the dependent variable on the deterministic terms (%s) and the other variables", strings.Join(vars, ", "), contract.DetNames[det])
	if all {
		b.WriteString("; each variable is the dependent in turn, one row each, since the test depends on the normalisation")
	}
	b.WriteString(". The residual ADF regression has no deterministic terms. Lagged differences: ")
	var lags []string
	for _, r := range rows {
		lags = append(lags, strconv.Itoa(r.Lags))
	}
	fmt.Fprintf(&b, "%s, %s.", strings.Join(lags, ", "), engine.DescribeLags(rule, rows[0].ADF.MaxLag))
	notes := []string{b.String()}

	b.Reset()
	n := rows[0].Vars
	if rows[0].Crit == nil {
		fmt.Fprintf(&b, "Critical values: none; MacKinnon (2010) tabulates no response surface for case n with N = %d variables, so stars follow the p-value.", n)
	} else {
		var ts []string
		for r, res := range rows {
			s := strconv.Itoa(res.NObs)
			if len(rows) > 1 {
				s += " (" + vars[deps[r]] + ")"
			}
			ts = append(ts, s)
		}
		fmt.Fprintf(&b, "Critical values: MacKinnon (2010) response surfaces for N = %d variables, case %s (%s), evaluated at T = %s, the observations of the residual ADF regression; stars by these critical values.", n, det, contract.DetNames[det], strings.Join(ts, ", "))
	}
	if n <= critical.MaxPN {
		fmt.Fprintf(&b, " p-value: MacKinnon (1994) asymptotic approximation for N = %d.", n)
	} else {
		fmt.Fprintf(&b, " p-value: not available (MacKinnon 1994 covers N ≤ %d).", critical.MaxPN)
	}
	notes = append(notes, b.String())
	dash := ""
	if all {
		dash = " A dash marks the row's dependent variable."
	}
	notes = append(notes, "The static coefficients are super-consistent, but the static regression's usual standard errors are not valid for inference, so none are shown and the coefficients carry no stars."+dash)
	return notes
}

// values returns the result's values: those of the first row (y as the
// dependent), the settings and sample, and with normalize: all every row
// under each.
func (s *egSpec) values(each []map[string]any, det critical.Case, nvars int, d *engine.Data, all bool) map[string]any {
	vals := map[string]any{}
	for k, v := range each[0] {
		if k != "name" {
			vals[k] = v
		}
	}
	vals["det"] = det.String()
	vals["y"] = s.Y
	vals["x"] = append([]string(nil), s.X...)
	vals["vars"] = nvars
	vals["sample"] = engine.SampleValues(d)
	if all {
		vals["each"] = each
	}
	return vals
}
