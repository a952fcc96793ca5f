package coint

import (
	"math"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/unitroot"

	"github.com/galley-econ/galley/internal/refdata"
)

type ghCase struct {
	Name, Y, Model, Select string
	X                      []string
	Trim                   float64
	Lags, Max              int
	Bandwidth              *int
	N, First, Last, BW     int
	Path                   struct {
		ADF, ZA, ZT []float64
		Lags        []int
	}
	ADF struct {
		Stat        float64
		Break, Lags int
	}
	ZT, ZA struct {
		Stat  float64
		Break int
	}
}

func ghSeries(t *testing.T) map[string][]float64 {
	m := refdata.CSVFile(t, "../../testdata/data/macrodata.csv")
	d := refdata.CSVFile(t, "../../testdata/data/denmark.csv")
	lg := func(v []float64) []float64 {
		out := make([]float64, len(v))
		for i, a := range v {
			out[i] = math.Log(a)
		}
		return out
	}
	return map[string][]float64{"lc": lg(m["realcons"]), "ly": lg(m["realdpi"]), "li": lg(m["realinv"]),
		"lrm": d["LRM"], "lry": d["LRY"]}
}

// TestGregoryHansenNumpy compares ADF(τ), Zt(τ) and Zα(τ) at every
// candidate break, the chosen lags, the minima and their dates with an
// independent numpy 1.24.2 implementation of the formulas of Gregory and
// Hansen (1996) (lag choice by statsmodels 0.13.5 adfuller where a
// criterion chooses; fixture testdata/fixtures/coint_gh_macro.json,
// script testdata/scripts/coint_gh_macro.py) on the US macro and Danish
// money data, to 1e-8 relative.
func TestGregoryHansenNumpy(t *testing.T) {
	var fx struct {
		Library string
		Cases   []ghCase
	}
	refdata.JSONFile(t, "../../testdata/fixtures/coint_gh_macro.json", &fx)
	if len(fx.Cases) < 5 {
		t.Fatal("incomplete fixture coint_gh_macro.json")
	}
	v := ghSeries(t)
	const tol = 1e-8
	for _, c := range fx.Cases {
		m, err := ParseGHModel(c.Model)
		if err != nil {
			t.Fatal(err)
		}
		var x [][]float64
		for _, n := range c.X {
			x = append(x, v[n])
		}
		lr := unitroot.LagRule{Lags: c.Lags}
		if c.Select == "aic" {
			lr = unitroot.LagRule{Select: unitroot.AIC, Max: c.Max}
		}
		bw := unitroot.Bandwidth{Rule: unitroot.Schwert4}
		if c.Bandwidth != nil {
			bw = unitroot.Bandwidth{Rule: unitroot.Given, Lags: *c.Bandwidth}
		}
		r, err := GregoryHansen(v[c.Y], x, m, c.Trim, lr, bw)
		if err != nil {
			t.Fatalf("%s: %v", c.Name, err)
		}
		if r.First != c.First || r.Last != c.Last || len(r.PathADF) != len(c.Path.ADF) {
			t.Fatalf("%s: breaks %d..%d (%d), numpy %d..%d (%d)", c.Name, r.First, r.Last, len(r.PathADF), c.First, c.Last, len(c.Path.ADF))
		}
		for i := range c.Path.ADF {
			if relErr(r.PathADF[i], c.Path.ADF[i]) > tol || relErr(r.PathZt[i], c.Path.ZT[i]) > tol ||
				relErr(r.PathZa[i], c.Path.ZA[i]) > tol || r.PathLags[i] != c.Path.Lags[i] || r.PathBW[i] != c.BW {
				t.Fatalf("%s at break %d: ADF %.12g (%d lags) Zt %.12g Zα %.12g L=%d; numpy %.12g (%d) %.12g %.12g L=%d", c.Name, c.First+i,
					r.PathADF[i], r.PathLags[i], r.PathZt[i], r.PathZa[i], r.PathBW[i], c.Path.ADF[i], c.Path.Lags[i], c.Path.ZT[i], c.Path.ZA[i], c.BW)
			}
		}
		if relErr(r.ADF.Stat, c.ADF.Stat) > tol || r.ADF.Break != c.ADF.Break || r.ADF.Lags != c.ADF.Lags ||
			relErr(r.Zt.Stat, c.ZT.Stat) > tol || r.Zt.Break != c.ZT.Break ||
			relErr(r.Za.Stat, c.ZA.Stat) > tol || r.Za.Break != c.ZA.Break {
			t.Errorf("%s: ADF* %.10g@%d Zt* %.10g@%d Zα* %.10g@%d; numpy %v %v %v", c.Name, r.ADF.Stat, r.ADF.Break, r.Zt.Stat, r.Zt.Break, r.Za.Stat, r.Za.Break, c.ADF, c.ZT, c.ZA)
		}
	}
}

// TestGHCriticalTable: the tabulated values are the published ones
// (Gregory and Hansen 1996, Table 1) at a few spot entries, ordered
// within each row, and absent beyond four regressors.
func TestGHCriticalTable(t *testing.T) {
	tz, za, ok := GHCritical(1, GHLevel)
	if !ok || tz[0].Value != -5.13 || tz[1].Value != -4.61 || za[2].Value != -36.19 {
		t.Fatalf("m=1 C: %v %v", tz, za)
	}
	tz, za, _ = GHCritical(4, GHRegime)
	if tz[0].Value != -6.92 || za[0].Value != -90.35 {
		t.Fatalf("m=4 C/S: %v %v", tz, za)
	}
	for m := 1; m <= MaxGHRegressors; m++ {
		for md := GHLevel; md <= GHRegime; md++ {
			tz, za, _ := GHCritical(m, md)
			for i := 1; i < 3; i++ {
				if !(tz[i].Value > tz[i-1].Value) || !(za[i].Value > za[i-1].Value) {
					t.Errorf("m=%d %v: not increasing %v %v", m, md, tz, za)
				}
			}
		}
	}
	if _, _, ok := GHCritical(5, GHLevel); ok {
		t.Error("m=5 tabulated")
	}
}

// TestGregoryHansenBadInput: no candidate date, too few observations,
// non-finite data: errors, not panics.
func TestGregoryHansenBadInput(t *testing.T) {
	v := ghSeries(t)
	y, x := v["lrm"][:10], [][]float64{v["lry"][:10]}
	if _, err := GregoryHansen(y, x, GHLevel, 0.15, unitroot.LagRule{}, unitroot.Bandwidth{}); err == nil || !strings.Contains(err.Error(), "too few") {
		t.Errorf("10 observations: %v", err)
	}
	y, x = v["lrm"], [][]float64{v["lry"]}
	if _, err := GregoryHansen(y, x, GHLevel, 0.6, unitroot.LagRule{}, unitroot.Bandwidth{}); err == nil || !strings.Contains(err.Error(), "trimming") {
		t.Errorf("trim 0.6: %v", err)
	}
	if _, err := GregoryHansen(y[:21], [][]float64{x[0][:21]}, GHRegime, 0.49, unitroot.LagRule{}, unitroot.Bandwidth{}); err == nil || !strings.Contains(err.Error(), "no candidate break") {
		t.Errorf("trim 0.49 with 21 observations: %v", err)
	}
	bad := append([]float64(nil), y...)
	bad[3] = math.NaN()
	if _, err := GregoryHansen(bad, x, GHLevel, 0.15, unitroot.LagRule{}, unitroot.Bandwidth{}); err == nil {
		t.Error("NaN accepted")
	}
	if _, err := GregoryHansen(y, nil, GHLevel, 0.15, unitroot.LagRule{}, unitroot.Bandwidth{}); err == nil {
		t.Error("no regressors accepted")
	}
}
