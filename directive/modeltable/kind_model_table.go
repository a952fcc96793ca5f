package modeltable

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
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

// modelStats are the lower-block rows a model table can show, with their
// labels; each is a key of contract.Model.Stats.
var modelStats = []struct{ key, label string }{
	{"nobs", "N"}, {"r2", "R²"}, {"r2_adj", "Adjusted R²"}, {"sigma", "Residual standard error"},
	{"loglik", "Log-likelihood"}, {"dw", "Durbin–Watson"}, {"alpha", "Adjustment coefficient α"},
	{"halflife", "Half-life"}, {"leads", "Leads of Δx"}, {"lags", "Lags of Δx"}, {"hac_lags", "HAC lags"}, {"bandwidth", "Bandwidth"},
}

// modelDiagnostics are the residual diagnostics (contract.Model's
// Diagnostics) a model table can show in its lower block, by the p-value
// of each test.
var modelDiagnostics = []string{"bg", "lb", "jb", "arch", "bp", "reset"}

func init() {
	engine.Register(engine.Kind{
		Name:    "model-table",
		Summary: "several estimated equations (ols, ecm, dols, fmols, …) side by side",
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
		return c.Errorf("", "galley model-table: the key \"models\" is required: a list of ids of estimated equations (ols, ecm, dols, fmols, …)")
	}
	seen := map[string]bool{}
	for _, id := range s.Models {
		if err := c.CheckRefWhere("models", id, func(k *engine.Kind) bool { return k.Model }); err != nil {
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

func (s *modelTableSpec) Run(c *engine.Context) (*engine.Result, error) {
	models := make([]*contract.Model, len(s.Models))
	var union []string
	for i, id := range s.Models {
		r, err := c.Result("models", id)
		if err != nil {
			return nil, err
		}
		if r.Model == nil {
			return nil, c.ItemErrorf("models", i, "%q is a %s result (line %d), which is not an estimated equation a model table can show", id, r.Kind, r.Line)
		}
		models[i] = r.Model
		for _, cf := range r.Model.Coefs {
			if !slices.Contains(union, cf.Term) {
				union = append(union, cf.Term)
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
	t := &table.Table{Stub: 1, Head: s.head(models)}
	t.Body = coefRows(c, models, terms, dec)
	stats, statVals := s.statRows(models, dec)
	t.Body = append(t.Body, stats...)
	t.Notes = modelNotes(c, models)
	vals := map[string]any{"models": append([]string(nil), s.Models...), "terms": append([]string(nil), terms...), "stats": statVals}
	return &engine.Result{Table: t, Values: vals}, nil
}

// head is the column numbers, the methods (or the author's labels) and
// the dependent variables.
func (s *modelTableSpec) head(models []*contract.Model) [][]table.Cell {
	head1 := []table.Cell{table.T("")}
	head2 := []table.Cell{table.T("")}
	head3 := []table.Cell{table.T("Dependent variable")}
	for i, m := range models {
		head1 = append(head1, table.T(fmt.Sprintf("(%d)", i+1)))
		label := m.Method
		if len(s.Labels) > 0 {
			label = s.Labels[i]
		}
		head2 = append(head2, table.T(label))
		head3 = append(head3, engine.TermCell(m.Dependent))
	}
	return [][]table.Cell{head1, head2, head3}
}

// coefRows are each term's estimates with stars and, beneath, their
// standard errors, empty where a model lacks the term.
func coefRows(c *engine.Context, models []*contract.Model, terms []string, dec int) []table.Row {
	var rows []table.Row
	for _, term := range terms {
		est := []table.Cell{c.TermCell(term)}
		se := []table.Cell{table.Empty}
		for _, m := range models {
			cf, ok := m.Coef(term)
			if !ok {
				est, se = append(est, table.Empty), append(se, table.Empty)
				continue
			}
			est = append(est, table.Starred(cf.Est, dec, starsOrZero(c, cf.P)))
			se = append(se, table.SECell(cf.SE, dec))
		}
		rows = append(rows, table.Row{Cells: est}, table.Row{Cells: se})
	}
	return rows
}

// statRows is the lower block: one row per statistic asked for, and the
// values shown, by statistic (nil where a model lacks it).
func (s *modelTableSpec) statRows(models []*contract.Model, dec int) ([]table.Row, map[string]any) {
	var rows []table.Row
	statVals := map[string]any{}
	for j, st := range s.stats() {
		label := st
		for _, ms := range modelStats {
			if ms.key == st {
				label = ms.label
			}
		}
		diag := slices.Contains(modelDiagnostics, st)
		if diag {
			label = diagnosticLabel(models, st) + ", p-value"
		}
		row := table.Row{Cells: []table.Cell{table.T(label)}, RuleAbove: j == 0}
		vs := make([]any, len(models))
		for i, m := range models {
			x, ok := m.Stats[st]
			if diag {
				var d contract.Diagnostic
				d, ok = m.Diagnostics[st]
				x = d.P
			}
			switch {
			case !ok:
				row.Cells = append(row.Cells, table.Empty)
				continue
			case st == "nobs" || st == "leads" || st == "lags" || st == "hac_lags" || (st == "bandwidth" && x == math.Trunc(x)):
				row.Cells = append(row.Cells, table.I(int(x)))
			case st == "bandwidth":
				row.Cells = append(row.Cells, table.N(x, 2))
			default:
				row.Cells = append(row.Cells, table.N(x, dec))
			}
			vs[i] = x
		}
		statVals[st] = vs
		rows = append(rows, row)
	}
	return rows, statVals
}

func starsOrZero(c *engine.Context, p float64) int {
	if math.IsNaN(p) {
		return 0
	}
	return c.StarsFor(p)
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

func modelNotes(c *engine.Context, models []*contract.Model) []string {
	var ses, samples, omitted []string
	normal, student := false, false
	for _, m := range models {
		ses = append(ses, m.SE)
		samples = append(samples, m.Sample)
		if o := m.Method + " columns omit " + m.Omitted + "."; m.Omitted != "" && !slices.Contains(omitted, o) {
			omitted = append(omitted, o)
		}
		if m.Normal {
			normal = true
		} else {
			student = true
		}
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
	return append(notes, omitted...)
}

// diagnosticLabel is the name of a diagnostic as the first model that
// has it labels it (e.g. "Breusch–Godfrey LM(12)").
func diagnosticLabel(models []*contract.Model, name string) string {
	for _, m := range models {
		if d, ok := m.Diagnostics[name]; ok && d.Label != "" {
			return d.Label
		}
	}
	return name
}
