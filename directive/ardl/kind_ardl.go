// Package ardl is the directive family of autoregressive distributed-lag
// models: the kind ardl, the bounds test of a level relationship and,
// with split:, the asymmetric (nonlinear) model with its symmetry tests
// and cumulative dynamic multipliers.
package ardl

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"gopkg.in/yaml.v3"

	"github.com/galley-econ/galley/analysis/ardl"
	"github.com/galley-econ/galley/analysis/ecm"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/rules"
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

// lagsKey is the lags: key: a criterion (aic, bic, hq), {select:
// CRITERION, max: N}, or the fixed orders [p, q1, …, qk].
type lagsKey struct {
	Set    bool
	Fixed  []int
	Select string
	Max    *int
	line   int
}

func (l *lagsKey) UnmarshalYAML(n *yaml.Node) error {
	l.Set, l.line = true, n.Line
	const help = "lags: write a criterion (aic, bic or hq), {select: aic, max: 4}, or the orders [p, q1, …] (p for y, then one q per entry of x)"
	switch n.Kind {
	case yaml.ScalarNode:
		if _, err := rules.ParseCriterion(n.Value); err != nil {
			return fmt.Errorf("line %d: %s", n.Line, help)
		}
		l.Select = strings.ToLower(n.Value)
		return nil
	case yaml.SequenceNode:
		if err := n.Decode(&l.Fixed); err != nil {
			return fmt.Errorf("line %d: %s", n.Line, help)
		}
		return nil
	case yaml.MappingNode:
		var m struct {
			Select string `yaml:"select"`
			Max    *int   `yaml:"max"`
		}
		for i := 0; i+1 < len(n.Content); i += 2 {
			if k := n.Content[i].Value; k != "select" && k != "max" {
				return fmt.Errorf("line %d: lags: unknown key %q (select, max)", n.Content[i].Line, k)
			}
		}
		if err := n.Decode(&m); err != nil {
			return fmt.Errorf("line %d: %s", n.Line, help)
		}
		if m.Select == "" {
			m.Select = "aic"
		}
		if _, err := rules.ParseCriterion(m.Select); err != nil {
			return fmt.Errorf("line %d: lags: %v", n.Line, err)
		}
		l.Select, l.Max = strings.ToLower(m.Select), m.Max
		return nil
	}
	return fmt.Errorf("line %d: %s", n.Line, help)
}

// DefaultMaxLag is the largest lag searched when lags: gives no max.
const DefaultMaxLag = 4

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

type settings struct {
	det     ardl.Case
	spec    ardl.Spec
	tables  string
	horizon int
	show    string
	sim     *engine.SimSettings
	dec     int
}

func (s *ardlSpec) settings(c *engine.Context) (*settings, error) {
	st := &settings{}
	if s.Y == "" {
		return nil, c.Errorf("", "galley ardl: the key \"y\" is required: the dependent variable")
	}
	if len(s.X) == 0 {
		return nil, c.Errorf("", "galley ardl: the key \"x\" is required: a list of one or more regressors")
	}
	for i, sp := range s.Split {
		if !slices.Contains(s.X, sp) {
			return nil, c.ItemErrorf("split", i, "split: %q is not one of the regressors in x (%s); write it exactly as in x", sp, strings.Join(s.X, ", "))
		}
		if slices.Index(s.Split, sp) != i {
			return nil, c.ItemErrorf("split", i, "split: %q is listed twice", sp)
		}
	}
	if s.Threshold != nil && len(s.Split) == 0 {
		return nil, c.Errorf("threshold", "threshold applies to the regressors of split; there are none")
	}
	if s.Horizon != nil {
		if len(s.Split) == 0 {
			return nil, c.Errorf("horizon", "horizon is the length of the dynamic multipliers of the regressors of split; there are none")
		}
		if *s.Horizon < 1 || *s.Horizon > 1000 {
			return nil, c.Errorf("horizon", "horizon must be 1…1000 periods, not %d", *s.Horizon)
		}
		st.horizon = *s.Horizon
	}
	det := s.Det
	if det == "" {
		det = "c"
	}
	d, err := ardl.ParseCase(det)
	if err != nil {
		return nil, c.Errorf("det", "%v", strings.TrimPrefix(err.Error(), "ardl: "))
	}
	st.det = d
	st.spec = ardl.Spec{Case: d, Crit: rules.AIC, MaxP: DefaultMaxLag, MaxQ: DefaultMaxLag}
	switch {
	case len(s.Lags.Fixed) > 0:
		if len(s.Lags.Fixed) != 1+len(s.X) {
			return nil, c.Errorf("lags", "lags: %d orders given; write %d: p for %s, then one q per entry of x", len(s.Lags.Fixed), 1+len(s.X), s.Y)
		}
		if s.Lags.Fixed[0] < 1 {
			return nil, c.Errorf("lags", "lags: the order of %s must be at least 1, not %d", s.Y, s.Lags.Fixed[0])
		}
		for _, q := range s.Lags.Fixed[1:] {
			if q < 0 {
				return nil, c.Errorf("lags", "lags: orders must be zero or more, not %d", q)
			}
		}
		st.spec.Fixed = &ardl.Orders{P: s.Lags.Fixed[0], Q: slices.Clone(s.Lags.Fixed[1:])}
	case s.Lags.Set && s.Lags.Select == "" && len(s.Lags.Fixed) == 0:
		return nil, c.Errorf("lags", "lags: give at least the order of %s", s.Y)
	case s.Lags.Select != "":
		cr, _ := rules.ParseCriterion(s.Lags.Select)
		st.spec.Crit = cr
		if s.Lags.Max != nil {
			if *s.Lags.Max < 1 {
				return nil, c.Errorf("lags", "lags: max must be at least 1, not %d", *s.Lags.Max)
			}
			st.spec.MaxP, st.spec.MaxQ = *s.Lags.Max, *s.Lags.Max
		}
	}
	switch s.Tables {
	case "", "auto", "pss", "narayan":
		st.tables = s.Tables
		if st.tables == "" {
			st.tables = "auto"
		}
	default:
		return nil, c.Errorf("tables", "tables: write auto, pss or narayan, not %q", s.Tables)
	}
	switch s.Show {
	case "", "bounds", "ecm":
		st.show = s.Show
		if st.show == "" {
			st.show = "bounds"
		}
	default:
		return nil, c.Errorf("show", "show: write bounds (the default) or ecm, not %q", s.Show)
	}
	if st.sim, err = s.SimKeys.Settings(c); err != nil {
		return nil, err
	}
	if st.sim != nil && c.Has("tables") {
		return nil, c.Errorf("tables", "tables chooses the published bounds; with crit: simulate they are simulated instead: drop tables")
	}
	st.dec = engine.DecimalsOr(c, s.Decimals)
	return st, nil
}

func (s *ardlSpec) exprs() []string {
	return append(append([]string{s.Y}, s.X...), s.Extra...)
}

func (s *ardlSpec) Check(c *engine.Context) error {
	if _, err := s.settings(c); err != nil {
		return err
	}
	return c.CheckData(c.DataAlias(s.Data), s.exprs(), s.Sample)
}

// posName and negName name the partial sums of a split regressor.
func posName(x string) string { return "pos:" + x }
func negName(x string) string { return "neg:" + x }

func (s *ardlSpec) Run(c *engine.Context) (*engine.Result, error) {
	st, err := s.settings(c)
	if err != nil {
		return nil, err
	}
	d, err := c.Data(c.DataAlias(s.Data), s.exprs(), s.Sample)
	if err != nil {
		return nil, err
	}
	nx := len(s.X)
	tau := 0.0
	if s.Threshold != nil {
		tau = *s.Threshold
	}
	in := ardl.Input{Y: d.Cols[0], YName: s.Y, Extra: d.Cols[1+nx:], ExtraNames: slices.Clone(s.Extra)}
	var pairs []ardl.Pair
	for j, x := range s.X {
		col := d.Cols[1+j]
		if i := slices.Index(s.Split, x); i >= 0 {
			pos, neg, _, _, err := ardl.PartialSums(col, tau)
			if err != nil {
				return nil, c.ItemErrorf("split", i, "split %s: %s in the sample %s", x, strings.TrimPrefix(err.Error(), "ardl: "), d.Range())
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
	m, err := ardl.Estimate(in, st.spec)
	if err != nil {
		msg := strings.TrimPrefix(err.Error(), "ardl: ")
		key := "lags"
		switch {
		case strings.Contains(msg, "collinear"):
			key = firstSet(c, "x", "extra")
		case strings.Contains(msg, "observations") || strings.Contains(msg, "beyond"):
			key = firstSet(c, "lags", "sample", "x")
		}
		if !c.Has(key) {
			key = ""
		}
		return nil, c.Errorf(key, "ARDL of %s: %s (sample %s, %d observations)", s.Y, msg, d.Range(), d.N())
	}
	b, err := s.bounds(c, st, m)
	if err != nil {
		return nil, err
	}
	sd := &engine.Data{Dates: d.Dates[m.First : m.Last+1]}
	// Symmetry tests and multipliers.
	var syms []map[string]any
	var mults []contract.Multiplier
	h := st.horizon
	if h == 0 {
		h = defaultHorizon(d.Freq)
	}
	type symRow struct {
		name        string
		long, short ardl.FTest
	}
	var symRows []symRow
	for _, p := range pairs {
		lr, sr, err := m.SymmetryTests(in.XNames, p)
		if err != nil {
			return nil, c.Errorf("split", "%v", err)
		}
		symRows = append(symRows, symRow{p.Name, lr, sr})
		syms = append(syms, map[string]any{"name": p.Name, "longrun": fValues(lr), "shortrun": fValues(sr)})
		mu, err := m.Multipliers(p, h)
		if err != nil {
			return nil, c.Errorf("horizon", "%v", err)
		}
		mults = append(mults, contract.Multiplier{Name: p.Name, Pos: mu.Pos, Neg: mu.Neg, Asym: mu.Asym, LongPos: mu.LongPos, LongNeg: mu.LongNeg})
	}

	dec := st.dec
	adj := m.Adjust
	unit := engine.PeriodUnit(d.Freq)
	t := &table.Table{Stub: 1, Head: [][]table.Cell{{table.T(""), table.T(ecm.DiffName(s.Y, 0))}}}
	var body []table.Row
	section := func(title string) {
		body = append(body, table.Row{Cells: []table.Cell{table.T(title), table.Empty}, RuleAbove: len(body) > 0})
	}
	hlRows := func() []table.Row {
		if adj.HasHalfLife {
			return []table.Row{{Cells: []table.Cell{table.T("    half-life, " + unit), table.N(adj.HalfLife, dec)}}, {Cells: []table.Cell{table.Empty, table.SECell(adj.HalfLifeSE, dec)}}}
		}
		return []table.Row{{Cells: []table.Cell{table.T("    half-life"), table.T("none: no error correction")}}}
	}
	if st.show == "ecm" {
		rows := engine.CoefRows(c, m.ECMNames, m.ECMCoef, dec, false)
		ia := slices.Index(m.ECMNames, ardl.ECTName)
		body = append(body, rows[:2*ia+2]...)
		body = append(body, hlRows()...)
		body = append(body, rows[2*ia+2:]...)
	} else {
		section("Long run")
		var lrNames []string
		var lrCoef = make([]ols.Coef, 0)
		for _, lr := range m.LongRun {
			lrNames = append(lrNames, lr.Name)
			lrCoef = append(lrCoef, lr.Coef)
		}
		body = append(body, engine.CoefRows(c, lrNames, lrCoef, dec, false)...)
		section("Adjustment")
		ia := slices.Index(m.ECMNames, ardl.ECTName)
		body = append(body, engine.CoefRows(c, []string{ardl.ECTName}, []ols.Coef{m.ECMCoef[ia]}, dec, false)...)
		body = append(body, hlRows()...)
		section("Bounds test")
		body = append(body, b.rows(dec)...)
		if len(symRows) > 0 {
			section("Symmetry (Wald F)")
			for _, r := range symRows {
				body = append(body, engine.TestRows("long run, "+r.name, r.long.Stat, r.long.PValue, dec, false)...)
				body = append(body, engine.TestRows("short run, "+r.name, r.short.Stat, r.short.PValue, dec, false)...)
			}
		}
	}
	body = append(body,
		table.Row{Cells: []table.Cell{table.T("N"), table.I(m.Fit.N)}, RuleAbove: true},
		table.Row{Cells: []table.Cell{table.T("R²"), table.N(m.Fit.R2(), dec)}},
		table.Row{Cells: []table.Cell{table.T("Adjusted R²"), table.N(m.Fit.R2Adj(), dec)}},
	)
	t.Body = body
	t.Notes = s.notes(c, st, m, b, pairs, tau, unit, sd)
	if w := engine.CondNote(m.Fit); w != "" {
		t.Notes = append(t.Notes, w)
	}

	qv := map[string]any{}
	for j, x := range s.X {
		qv[x] = m.Orders.Q[j]
	}
	vals := map[string]any{
		"coef": engine.CoefValues(m.Names, m.Coef), "ecm": engine.CoefValues(m.ECMNames, m.ECMCoef),
		"longrun": longrunValues(m), "alpha": adj.Alpha, "alpha_se": adj.SE, "halflife": nil, "halflife_se": nil,
		"error_corrects": adj.HasHalfLife, "bounds": b.values(),
		"lags": map[string]any{"p": m.Orders.P, "q": qv},
		"nobs": m.Fit.N, "r2": m.Fit.R2(), "r2_adj": m.Fit.R2Adj(), "sigma": math.Sqrt(m.Fit.Sigma2()),
		"det": st.det.String(), "case": st.det.Roman(), "y": s.Y, "x": s.X, "show": st.show,
		"sample": engine.SampleValues(sd),
	}
	if adj.HasHalfLife {
		vals["halflife"], vals["halflife_se"] = adj.HalfLife, adj.HalfLifeSE
	}
	if m.Selection != nil {
		vals["selection"] = map[string]any{"criterion": m.Selection.Crit.String(), "max": m.Selection.MaxP,
			"nobs": m.Selection.NObs, "models": m.Selection.Models, "value": m.Selection.Value}
	}
	if len(pairs) > 0 {
		vals["split"] = s.Split
		vals["threshold"] = tau
		vals["symmetry"] = syms
		vals["multipliers"] = contract.MultiplierValues(mults)
	}
	res := &engine.Result{Table: t, Values: vals, Test: b.outcome()}
	res.SetSeries("resid", contract.NewDated(d.Dates, m.ECT))
	res.Model = engine.ModelOf("ARDL", s.Y, m.Names, m.Coef, vals, false, "")
	return res, nil
}

func firstSet(c *engine.Context, keys ...string) string {
	for _, k := range keys {
		if c.Has(k) {
			return k
		}
	}
	return ""
}

func fValues(f ardl.FTest) map[string]any {
	return map[string]any{"stat": f.Stat, "df1": f.DF1, "df2": f.DF2, "pvalue": f.PValue}
}

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
		ns = append(ns, fmt.Sprintf("Restricted error-correction model of an %s; dependent variable %s. %s is the equilibrium error %s − θ'x with the long-run coefficients of the conditional model, lagged one period; least squares with conventional standard errors, the error-correction term taken as given. Deterministic terms: case %s (%s).%s", choice, ecm.DiffName(s.Y, 0), ardl.ECTName, s.Y, st.det.Roman(), st.det.Describe(), z))
	} else {
		ns = append(ns, fmt.Sprintf("Conditional error-correction form of an %s; least squares with conventional standard errors. Deterministic terms: case %s (%s).%s", choice, st.det.Roman(), st.det.Describe(), z))
		ns = append(ns, fmt.Sprintf("Long run: θ = −π_x/π_y, the coefficients of the lagged levels of the regressors over minus that of %s(-1), with delta-method standard errors; p-values from the standard normal. Adjustment: the coefficient α of %s in the restricted error-correction model (equal to π_y), with the half-life ln 0.5 / ln|1 + α| in %s.", s.Y, ardl.ECTName, unit))
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
