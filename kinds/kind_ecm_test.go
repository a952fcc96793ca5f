package kinds

import (
	"math"
	"testing"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/diag"
	"github.com/galley-econ/galley/analysis/ecm"
	"github.com/galley-econ/galley/analysis/longrun"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/unitroot"
	"github.com/galley-econ/galley/engine"
)

// checkECM compares an ecm result with ecm.Estimate on the same input.
func checkECM(t *testing.T, id string, v map[string]any, m *ecm.Model) {
	t.Helper()
	coef := v["coef"].([]map[string]any)
	if len(coef) != len(m.Names) {
		t.Fatalf("%s: %d terms, want %v", id, len(coef), m.Names)
	}
	for i, c := range coef {
		if c["term"] != m.Names[i] {
			t.Errorf("%s: term %d is %v, want %s", id, i, c["term"], m.Names[i])
		}
		wantNum(t, id+" est "+m.Names[i], c["est"], m.Coef[i].Est)
		wantNum(t, id+" se "+m.Names[i], c["se"], m.Coef[i].SE)
		wantNum(t, id+" t "+m.Names[i], c["t"], m.Coef[i].T)
		wantNum(t, id+" p "+m.Names[i], c["p"], m.Coef[i].P)
	}
	wantNum(t, id+" nobs", v["nobs"], float64(m.Fit.N))
	wantNum(t, id+" r2", v["r2"], m.Fit.R2())
	wantNum(t, id+" alpha", v["alpha"], m.Adjust.Alpha)
	wantNum(t, id+" alpha_se", v["alpha_se"], m.Adjust.SE)
	if v["error_corrects"] != m.Adjust.HasHalfLife {
		t.Errorf("%s error_corrects = %v", id, v["error_corrects"])
	}
	if m.Adjust.HasHalfLife {
		wantNum(t, id+" halflife", v["halflife"], m.Adjust.HalfLife)
		wantNum(t, id+" halflife_se", v["halflife_se"], m.Adjust.HalfLifeSE)
	} else if v["halflife"] != nil || v["halflife_se"] != nil {
		t.Errorf("%s: a half-life is given for a model that does not error-correct", id)
	}
	if v["cov"] != m.Cov.String() {
		t.Errorf("%s cov = %v, want %s", id, v["cov"], m.Cov)
	}
}

// checkDiag compares one diagnostic with the analysis value.
func checkDiag(t *testing.T, id, name string, v map[string]any, want diag.Test, wantErr error) {
	t.Helper()
	if wantErr != nil {
		t.Fatal(wantErr)
	}
	ds := v["diagnostics"].(map[string]any)
	d, ok := ds[name].(map[string]any)
	if !ok {
		t.Fatalf("%s: no diagnostic %s (have %v)", id, name, engine.Keys(ds))
	}
	wantNum(t, id+" "+name+" stat", d["stat"], want.Stat)
	wantNum(t, id+" "+name+" df", d["df"], float64(want.DF))
	wantNum(t, id+" "+name+" pvalue", d["pvalue"], want.PValue)
	if math.IsNaN(want.PValue) {
		t.Errorf("%s %s has no p-value", id, name)
	}
}

func TestECMWiring(t *testing.T) {
	t.Parallel()
	doc := cointResults(t)
	g := readGridlink(t)

	// ecm_north: from the Engle–Granger relation, p = q = 1, OLS
	// standard errors, the default diagnostics of order 12 (monthly).
	eg, err := coint.EngleGranger(g.north, [][]float64{g.fuel}, critical.Const, unitroot.LagRule{Select: unitroot.AIC, Max: -1})
	if err != nil {
		t.Fatal(err)
	}
	m, err := ecm.Estimate(ecm.Input{Y: g.north, YName: "log(north)", X: [][]float64{g.fuel}, XNames: []string{"log(fuel)"}, ECT: eg.Resid},
		ecm.Spec{YLags: 1, XLags: 1})
	if err != nil {
		t.Fatal(err)
	}
	v := resultByID(t, doc, "ecm_north").Values
	checkECM(t, "ecm_north", v, m)
	wantTerms := []string{"const", "lag(ect,1)", "lag(diff(log(north)),1)", "diff(log(fuel))", "lag(diff(log(fuel)),1)"}
	for i, w := range wantTerms {
		if m.Names[i] != w {
			t.Errorf("term %d = %s, want %s", i, m.Names[i], w)
		}
	}
	if s := v["sample"].(map[string]any); s["from"] != "2004-03" || s["to"] != "2025-12" || s["n"] != 262 {
		t.Errorf("ecm_north sample %v", s)
	}
	bg, err := diag.BreuschGodfrey(m.Fit, 12)
	checkDiag(t, "ecm_north", "bg", v, bg, err)
	lb, err := diag.LjungBox(m.Fit.Resid, 12, 0)
	checkDiag(t, "ecm_north", "lb", v, lb, err)
	jb, err := diag.JarqueBera(m.Fit.Resid)
	checkDiag(t, "ecm_north", "jb", v, jb, err)
	ar, err := diag.ARCH(m.Fit.Resid, 12)
	checkDiag(t, "ecm_north", "arch", v, ar, err)
	bp, err := diag.BreuschPagan(m.Fit, true)
	checkDiag(t, "ecm_north", "bp", v, bp, err)
	rs, err := diag.RESET(m.Fit, 3)
	checkDiag(t, "ecm_north", "reset", v, rs, err)
	dw, err := diag.DurbinWatsonExact(m.Fit)
	checkDiag(t, "ecm_north", "dw", v, dw, err)

	// ecm_south: p = 2, q = 0, HAC(4), an extra regressor whose first two
	// values are missing (it enters at time t, so the first usable
	// observation is 2004-04, where the lags of diff(log(south)) first
	// exist), diagnostics with orders as written.
	egs, err := coint.EngleGranger(g.south, [][]float64{g.north}, critical.Const, unitroot.LagRule{Select: unitroot.BIC, Max: 6})
	if err != nil {
		t.Fatal(err)
	}
	extra := make([]float64, len(g.fuel))
	extra[0], extra[1] = math.NaN(), math.NaN()
	for i := 2; i < len(extra); i++ {
		extra[i] = g.fuel[i-1] - g.fuel[i-2]
	}
	m, err = ecm.Estimate(ecm.Input{Y: g.south, YName: "log(south)", X: [][]float64{g.north}, XNames: []string{"log(north)"},
		ECT: egs.Resid, Extra: [][]float64{extra}, ExtraNames: []string{"lag(diff(log(fuel)), 1)"}},
		ecm.Spec{YLags: 2, XLags: 0, Cov: ols.CovSpec{Kind: ols.HAC, Lags: 4}})
	if err != nil {
		t.Fatal(err)
	}
	v = resultByID(t, doc, "ecm_south").Values
	checkECM(t, "ecm_south", v, m)
	if s := v["sample"].(map[string]any); s["from"] != "2004-04" || s["n"] != m.Fit.N || m.First != 3 {
		t.Errorf("ecm_south sample %v", s)
	}
	bg, err = diag.BreuschGodfrey(m.Fit, 6)
	checkDiag(t, "ecm_south", "bg", v, bg, err)
	lb, err = diag.LjungBox(m.Fit.Resid, 8, 0)
	checkDiag(t, "ecm_south", "lb", v, lb, err)
	ar, err = diag.ARCH(m.Fit.Resid, 3)
	checkDiag(t, "ecm_south", "arch", v, ar, err)
	rs, err = diag.RESET(m.Fit, 4)
	checkDiag(t, "ecm_south", "reset", v, rs, err)
	if got := v["coef"].([]map[string]any)[len(m.Names)-1]["term"]; got != "lag(diff(log(fuel)), 1)" {
		t.Errorf("last term %v", got)
	}

	// ecm_dols: the equilibrium error of the DOLS relation over the whole
	// sample (not only the DOLS estimation sample), no diagnostics.
	dr, err := longrun.DOLS(g.north, [][]float64{g.fuel}, []string{"log(fuel)"},
		longrun.DOLSSpec{Det: critical.Const, Leads: 2, Lags: 3, Cov: ols.CovSpec{Kind: ols.HAC, Lags: 5}})
	if err != nil {
		t.Fatal(err)
	}
	z := make([]float64, len(g.north))
	for i := range z {
		z[i] = g.north[i] - dr.Fit.Coef[0] - dr.Fit.Coef[1]*g.fuel[i]
	}
	m, err = ecm.Estimate(ecm.Input{Y: g.north, YName: "log(north)", X: [][]float64{g.fuel}, XNames: []string{"log(fuel)"}, ECT: z}, ecm.Spec{})
	if err != nil {
		t.Fatal(err)
	}
	v = resultByID(t, doc, "ecm_dols").Values
	checkECM(t, "ecm_dols", v, m)
	if n := len(v["diagnostics"].(map[string]any)); n != 0 {
		t.Errorf("diagnostics: [] gave %d diagnostics", n)
	}

	// ecm_fmols: the FMOLS relation θ̂⁺.
	fr, err := longrun.FMOLS(g.north, [][]float64{g.fuel}, []string{"log(fuel)"}, longrun.FMOLSSpec{Det: critical.Const, Kernel: longrun.Bartlett})
	if err != nil {
		t.Fatal(err)
	}
	for i := range z {
		z[i] = g.north[i] - fr.Coef[0] - fr.Coef[1]*g.fuel[i]
	}
	m, err = ecm.Estimate(ecm.Input{Y: g.north, YName: "log(north)", X: [][]float64{g.fuel}, XNames: []string{"log(fuel)"}, ECT: z}, ecm.Spec{})
	if err != nil {
		t.Fatal(err)
	}
	checkECM(t, "ecm_fmols", resultByID(t, doc, "ecm_fmols").Values, m)
}

// TestECMHalfLifeFlag: with α ≥ 0 or α ≤ −2 the table and the values say
// that the model does not error-correct instead of giving a half-life.
func TestECMHalfLifeFlag(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name  string
		n     int
		alpha float64 // of the generated equilibrium error
		check func(a float64) bool
	}{
		{"explosive", 60, 0.08, func(a float64) bool { return a >= 0 }},
		{"overshooting", 40, -2.3, func(a float64) bool { return a <= -2 }},
		{"correcting", 80, -0.5, func(a float64) bool { return a > -2 && a < 0 }},
	} {
		t.Run(tc.name, func(t *testing.T) {
			csvText := syntheticCSV("y", "x", gridlinkSynthetic(tc.n, tc.alpha))
			doc := front + "\n" + fence("engle-granger", "id: eg\ny: y\nx: [x]\nlags: 0\n") + "\n" + fence("ecm", "id: m\nfrom: eg\nlags: 0\ndiagnostics: [dw]\n")
			p := writeProject(t, doc, map[string]string{"data.csv": csvText})
			d, err := engine.Parse(p, engine.Options{})
			if err != nil {
				t.Fatal(err)
			}
			if err := d.Run(); err != nil {
				t.Fatal(err)
			}
			res := resultByID(t, d, "m")
			a := res.Values["alpha"].(float64)
			if !tc.check(a) {
				t.Fatalf("test data give α = %g, not the case under test", a)
			}
			want := ecm.NewAdjustment(a, res.Values["alpha_se"].(float64))
			if res.Values["error_corrects"] != want.HasHalfLife {
				t.Errorf("error_corrects = %v at α = %g", res.Values["error_corrects"], a)
			}
			hlRow := res.Table.Body[4].Cells
			if want.HasHalfLife {
				wantNum(t, "halflife", res.Values["halflife"], want.HalfLife)
				if !hlRow[1].IsNum || hlRow[1].Num != want.HalfLife {
					t.Errorf("half-life row %+v", hlRow)
				}
			} else {
				if res.Values["halflife"] != nil {
					t.Errorf("halflife = %v, want null", res.Values["halflife"])
				}
				if hlRow[1].IsNum || hlRow[1].Text == "" {
					t.Errorf("half-life row %+v should flag no error correction", hlRow)
				}
			}
		})
	}
}

func TestECMBadInput(t *testing.T) {
	t.Parallel()
	files := map[string]string{"data.csv": syntheticCSV("y", "x", gridlinkSynthetic(80, -0.5))}
	up := front + "\n" + fence("engle-granger", "id: eg\ny: y\nx: [x]\n") + "\n" + fence("ols", "id: o\ny: y\nx: [x]\n") + "\n"
	// The ecm fence is on line 19.
	ec := func(body string) string { return up + fence("ecm", body) }
	t.Run("missing id", func(t *testing.T) {
		runBad(t, ec("id: m\nfrom: egg\n"), files, "paper.md:21:", `no directive has id "egg"`, "did you mean eg?")
	})
	t.Run("not a cointegration result", func(t *testing.T) {
		runBad(t, ec("id: m\nfrom: o\n"), files, "paper.md:21:", `"o" is a ols result (line 13)`, "engle-granger or dols or fmols")
	})
	t.Run("no from", func(t *testing.T) {
		runBad(t, ec("id: m\nlags: 1\n"), files, "paper.md:19:", `"from" is required`)
	})
	t.Run("lags and ylags", func(t *testing.T) {
		runBad(t, ec("id: m\nfrom: eg\nlags: 1\nylags: 2\n"), files, "paper.md:22:", "not both")
	})
	t.Run("negative lags", func(t *testing.T) {
		runBad(t, ec("id: m\nfrom: eg\nxlags: -1\n"), files, "paper.md:22:", "zero or more")
	})
	t.Run("bad se", func(t *testing.T) {
		runBad(t, ec("id: m\nfrom: eg\nse: hac\n"), files, "paper.md:22:", "hac(L)")
	})
	t.Run("bad diagnostic", func(t *testing.T) {
		runBad(t, ec("id: m\nfrom: eg\ndiagnostics: [bg(4), jarque]\n"), files, "paper.md:22:", `unknown diagnostic "jarque"`)
	})
	t.Run("order on jb", func(t *testing.T) {
		runBad(t, ec("id: m\nfrom: eg\ndiagnostics: [jb(2)]\n"), files, "paper.md:22:", "takes no order")
	})
	t.Run("bad extra", func(t *testing.T) {
		runBad(t, ec("id: m\nfrom: eg\nextra: [dumy]\n"), files, "paper.md:22:", `no column "dumy"`)
	})
	t.Run("too many lags", func(t *testing.T) {
		runBad(t, ec("id: m\nfrom: eg\nlags: 60\n"), files, "paper.md:22:", "usable observations")
	})
}
