package diag

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/ols"
)

// BreuschPagan is the Breusch and Pagan (1979) LM test for
// heteroskedasticity that depends on the regressors X of the fit. With
// the p non-constant columns of X (a constant is added to the auxiliary
// regression when X has none):
//
// studentised (Koenker 1981, robust to non-normal errors):
//
//	e_t² = x_t'γ + v_t,  LM = N·R²;
//
// original (Breusch and Pagan 1979, assumes normal errors):
//
//	e_t²/σ̃² = x_t'γ + v_t,  σ̃² = e'e/N,  LM = ESS/2,
//
// where ESS is the centred explained sum of squares. Both are
// asymptotically χ²(p) under homoskedasticity.
func BreuschPagan(f *ols.Fit, studentised bool) (Test, error) {
	if f == nil {
		return Test{}, ErrNoFit
	}
	x := f.X()
	c := hasConst(x)
	p := f.K
	if c {
		p--
	}
	if p < 1 {
		return Test{}, fmt.Errorf("diag: Breusch–Pagan needs at least one non-constant regressor")
	}
	if f.SSR == 0 {
		return Test{}, fmt.Errorf("diag: Breusch–Pagan: the residuals are all zero")
	}
	n := f.N
	s2 := f.SSR / float64(n)
	y := make([]float64, n)
	for t, e := range f.Resid {
		y[t] = e * e
		if !studentised {
			y[t] /= s2
		}
	}
	aux, err := ols.Regress(y, design(x, !c, n))
	if err != nil {
		return Test{}, fmt.Errorf("diag: Breusch–Pagan auxiliary regression: %w", err)
	}
	if studentised {
		return chi2Test("Breusch–Pagan LM (studentised)", float64(n)*aux.R2(), p), nil
	}
	return chi2Test("Breusch–Pagan LM", (aux.TSS-aux.SSR)/2, p), nil
}
