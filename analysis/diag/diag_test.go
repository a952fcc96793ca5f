package diag

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/ols"

	"github.com/galley-econ/galley/internal/refdata"
)

type diagFixture struct {
	Library, Version string
	Models           map[string]map[string]any
}

// macroFits rebuilds the two regressions of testdata/scripts/diag_macro.py.
func macroFits(t *testing.T) map[string]*ols.Fit {
	d := refdata.CSVFile(t, "../../testdata/data/macrodata.csv")
	n := len(d["realcons"])
	out := map[string]*ols.Fit{}

	y := make([]float64, 0, n-1)
	x := mat.NewDense(n-1, 3, nil)
	for t := 1; t < n; t++ {
		y = append(y, math.Log(d["realcons"][t])-math.Log(d["realcons"][t-1]))
		x.Set(t-1, 0, 1)
		x.Set(t-1, 1, math.Log(d["realdpi"][t])-math.Log(d["realdpi"][t-1]))
		x.Set(t-1, 2, d["tbilrate"][t])
	}
	f, err := ols.Regress(y, x)
	if err != nil {
		t.Fatal(err)
	}
	out["growth"] = f

	y = make([]float64, n)
	x = mat.NewDense(n, 3, nil)
	for t := 0; t < n; t++ {
		y[t] = math.Log(d["realinv"][t])
		x.Set(t, 0, 1)
		x.Set(t, 1, math.Log(d["realgdp"][t]))
		x.Set(t, 2, d["tbilrate"][t])
	}
	if f, err = ols.Regress(y, x); err != nil {
		t.Fatal(err)
	}
	out["levels"] = f
	return out
}

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

// TestAgainstStatsmodels checks every test against statsmodels 0.13.5
// (fixture testdata/fixtures/diag_macro.json, script
// testdata/scripts/diag_macro.py) to 1e-8 relative, statistic and p-value.
func TestAgainstStatsmodels(t *testing.T) {
	var fx diagFixture
	refdata.JSONFile(t, "../../testdata/fixtures/diag_macro.json", &fx)
	if fx.Library != "statsmodels" {
		t.Fatalf("fixture library %q", fx.Library)
	}
	const tol = 1e-8
	for name, f := range macroFits(t) {
		want := fx.Models[name]
		if int(want["nobs"].(float64)) != f.N {
			t.Fatalf("%s: N = %d, statsmodels %v", name, f.N, want["nobs"])
		}
		cases := []struct {
			key string
			run func() (Test, error)
			df  int
		}{
			// statsmodels acorr_breusch_godfrey(res, nlags=r)
			{"bg1", func() (Test, error) { return BreuschGodfrey(f, 1) }, 1},
			{"bg4", func() (Test, error) { return BreuschGodfrey(f, 4) }, 4},
			// statsmodels het_arch(resid, nlags=r)
			{"arch1", func() (Test, error) { return ARCH(f.Resid, 1) }, 1},
			{"arch4", func() (Test, error) { return ARCH(f.Resid, 4) }, 4},
			// statsmodels acorr_ljungbox(resid, lags=[r])
			{"lb4", func() (Test, error) { return LjungBox(f.Resid, 4, 0) }, 4},
			{"lb8", func() (Test, error) { return LjungBox(f.Resid, 8, 0) }, 8},
			// statsmodels jarque_bera(resid)
			{"jb", func() (Test, error) { return JarqueBera(f.Resid) }, 2},
			// statsmodels het_breuschpagan(resid, X, robust=True / False)
			{"bp_koenker", func() (Test, error) { return BreuschPagan(f, true) }, 2},
			{"bp_original", func() (Test, error) { return BreuschPagan(f, false) }, 2},
			// statsmodels linear_reset(res, power=h, use_f=True)
			{"reset2", func() (Test, error) { return RESET(f, 2) }, 1},
			{"reset3", func() (Test, error) { return RESET(f, 3) }, 2},
		}
		for _, c := range cases {
			got, err := c.run()
			if err != nil {
				t.Fatalf("%s %s: %v", name, c.key, err)
			}
			w := want[c.key].([]any)
			ws, wp := w[0].(float64), w[1].(float64)
			if e := relErr(got.Stat, ws); e > tol {
				t.Errorf("%s %s: stat %.12g, statsmodels %.12g (rel %.1e)", name, c.key, got.Stat, ws, e)
			}
			if e := relErr(got.PValue, wp); e > tol {
				t.Errorf("%s %s: p %.12g, statsmodels %.12g (rel %.1e)", name, c.key, got.PValue, wp, e)
			}
			if got.DF != c.df {
				t.Errorf("%s %s: df %d, want %d", name, c.key, got.DF, c.df)
			}
			if len(w) == 4 && got.DF2 != int(w[3].(float64)) {
				t.Errorf("%s %s: df2 %d, statsmodels %v", name, c.key, got.DF2, w[3])
			}
		}
		// statsmodels durbin_watson(resid)
		dw, err := DurbinWatson(f)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(dw.Stat, want["dw"].(float64)); e > tol {
			t.Errorf("%s dw: %.12g, statsmodels %v", name, dw.Stat, want["dw"])
		}
		if !math.IsNaN(dw.PValue) {
			t.Errorf("%s dw: p-value %v, want NaN", name, dw.PValue)
		}
	}
}

func TestBadInput(t *testing.T) {
	fits := macroFits(t)
	f := fits["growth"]
	for name, run := range map[string]func() (Test, error){
		"bg order 0":   func() (Test, error) { return BreuschGodfrey(f, 0) },
		"bg nil":       func() (Test, error) { return BreuschGodfrey(nil, 1) },
		"lb order":     func() (Test, error) { return LjungBox(f.Resid, 0, 0) },
		"lb model df":  func() (Test, error) { return LjungBox(f.Resid, 2, 2) },
		"lb nan":       func() (Test, error) { return LjungBox([]float64{1, math.NaN(), 2, 3}, 1, 0) },
		"jb short":     func() (Test, error) { return JarqueBera([]float64{1, 2}) },
		"jb constant":  func() (Test, error) { return JarqueBera([]float64{1, 1, 1, 1}) },
		"arch short":   func() (Test, error) { return ARCH([]float64{1, 2, 3}, 1) },
		"reset power":  func() (Test, error) { return RESET(f, 1) },
		"bp nil":       func() (Test, error) { return BreuschPagan(nil, true) },
		"dw nil":       func() (Test, error) { return DurbinWatson(nil) },
		"bg too short": func() (Test, error) { return BreuschGodfrey(f, f.N) },
	} {
		if _, err := run(); err == nil {
			t.Errorf("%s: no error", name)
		}
	}
}
