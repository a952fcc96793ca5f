package engine

import (
	"crypto/sha256"
	"encoding/binary"
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/diag"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/engine/table"
	"github.com/galley-econ/galley/manuscript"
)

// A residual diagnostic as written in a `diagnostics:` list: a name and,
// for the tests that have one, an order in parentheses: "bg(4)", "jb".
type DiagItem struct {
	Name  string // bg | lb | jb | arch | bp | reset | dw
	Order int    // 0: the default for the data's frequency
}

// diagKinds lists the diagnostics in table order, with whether they take
// an order.
var diagKinds = []struct {
	name    string
	ordered bool
}{{"bg", true}, {"lb", true}, {"jb", false}, {"arch", true}, {"bp", false}, {"reset", true}, {"dw", false}}

// defaultDiagnostics is the set used when the key is absent: all seven.
func defaultDiagnostics() []DiagItem {
	out := make([]DiagItem, len(diagKinds))
	for i, k := range diagKinds {
		out[i] = DiagItem{Name: k.name}
	}
	return out
}

// ParseDiagnostics reads a diagnostics list; set is whether the key was
// written (an empty list then means none).
func ParseDiagnostics(c *Context, key string, list []string, set bool) ([]DiagItem, error) {
	if !set {
		return defaultDiagnostics(), nil
	}
	var names []string
	for _, k := range diagKinds {
		names = append(names, k.name)
	}
	seen := map[string]bool{}
	var out []DiagItem
	for _, s := range list {
		t := strings.ToLower(strings.ReplaceAll(s, " ", ""))
		name, arg, hasArg := strings.Cut(t, "(")
		it := DiagItem{Name: name}
		ordered, known := false, false
		for _, k := range diagKinds {
			if k.name == name {
				ordered, known = k.ordered, true
			}
		}
		if !known {
			return nil, c.Errorf(key, "unknown diagnostic %q%s; write one of %s, with an order where it takes one, e.g. bg(4)", s, manuscript.DidYouMean(name, names), strings.Join(names, ", "))
		}
		if hasArg {
			if !ordered {
				return nil, c.Errorf(key, "diagnostic %q takes no order", s)
			}
			n, err := strconv.Atoi(strings.TrimSuffix(arg, ")"))
			if err != nil || !strings.HasSuffix(arg, ")") || n < 1 {
				return nil, c.Errorf(key, "diagnostic %q: the order must be a whole number of 1 or more, e.g. %s(4)", s, name)
			}
			if name == "reset" && n < 2 {
				return nil, c.Errorf(key, "diagnostic %q: RESET needs powers up to 2 or more, e.g. reset(3)", s)
			}
			it.Order = n
		}
		if seen[name] {
			return nil, c.Errorf(key, "diagnostic %q is listed twice", name)
		}
		seen[name] = true
		out = append(out, it)
	}
	return out, nil
}

// defaultOrder is the lag order of bg, lb and arch when none is written:
// 12 for monthly data, 4 otherwise (a year of quarterly data).
func defaultOrder(f series.Freq) int {
	if f == series.Monthly {
		return 12
	}
	return 4
}

// diagResult is one diagnostic computed.
type diagResult struct {
	Item  DiagItem
	Label string
	Dist  string // "χ²(4)", "F(2, 250)", "" for Durbin–Watson (exact p-value, no reference distribution)
	Test  diag.Test
}

// RunDiagnostics computes the diagnostics of a fit. dwNull gives the null
// distribution of the Durbin–Watson statistic for a design (memoised per
// build: it costs an eigenvalue decomposition, and a grid of models on the
// same regressors shares it).
func RunDiagnostics(f *ols.Fit, items []DiagItem, freq series.Freq, dwNull func(*ols.Fit) (*diag.DWNull, error)) ([]diagResult, error) {
	var out []diagResult
	for _, it := range items {
		r := it.Order
		if r == 0 {
			r = defaultOrder(freq)
			if it.Name == "reset" {
				r = 3
			}
		}
		it.Order = r
		var (
			t     diag.Test
			err   error
			label string
		)
		switch it.Name {
		case "bg":
			t, err = diag.BreuschGodfrey(f, r)
			label = fmt.Sprintf("Breusch–Godfrey LM(%d)", r)
		case "lb":
			t, err = diag.LjungBox(f.Resid, r, 0)
			label = fmt.Sprintf("Ljung–Box Q(%d)", r)
		case "jb":
			t, err = diag.JarqueBera(f.Resid)
			label = "Jarque–Bera"
			it.Order = 0
		case "arch":
			t, err = diag.ARCH(f.Resid, r)
			label = fmt.Sprintf("ARCH-LM(%d)", r)
		case "bp":
			t, err = diag.BreuschPagan(f, true)
			label = "Breusch–Pagan (studentised)"
			it.Order = 0
		case "reset":
			t, err = diag.RESET(f, r)
			label = fmt.Sprintf("RESET (powers 2–%d)", r)
		case "dw":
			// The exact p-value P(d ≤ d̂) under normal errors given the
			// regressors; past diag.MaxExactDWObs observations the
			// statistic alone (the note says so).
			var nd *diag.DWNull
			if nd, err = dwNull(f); err == nil {
				t = diag.Test{Name: "Durbin–Watson", Stat: f.DW(), PValue: nd.CDF(f.DW())}
			} else if errors.Is(err, diag.ErrDWTooLarge) {
				t, err = diag.DurbinWatson(f)
			}
			label = "Durbin–Watson"
			it.Order = 0
		}
		if err != nil {
			return nil, fmt.Errorf("diagnostic %s: %v", it.Name, err)
		}
		dist := ""
		switch {
		case it.Name == "dw":
		case t.DF2 > 0:
			dist = fmt.Sprintf("F(%d, %d)", t.DF, t.DF2)
		default:
			dist = fmt.Sprintf("χ²(%d)", t.DF)
		}
		out = append(out, diagResult{Item: it, Label: label, Dist: dist, Test: t})
	}
	return out, nil
}

// TestRows lays out a test the way every block of tests is shown: the
// statistic on one row, its p-value on the next.
func TestRows(label string, stat, p float64, dec int, ruleAbove bool) []table.Row {
	rows := []table.Row{{Cells: []table.Cell{table.T(label), table.N(stat, dec)}, RuleAbove: ruleAbove}}
	if !math.IsNaN(p) {
		rows = append(rows, table.Row{Cells: []table.Cell{table.T("    p-value"), table.N(p, dec)}})
	}
	return rows
}

// DiagRows are the table rows of the diagnostics.
func DiagRows(ds []diagResult, dec int) []table.Row {
	var rows []table.Row
	for i, d := range ds {
		label := d.Label
		if d.Dist != "" {
			label += ", " + d.Dist
		}
		rows = append(rows, TestRows(label, d.Test.Stat, d.Test.PValue, dec, i == 0)...)
	}
	return rows
}

// DiagValues is the results-file form: name → {stat, df, df2, pvalue, order}.
func DiagValues(ds []diagResult) map[string]any {
	m := map[string]any{}
	for _, d := range ds {
		v := map[string]any{"test": d.Label, "stat": d.Test.Stat, "df": d.Test.DF, "pvalue": d.Test.PValue}
		if d.Test.DF2 > 0 {
			v["df2"] = d.Test.DF2
		}
		if d.Item.Order > 0 {
			v["order"] = d.Item.Order
		}
		if d.Item.Name == "dw" {
			// pvalue is P(d ≤ d̂), against positive autocorrelation;
			// pvalue_upper is P(d ≥ d̂) = 1 − pvalue, against negative.
			v["pvalue_upper"] = 1 - d.Test.PValue
		}
		m[d.Item.Name] = v
	}
	return m
}

// DiagNote explains the diagnostics block.
func DiagNote(ds []diagResult) string {
	if len(ds) == 0 {
		return ""
	}
	parts := []string{"Residual diagnostics (the statistic, with its p-value beneath)"}
	for _, d := range ds {
		switch d.Item.Name {
		case "bg":
			parts = append(parts, fmt.Sprintf("Breusch–Godfrey LM test of serial correlation up to order %d (pre-sample residuals set to zero)", d.Item.Order))
		case "lb":
			parts = append(parts, fmt.Sprintf("Ljung–Box Q of the residual autocorrelations up to lag %d", d.Item.Order))
		case "jb":
			parts = append(parts, "Jarque–Bera test of normality")
		case "arch":
			parts = append(parts, fmt.Sprintf("ARCH-LM test with %d lags of the squared residuals", d.Item.Order))
		case "bp":
			parts = append(parts, "Breusch–Pagan test of heteroskedasticity in the regressors (Koenker's studentised form)")
		case "reset":
			parts = append(parts, fmt.Sprintf("RESET with powers 2 to %d of the fitted values (F form)", d.Item.Order))
		case "dw":
			if math.IsNaN(d.Test.PValue) {
				parts = append(parts, fmt.Sprintf("Durbin–Watson d, without a p-value: its null distribution depends on the regressors and is computed exactly only up to %d observations", diag.MaxExactDWObs))
				break
			}
			parts = append(parts, "Durbin–Watson d with its exact p-value P(d ≤ d̂) against positive first-order autocorrelation for normal errors given the regressors (Imhof's inversion), "+
				"only indicative here since the regressors are lagged values of the dependent variable or built from them (ectₜ₋₁, lags of its difference), which biases d toward 2 (common practice: Breusch–Godfrey is the valid test)")
		}
	}
	return parts[0] + ": " + strings.Join(parts[1:], "; ") + "."
}

// DwNull returns the Durbin–Watson null distribution for the design of f,
// computed once per build for each distinct design.
func (c *Context) DwNull(f *ols.Fit) (*diag.DWNull, error) {
	h := sha256.New()
	n, k := f.X().Dims()
	var buf [8]byte
	binary.LittleEndian.PutUint64(buf[:], uint64(n*1000003+k))
	h.Write(buf[:])
	for i := 0; i < n; i++ {
		for j := 0; j < k; j++ {
			binary.LittleEndian.PutUint64(buf[:], math.Float64bits(f.X().At(i, j)))
			h.Write(buf[:])
		}
	}
	key := string(h.Sum(nil))
	if nd, ok := c.doc.dwMemo[key]; ok {
		return nd, nil
	}
	nd, err := diag.NewDWNull(f.X())
	if err != nil {
		return nil, err
	}
	if c.doc.dwMemo == nil {
		c.doc.dwMemo = map[string]*diag.DWNull{}
	}
	c.doc.dwMemo[key] = nd
	return nd, nil
}
