package kinds

import (
	"math"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/unitroot"
	dunitroot "github.com/galley-econ/galley/directive/unitroot"
	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/internal/refdata"
)

// valuesOf parses and runs a manuscript and returns its values by id.
func valuesOf(t *testing.T, path string) map[string]map[string]any {
	t.Helper()
	doc, err := engine.Parse(path, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	out := map[string]map[string]any{}
	for _, r := range doc.Results() {
		out[r.ID] = r.Values
	}
	return out
}

func macroProject(t *testing.T, body string) string {
	t.Helper()
	csv, err := os.ReadFile(filepath.Join(refdata.Root(), "data", "macrodata.csv"))
	if err != nil {
		t.Fatal(err)
	}
	return writeProject(t, "---\ndata:\n  macro: macro.csv\n---\n\n"+body, map[string]string{"macro.csv": string(csv)})
}

// TestUnitRootWiring: the values a directive reports are those of the
// analysis functions (themselves checked against statsmodels and urca in
// analysis/unitroot) on the same series, lags and case.
func TestUnitRootWiring(t *testing.T) {
	t.Parallel()
	p := macroProject(t, fence("adf", "id: a\nseries: log(realgdp)\ndet: ct\nlags: {select: aic, max: 8}\n")+
		fence("pp", "id: p\nseries: log(realgdp)\ndet: c\nbandwidth: rule12\n")+
		fence("kpss", "id: k\nseries: infl\ndet: c\nbandwidth: 3\n")+
		fence("dfgls", "id: g\nseries: log(realgdp)\ndet: ct\nlags: 2\n")+
		fence("za", "id: z\nseries: log(realgdp)\nbreak: both\nlags: 1\n"))
	v := valuesOf(t, p)
	_, d, _ := refdata.CSV("macrodata")
	lg := make([]float64, len(d["realgdp"]))
	for i, x := range d["realgdp"] {
		lg[i] = math.Log(x)
	}
	adf, _ := unitroot.ADF(lg, critical.ConstTrend, unitroot.LagRule{Select: unitroot.AIC, Max: 8})
	pp, _ := unitroot.PP(lg, critical.Const, unitroot.Bandwidth{Rule: unitroot.Schwert12})
	kp, _ := unitroot.KPSS(d["infl"], critical.Const, unitroot.Bandwidth{Rule: unitroot.Given, Lags: 3})
	gls, _ := unitroot.DFGLS(lg, critical.ConstTrend, unitroot.LagRule{Lags: 2})
	za, _ := unitroot.ZA(lg, critical.BreakBoth, 0, unitroot.LagRule{Lags: 1})
	for _, c := range []struct {
		id      string
		stat, p float64
		lags, n int
		lagKey  string
		crit5   float64
	}{
		{"a", adf.Stat, adf.PValue, adf.Lags, adf.NObs, "lags", adf.Crit[1].Value},
		{"p", pp.Stat, pp.PValue, pp.Bandwidth, pp.NObs, "bandwidth", pp.Crit[1].Value},
		{"k", kp.Stat, kp.PValue, kp.Bandwidth, kp.NObs, "bandwidth", kp.Crit[1].Value},
		{"g", gls.Stat, gls.PValue, gls.Lags, gls.NObs, "lags", gls.Crit[1].Value},
		{"z", za.Stat, za.PValue, za.Lags, za.NObs, "lags", za.Crit[2].Value},
	} {
		got := v[c.id]
		if got["stat"] != c.stat || got["nobs"] != c.n || got[c.lagKey] != c.lags {
			t.Errorf("%s: stat %v nobs %v %s %v; want %v %v %v", c.id, got["stat"], got["nobs"], c.lagKey, got[c.lagKey], c.stat, c.n, c.lags)
		}
		if pv := got["pvalue"].(float64); !(pv == c.p || math.IsNaN(pv) && math.IsNaN(c.p)) {
			t.Errorf("%s: pvalue %v, want %v", c.id, pv, c.p)
		}
		if cv := got["crit"].(map[string]any)["5%"]; cv != c.crit5 {
			t.Errorf("%s: 5%% critical value %v, want %v", c.id, cv, c.crit5)
		}
	}
	if b := v["z"]["break"]; b != refDateAt(t, za.Break) {
		t.Errorf("za break %v", b)
	}
}

func refDateAt(t *testing.T, i int) string {
	dates, _, _ := refdata.CSV("macrodata")
	return dates[i]
}

// TestUnitRootBadInput: the bad inputs of a unit-root directive name the line.
func TestUnitRootBadInput(t *testing.T) {
	t.Parallel()
	short := "date,x,k,g\n" + func() string {
		var b strings.Builder
		for i := 0; i < 10; i++ {
			g := "1"
			if i == 5 {
				g = ""
			}
			b.WriteString("2004-" + []string{"01", "02", "03", "04", "05", "06", "07", "08", "09", "10"}[i] + ",")
			b.WriteString([]string{"1", "3", "2", "5", "4", "6", "5", "8", "7", "9"}[i] + ",7," + map[bool]string{true: "", false: "2." + string(rune('0'+i))}[g == ""] + "\n")
		}
		return b.String()
	}()
	for _, tc := range []struct {
		name, body string
		want       []string
	}{
		{"lags too many", "id: a\nseries: x\nlags: 12\n", []string{"paper.md:9:", "ADF of x", "too few observations"}},
		{"constant series", "id: a\nseries: k\nlags: 0\n", []string{"paper.md:9:", "constant"}},
		{"interior gap", "id: a\nseries: g\nlags: 0\n", []string{"paper.md:7:", "g", "2004-06"}},
		{"unknown case", "id: a\nseries: x\ndet: cx\n", []string{"paper.md:10:", `unknown deterministic case "cx"`}},
		{"lags negative", "id: a\nseries: x\nlags: -1\n", []string{"paper.md:10:", "lags must be zero or more"}},
		{"kpss with lags", "id: a\nseries: x\nlags: 2\n", nil},
	} {
		t.Run(tc.name, func(t *testing.T) {
			kind := "adf"
			if tc.name == "kpss with lags" {
				kind = "kpss"
				tc.want = []string{"paper.md:10:", "bandwidth"}
			}
			p := writeProject(t, front+"\n"+fence(kind, tc.body), map[string]string{"data.csv": short})
			doc, err := engine.Parse(p, engine.Options{})
			if err == nil {
				err = doc.Run()
			}
			if err == nil {
				t.Fatal("no error")
			}
			inOrder(t, err.Error(), tc.want)
		})
	}
}

func TestOrderVerdict(t *testing.T) {
	t.Parallel()
	unit := &contract.Outcome{Stat: -1, Crit: []critical.Value{{Level: 0.05, Value: -2.9}}}
	stat := &contract.Outcome{Stat: -5, Crit: []critical.Value{{Level: 0.05, Value: -2.9}}}
	kpssRej := &contract.Outcome{Stat: 1, Upper: true, Crit: []critical.Value{{Level: 0.05, Value: 0.463}}}
	kpssOK := &contract.Outcome{Stat: 0.1, Upper: true, Crit: []critical.Value{{Level: 0.05, Value: 0.463}}}
	for _, tc := range []struct {
		lev, dif []*contract.Outcome
		want     string
	}{
		{[]*contract.Outcome{stat, kpssOK}, []*contract.Outcome{stat, kpssOK}, "I(0)"},
		{[]*contract.Outcome{unit, kpssRej}, []*contract.Outcome{stat, kpssOK}, "I(1)"},
		{[]*contract.Outcome{unit, kpssRej}, []*contract.Outcome{unit, kpssRej}, "I(2)"},
		{[]*contract.Outcome{unit, kpssOK}, []*contract.Outcome{stat, kpssOK}, "unclear"},
		{[]*contract.Outcome{unit, kpssRej}, []*contract.Outcome{unit, kpssOK}, "unclear"},
	} {
		if got := dunitroot.Order(dunitroot.Verdict(tc.lev, 0.05), dunitroot.Verdict(tc.dif, 0.05), true); got != tc.want {
			t.Errorf("verdict = %s, want %s", got, tc.want)
		}
	}
}

// TestDemoIsI1: the demo's generated series are I(1) by construction, and
// the order-of-integration table says so.
func TestDemoIsI1(t *testing.T) {
	t.Parallel()
	var oi map[string]any
	ok := false
	withDemo(t, func(doc *engine.Document) {
		for _, r := range doc.Results() {
			if r.ID == "oi" {
				oi, ok = r.Values, true
			}
		}
	})
	if !ok {
		t.Fatal("the demo has no unitroot-table with id oi")
	}
	for _, s := range oi["series"].([]map[string]any) {
		if s["order"] != "I(1)" {
			t.Errorf("%s: order %v, want I(1)", s["name"], s["order"])
		}
	}
}

// The demo run once, without a cache, for the tests that only read it
// (withDemo).
var (
	demoOnce sync.Once
	demoDoc  *engine.Document
	demoErr  error
	demoMu   sync.Mutex
)

// withDemo calls f with the demo paper run once for all the tests that
// read it, one test at a time (a writer may fill a document's lazily
// built parts).
func withDemo(t *testing.T, f func(*engine.Document)) {
	t.Helper()
	demoOnce.Do(func() {
		demoDoc, demoErr = engine.Parse(filepath.Join("..", "examples", "gridlink", "paper.md"), engine.Options{})
		if demoErr == nil {
			demoErr = demoDoc.Run()
		}
	})
	if demoErr != nil {
		t.Fatal(demoErr)
	}
	demoMu.Lock()
	defer demoMu.Unlock()
	f(demoDoc)
}
