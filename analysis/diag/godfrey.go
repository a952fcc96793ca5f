package diag

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/ols"
)

// BreuschGodfrey is the Breusch (1978)–Godfrey (1978) LM test for serial
// correlation of order up to r in the residuals e of the fit y = Xβ + e.
//
// The auxiliary regression is
//
//	e_t = x_t'γ + ρ₁e_{t−1} + … + ρ_r e_{t−r} + v_t,  t = 1..N,
//
// with the pre-sample residuals e_0, …, e_{1−r} set to zero (common
// practice, so that all N observations are kept), and a constant added
// when X has none. The statistic is LM = N·R² of that regression, with R²
// centred, asymptotically χ²(r) under no serial correlation.
func BreuschGodfrey(f *ols.Fit, r int) (Test, error) {
	if f == nil {
		return Test{}, ErrNoFit
	}
	if r < 1 {
		return Test{}, fmt.Errorf("diag: Breusch–Godfrey order must be at least 1, got %d", r)
	}
	n := f.N
	if n <= f.K+r+1 {
		return Test{}, fmt.Errorf("diag: Breusch–Godfrey of order %d needs more than %d observations, have %d", r, f.K+r+1, n)
	}
	lags := make([][]float64, r)
	for j := 1; j <= r; j++ {
		c := make([]float64, n)
		for t := j; t < n; t++ {
			c[t] = f.Resid[t-j]
		}
		lags[j-1] = c
	}
	x := f.X()
	aux, err := ols.Regress(f.Resid, design(x, !hasConst(x), n, lags...))
	if err != nil {
		return Test{}, fmt.Errorf("diag: Breusch–Godfrey auxiliary regression: %w", err)
	}
	return chi2Test(fmt.Sprintf("Breusch–Godfrey LM(%d)", r), float64(n)*aux.R2(), r), nil
}
