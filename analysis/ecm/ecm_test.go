package ecm

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/ols"

	"github.com/galley-econ/galley/internal/refdata"
)

type ecmFixture struct {
	Library, Version string
	Cases            []struct {
		Name        string
		Y           string
		X           []string
		P, Q        int
		Extra       []string
		Names       []string
		First, Last int
		Nobs        int
		Fits        map[string]struct{ Coef, SE []float64 }
	}
}

func relErr(got, want float64) float64 {
	if want == 0 {
		return math.Abs(got)
	}
	return math.Abs(got-want) / math.Abs(want)
}

// staticResid is the residual of y on a constant and xs (levels).
func staticResid(t *testing.T, y []float64, xs [][]float64) []float64 {
	x := mat.NewDense(len(y), 1+len(xs), nil)
	for i := range y {
		x.Set(i, 0, 1)
		for k, c := range xs {
			x.Set(i, k+1, c[i])
		}
	}
	f, err := ols.Regress(y, x)
	if err != nil {
		t.Fatal(err)
	}
	return f.Resid
}

// TestAgainstStatsmodels compares coefficients and standard errors (ols,
// hc1, hac(4)) with statsmodels 0.13.5 OLS on regressors built
// independently with pandas (fixture testdata/fixtures/ecm_macro.json,
// script testdata/scripts/ecm_macro.py), to 1e-8 relative.
func TestAgainstStatsmodels(t *testing.T) {
	var fx ecmFixture
	refdata.JSONFile(t, "../../testdata/fixtures/ecm_macro.json", &fx)
	d := refdata.CSVFile(t, "../../testdata/data/macrodata.csv")
	n := len(d["realcons"])
	vars := map[string][]float64{"lc": make([]float64, n), "ly": make([]float64, n), "r": d["tbilrate"], "infl": d["infl"]}
	for i := 0; i < n; i++ {
		vars["lc"][i] = math.Log(d["realcons"][i])
		vars["ly"][i] = math.Log(d["realdpi"][i])
	}
	const tol = 1e-8
	if len(fx.Cases) == 0 {
		t.Fatal("empty fixture")
	}
	for _, c := range fx.Cases {
		in := Input{Y: vars[c.Y], YName: c.Y, XNames: c.X, ExtraNames: c.Extra}
		for _, x := range c.X {
			in.X = append(in.X, vars[x])
		}
		for _, e := range c.Extra {
			in.Extra = append(in.Extra, vars[e])
		}
		in.ECT = staticResid(t, in.Y, in.X)
		for cs, want := range c.Fits {
			cov, err := ols.ParseCov(cs)
			if err != nil {
				t.Fatal(err)
			}
			m, err := Estimate(in, Spec{YLags: c.P, XLags: c.Q, Cov: cov})
			if err != nil {
				t.Fatalf("%s %s: %v", c.Name, cs, err)
			}
			if m.First != c.First || m.Last != c.Last || m.Fit.N != c.Nobs {
				t.Errorf("%s: sample %d..%d (N=%d), statsmodels %d..%d (N=%d)", c.Name, m.First, m.Last, m.Fit.N, c.First, c.Last, c.Nobs)
			}
			if len(m.Names) != len(c.Names) {
				t.Fatalf("%s: names %v, want %v", c.Name, m.Names, c.Names)
			}
			for j := range c.Names {
				if m.Names[j] != refdata.TermName(c.Names[j]) {
					t.Errorf("%s: name %d %q, want %q", c.Name, j, m.Names[j], c.Names[j])
				}
				if e := relErr(m.Coef[j].Est, want.Coef[j]); e > tol {
					t.Errorf("%s %s %s: coef %.12g, statsmodels %.12g", c.Name, cs, c.Names[j], m.Coef[j].Est, want.Coef[j])
				}
				if e := relErr(m.Coef[j].SE, want.SE[j]); e > tol {
					t.Errorf("%s %s %s: se %.12g, statsmodels %.12g", c.Name, cs, c.Names[j], m.Coef[j].SE, want.SE[j])
				}
			}
			if m.Adjust.Alpha != m.Coef[1].Est || m.Adjust.SE != m.Coef[1].SE {
				t.Errorf("%s: adjustment %+v does not carry the ect(-1) row", c.Name, m.Adjust)
			}
		}
	}
}

// TestHalfLife checks h = ln 0.5 / ln|1+α| at points where it is exact by
// hand, and the delta-method slope against a central finite difference.
func TestHalfLife(t *testing.T) {
	for _, c := range []struct {
		alpha, h float64
		has      bool
	}{
		{-0.5, 1, true},    // ln 0.5 / ln 0.5
		{-0.75, 0.5, true}, // ln 0.5 / ln 0.25
		{-1 + math.Pow(0.5, 0.25), 4, true},
		{-1.5, 1, true}, // |1+α| = 0.5, overshooting
		{0, math.NaN(), false},
		{0.1, math.NaN(), false},
		{-2, math.NaN(), false},
		{-2.5, math.NaN(), false},
	} {
		a := NewAdjustment(c.alpha, 0.01)
		if a.HasHalfLife != c.has {
			t.Errorf("α=%g: HasHalfLife %v", c.alpha, a.HasHalfLife)
			continue
		}
		if !c.has {
			if !math.IsNaN(a.HalfLife) || !math.IsNaN(a.HalfLifeSE) {
				t.Errorf("α=%g: half-life %g ± %g, want NaN", c.alpha, a.HalfLife, a.HalfLifeSE)
			}
			continue
		}
		if relErr(a.HalfLife, c.h) > 1e-12 {
			t.Errorf("α=%g: half-life %.15g, want %g", c.alpha, a.HalfLife, c.h)
		}
		const eps = 1e-6
		h := func(x float64) float64 { return NewAdjustment(x, 0).HalfLife }
		slope := (h(c.alpha+eps) - h(c.alpha-eps)) / (2 * eps)
		if relErr(a.HalfLifeSE, math.Abs(slope)*0.01) > 1e-6 {
			t.Errorf("α=%g: SE %.10g, finite difference %.10g", c.alpha, a.HalfLifeSE, math.Abs(slope)*0.01)
		}
	}
	if a := NewAdjustment(-1, 0.1); a.HalfLife != 0 || !math.IsInf(a.HalfLifeSE, 1) {
		t.Errorf("α=−1: %+v", a)
	}
}

func TestBadInput(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	y := make([]float64, 12)
	x := make([]float64, 12)
	for i := 1; i < len(y); i++ {
		x[i] = x[i-1] + rng.NormFloat64()
		y[i] = 0.5*y[i-1] + 0.5*x[i] + rng.NormFloat64()
	}
	z := make([]float64, len(y))
	for i := range z {
		z[i] = y[i] - x[i]
	}
	gap := append([]float64(nil), z...)
	gap[6] = math.NaN()
	for name, in := range map[string]Input{
		"empty":       {},
		"ect length":  {Y: y, X: [][]float64{x}, ECT: z[:5]},
		"x length":    {Y: y, X: [][]float64{x[:4]}, ECT: z},
		"names":       {Y: y, X: [][]float64{x}, XNames: []string{"a", "b"}, ECT: z},
		"gap":         {Y: y, X: [][]float64{x}, ECT: gap},
		"collinear":   {Y: y, X: [][]float64{x, x}, ECT: z},
		"few obs":     {Y: y[:4], X: [][]float64{x[:4]}, ECT: z[:4]},
		"extra names": {Y: y, X: [][]float64{x}, ECT: z, Extra: [][]float64{x}, ExtraNames: []string{}},
	} {
		if _, err := Estimate(in, Spec{YLags: 1, XLags: 1}); err == nil {
			t.Errorf("%s: no error", name)
		}
	}
	if _, err := Estimate(Input{Y: y, X: [][]float64{x}, ECT: z}, Spec{YLags: -1}); err == nil {
		t.Error("negative lag: no error")
	}
	// NaN only at the start of the equilibrium error trims the sample.
	lead := append([]float64(nil), z...)
	lead[0], lead[1] = math.NaN(), math.NaN()
	m, err := Estimate(Input{Y: y, X: [][]float64{x}, ECT: lead}, Spec{})
	if err != nil {
		t.Fatal(err)
	}
	if m.First != 3 || m.Last != len(y)-1 {
		t.Errorf("trimmed sample %d..%d, want 3..%d", m.First, m.Last, len(y)-1)
	}
}
