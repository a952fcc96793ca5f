package longrun

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/longrun"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/restrict"
	"github.com/galley-econ/galley/analysis/rules"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
)

// RelationKeys are the keys every long-run estimator of this package
// shares: where the relation is (data, y, x, sample), its deterministic
// terms, the Wald restrictions to test and the decimals. It is exported
// because the key checks (manuscript.YamlFields) read exported fields.
type RelationKeys struct {
	engine.Common `yaml:",inline"`
	Data          string   `yaml:"data"`
	Y             string   `yaml:"y"`
	X             []string `yaml:"x"`
	Det           string   `yaml:"det"`
	Sample        string   `yaml:"sample"`
	Restrict      []string `yaml:"restrict"`
	Decimals      *int     `yaml:"decimals"`
}

// dols: estimates of a cointegrating relation with valid
// standard errors, and Wald tests of restrictions on it.
type dolsSpec struct {
	RelationKeys `yaml:",inline"`
	SE           string `yaml:"se"`
	Leads        *int   `yaml:"leads"`
	Lags         *int   `yaml:"lags"`
	Select       string `yaml:"select"`
	Max          *int   `yaml:"max"`
}

// longrunFields are the values both estimators report; dolsFields and
// fmolsFields add their own.
var (
	longrunFields = []string{"coef", "nobs", "wald", "cov", "se_desc", "det", "y", "x", "sample", "resid"}
	dolsFields    = append([]string{"leads", "lags", "r2", "select", "dynamics", "bandwidth", "hac_lags", "kernel"}, longrunFields...)
	fmolsFields   = append([]string{"bandwidth", "kernel", "lc"}, longrunFields...)
)

func init() {
	engine.Register(engine.Kind{Name: "dols", Summary: "dynamic OLS estimate of a cointegrating relation, with Wald tests", Fields: dolsFields, Model: true,
		New: func() engine.Directive { return &dolsSpec{} }})
}

// Relation says where the long-run relation was estimated.
func (k *RelationKeys) Relation() contract.LongRun {
	return contract.LongRun{Data: k.Data, Y: k.Y, X: k.X, Sample: k.Sample, Missing: k.Missing}
}

// checkRelation checks the shared keys of a block of the named kind.
func (k *RelationKeys) checkRelation(c *engine.Context, kind string) error {
	if err := c.Require("y", k.Y == ""); err != nil {
		return err
	}
	if len(k.X) == 0 {
		return c.Errorf("", "galley %s: the key \"x\" is required (one or more regressors)", kind)
	}
	if _, err := engine.ParseDet(c, k.Det); err != nil {
		return err
	}
	if _, err := parseRestrictions(c, k.Restrict, k.X); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(k.Data), k.columns(), k.Sample)
}

// columns are y and then the regressors.
func (k *RelationKeys) columns() []string { return append([]string{k.Y}, k.X...) }

// data reads y and the regressors over the sample.
func (k *RelationKeys) data(c *engine.Context) (*engine.Data, error) {
	return c.Data(c.DataAlias(k.Data), k.columns(), k.Sample)
}

// dolsSettings are the lead/lag choice and the covariance of a dols spec;
// T is the sample size (0 while checking).
type dolsSettings struct {
	spec    longrun.DOLSSpec
	autoHAC bool
}

func (s *dolsSpec) settings(c *engine.Context, T int) (dolsSettings, error) {
	var st dolsSettings
	det, err := engine.ParseDet(c, s.Det)
	if err != nil {
		return st, err
	}
	st.spec.Det = det
	fixed := s.Leads != nil || s.Lags != nil
	switch strings.ToLower(s.Select) {
	case "":
		if fixed {
			st.spec.Select = longrun.Fixed
		} else {
			st.spec.Select = longrun.AIC
		}
	case "aic":
		st.spec.Select = longrun.AIC
	case "bic":
		st.spec.Select = longrun.BIC
	default:
		return st, c.Errorf("select", "select: write aic or bic (or give leads and lags instead)")
	}
	if fixed && s.Select != "" {
		return st, c.Errorf("select", "give either fixed leads and lags or select, not both")
	}
	if fixed {
		switch {
		case s.Leads == nil:
			st.spec.Leads, st.spec.Lags = *s.Lags, *s.Lags
		case s.Lags == nil:
			st.spec.Leads, st.spec.Lags = *s.Leads, *s.Leads
		default:
			st.spec.Leads, st.spec.Lags = *s.Leads, *s.Lags
		}
		if st.spec.Leads < 0 || st.spec.Lags < 0 {
			key := "lags"
			if s.Leads != nil && *s.Leads < 0 {
				key = "leads"
			}
			return st, c.Errorf(key, "leads and lags must be zero or more")
		}
		if s.Max != nil {
			return st, c.Errorf("max", "max bounds a selection (select: aic or bic); with fixed leads and lags it does not apply")
		}
	} else {
		mx := rules.Schwert4.Lag(T)
		if s.Max != nil {
			if *s.Max < 0 {
				return st, c.Errorf("max", "max must be zero or more")
			}
			mx = *s.Max
		}
		st.spec.MaxLeads, st.spec.MaxLags = mx, mx
	}
	se := strings.ToLower(strings.ReplaceAll(s.SE, " ", ""))
	if se == "" || se == "hac" {
		st.autoHAC = true
		st.spec.Cov = ols.CovSpec{Kind: ols.HAC, Lags: rules.NeweyWest94Bartlett.Lag(T)}
	} else if st.spec.Cov, err = ols.ParseCov(s.SE); err != nil {
		return st, c.Errorf("se", "%v (or hac for an automatic lag)", err)
	}
	return st, nil
}

func (s *dolsSpec) Check(c *engine.Context) error {
	if err := s.checkRelation(c, "dols"); err != nil {
		return err
	}
	_, err := s.settings(c, 0)
	return err
}

// Run estimates the DOLS regression and returns its table (the long-run
// coefficients, N, leads and lags, Wald tests), values, relation residuals
// and model.
func (s *dolsSpec) Run(c *engine.Context) (*engine.Result, error) {
	d, err := s.data(c)
	if err != nil {
		return nil, err
	}
	st, err := s.settings(c, d.N())
	if err != nil {
		return nil, err
	}
	restr, _ := parseRestrictions(c, s.Restrict, s.X)
	r, err := longrun.DOLS(d.Cols[0], d.Cols[1:], s.X, st.spec)
	if err != nil {
		key := ""
		if c.Has("leads") || c.Has("lags") || c.Has("max") {
			key = "lags"
		}
		return nil, c.Errorf(key, "DOLS of %s on %s: %v", s.Y, strings.Join(s.X, ", "), err)
	}
	nd := st.spec.Det.Deterministics()
	k := len(s.X)
	terms := r.Names[:nd+k]
	coefs := r.Table[:nd+k]
	walds, err := runWald(c, restr, r.LongRun)
	if err != nil {
		return nil, err
	}
	dec := engine.DecimalsOr(c, s.Decimals)
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.T(""), c.TermCell(s.Y)}}}
	t.Body = longRunRows(c, terms, coefs, nd, dec)
	t.Body = append(t.Body,
		table.Row{Cells: []table.Cell{table.T("N"), table.I(r.Fit.N)}, RuleAbove: true},
		table.Row{Cells: []table.Cell{table.T("Leads of Δx"), table.I(r.Leads)}},
		table.Row{Cells: []table.Cell{table.T("Lags of Δx"), table.I(r.Lags)}},
	)
	t.Body = append(t.Body, waldRows(walds, dec)...)
	sd := &engine.Data{Dates: d.Dates[r.First : r.Last+1]}
	choice := leadLagChoice(st.spec, r)
	seNote := st.spec.Cov.Describe()
	if st.autoHAC {
		seNote += fmt.Sprintf(", the lag being the integer part of 4(T/100)^(2/9) with T = %d, the observations of the sample before the leads and lags shorten it", d.N())
	}
	t.Notes = []string{
		fmt.Sprintf("Dynamic OLS of %s on %s, with leads and lags of the differenced regressors (not shown), %s. Deterministic terms: %s. Standard errors in parentheses: %s; t-ratios and Wald statistics compared with the standard normal and χ² distributions.",
			s.Y, strings.Join(s.X, ", "), choice, contract.DetNames[st.spec.Det], seNote),
	}
	if st.spec.Cov.Kind != ols.HAC {
		t.Notes = append(t.Notes, "Warning: DOLS inference needs a long-run (HAC) variance; these standard errors are valid only if the regression errors are serially uncorrelated.")
	}
	if w := waldNote(walds); w != "" {
		t.Notes = append(t.Notes, w)
	}
	t.Notes = append(t.Notes, c.StarNote()+" "+sd.SampleNote())
	vals := s.values(st, r, nd+k, walds, seNote, sd)
	// The leads and lags are nuisance terms the table does not show.
	res := &engine.Result{Table: t, Values: vals, Hidden: []string{"dynamics"}, Cites: []string{"saikkonen-1991", "stock-watson-1993", "newey-west-1987"}}
	res.SetSeries("resid", contract.ViewDated(d.Dates, longrun.RelationResid(d.Cols[0], d.Cols[1:], st.spec.Det, r.Fit.Coef[:nd+k])))
	res.Model = engine.ModelOf("DOLS", s.Y, terms, coefs, vals, true, "the coefficients of the leads and lags of the differenced regressors")
	return res, nil
}

// leadLagChoice returns how the leads and lags were set, for the note:
// fixed, or chosen by a criterion over a stated range.
func leadLagChoice(sp longrun.DOLSSpec, r *longrun.DOLSResult) string {
	if sp.Select == longrun.Fixed {
		return fmt.Sprintf("fixed at %d leads and %d lags", r.Leads, r.Lags)
	}
	return fmt.Sprintf("chosen by %s over 0–%d leads and 0–%d lags on a common sample, then re-estimated on the full sample", map[longrun.Selector]string{longrun.AIC: "AIC", longrun.BIC: "BIC"}[sp.Select], sp.MaxLeads, sp.MaxLags)
}

// values returns the results-file values of a DOLS result whose first
// nk terms are the long-run ones (the rest, the leads and lags, go under
// dynamics), with the bandwidth of a HAC covariance.
func (s *dolsSpec) values(st dolsSettings, r *longrun.DOLSResult, nk int, walds []waldResult, seNote string, sd *engine.Data) map[string]any {
	terms, coefs := r.Names[:nk], r.Table[:nk]
	var dyn []map[string]any
	if len(r.Names) > nk {
		dyn = engine.CoefValues(r.Names[nk:], r.Table[nk:])
	}
	sel := "fixed"
	if st.spec.Select == longrun.AIC {
		sel = "aic"
	} else if st.spec.Select == longrun.BIC {
		sel = "bic"
	}
	vals := map[string]any{
		"coef": engine.CoefValues(terms, coefs), "nobs": r.Fit.N, "wald": waldValues(walds), "leads": r.Leads, "lags": r.Lags,
		"r2": r.Fit.R2(), "cov": st.spec.Cov.String(), "se_desc": seNote, "select": sel, "det": st.spec.Det.String(),
		"y": s.Y, "x": append([]string(nil), s.X...), "dynamics": dyn,
		"sample": engine.SampleValues(sd),
	}
	if st.spec.Cov.Kind == ols.HAC {
		// b = L + 1 is the Bartlett bandwidth with the weights of L HAC
		// lags, the same scale as fmols's bandwidth.
		vals["bandwidth"] = st.spec.Cov.Lags + 1
		vals["hac_lags"] = st.spec.Cov.Lags
		vals["kernel"] = "bartlett"
	}
	return vals
}

// kernelBandwidth reads the kernel: and bandwidth: keys fmols and ccr
// share; bandwidth 0 means automatic (Andrews 1991).
func kernelBandwidth(c *engine.Context, kernel, bandwidth string) (longrun.Kernel, float64, error) {
	var k longrun.Kernel
	switch strings.ToLower(kernel) {
	case "", "bartlett":
		k = longrun.Bartlett
	case "qs", "quadratic-spectral":
		k = longrun.QuadraticSpectral
	default:
		return k, 0, c.Errorf("kernel", "kernel: write bartlett or qs (quadratic spectral)")
	}
	switch b := strings.ToLower(strings.TrimSpace(bandwidth)); b {
	case "", "auto":
	default:
		v, err := strconv.ParseFloat(b, 64)
		if err != nil || !(v > 0) || math.IsInf(v, 0) {
			return k, 0, c.Errorf("bandwidth", "bandwidth: write auto (Andrews 1991) or a positive number")
		}
		return k, v, nil
	}
	return k, 0, nil
}

// relationError places an estimation error of fmols or ccr: too few
// observations at sample: (or the fence), a constant regressor at its
// item of x:, anything else at x:.
func relationError(c *engine.Context, method, y string, x []string, err error) error {
	var short *longrun.ShortSampleError
	var flat *longrun.ConstantRegressorError
	switch {
	case errors.As(err, &short):
		key := ""
		if c.Has("sample") {
			key = "sample"
		}
		return c.Errorf(key, "%s of %s on %s: %v", method, y, strings.Join(x, ", "), short)
	case errors.As(err, &flat):
		return c.ItemErrorf("x", flat.Index, "%s of %s on %s: %v", method, y, strings.Join(x, ", "), flat)
	}
	msg := strings.TrimPrefix(err.Error(), strings.ToLower(method)+": ")
	return c.Errorf("x", "%s of %s on %s: %s", method, y, strings.Join(x, ", "), msg)
}

// bandwidthText says which bandwidth was used and how it was set (given
// 0 when automatic).
func bandwidthText(used, given float64) string {
	if given > 0 {
		return fmt.Sprintf("bandwidth %g as given", given)
	}
	return fmt.Sprintf("bandwidth %.2f chosen by Andrews' (1991) AR(1) rule", used)
}

// kernelName is the kernel as the notes write it.
func kernelName(k longrun.Kernel) string {
	return map[longrun.Kernel]string{longrun.Bartlett: "Bartlett", longrun.QuadraticSpectral: "quadratic-spectral"}[k]
}

// longRunRows shows the long-run coefficients first, then the
// deterministic terms (terms holds the deterministic terms first).
func longRunRows(c *engine.Context, terms []string, coefs []ols.Coef, nd, dec int) []table.Row {
	rows := engine.CoefRows(c, terms[nd:], coefs[nd:], dec, false)
	if nd > 0 {
		det := engine.CoefRows(c, terms[:nd], coefs[:nd], dec, false)
		det[0].RuleAbove = true
		rows = append(rows, det...)
	}
	return rows
}

// A Wald restriction as written: one or more linear equations in the
// long-run coefficients, joined by ";" for a joint test, e.g.
// "log(fuel) = 1" or "x1 - x2 = 0; x3 = 0", in the grammar of
// analysis/restrict.
type restriction struct {
	Text string
	R    [][]float64
	r    []float64
	line int
}

func parseRestrictions(c *engine.Context, list []string, terms []string) ([]restriction, error) {
	var out []restriction
	for i, s := range list {
		line := c.ItemLine("restrict", i)
		lin, err := engine.ParseRestriction(s, terms, restrict.Options{})
		if err != nil {
			return nil, &manuscript.PosError{File: c.File(), Line: line, Msg: fmt.Sprintf("restriction %q: %v", s, err)}
		}
		out = append(out, restriction{Text: s, R: lin.R, r: lin.Rhs, line: line})
	}
	return out, nil
}

// waldResult is one Wald test computed.
type waldResult struct {
	Text string
	W    longrun.WaldTest
}

func runWald(c *engine.Context, rs []restriction, lr longrun.Coefs) ([]waldResult, error) {
	var out []waldResult
	for _, r := range rs {
		R := mat.NewDense(len(r.R), len(lr.Coef), nil)
		for i, row := range r.R {
			R.SetRow(i, row)
		}
		w, err := longrun.Wald(lr, R, r.r)
		if err != nil {
			return nil, &manuscript.PosError{File: c.File(), Line: r.line, Msg: fmt.Sprintf("restriction %q: %v", r.Text, err)}
		}
		out = append(out, waldResult{Text: r.Text, W: w})
	}
	return out, nil
}

func waldRows(ws []waldResult, dec int) []table.Row {
	var rows []table.Row
	for i, w := range ws {
		rows = append(rows, engine.TestRows(fmt.Sprintf("Wald: %s, χ²(%d)", w.Text, w.W.DF), w.W.Stat, w.W.PValue, dec, i == 0)...)
	}
	return rows
}

func waldValues(ws []waldResult) []map[string]any {
	out := []map[string]any{}
	for _, w := range ws {
		out = append(out, map[string]any{"name": w.Text, "stat": w.W.Stat, "df": w.W.DF, "pvalue": w.W.PValue})
	}
	return out
}

func waldNote(ws []waldResult) string {
	if len(ws) == 0 {
		return ""
	}
	return "Wald tests of the restrictions shown on the long-run coefficients (statistic, with its p-value beneath), using the covariance of the standard errors above; asymptotically χ² with one degree of freedom per equation."
}
