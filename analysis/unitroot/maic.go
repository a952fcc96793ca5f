package unitroot

import (
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/ols"
	"gonum.org/v1/gonum/mat"
)

// selectMAIC chooses the number of lagged differences by the modified
// Akaike criterion (MAIC) of Ng and Perron (2001, Section 3, the MIC
// family with penalty C_T = 2). For k = 0..kmax, on the common sample
// t = kmax+2..T of N = T − 1 − kmax observations (the "T − kmax"
// observations of the paper, whose series starts at t = 0), fit
//
//	Δỹ_t = b₀ ỹ_{t−1} + Σ_{j=1..k} b_j Δỹ_{t−j} + e_{tk}
//
// and evaluate
//
//	MAIC(k) = ln σ̂²_k + 2 (τ_T(k) + k) / N,
//	σ̂²_k = SSR_k / N,   τ_T(k) = b̂₀² Σ_t ỹ²_{t−1} / σ̂²_k,
//
// the sum over the common sample. The regression has no deterministic
// terms (d must be 0): ỹ is a detrended series, GLS-detrended for DF-GLS
// and the Ng–Perron M tests. The values for every k are returned with
// the minimiser (the smallest k on ties); a rank-deficient k gets +Inf.
//
// Each k is a separate least-squares fit (package ols), because τ_T(k)
// needs b̂₀ of every sub-model, which the nested factorisation used for
// AIC and BIC does not give.
func selectMAIC(y []float64, d, max int) ([]float64, int, error) {
	if d != 0 {
		return nil, 0, fmt.Errorf("unitroot: the MAIC lag selector needs a detrended series without deterministic terms in the regression (DF-GLS, Ng–Perron), not %d deterministic regressors", d)
	}
	det, _ := caseDet(0)
	cols, n := selectionColumns(y, det, 0, max)
	lev := cols[0] // ỹ_{t−1}
	var s float64
	for _, v := range lev {
		s += v * v
	}
	if s == 0 {
		return nil, 0, fmt.Errorf("unitroot: the lagged level is zero on the MAIC comparison sample")
	}
	dy := cols[max+1]
	nf := float64(n)
	ic := make([]float64, max+1)
	best := -1
	for k := 0; k <= max; k++ {
		x := mat.NewDense(n, k+1, nil)
		for j := 0; j <= k; j++ {
			x.SetCol(j, cols[j])
		}
		fit, err := ols.Regress(dy, x)
		if err != nil || fit.SSR <= 0 {
			ic[k] = math.Inf(1)
			continue
		}
		s2 := fit.SSR / nf
		tau := fit.Coef[0] * fit.Coef[0] * s / s2
		ic[k] = math.Log(s2) + 2*(tau+float64(k))/nf
		if best < 0 || ic[k] < ic[best] {
			best = k
		}
	}
	if best < 0 {
		return nil, 0, fmt.Errorf("unitroot: no lag order in 0..%d gives a full-rank MAIC regression", max)
	}
	return ic, best, nil
}
