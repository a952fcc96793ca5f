package coint

import (
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/unitroot"

	"github.com/galley-econ/galley/internal/refdata"
)

type egFixture struct {
	Library, Version string
	Cases            []struct {
		K       int
		Trend   string
		Maxlag  int
		Autolag string
		Stat    float64
		PValue  float64
		Usedlag int
		Nobs    int
		CritSM  []*float64 `json:"crit_sm"`
		CritAtT []float64  `json:"crit_at_T"`
		Static  []float64
	}
}

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

func macroLogs(t *testing.T) (y []float64, x [][]float64) {
	d := refdata.CSVFile(t, "../../testdata/data/macrodata.csv")
	lg := func(c string) []float64 {
		v := make([]float64, len(d[c]))
		for i, a := range d[c] {
			v[i] = math.Log(a)
		}
		return v
	}
	return lg("realcons"), [][]float64{lg("realdpi"), lg("realgdp"), lg("realinv")}
}

// TestEngleGrangerStatsmodels compares the Engle–Granger τ, its lag and
// sample, p-value, critical values and static coefficients with
// statsmodels 0.13.5 coint/adfuller/mackinnoncrit (fixture
// testdata/fixtures/coint_eg_macro.json, script
// testdata/scripts/coint_eg_macro.py): τ and coefficients to 1e-6
// relative; p-values and critical values to 1e-8 relative (both sides
// evaluate the same published polynomials). Critical values are checked
// at galley's T (ADF regression observations) against mackinnoncrit at
// that T, and against coint's own output where the two T agree (p = 0).
func TestEngleGrangerStatsmodels(t *testing.T) {
	var fx egFixture
	refdata.JSONFile(t, "../../testdata/fixtures/coint_eg_macro.json", &fx)
	if len(fx.Cases) == 0 {
		t.Fatal("empty fixture")
	}
	y, xs := macroLogs(t)
	for _, c := range fx.Cases {
		det, err := critical.ParseCase(c.Trend)
		if err != nil {
			t.Fatal(err)
		}
		lr := unitroot.LagRule{Lags: c.Maxlag, Select: unitroot.Fixed}
		if c.Autolag == "aic" {
			lr = unitroot.LagRule{Select: unitroot.AIC, Max: c.Maxlag}
		}
		name := c.Trend + "/" + c.Autolag + "/k=" + string(rune('0'+c.K))
		r, err := EngleGranger(y, xs[:c.K], det, lr)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if r.Lags != c.Usedlag || r.NObs != c.Nobs {
			t.Errorf("%s: lags %d nobs %d, statsmodels %d %d", name, r.Lags, r.NObs, c.Usedlag, c.Nobs)
		}
		if relErr(r.Stat, c.Stat) > 1e-6 {
			t.Errorf("%s: τ %.12g, statsmodels %.12g", name, r.Stat, c.Stat)
		}
		if relErr(r.PValue, c.PValue) > 1e-8 {
			t.Errorf("%s: p %.12g, statsmodels %.12g", name, r.PValue, c.PValue)
		}
		for j, b := range c.Static {
			if relErr(r.Coef[j], b) > 1e-6 {
				t.Errorf("%s: static coef %d %.12g, statsmodels %.12g", name, j, r.Coef[j], b)
			}
		}
		if det == critical.NoConst {
			if r.Crit != nil {
				t.Errorf("%s: critical values %v for case n", name, r.Crit)
			}
			for _, v := range c.CritSM {
				if v != nil {
					t.Errorf("%s: statsmodels gives a critical value for case n", name)
				}
			}
			continue
		}
		if len(r.Crit) != 3 {
			t.Fatalf("%s: %d critical values", name, len(r.Crit))
		}
		for j, cv := range r.Crit {
			if relErr(cv.Value, c.CritAtT[j]) > 1e-8 {
				t.Errorf("%s: crit %g %.12g, statsmodels mackinnoncrit at T=%d %.12g", name, cv.Level, cv.Value, r.NObs, c.CritAtT[j])
			}
			if r.Lags == 0 && relErr(cv.Value, *c.CritSM[j]) > 1e-8 {
				t.Errorf("%s: crit %g %.12g, statsmodels coint %.12g", name, cv.Level, cv.Value, *c.CritSM[j])
			}
		}
		if !strings.Contains(r.CritSource, "MacKinnon (2010)") {
			t.Errorf("%s: source %q", name, r.CritSource)
		}
	}
}

func TestEngleGrangerEach(t *testing.T) {
	y, xs := macroLogs(t)
	all, err := EngleGrangerEach([][]float64{y, xs[0], xs[1]}, critical.Const, unitroot.LagRule{Lags: 1})
	if err != nil {
		t.Fatal(err)
	}
	for i, r := range all {
		x := [][]float64{}
		for j, v := range [][]float64{y, xs[0], xs[1]} {
			if j != i {
				x = append(x, v)
			}
		}
		want, err := EngleGranger([][]float64{y, xs[0], xs[1]}[i], x, critical.Const, unitroot.LagRule{Lags: 1})
		if err != nil {
			t.Fatal(err)
		}
		if r.Stat != want.Stat {
			t.Errorf("normalisation %d: τ %g, direct %g", i, r.Stat, want.Stat)
		}
	}
	if all[0].Stat == all[1].Stat {
		t.Error("normalisations give identical statistics")
	}
}

func TestEngleGrangerErrors(t *testing.T) {
	y, xs := macroLogs(t)
	lr := unitroot.LagRule{Lags: 1}
	if _, err := EngleGranger(y, nil, critical.Const, lr); err == nil {
		t.Error("no regressors: no error")
	}
	_, err := EngleGranger(y, [][]float64{xs[0], xs[1], xs[0]}, critical.Const, lr)
	if err == nil || !strings.Contains(err.Error(), "x[2]") {
		t.Errorf("collinear regressor: error %v does not name x[2]", err)
	}
	many := make([][]float64, critical.MaxTauN)
	for i := range many {
		many[i] = xs[i%3]
	}
	if _, err := EngleGranger(y, many, critical.Const, lr); err == nil || !strings.Contains(err.Error(), "simulate") {
		t.Errorf("too many variables: %v", err)
	}
	if _, err := EngleGranger(y, [][]float64{xs[0][:50]}, critical.Const, lr); err == nil {
		t.Error("length mismatch: no error")
	}
	if _, err := EngleGranger(y, [][]float64{y}, critical.Const, lr); err == nil {
		t.Error("exact relation: no error")
	}
	if _, err := EngleGrangerEach([][]float64{y}, critical.Const, lr); err == nil {
		t.Error("one series: no error")
	}
	// Between the p-value table (N ≤ 6) and the critical-value table
	// (N ≤ 12) the test runs with critical values and a NaN p-value.
	six := [][]float64{xs[0], xs[1], xs[2], make([]float64, len(y)), make([]float64, len(y)), make([]float64, len(y))}
	for i := range y {
		six[3][i] = math.Sin(float64(i)) + float64(i)/50
		six[4][i] = math.Cos(float64(i)/3) * float64(i) / 100
		six[5][i] = math.Sqrt(float64(i + 1))
	}
	r, err := EngleGranger(y, six, critical.Const, lr)
	if err != nil {
		t.Fatal(err)
	}
	if !math.IsNaN(r.PValue) || len(r.Crit) != 3 {
		t.Errorf("N=7: p %g, %d critical values", r.PValue, len(r.Crit))
	}
}
