package coint

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
)

// POResult holds the Phillips–Ouliaris residual-based tests.
type POResult struct {
	Pu float64 // variance-ratio statistic P̂u
	Pz float64 // multivariate trace statistic P̂z
	// CritPu and CritPz are the 1%, 5% and 10% asymptotic critical values
	// (reject no cointegration for larger statistics).
	CritPu, CritPz []critical.Value
	CritSource     string
	Det            critical.Case
	Lags           int           // Bartlett truncation lag l
	NObs           int           // N = T − 1, observations of the VAR(1)
	Omega          *mat.SymDense // Ω̂ of the VAR(1) residuals, y first
	Omega11_2      float64       // ω̂₁₁·₂
	Coef           []float64     // static coefficients: deterministic terms, then x
	Resid          []float64     // static residuals û_t, t = 1..T
}

// PhillipsOuliaris computes the P̂u and P̂z tests of the null of no
// cointegration among z_t = (y_t, x_t')', t = 1..T, of Phillips and
// Ouliaris (1990), with the deterministic terms of det (n, c or ct):
//
//  1. û_t, t = 1..T: residuals of the static OLS of y_t on the
//     deterministic terms and x_t;
//  2. ξ̂_t, t = 2..T: residuals of the VAR(1) regression of z_t on
//     z_{t−1} and the deterministic terms; N = T − 1;
//  3. Ω̂ = N⁻¹ [Σ ξ̂_tξ̂_t' + Σ_{s=1..l} (1 − s/(l+1)) Σ_t (ξ̂_tξ̂_{t−s}' +
//     ξ̂_{t−s}ξ̂_t')] (Bartlett weights, truncation l = lags), and
//     ω̂₁₁·₂ = ω̂₁₁ − ω̂₂₁'Ω̂₂₂⁻¹ω̂₂₁;
//  4. P̂u = N ω̂₁₁·₂ / (N⁻¹ Σ_{t=1..T} û_t²);
//  5. P̂z = N tr(Ω̂ M⁻¹), M = N⁻¹ Σ_{t=2..T} z̃_t z̃_t', where z̃_t is z_t
//     (case n) or the residual of z_t on the deterministic terms over
//     t = 2..T (cases c and ct).
//
// N = T − 1 stands for the paper's T throughout (asymptotically the
// same). P̂z does not depend on which variable is called y. Critical
// values are from POCritical. lags is the Bartlett truncation lag;
// ⌊4(N/100)^{1/4}⌋ and ⌊12(N/100)^{1/4}⌋ (rules.Schwert4.Lag(N) and
// rules.Schwert12.Lag(N)) are common choices.
func PhillipsOuliaris(y []float64, x [][]float64, det critical.Case, lags int) (*POResult, error) {
	k := len(x)
	if k < 1 {
		return nil, errors.New("coint: Phillips–Ouliaris needs at least one regressor")
	}
	if det < critical.NoConst || det > critical.ConstTrend {
		return nil, fmt.Errorf("coint: Phillips–Ouliaris supports cases n, c and ct, not %v", det)
	}
	critPu, err := POCritical(k, det, false)
	if err != nil {
		return nil, err
	}
	critPz, _ := POCritical(k, det, true)
	if lags < 0 {
		return nil, fmt.Errorf("coint: Bartlett lag %d is negative", lags)
	}
	for i, v := range y {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("coint: y[%d] is not finite", i)
		}
	}
	for j, c := range x {
		for i, v := range c {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, fmt.Errorf("coint: x[%d][%d] is not finite", j, i)
			}
		}
	}
	static, err := staticFit(y, x, det)
	if err != nil {
		return nil, err
	}
	tt := len(y)
	n := tt - 1
	m := k + 1
	nd := det.Deterministics()
	if lags >= n {
		return nil, fmt.Errorf("coint: Bartlett lag %d not below the %d VAR observations", lags, n)
	}
	if n <= nd+m+1 {
		return nil, fmt.Errorf("coint: %d observations are too few for the VAR(1) in %d variables", tt, m)
	}
	zAt := func(t, a int) float64 {
		if a == 0 {
			return y[t]
		}
		return x[a-1][t]
	}
	// VAR(1) design [det | z_{t−1}] and the deterministic-only design.
	full := mat.NewDense(n, nd+m, nil)
	var dOnly *mat.Dense
	if nd > 0 {
		dOnly = mat.NewDense(n, nd, nil)
	}
	for i := 0; i < n; i++ {
		s := float64(i + 1)
		for j := 0; j < nd; j++ {
			v := math.Pow(s, float64(j))
			full.Set(i, j, v)
			dOnly.Set(i, j, v)
		}
		for a := 0; a < m; a++ {
			full.Set(i, nd+a, zAt(i, a))
		}
	}
	xi := mat.NewDense(n, m, nil)
	zt := mat.NewDense(n, m, nil)
	for a := 0; a < m; a++ {
		col := make([]float64, n)
		for i := 0; i < n; i++ {
			col[i] = zAt(i+1, a)
		}
		f, err := ols.Regress(col, full)
		if err != nil {
			return nil, fmt.Errorf("coint: VAR(1) regression: %w", err)
		}
		xi.SetCol(a, f.Resid)
		if dOnly != nil {
			g, err := ols.Regress(col, dOnly)
			if err != nil {
				return nil, fmt.Errorf("coint: detrending: %w", err)
			}
			zt.SetCol(a, g.Resid)
		} else {
			zt.SetCol(a, col)
		}
	}
	omega := ols.BartlettLRV(xi, lags)
	omega.ScaleSym(1/float64(n), omega)

	o22 := mat.NewSymDense(k, nil)
	o21 := mat.NewVecDense(k, nil)
	for a := 0; a < k; a++ {
		o21.SetVec(a, omega.At(1+a, 0))
		for b := a; b < k; b++ {
			o22.SetSym(a, b, omega.At(1+a, 1+b))
		}
	}
	var ch mat.Cholesky
	if !ch.Factorize(o22) {
		return nil, errors.New("coint: the long-run covariance of the regressors' VAR residuals is not positive definite")
	}
	var g mat.VecDense
	if err := ch.SolveVecTo(&g, o21); err != nil {
		return nil, fmt.Errorf("coint: %w", err)
	}
	o112 := omega.At(0, 0) - mat.Dot(o21, &g)
	pu := float64(n) * o112 / (static.SSR / float64(n))

	var mzz mat.SymDense
	mzz.SymOuterK(1/float64(n), zt.T())
	var mc mat.Cholesky
	if !mc.Factorize(&mzz) {
		return nil, errors.New("coint: the moment matrix of the (detrended) levels is not positive definite")
	}
	var minv mat.SymDense
	if err := mc.InverseTo(&minv); err != nil {
		return nil, fmt.Errorf("coint: %w", err)
	}
	var prod mat.Dense
	prod.Mul(omega, &minv)
	pz := float64(n) * mat.Trace(&prod)

	return &POResult{
		Pu: pu, Pz: pz, CritPu: critPu, CritPz: critPz,
		CritSource: fmt.Sprintf("Phillips and Ouliaris (1990), Tables I%s and II%s (asymptotic), k=%d, case %v", poTableLetter(det), poTableLetter(det), k, det),
		Det:        det, Lags: lags, NObs: n, Omega: omega, Omega11_2: o112,
		Coef: append([]float64(nil), static.Coef...), Resid: static.Resid,
	}, nil
}

func poTableLetter(c critical.Case) string { return string(rune('a' + int(c))) }
