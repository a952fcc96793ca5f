package sysdiag

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/ols"
)

// TestVECMRegressorsEveryCase: in each of the five cases, with two lagged
// differences, unrestricted extra regressors and (in the cases with a
// restricted term) a restricted step dummy, the least-squares residuals of
// Δy_t on the regressors VECMRegressors builds are johansen's own
// short-run residuals, so the regressors span the model's short-run
// regression given β̂. (The columns are also checked one for one against
// statsmodels in TestVECMRegressors.)
func TestVECMRegressorsEveryCase(t *testing.T) {
	const rows, k, lags = 150, 3, 2
	r := rand.New(rand.NewPCG(3, 5))
	y := mat.NewDense(rows, k, nil)
	for i := 1; i < rows; i++ {
		trend := y.At(i-1, 0) + r.NormFloat64()
		y.Set(i, 0, trend)
		y.Set(i, 1, 0.8*trend+r.NormFloat64())
		y.Set(i, 2, y.At(i-1, 2)+0.3*r.NormFloat64()+0.05)
	}
	un := mat.NewDense(rows, 2, nil)
	step := mat.NewDense(rows, 1, nil)
	for i := 0; i < rows; i++ {
		un.Set(i, 0, math.Sin(float64(i)/3))
		un.Set(i, 1, r.NormFloat64())
		if i >= 70 {
			step.Set(i, 0, 1)
		}
	}
	for _, c := range []johansen.Case{johansen.N, johansen.RC, johansen.C, johansen.RT, johansen.CT} {
		x := johansen.Extra{Unrestricted: un}
		if c == johansen.RC || c == johansen.RT {
			x.Restricted = step
		}
		res, err := johansen.TestExtra(y, c, lags, x)
		if err != nil {
			t.Fatalf("%v: %v", c, err)
		}
		m, err := res.Estimate(1, []int{0})
		if err != nil {
			t.Fatalf("%v: %v", c, err)
		}
		z, err := VECMRegressors(y, c, m, x)
		if err != nil {
			t.Fatalf("%v: %v", c, err)
		}
		tt, cols := z.Dims()
		if tt != rows-lags-1 || cols != 1+len(m.Terms) {
			t.Fatalf("%v: %d×%d regressors", c, tt, cols)
		}
		dy := make([]float64, tt)
		for j := 0; j < k; j++ {
			for i := range dy {
				dy[i] = y.At(i+lags+1, j) - y.At(i+lags, j)
			}
			f, err := ols.Regress(dy, z)
			if err != nil {
				t.Fatalf("%v: %v", c, err)
			}
			for i, e := range f.Resid {
				if d := math.Abs(e - m.Resid.At(i, j)); d > 1e-9*(1+math.Abs(e)) {
					t.Fatalf("%v: equation %d, residual %d: %.12g, johansen %.12g", c, j, i, e, m.Resid.At(i, j))
				}
			}
		}
		if _, err := SerialLM(m.Resid, z, 2); err != nil {
			t.Errorf("%v: %v", c, err)
		}
	}
	// Mismatched extra regressors are errors, not panics.
	res, _ := johansen.TestExtra(y, johansen.C, lags, johansen.Extra{Unrestricted: un})
	m, _ := res.Estimate(1, []int{0})
	if _, err := VECMRegressors(y, johansen.C, m, johansen.Extra{}); err == nil {
		t.Error("missing unrestricted regressors accepted")
	}
	if _, err := VECMRegressors(y.Slice(0, rows-1, 0, k).(*mat.Dense), johansen.C, m, johansen.Extra{Unrestricted: un}); err == nil {
		t.Error("levels of the wrong length accepted")
	}
}
