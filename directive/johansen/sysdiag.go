package johansen

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/sysdiag"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
)

// The vecm directive's `diagnostics:` key: system residual diagnostics of
// the estimated VECM, in the lower block of its table (analysis/sysdiag
// computes them). The list is written as for the single-equation
// diagnostics of ecm and ols (`bg(4)`, `jb`, `arch(2)`), with the system
// tests' names: bg, jb, dh, arch.

// sysDiagItem is one entry of the list: a test and, for bg and arch, its
// order (0: sysdiag.DefaultOrder).
type sysDiagItem struct {
	Name  string
	Order int
}

// sysDiagNames are the system diagnostics in table order, with whether
// they take an order.
var sysDiagNames = []struct {
	name    string
	ordered bool
}{{"bg", true}, {"jb", false}, {"dh", false}, {"arch", true}}

// singleOnly are the single-equation diagnostics with no system form here.
var singleOnly = []string{"lb", "bp", "reset", "dw"}

// parseSysDiag reads the diagnostics: list of a vecm (none when the key is
// left out).
func parseSysDiag(c *engine.Context, list []string) ([]sysDiagItem, error) {
	var names []string
	for _, k := range sysDiagNames {
		names = append(names, k.name)
	}
	seen := map[string]bool{}
	var out []sysDiagItem
	for _, s := range list {
		t := strings.ToLower(strings.ReplaceAll(s, " ", ""))
		name, arg, hasArg := strings.Cut(t, "(")
		ordered, known := false, false
		for _, k := range sysDiagNames {
			if k.name == name {
				ordered, known = k.ordered, true
			}
		}
		for _, k := range singleOnly {
			if k == name {
				return nil, c.Errorf("diagnostics", "diagnostic %q is a single-equation test (ecm, ols); a vecm takes the system tests %s", s, strings.Join(names, ", "))
			}
		}
		if !known {
			return nil, c.Errorf("diagnostics", "unknown diagnostic %q%s; write one of %s, with an order where it takes one, e.g. bg(4)", s, manuscript.DidYouMean(name, names), strings.Join(names, ", "))
		}
		it := sysDiagItem{Name: name}
		if hasArg {
			if !ordered {
				return nil, c.Errorf("diagnostics", "diagnostic %q takes no order", s)
			}
			n, err := strconv.Atoi(strings.TrimSuffix(arg, ")"))
			if err != nil || !strings.HasSuffix(arg, ")") || n < 1 {
				return nil, c.Errorf("diagnostics", "diagnostic %q: the order must be a whole number of 1 or more, e.g. %s(4)", s, name)
			}
			it.Order = n
		}
		if seen[name] {
			return nil, c.Errorf("diagnostics", "diagnostic %q is listed twice", name)
		}
		seen[name] = true
		out = append(out, it)
	}
	return out, nil
}

// sysDiagTest is one computed row: a label, the test, and its name, order
// and further values in the results.
type sysDiagTest struct {
	key, label string
	order      int
	t          sysdiag.Test
	extra      map[string]any
}

// runSysDiag computes the listed diagnostics on the residuals of the
// system's VECM.
func runSysDiag(st *sysState, items []sysDiagItem) ([]sysDiagTest, error) {
	u := st.vecm.Resid
	var out []sysDiagTest
	for _, it := range items {
		h := it.Order
		if h == 0 {
			h = sysdiag.DefaultOrder
		}
		switch it.Name {
		case "bg":
			x, err := sysdiag.VECMRegressors(st.y, st.res.Case, st.vecm, st.ex.x)
			if err != nil {
				return nil, err
			}
			s, err := sysdiag.SerialLM(u, x, h)
			if err != nil {
				return nil, err
			}
			out = append(out,
				sysDiagTest{key: "bg", label: fmt.Sprintf("System Breusch–Godfrey LM(%d)", h), order: h, t: s.LM},
				sysDiagTest{key: "bg_f", label: fmt.Sprintf("Edgerton–Shukur F(%d)", h), order: h, t: s.F})
		case "jb":
			n, err := sysdiag.JarqueBera(u)
			if err != nil {
				return nil, err
			}
			out = append(out,
				sysDiagTest{key: "jb_skew", label: "System Jarque–Bera, skewness", t: n.Skew},
				sysDiagTest{key: "jb_kurt", label: "System Jarque–Bera, kurtosis", t: n.Kurt},
				sysDiagTest{key: "jb", label: "System Jarque–Bera, joint", t: n.Joint})
		case "dh":
			o, err := sysdiag.DoornikHansen(u)
			if err != nil {
				return nil, err
			}
			out = append(out, sysDiagTest{key: "dh", label: "Doornik–Hansen", t: o.Test,
				extra: map[string]any{"z1": o.Z1, "z2": o.Z2}})
		case "arch":
			a, err := sysdiag.ARCH(u, h)
			if err != nil {
				return nil, err
			}
			out = append(out, sysDiagTest{key: "arch", label: fmt.Sprintf("System ARCH-LM(%d)", h), order: h, t: a})
		}
	}
	return out, nil
}

// sysDiagRows lays the tests out as the vecm table's likelihood-ratio rows
// are: the statistic with its degrees of freedom in brackets, then its
// p-value, padded to the table's width.
func sysDiagRows(ds []sysDiagTest, cols, dec int) []table.Row {
	var rows []table.Row
	for i, d := range ds {
		stat := table.N(d.t.Stat, dec)
		stat.Suffix = fmt.Sprintf(" [%d]", d.t.DF)
		if d.t.DF2 > 0 {
			stat.Suffix = fmt.Sprintf(" [%d, %s]", d.t.DF, strconv.FormatFloat(d.t.DF2, 'f', 1, 64))
		}
		row := []table.Cell{table.T(d.label), stat, table.N(d.t.P, dec)}
		for len(row) < cols {
			row = append(row, table.Empty)
		}
		rows = append(rows, table.Row{Cells: row, RuleAbove: i == 0})
	}
	return rows
}

// sysDiagValues is the results-file form: name → {test, stat, df, df2,
// pvalue, order}, as the single-equation diagnostics.
func sysDiagValues(ds []sysDiagTest) map[string]any {
	m := map[string]any{}
	for _, d := range ds {
		v := map[string]any{"test": d.label, "stat": d.t.Stat, "df": d.t.DF, "pvalue": d.t.P}
		if d.t.DF2 > 0 {
			v["df2"] = d.t.DF2
		}
		if d.order > 0 {
			v["order"] = d.order
		}
		for k, x := range d.extra {
			v[k] = x
		}
		m[d.key] = v
	}
	return m
}

// sysDiagNote explains each test in the block, with its reference.
func sysDiagNote(ds []sysDiagTest, k int) string {
	parts := []string{}
	for _, d := range ds {
		switch d.key {
		case "bg":
			parts = append(parts, fmt.Sprintf("the Breusch–Godfrey LM test of autocorrelation up to order %d, from the regression of the residuals on the model's regressors given β̂ and on their own lags 1–%d, pre-sample residuals set to zero (Lütkepohl 2005, §4.4.4 and §8.4), χ²(%d)", d.order, d.order, d.t.DF))
		case "bg_f":
			parts = append(parts, "its F form, Rao's approximation for systems (Edgerton and Shukur 1999), which keeps closer to its nominal size than the χ² form when the system is large relative to T")
		case "jb":
			parts = append(parts, fmt.Sprintf("the system Jarque–Bera tests of the skewness and kurtosis of the residuals standardised by the Cholesky factor of their covariance, χ²(%d) each and χ²(%d) jointly (Lütkepohl 2005, §4.5; the outcome depends on the order of the series)", k, 2*k))
		case "dh":
			parts = append(parts, fmt.Sprintf("the Doornik–Hansen omnibus test of normality, on residuals orthogonalised by their correlation matrix so that the order of the series does not matter, with transformed skewness and kurtosis, χ²(%d) (Doornik and Hansen 2008)", 2*k))
		case "arch":
			parts = append(parts, fmt.Sprintf("the multivariate ARCH-LM test, from the regression of the squares and cross-products of the residuals on a constant and %s of themselves (Lütkepohl 2005, ch. 16), χ²(%d)", lagWord(d.order), d.t.DF))
		}
	}
	return "System residual diagnostics of the VECM residuals ε̂ₜ (each row: the statistic with its degrees of freedom in brackets, then its p-value): " + strings.Join(parts, "; ") + "."
}

// addSysDiag computes the vecm's diagnostics and adds their rows, note and
// values to its table and values; it returns the keys of the works its
// note cites. An error names the diagnostics key.
func (s *vecmSpec) addSysDiag(c *engine.Context, st *sysState, t *table.Table, vals map[string]any, dec int) ([]string, error) {
	items, err := parseSysDiag(c, s.Diagnostics)
	if err != nil || len(items) == 0 {
		return nil, err
	}
	ds, err := runSysDiag(st, items)
	if err != nil {
		return nil, c.Errorf("diagnostics", "%d observations of %d series: %s", st.res.T, st.res.K, strings.TrimPrefix(err.Error(), "sysdiag: "))
	}
	cols := 0
	for _, r := range t.Body {
		cols = max(cols, len(r.Cells))
	}
	for _, h := range t.Head {
		w := 0
		for _, cell := range h {
			w += max(cell.Span, 1)
		}
		cols = max(cols, w)
	}
	t.Body = append(t.Body, sysDiagRows(ds, cols, dec)...)
	t.Notes = append(t.Notes, sysDiagNote(ds, st.res.K))
	vals["diagnostics"] = sysDiagValues(ds)
	return sysDiagCites(ds), nil
}

// sysDiagCites are the works sysDiagNote cites, in the method reference
// table's keys.
func sysDiagCites(ds []sysDiagTest) []string {
	var out []string
	add := func(k string) {
		if !slices.Contains(out, k) {
			out = append(out, k)
		}
	}
	for _, d := range ds {
		switch d.key {
		case "bg", "jb_skew", "jb_kurt", "jb", "arch":
			add("lutkepohl-2005")
		case "bg_f":
			add("edgerton-shukur-1999")
		case "dh":
			add("doornik-hansen-2008")
		}
	}
	return out
}

// lagWord is "1 lag" or "n lags".
func lagWord(n int) string {
	if n == 1 {
		return "1 lag"
	}
	return fmt.Sprintf("%d lags", n)
}
