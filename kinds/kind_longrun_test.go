package kinds

import (
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/longrun"
	"github.com/galley-econ/galley/analysis/ols"
)

// checkCoefs compares a coef list with names and ols.Coef rows.
func checkCoefs(t *testing.T, id string, v map[string]any, names []string, cs []ols.Coef) {
	t.Helper()
	coef := v["coef"].([]map[string]any)
	if len(coef) != len(names) {
		t.Fatalf("%s: %d terms, want %v", id, len(coef), names)
	}
	for i, c := range coef {
		if c["term"] != names[i] {
			t.Errorf("%s: term %d = %v, want %s", id, i, c["term"], names[i])
		}
		wantNum(t, id+" est "+names[i], c["est"], cs[i].Est)
		wantNum(t, id+" se "+names[i], c["se"], cs[i].SE)
		wantNum(t, id+" p "+names[i], c["p"], cs[i].P)
	}
}

func checkWald(t *testing.T, id string, v map[string]any, i int, lr longrun.Coefs, R [][]float64, r []float64) {
	t.Helper()
	Rm := mat.NewDense(len(R), len(R[0]), nil)
	for j, row := range R {
		Rm.SetRow(j, row)
	}
	w, err := longrun.Wald(lr, Rm, r)
	if err != nil {
		t.Fatal(err)
	}
	got := v["wald"].([]map[string]any)[i]
	wantNum(t, id+" wald stat", got["stat"], w.Stat)
	wantNum(t, id+" wald df", got["df"], float64(w.DF))
	wantNum(t, id+" wald p", got["pvalue"], w.PValue)
}

func TestDOLSWiring(t *testing.T) {
	t.Parallel()
	doc := cointResults(t)
	g := readGridlink(t)
	r, err := longrun.DOLS(g.north, [][]float64{g.fuel}, []string{"log(fuel)"},
		longrun.DOLSSpec{Det: critical.Const, Leads: 2, Lags: 3, Cov: ols.CovSpec{Kind: ols.HAC, Lags: 5}})
	if err != nil {
		t.Fatal(err)
	}
	v := resultByID(t, doc, "dols").Values
	checkCoefs(t, "dols", v, r.Names[:2], r.Table[:2])
	wantNum(t, "dols nobs", v["nobs"], float64(r.Fit.N))
	wantNum(t, "dols leads", v["leads"], 2)
	wantNum(t, "dols lags", v["lags"], 3)
	wantNum(t, "dols bandwidth", v["bandwidth"], 6) // b = L + 1
	if dyn := v["dynamics"].([]map[string]any); len(dyn) != 6 || dyn[0]["term"] != "lag(diff(log(fuel)),3)" || dyn[5]["term"] != "lead(diff(log(fuel)),2)" {
		t.Errorf("dynamics terms %v", dyn)
	}
	if s := v["sample"].(map[string]any); s["from"] != "2004-05" || s["to"] != "2025-10" || s["n"] != 258 {
		t.Errorf("dols sample %v (want 2004-05..2025-10 for 3 lags and 2 leads)", s)
	}
	checkWald(t, "dols", v, 0, r.LongRun, [][]float64{{1}}, []float64{0.8})
	checkWald(t, "dols", v, 1, r.LongRun, [][]float64{{2}}, []float64{1})

	// BIC over 0..3 × 0..3 with det ct and the automatic HAC lag
	// ⌊4(264/100)^(2/9)⌋ = 4.
	r, err = longrun.DOLS(g.north, [][]float64{g.fuel}, []string{"log(fuel)"},
		longrun.DOLSSpec{Det: critical.ConstTrend, Select: longrun.BIC, MaxLags: 3, MaxLeads: 3, Cov: ols.CovSpec{Kind: ols.HAC, Lags: 4}})
	if err != nil {
		t.Fatal(err)
	}
	v = resultByID(t, doc, "dols_bic").Values
	checkCoefs(t, "dols_bic", v, r.Names[:3], r.Table[:3])
	wantNum(t, "dols_bic leads", v["leads"], float64(r.Leads))
	wantNum(t, "dols_bic lags", v["lags"], float64(r.Lags))
	wantNum(t, "dols_bic hac_lags", v["hac_lags"], 4)
	if v["select"] != "bic" {
		t.Errorf("select = %v", v["select"])
	}
}

func TestFMOLSWiring(t *testing.T) {
	t.Parallel()
	doc := cointResults(t)
	g := readGridlink(t)
	r, err := longrun.FMOLS(g.north, [][]float64{g.fuel}, []string{"log(fuel)"}, longrun.FMOLSSpec{Det: critical.Const, Kernel: longrun.Bartlett})
	if err != nil {
		t.Fatal(err)
	}
	v := resultByID(t, doc, "fmols").Values
	checkCoefs(t, "fmols", v, r.Names, r.Table)
	wantNum(t, "fmols nobs", v["nobs"], float64(r.N))
	wantNum(t, "fmols bandwidth", v["bandwidth"], r.Bandwidth)
	if v["kernel"] != "bartlett" {
		t.Errorf("kernel %v", v["kernel"])
	}
	checkWald(t, "fmols", v, 0, r.LongRun, [][]float64{{1}}, []float64{0.8})

	// Two regressors, QS kernel, a given bandwidth; a joint restriction
	// and one with a coefficient written without "*".
	r, err = longrun.FMOLS(g.south, [][]float64{g.north, g.fuel}, []string{"log(north)", "log(fuel)"},
		longrun.FMOLSSpec{Det: critical.Const, Kernel: longrun.QuadraticSpectral, Bandwidth: 5.5})
	if err != nil {
		t.Fatal(err)
	}
	v = resultByID(t, doc, "fmols_qs").Values
	checkCoefs(t, "fmols_qs", v, r.Names, r.Table)
	wantNum(t, "fmols_qs bandwidth", v["bandwidth"], 5.5)
	checkWald(t, "fmols_qs", v, 0, r.LongRun, [][]float64{{1, -1}, {0, 1}}, []float64{0, 0})
	checkWald(t, "fmols_qs", v, 1, r.LongRun, [][]float64{{1, 0.5}}, []float64{1})
}

// TestLongRunDemoCoverage: on the demo's generated data (true long-run
// coefficient 0.80 and adjustment speed −0.25 for North; see
// examples/gridlink/gen) the 95% intervals of DOLS, FMOLS and of the
// ECM's α cover the true values. (The draw puts α̂ near −0.32, so the α
// intervals cover −0.25 with little to spare: this checks that nothing
// in the wiring biases the estimates, not a property that holds for
// every draw.)
func TestLongRunDemoCoverage(t *testing.T) {
	t.Parallel()
	doc := cointResults(t)
	covers := func(what string, est, se, truth float64) {
		lo, hi := est-1.959963984540054*se, est+1.959963984540054*se
		if truth < lo || truth > hi {
			t.Errorf("%s: 95%% interval [%.4f, %.4f] misses %g", what, lo, hi, truth)
		}
	}
	for _, id := range []string{"dols", "fmols"} {
		for _, c := range resultByID(t, doc, id).Values["coef"].([]map[string]any) {
			if c["term"] == "log(fuel)" {
				covers(id+" β", c["est"].(float64), c["se"].(float64), 0.80)
			}
		}
	}
	for _, id := range []string{"ecm_north", "ecm_dols", "ecm_fmols"} {
		v := resultByID(t, doc, id).Values
		covers(id+" α", v["alpha"].(float64), v["alpha_se"].(float64), -0.25)
	}
	v := resultByID(t, doc, "ecm_south").Values
	covers("ecm_south α", v["alpha"].(float64), v["alpha_se"].(float64), -0.35)
}

func TestLongRunBadInput(t *testing.T) {
	t.Parallel()
	files := map[string]string{"data.csv": syntheticCSV("y", "x", gridlinkSynthetic(80, -0.5))}
	dols := func(body string) string { return front + "\n" + fence("dols", body) }
	fm := func(body string) string { return front + "\n" + fence("fmols", body) }
	t.Run("restriction on its own line", func(t *testing.T) {
		runBad(t, dols("id: d\ny: y\nx: [x]\nrestrict:\n  - x = 2\n  - z = 1\n"), files, "paper.md:13:", `restriction "z = 1"`, `"z" is not one of the terms (x)`)
		runBad(t, dols("id: d\ny: y\nx: [x]\nrestrict:\n  - z1 = 2\n"), files, "paper.md:12:", `restriction "z1 = 2"`, `"z1" is not one of the terms (x) (did you mean x?)`)
	})
	t.Run("restriction in a flow list", func(t *testing.T) {
		runBad(t, fm("id: d\ny: y\nx: [x]\nrestrict: [\"x == 1\"]\n"), files, "paper.md:11:", `one "="`)
	})
	t.Run("select and fixed", func(t *testing.T) {
		runBad(t, dols("id: d\ny: y\nx: [x]\nleads: 1\nselect: aic\n"), files, "paper.md:12:", "not both")
	})
	t.Run("bad select", func(t *testing.T) {
		runBad(t, dols("id: d\ny: y\nx: [x]\nselect: hq\n"), files, "paper.md:11:", "aic or bic")
	})
	t.Run("max with fixed", func(t *testing.T) {
		runBad(t, dols("id: d\ny: y\nx: [x]\nlags: 1\nmax: 3\n"), files, "paper.md:12:", "max bounds a selection")
	})
	t.Run("negative leads", func(t *testing.T) {
		runBad(t, dols("id: d\ny: y\nx: [x]\nleads: -1\nlags: 1\n"), files, "paper.md:11:", "zero or more")
	})
	t.Run("bad se", func(t *testing.T) {
		runBad(t, dols("id: d\ny: y\nx: [x]\nse: hc3\n"), files, "paper.md:11:", "hc3")
	})
	t.Run("too many leads", func(t *testing.T) {
		runBad(t, dols("id: d\ny: y\nx: [x]\nleads: 40\nlags: 40\n"), files, "paper.md:12:", "DOLS of y on x")
	})
	t.Run("bad kernel", func(t *testing.T) {
		runBad(t, fm("id: d\ny: y\nx: [x]\nkernel: parzen\n"), files, "paper.md:11:", "bartlett or qs")
	})
	t.Run("bad bandwidth", func(t *testing.T) {
		runBad(t, fm("id: d\ny: y\nx: [x]\nbandwidth: -2\n"), files, "paper.md:11:", "positive number")
	})
	t.Run("no x", func(t *testing.T) {
		runBad(t, fm("id: d\ny: y\n"), files, "paper.md:7:", `"x" is required`)
	})
}
