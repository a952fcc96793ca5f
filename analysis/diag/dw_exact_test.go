package diag

import (
	"errors"
	"math"
	"strconv"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/internal/refdata"
)

type dwFixture struct {
	Library, Version string
	Grid             []float64
	MCReps           float64 `json:"mc_reps"`
	Models           map[string]struct {
		Nobs, K     int
		DW          float64
		Eigenvalues []float64
		PLower      float64   `json:"p_lower"`
		CDFGrid     []float64 `json:"cdf_grid"`
		MCPLower    float64   `json:"mc_p_lower"`
		MCCDFGrid   []float64 `json:"mc_cdf_grid"`
	}
}

// dwFits rebuilds the regressions of testdata/scripts/diag_dw_exact.py.
func dwFits(t *testing.T) map[string]*ols.Fit {
	d := refdata.CSVFile(t, "../../testdata/data/macrodata.csv")
	n := len(d["realcons"])
	fit := func(y []float64, cols ...[]float64) *ols.Fit {
		x := mat.NewDense(len(y), len(cols), nil)
		for j, c := range cols {
			for i := range y {
				x.Set(i, j, c[i])
			}
		}
		f, err := ols.Regress(y, x)
		if err != nil {
			t.Fatal(err)
		}
		return f
	}
	ones := func(m int) []float64 {
		c := make([]float64, m)
		for i := range c {
			c[i] = 1
		}
		return c
	}
	logs := func(v []float64) []float64 {
		c := make([]float64, len(v))
		for i, x := range v {
			c[i] = math.Log(x)
		}
		return c
	}
	dlog := func(v []float64) []float64 {
		c := make([]float64, len(v)-1)
		for i := 1; i < len(v); i++ {
			c[i-1] = math.Log(v[i]) - math.Log(v[i-1])
		}
		return c
	}
	return map[string]*ols.Fit{
		"cons_dpi": fit(logs(d["realcons"]), ones(n), logs(d["realdpi"])),
		"infl":     fit(d["infl"], ones(n), d["tbilrate"], d["unemp"]),
		"infl_nc":  fit(d["infl"], d["tbilrate"], d["unemp"]),
		"growth":   fit(dlog(d["realcons"]), ones(n-1), dlog(d["realdpi"]), d["tbilrate"][1:]),
	}
}

// TestDurbinWatsonExactScipy checks the exact null distribution of d on
// four regressions of macrodata.csv against testdata/fixtures/diag_dw_exact.json
// (script testdata/scripts/diag_dw_exact.py, scipy 1.10.1 / numpy 1.24.2 /
// statsmodels 0.13.5):
//   - the eigenvalues of Z'AZ (scipy.linalg.eigvalsh on an SVD null-space
//     basis) to 1e-10 absolute;
//   - P(d ≤ c) at the observed d and at a grid of c, against Imhof's
//     integral by scipy.integrate.quad, to 1e-6 absolute;
//   - the same probabilities against a Monte Carlo simulation of d from
//     least-squares residuals of normal y (10⁶ seeded draws, no
//     eigenvalues), within 4.5 Monte Carlo standard errors plus 1/R;
//   - d itself against statsmodels durbin_watson to 1e-10 relative.
func TestDurbinWatsonExactScipy(t *testing.T) {
	var fx dwFixture
	refdata.JSONFile(t, "../../testdata/fixtures/diag_dw_exact.json", &fx)
	if fx.Library != "scipy" || len(fx.Models) != 4 || len(fx.Grid) == 0 || fx.MCReps < 1e5 {
		t.Fatalf("fixture: library %q, %d models, %d grid points, %g draws", fx.Library, len(fx.Models), len(fx.Grid), fx.MCReps)
	}
	const (
		eigTol = 1e-10
		pTol   = 1e-6
	)
	for name, f := range dwFits(t) {
		want, ok := fx.Models[name]
		if !ok {
			t.Fatalf("no fixture for %s", name)
		}
		if f.N != want.Nobs || f.K != want.K {
			t.Fatalf("%s: N, K = %d, %d; fixture %d, %d", name, f.N, f.K, want.Nobs, want.K)
		}
		nd, err := NewDWNull(f.X())
		if err != nil {
			t.Fatal(err)
		}
		if len(nd.Lambda) != len(want.Eigenvalues) {
			t.Fatalf("%s: %d eigenvalues, scipy %d", name, len(nd.Lambda), len(want.Eigenvalues))
		}
		for i, l := range nd.Lambda {
			if math.Abs(l-want.Eigenvalues[i]) > eigTol {
				t.Errorf("%s: λ_%d = %.14g, scipy %.14g", name, i, l, want.Eigenvalues[i])
			}
		}
		test, upper, err := DurbinWatsonTails(f)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(test.Stat, want.DW); e > 1e-10 {
			t.Errorf("%s: d = %.14g, statsmodels %.14g", name, test.Stat, want.DW)
		}
		if math.Abs(test.PValue-want.PLower) > pTol {
			t.Errorf("%s: P(d ≤ %.6f) = %.12g, scipy quad %.12g", name, test.Stat, test.PValue, want.PLower)
		}
		if math.Abs(upper-(1-want.PLower)) > pTol {
			t.Errorf("%s: P(d ≥ %.6f) = %.12g, scipy quad %.12g", name, test.Stat, upper, 1-want.PLower)
		}
		ex, err := DurbinWatsonExact(f)
		if err != nil || ex != test {
			t.Errorf("%s: DurbinWatsonExact %+v, %v; DurbinWatsonTails %+v", name, ex, err, test)
		}
		mcTol := func(p float64) float64 { return 4.5*math.Sqrt(p*(1-p)/fx.MCReps) + 1/fx.MCReps }
		if math.Abs(test.PValue-want.MCPLower) > mcTol(test.PValue) {
			t.Errorf("%s: P(d ≤ %.6f) = %.6g, Monte Carlo %.6g", name, test.Stat, test.PValue, want.MCPLower)
		}
		for i, c := range fx.Grid {
			p := nd.CDF(c)
			if math.Abs(p-want.CDFGrid[i]) > pTol {
				t.Errorf("%s: P(d ≤ %g) = %.12g, scipy quad %.12g", name, c, p, want.CDFGrid[i])
			}
			if math.Abs(p-want.MCCDFGrid[i]) > mcTol(p) {
				t.Errorf("%s: P(d ≤ %g) = %.6g, Monte Carlo %.6g", name, c, p, want.MCCDFGrid[i])
			}
		}
	}
}

// TestImhofClosedForm checks the integrator on two-term forms with a
// closed form: for a, b > 0, P(a z₁² − b z₂² ≤ 0) = P(|z₁/z₂| ≤ √(b/a))
// = (2/π) arctan √(b/a), z₁/z₂ being standard Cauchy. Tolerance 1e-9.
func TestImhofClosedForm(t *testing.T) {
	for _, c := range []struct{ a, b float64 }{
		{1, 1}, {1, 3}, {3, 1}, {0.01, 2}, {4, 1e-3}, {1e-4, 1e-4},
	} {
		got := imhofLower([]float64{c.a, -c.b})
		want := 2 / math.Pi * math.Atan(math.Sqrt(c.b/c.a))
		if math.Abs(got-want) > 1e-9 {
			t.Errorf("a=%g b=%g: %.15g, closed form %.15g", c.a, c.b, got, want)
		}
	}
	// One sign only: the probability is 0 or 1 exactly.
	if p := imhofLower([]float64{1, 2}); p != 0 {
		t.Errorf("positive form: %g", p)
	}
	if p := imhofLower([]float64{-1, -2}); p != 1 {
		t.Errorf("negative form: %g", p)
	}
}

func TestDurbinWatsonExactBadInput(t *testing.T) {
	if _, err := DurbinWatsonExact(nil); err == nil {
		t.Error("nil fit: no error")
	}
	if _, err := NewDWNull(nil); err == nil {
		t.Error("nil design: no error")
	}
	if _, err := NewDWNull(mat.NewDense(2, 2, []float64{1, 2, 3, 4})); err == nil {
		t.Error("N = K: no error")
	}
	if _, err := NewDWNull(mat.NewDense(3, 2, []float64{1, 2, 1, 2, 1, 2})); err == nil {
		t.Error("collinear design: no error")
	}
	if _, err := NewDWNull(mat.NewDense(3, 1, []float64{1, math.NaN(), 1})); err == nil {
		t.Error("NaN in design: no error")
	}
	if _, err := NewDWNull(mat.NewDense(MaxExactDWObs+1, 1, nil)); !errors.Is(err, ErrDWTooLarge) {
		t.Errorf("too many observations: %v, want ErrDWTooLarge", err)
	}
}

func BenchmarkDWNull(b *testing.B) {
	for _, n := range []int{200, 1000, 2000} {
		x := mat.NewDense(n, 3, nil)
		for i := 0; i < n; i++ {
			x.Set(i, 0, 1)
			x.Set(i, 1, float64(i))
			x.Set(i, 2, math.Sin(float64(i)))
		}
		b.Run(strconv.Itoa(n), func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				nd, err := NewDWNull(x)
				if err != nil {
					b.Fatal(err)
				}
				nd.CDF(1.9)
			}
		})
	}
}
