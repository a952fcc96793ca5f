package grid

import (
	"cmp"
	"math"
	"slices"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/manuscript"
)

// gridShow says which value each cell shows.
type gridShow struct {
	path  string // as written, or the default
	coef  bool   // a coefficient: estimate over its standard error
	term  string // the coefficient's term
	field string // a single field of the coefficient (est, se, t, p); "" = both
	parts []string
	test  bool // the test statistic: stars by the test's own rule
}

// gridShown is one cell's shown value.
type gridShown struct {
	missing bool // the term is not in this cell's regression
	est, se float64
	hasSE   bool
	isInt   bool // an integer value such as a lag count
	stars   int
	byTest  bool   // stars by a test's own rule or critical values (not by a coefficient's p-value)
	testRef string // e.g. "ADF"
}

var coefFields = []string{"est", "se", "t", "p"}

// resolveShow turns show: (or the kind's default) into a gridShow.
func (s *gridSpec) resolveShow(c *engine.Context, results []*engine.Result) (gridShow, error) {
	path := s.Show
	if path == "" {
		_, hasStat := results[0].Values["stat"]
		switch {
		case hasStat:
			path = "stat"
		case results[0].Values["coef"] != nil:
			term := firstTerm(results[0].Values["coef"])
			if term == "" {
				return gridShow{}, c.Errorf("", "a grid of %s needs show: to say which coefficient to tabulate, e.g. show: coef.TERM", s.kind.Name)
			}
			path = "coef." + term
		default:
			return gridShow{}, c.Errorf("", "a grid of %s needs show: to say which value to tabulate; values: %s", s.kind.Name, strings.Join(engine.Keys(results[0].Values), ", "))
		}
	}
	sh := gridShow{path: path}
	if rest, ok := strings.CutPrefix(path, "coef."); ok && rest != "" {
		sh.coef, sh.term = true, rest
		for _, f := range coefFields {
			if t, ok := strings.CutSuffix(rest, "."+f); ok && t != "" && !anyHasTerm(results, rest) {
				sh.term, sh.field = t, f
			}
		}
		if !anyHasTerm(results, sh.term) {
			terms := allTerms(results)
			key := "show"
			if s.Show == "" {
				key = ""
			}
			return sh, c.Errorf(key, "show: no cell has the term %q%s; terms: %s", sh.term, termHint(sh.term, terms), strings.Join(terms, ", "))
		}
		return sh, nil
	}
	sh.parts = strings.Split(path, ".")
	sh.test = path == "stat"
	return sh, nil
}

// firstTerm returns the first term of a coefficient list other than the
// constant (the constant when it is the only one; "" for an empty list).
func firstTerm(v any) string {
	list, _ := v.([]map[string]any)
	for _, e := range list {
		if t, _ := e["term"].(string); t != "" && t != "const" {
			return t
		}
	}
	if len(list) > 0 {
		t, _ := list[0]["term"].(string)
		return t
	}
	return ""
}

// termOf returns the entry of a coefficient list for term, and whether
// there is one.
func termOf(v any, term string) (map[string]any, bool) {
	list, _ := v.([]map[string]any)
	for _, e := range list {
		if t, _ := e["term"].(string); t == term {
			return e, true
		}
	}
	return nil, false
}

// anyHasTerm returns whether any cell's coefficients include term.
func anyHasTerm(results []*engine.Result, term string) bool {
	for _, r := range results {
		if _, ok := termOf(r.Values["coef"], term); ok {
			return true
		}
	}
	return false
}

// allTerms returns every term of the cells' coefficients, once each, in
// order of first appearance.
func allTerms(results []*engine.Result) []string {
	var out []string
	for _, r := range results {
		list, _ := r.Values["coef"].([]map[string]any)
		for _, e := range list {
			if t, _ := e["term"].(string); t != "" && !slices.Contains(out, t) {
				out = append(out, t)
			}
		}
	}
	return out
}

// pick reads the shown value of one cell, with its stars.
func (sh gridShow) pick(c *engine.Context, cell *gridCell, r *engine.Result) (gridShown, error) {
	if sh.coef {
		e, ok := termOf(r.Values["coef"], sh.term)
		if !ok {
			return gridShown{missing: true}, nil
		}
		if sh.field != "" {
			v, _ := toFloat(e[sh.field])
			return gridShown{est: v}, nil
		}
		est, _ := toFloat(e["est"])
		se, okSE := toFloat(e["se"])
		out := gridShown{est: est, se: se, hasSE: okSE}
		if p, ok := toFloat(e["p"]); ok && !math.IsNaN(p) {
			out.stars = c.StarsFor(p)
		}
		return out, nil
	}
	v, err := engine.Lookup(r.Values, sh.parts)
	if err != nil {
		return gridShown{}, cellError(c, cell, c.Errorf("show", "show: %v", err))
	}
	x, ok := toFloat(v)
	if !ok {
		return gridShown{}, c.Errorf("show", "show: %s is %v in cell %s, not a number", sh.path, v, cell.id)
	}
	out := gridShown{est: x, isInt: isInt(v)}
	if sh.test {
		out.stars = testStars(c, r)
		out.testRef, _ = r.Values["test"].(string)
		out.byTest = true
	} else if crit := critOf(r.Values, sh.parts); len(crit) >= 2 && !math.IsNaN(x) {
		lo, hi := crit[0], crit[len(crit)-1] // sorted by level
		o := &contract.Outcome{Stat: x, PValue: math.NaN(), Crit: crit, Upper: lo.Value > hi.Value}
		out.stars, out.byTest = o.Stars(c.Stars()), true
	}
	return out, nil
}

// critOf returns the critical values a result gives for the value at
// path, sorted by level: for X.stat those of X.crit (lc.stat, lc.crit);
// for X or X.i those of crit_X or crit_X.i (pu, crit_pu; trace.0,
// crit_trace.0). Nil when there are none.
func critOf(v map[string]any, path []string) []critical.Value {
	var at []string
	switch n := len(path); {
	case n == 0:
		return nil
	case n > 1 && path[n-1] == "stat":
		at = append(slices.Clone(path[:n-1]), "crit")
	default:
		at = append([]string{"crit_" + path[0]}, path[1:]...)
	}
	m, err := engine.Lookup(v, at)
	if err != nil {
		return nil
	}
	return critFromValues(m)
}

// testStars counts the star levels at which a test rejects, by the test's
// own rule: for the unit-root kinds, Outcome.stars on the cell's
// statistic and critical values; for other tests with two or more
// critical values the same rule, the tail inferred from their order (a
// lower-tail test has its 1% value below its 10% value), which uses the
// critical value at each star level it tabulates and the p-value at the
// others; with fewer, the p-value.
func testStars(c *engine.Context, r *engine.Result) int {
	if r.Test != nil {
		return r.Test.Stars(c.Stars())
	}
	v := r.Values
	stat, ok := toFloat(v["stat"])
	if !ok || math.IsNaN(stat) {
		return 0
	}
	p, hasP := toFloat(v["pvalue"])
	if !hasP {
		p = math.NaN()
	}
	crit := critFromValues(v["crit"])
	if len(crit) >= 2 {
		lo, hi := crit[0], crit[len(crit)-1] // sorted by level
		o := &contract.Outcome{Stat: stat, PValue: p, Crit: crit, Upper: lo.Value > hi.Value}
		return o.Stars(c.Stars())
	}
	if !math.IsNaN(p) {
		return c.StarsFor(p)
	}
	return 0
}

// critFromValues reads a results-file critical-value map ({"5%": -2.9})
// back into values by level.
func critFromValues(v any) []critical.Value {
	m, _ := v.(map[string]any)
	var out []critical.Value
	for k, x := range m {
		f, ok := toFloat(x)
		lev, err := strconv.ParseFloat(strings.TrimSuffix(k, "%"), 64)
		if !ok || err != nil || !strings.HasSuffix(k, "%") {
			continue
		}
		out = append(out, critical.Value{Level: lev / 100, Value: f})
	}
	slices.SortFunc(out, func(a, b critical.Value) int { return cmp.Compare(a.Level, b.Level) })
	return out
}

// toFloat reads a number from a results value.
func toFloat(v any) (float64, bool) {
	switch x := v.(type) {
	case float64:
		return x, true
	case float32:
		return float64(x), true
	case int:
		return float64(x), true
	case int64:
		return float64(x), true
	}
	return 0, false
}

// isInt returns whether a results value is an integer (a lag count, say).
func isInt(v any) bool {
	switch v.(type) {
	case int, int64:
		return true
	}
	return false
}

// termHint suggests the term meant: its new spelling when written in the
// old suffix notation, else the closest name.
func termHint(term string, names []string) string {
	if h := engine.TermHint(term); h != "" {
		return h
	}
	return manuscript.DidYouMean(term, names)
}
