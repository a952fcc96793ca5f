package kinds

import (
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/engine/contract"
	"github.com/galley-econ/galley/write/html"
	"github.com/galley-econ/galley/write/latex"
	"github.com/galley-econ/galley/write/markdown"
)

// TestGregoryHansenDirective runs a gregory-hansen directive on the US
// macro data and compares what reaches the results with the independent
// numpy implementation of Gregory and Hansen (1996) in
// testdata/scripts/coint_gh_macro.py (case cs_p1_bw6: log consumption on
// log disposable income, regime shift, one lagged difference, six
// Bartlett lags; numpy 1.24.2), to 1e-8 relative; the break dates are
// the 109th (ADF*) and 106th (Zt*, Zα*) observations, 1986Q1 and 1985Q2.
// The result's contract carries the ADF* outcome and the three breaks,
// and prose can quote them.
func TestGregoryHansenDirective(t *testing.T) {
	t.Parallel()
	body := "ADF* is {{gh.stat %.2f}}, break {{gh.adf.break}}; Zα* {{gh.za.stat %.1f}}.\n\n" +
		fence("gregory-hansen", "id: gh\ny: log(realcons)\nx: [log(realdpi)]\nshift: regime\nlags: 1\nbandwidth: 6\n")
	p := macroProject(t, body)
	doc, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := doc.Run(); err != nil {
		t.Fatal(err)
	}
	r := doc.Results()[0]
	v := r.Values
	rel := func(a, b float64) float64 { return math.Abs(a-b) / math.Abs(b) }
	checks := []struct {
		key    string
		want   float64
		break_ string
	}{{"adf", -5.024788405131316, "1986Q1"}, {"zt", -7.164852701308375, "1985Q2"}, {"za", -86.64309948465242, "1985Q2"}}
	for _, c := range checks {
		m := v[c.key].(map[string]any)
		if rel(m["stat"].(float64), c.want) > 1e-8 || m["break"] != c.break_ {
			t.Errorf("%s: %v at %v, numpy %v at %s", c.key, m["stat"], m["break"], c.want, c.break_)
		}
	}
	if v["stat"] != v["adf"].(map[string]any)["stat"] || v["lags"] != 1 || v["nobs"] != 203 || v["model"] != "C/S" {
		t.Errorf("top-level values: stat %v lags %v nobs %v model %v", v["stat"], v["lags"], v["nobs"], v["model"])
	}
	crit := v["crit"].(map[string]any)
	if crit["5%"] != -4.95 || v["za"].(map[string]any)["crit"].(map[string]any)["1%"] != -57.17 {
		t.Errorf("critical values %v", crit)
	}
	if r.Test == nil || r.Test.Stat != v["stat"] || !r.Test.Rejects(0.05) {
		t.Fatalf("contract outcome %+v", r.Test)
	}
	br := r.Test.Breaks()
	if len(br) != 3 || br[0] != (contract.Break{Label: "ADF*", Date: "1986Q1", Index: 108}) || br[2].Date != "1985Q2" {
		t.Errorf("breaks %+v", br)
	}
	md, err := markdown.Write(doc, markdown.Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"ADF* is -5.02, break 1986Q1; Zα* -86.6.", "Gregory and Hansen (1996) Table 1 for m = 1 regressors, model C/S", "Zα*"} {
		if !strings.Contains(strings.ReplaceAll(string(md), "−", "-"), want) {
			t.Errorf("markdown lacks %q", want)
		}
	}
	if _, err := html.Write(doc, html.Options{}); err != nil {
		t.Fatal(err)
	}
	if _, err := latex.Write(doc, latex.Options{}); err != nil {
		t.Fatal(err)
	}
}

// TestGregoryHansenSimulate: crit: simulate replaces the table by
// simulated critical values for each statistic at the test's T, with
// p-values, and the note says so.
func TestGregoryHansenSimulate(t *testing.T) {
	t.Parallel()
	p := macroProject(t, fence("gregory-hansen", "id: gh\ny: log(realcons)\nx: [log(realdpi)]\nsample: 1990Q1..\nlags: 0\ncrit: simulate\nreplications: 300\n"))
	v := valuesOf(t, p)["gh"]
	for _, k := range []string{"adf", "zt", "za"} {
		m := v[k].(map[string]any)
		if _, ok := m["crit_mcse"]; !ok {
			t.Errorf("%s: no simulated critical values: %v", k, m)
		}
		if pv := m["pvalue"].(float64); !(pv >= 0 && pv <= 1) {
			t.Errorf("%s: p-value %v", k, pv)
		}
		if m["sim"].(map[string]any)["t"] != 79 {
			t.Errorf("%s: simulated at T=%v, want 79", k, m["sim"].(map[string]any)["t"])
		}
	}
	if !strings.HasPrefix(v["crit_source"].(string), "simulated: 300 replications") {
		t.Errorf("crit_source %q", v["crit_source"])
	}
}

// TestGregoryHansenBadInput: clear errors naming the manuscript line.
func TestGregoryHansenBadInput(t *testing.T) {
	t.Parallel()
	cases := []struct{ name, body, want string }{
		{"trim out of range", "id: g\ny: log(realcons)\nx: [log(realdpi)]\ntrim: 0.6\n", "paper.md:10: trim: the share cut at each end must lie strictly between 0 and 0.5"},
		{"no candidate date", "id: g\ny: log(realcons)\nx: [log(realdpi)]\nshift: regime\nsample: 2004Q1..\ntrim: 0.49\nlags: 0\n", "paper.md:12: Gregory–Hansen: 23 observations leave no candidate break date"},
		{"too few observations", "id: g\ny: log(realcons)\nx: [log(realdpi), log(realinv)]\nshift: regime\nsample: 2007Q1..\n", "paper.md:6: Gregory–Hansen: 11 observations are too few for model C/S"},
		{"unknown shift", "id: g\ny: log(realcons)\nx: [log(realdpi)]\nshift: slope\n", "paper.md:10: shift: write level, trend"},
		{"simulate replications", "id: g\ny: log(realcons)\nx: [log(realdpi)]\nreplications: 500\n", "paper.md:10: replications applies only with crit: simulate"},
	}
	for _, c := range cases {
		p := macroProject(t, fence("gregory-hansen", c.body))
		doc, err := engine.Parse(p, engine.Options{})
		if err == nil {
			err = doc.Run()
		}
		if err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want %q", c.name, err, c.want)
		}
	}
}
