package diag

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/ols"
)

// ARCH is Engle's (1982) LM test for autoregressive conditional
// heteroskedasticity of order r. The auxiliary regression is
//
//	e_t² = γ₀ + γ₁e²_{t−1} + … + γ_r e²_{t−r} + v_t,  t = r+1..N,
//
// on the N − r observations for which all lags exist, and the statistic
// is LM = (N − r)·R², asymptotically χ²(r) under no ARCH.
func ARCH(e []float64, r int) (Test, error) {
	n := len(e)
	if r < 1 {
		return Test{}, fmt.Errorf("diag: ARCH order must be at least 1, got %d", r)
	}
	if n-r <= r+1 {
		return Test{}, fmt.Errorf("diag: ARCH of order %d needs more than %d observations, have %d", r, 2*r+1, n)
	}
	if err := checkFinite("residual", e); err != nil {
		return Test{}, err
	}
	m := n - r
	y := make([]float64, m)
	cols := make([][]float64, r)
	for j := range cols {
		cols[j] = make([]float64, m)
	}
	for t := r; t < n; t++ {
		y[t-r] = e[t] * e[t]
		for j := 1; j <= r; j++ {
			cols[j-1][t-r] = e[t-j] * e[t-j]
		}
	}
	aux, err := ols.Regress(y, design(nil, true, m, cols...))
	if err != nil {
		return Test{}, fmt.Errorf("diag: ARCH auxiliary regression: %w", err)
	}
	return chi2Test(fmt.Sprintf("ARCH LM(%d)", r), float64(m)*aux.R2(), r), nil
}
