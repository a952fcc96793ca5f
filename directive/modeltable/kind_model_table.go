package modeltable

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
)

// model-table: several estimated models side by side, one column each.
type modelTableSpec struct {
	engine.Common `yaml:",inline"`
	Models        []string `yaml:"models"`
	Terms         []string `yaml:"terms"`
	Labels        []string `yaml:"labels"`
	Stats         []string `yaml:"stats"`
	Decimals      *int     `yaml:"decimals"`
}

// modelKinds are the kinds whose results a model table can show.
var modelKinds = []string{"ols", "ecm", "dols", "fmols"}

// modelStats are the lower-block rows a model table can show, with their
// labels; each is a top-level number in the models' values.
var modelStats = []struct{ key, label string }{
	{"nobs", "N"}, {"r2", "R²"}, {"r2_adj", "Adjusted R²"}, {"sigma", "Residual standard error"},
	{"loglik", "Log-likelihood"}, {"dw", "Durbin–Watson"}, {"alpha", "Adjustment coefficient α"},
	{"halflife", "Half-life"}, {"leads", "Leads of Δx"}, {"lags", "Lags of Δx"}, {"bandwidth", "Bandwidth"},
}

// modelDiagnostics are the residual diagnostics (of ecm results) a model
// table can show in its lower block: the p-value of each test (for
// Durbin–Watson, which ols results carry at the top level, the statistic).
var modelDiagnostics = []string{"bg", "lb", "jb", "arch", "bp", "reset"}

var modelMethod = map[string]string{"ols": "OLS", "ecm": "ECM", "dols": "DOLS", "fmols": "FMOLS"}

func init() {
	engine.Register(engine.Kind{
		Name:    "model-table",
		Summary: "several ols, ecm, dols or fmols results side by side",
		New:     func() engine.Directive { return &modelTableSpec{} },
		Fields:  []string{"models", "terms", "stats"},
	})
}

func (s *modelTableSpec) stats() []string {
	if len(s.Stats) == 0 {
		return []string{"nobs", "r2"}
	}
	return s.Stats
}

func (s *modelTableSpec) Check(c *engine.Context) error {
	if len(s.Models) == 0 {
		return c.Errorf("", "galley model-table: the key \"models\" is required: a list of ids of %s results", strings.Join(modelKinds, ", "))
	}
	seen := map[string]bool{}
	for _, id := range s.Models {
		if err := c.CheckRef("models", id, modelKinds...); err != nil {
			return err
		}
		if seen[id] {
			return c.Errorf("models", "%q is listed twice", id)
		}
		seen[id] = true
	}
	if len(s.Labels) > 0 && len(s.Labels) != len(s.Models) {
		return c.Errorf("labels", "%d labels for %d models; give one label per model", len(s.Labels), len(s.Models))
	}
	var keys []string
	for _, st := range modelStats {
		keys = append(keys, st.key)
	}
	keys = append(keys, modelDiagnostics...)
	for _, st := range s.stats() {
		if !slices.Contains(keys, st) {
			return c.Errorf("stats", "unknown statistic %q%s; valid: %s", st, manuscript.DidYouMean(st, keys), strings.Join(keys, ", "))
		}
	}
	return nil
}

// modelCoef is one coefficient of a model, from its values.
type modelCoef struct{ est, se, p float64 }

func modelCoefs(r *engine.Result) (map[string]modelCoef, []string) {
	m := map[string]modelCoef{}
	var order []string
	list, _ := r.Values["coef"].([]map[string]any)
	for _, e := range list {
		name, _ := e["term"].(string)
		est, _ := e["est"].(float64)
		se, _ := e["se"].(float64)
		p, ok := e["p"].(float64)
		if !ok {
			p = math.NaN()
		}
		m[name] = modelCoef{est, se, p}
		order = append(order, name)
	}
	return m, order
}

func (s *modelTableSpec) Run(c *engine.Context) (*engine.Result, error) {
	res := make([]*engine.Result, len(s.Models))
	coefs := make([]map[string]modelCoef, len(s.Models))
	var union []string
	for i, id := range s.Models {
		r, err := c.Result("models", id, modelKinds...)
		if err != nil {
			return nil, err
		}
		res[i] = r
		var order []string
		coefs[i], order = modelCoefs(r)
		for _, t := range order {
			if !slices.Contains(union, t) {
				union = append(union, t)
			}
		}
	}
	terms := union
	if len(s.Terms) > 0 {
		for _, t := range s.Terms {
			if !slices.Contains(union, t) {
				return nil, c.Errorf("terms", "no model in the table has the term %q%s; terms: %s", t, manuscript.DidYouMean(t, union), strings.Join(union, ", "))
			}
		}
		terms = s.Terms
	}
	dec := engine.DecimalsOr(c, s.Decimals)
	n := len(s.Models)
	head1 := []table.Cell{table.T("")}
	head2 := []table.Cell{table.T("")}
	head3 := []table.Cell{table.T("Dependent variable")}
	for i, r := range res {
		head1 = append(head1, table.T(fmt.Sprintf("(%d)", i+1)))
		label := modelMethod[r.Kind]
		if len(s.Labels) > 0 {
			label = s.Labels[i]
		}
		head2 = append(head2, table.T(label))
		head3 = append(head3, table.T(modelDep(r)))
	}
	t := &table.Table{Stub: 1, Head: [][]table.Cell{head1, head2, head3}}
	for _, term := range terms {
		est := []table.Cell{table.T(term)}
		se := []table.Cell{table.Empty}
		for i := range res {
			cf, ok := coefs[i][term]
			if !ok {
				est, se = append(est, table.Empty), append(se, table.Empty)
				continue
			}
			est = append(est, table.Starred(cf.est, dec, starsOrZero(c, cf.p)))
			se = append(se, table.SECell(cf.se, dec))
		}
		t.Body = append(t.Body, table.Row{Cells: est}, table.Row{Cells: se})
	}
	statVals := map[string]any{}
	for j, st := range s.stats() {
		label := st
		for _, ms := range modelStats {
			if ms.key == st {
				label = ms.label
			}
		}
		if slices.Contains(modelDiagnostics, st) {
			label = diagnosticLabel(res, st) + ", p-value"
		}
		row := table.Row{Cells: []table.Cell{table.T(label)}, RuleAbove: j == 0}
		vs := make([]any, n)
		for i, r := range res {
			v, ok := r.Values[st]
			if !ok {
				v, ok = diagnosticValue(r, st)
			}
			vs[i] = v
			switch x := v.(type) {
			case int:
				row.Cells = append(row.Cells, table.I(x))
			case float64:
				if ok && st == "bandwidth" && x != math.Trunc(x) {
					row.Cells = append(row.Cells, table.N(x, 2))
				} else if st == "bandwidth" || st == "leads" || st == "lags" {
					row.Cells = append(row.Cells, table.I(int(x)))
				} else {
					row.Cells = append(row.Cells, table.N(x, dec))
				}
			default:
				row.Cells = append(row.Cells, table.Empty)
			}
		}
		statVals[st] = vs
		t.Body = append(t.Body, row)
	}
	t.Notes = modelNotes(c, res)
	vals := map[string]any{"models": append([]string(nil), s.Models...), "terms": append([]string(nil), terms...), "stats": statVals}
	return &engine.Result{Table: t, Values: vals}, nil
}

func starsOrZero(c *engine.Context, p float64) int {
	if math.IsNaN(p) {
		return 0
	}
	return c.StarsFor(p)
}

// modelDep is the dependent variable of a model.
func modelDep(r *engine.Result) string {
	if y, ok := r.Values["y"].(string); ok {
		return y
	}
	if y, ok := r.Spec["y"].(string); ok {
		return y
	}
	return ""
}

// modelSE describes a model's standard errors.
func modelSE(r *engine.Result) string {
	if s, ok := r.Values["se_desc"].(string); ok {
		return s
	}
	if s, ok := r.Values["cov"].(string); ok {
		if cv, err := ols.ParseCov(s); err == nil {
			return cv.Describe()
		}
	}
	return "standard errors as in the model's own table"
}

func modelSample(r *engine.Result) string {
	m, ok := r.Values["sample"].(map[string]any)
	if !ok {
		return "sample as in the model's own table"
	}
	return fmt.Sprintf("%v–%v, N = %v", m["from"], m["to"], m["n"])
}

// allSame reports whether every string is the same, returning it.
func allSame(s []string) (string, bool) {
	for _, x := range s[1:] {
		if x != s[0] {
			return "", false
		}
	}
	return s[0], true
}

func modelNotes(c *engine.Context, res []*engine.Result) []string {
	var ses, samples []string
	for _, r := range res {
		ses = append(ses, modelSE(r))
		samples = append(samples, modelSample(r))
	}
	list := func(s []string) string {
		parts := make([]string, len(s))
		for i, x := range s {
			parts[i] = fmt.Sprintf("(%d) %s", i+1, x)
		}
		return strings.Join(parts, "; ")
	}
	var b strings.Builder
	b.WriteString("Standard errors in parentheses: ")
	if s, ok := allSame(ses); ok {
		b.WriteString(s + " in every column.")
	} else {
		b.WriteString(list(ses) + ".")
	}
	normal := false
	student := false
	for _, r := range res {
		if r.Kind == "ols" {
			student = true
		} else {
			normal = true
		}
	}
	switch {
	case normal && student:
		b.WriteString(" Stars from Student's t for OLS columns and from the standard normal for the others.")
	case normal:
		b.WriteString(" Stars from the standard normal distribution.")
	default:
		b.WriteString(" Stars from Student's t distribution.")
	}
	notes := []string{b.String()}
	s := "Samples: " + list(samples) + "."
	if one, ok := allSame(samples); ok {
		s = "Sample " + one + " in every column."
	}
	notes = append(notes, c.StarNote()+" "+s)
	if dols := slices.ContainsFunc(res, func(r *engine.Result) bool { return r.Kind == "dols" }); dols {
		notes = append(notes, "DOLS columns omit the coefficients of the leads and lags of the differenced regressors.")
	}
	return notes
}

// diagnosticValue reads a residual diagnostic from a result's values: the
// p-value, or for Durbin–Watson the statistic.
func diagnosticValue(r *engine.Result, name string) (any, bool) {
	ds, _ := r.Values["diagnostics"].(map[string]any)
	d, _ := ds[name].(map[string]any)
	if d == nil {
		return nil, false
	}
	key := "pvalue"
	if name == "dw" {
		key = "stat"
	}
	v, ok := d[key]
	return v, ok
}

// diagnosticLabel is the name of a diagnostic as the first model that
// has it labels it (e.g. "Breusch–Godfrey LM(12)").
func diagnosticLabel(res []*engine.Result, name string) string {
	for _, r := range res {
		ds, _ := r.Values["diagnostics"].(map[string]any)
		if d, _ := ds[name].(map[string]any); d != nil {
			if l, _ := d["test"].(string); l != "" {
				return l
			}
		}
	}
	return name
}
