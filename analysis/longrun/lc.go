package longrun

import (
	"errors"
	"fmt"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
)

// LcTest is Hansen's (1992) Lc test of the stability of a cointegrating
// regression.
type LcTest struct {
	Stat float64
	// Crit are the upper-tail 1%, 5% and 10% critical values (reject
	// stability for Stat above them); nil when not tabulated.
	Crit       []critical.Value
	CritSource string
	M          int // stochastic regressors
}

// HansenLc computes the Lc statistic of Hansen (1992) from a fully
// modified OLS fit r of y on x (FMOLS with the same y, x and
// deterministic case det): with z_t = (d_t', x_t')', t = 2..T (N = T − 1
// observations), y⁺_t = y_t − ω̂₁₂Ω̂₂₂⁻¹v̂_t and θ̂⁺ the FMOLS estimate,
//
//	û⁺_t = y⁺_t − z_t'θ̂⁺,
//	ŝ_t  = z_t û⁺_t − (0', Δ̂⁺₂₁')'        (the correction on the rows of x),
//	Ŝ_t  = Σ_{i≤t} ŝ_i                    (Ŝ_N = 0 by the FMOLS equations),
//	Lc   = N⁻¹ Σ_t Ŝ_t' (ω̂₁·₂ Z'Z)⁻¹ Ŝ_t,
//
// the LM-type statistic for the null of constant coefficients (all of
// them, deterministic terms included) against a martingale in the
// coefficients (Hansen 1992, Section 3); N⁻¹ makes it O_p(1). Large
// values reject stability. Critical values: LcCritical, for cases c and
// ct with m = 1..4 regressors.
func HansenLc(y []float64, x [][]float64, det critical.Case, r *FMOLSResult) (*LcTest, error) {
	if r == nil {
		return nil, errors.New("lc: no FMOLS fit")
	}
	k := len(x)
	nd := det.Deterministics()
	p := nd + k
	n := r.N
	if len(y) != n+1 || len(r.Coef) != p {
		return nil, fmt.Errorf("lc: the FMOLS fit has %d coefficients and %d observations for %d regressors and %d observations", len(r.Coef), r.N, p, len(y)-1)
	}
	omega := r.Omega
	o22 := subCov(omega, 1, k)
	var ch mat.Cholesky
	if !ch.Factorize(o22) {
		return nil, errors.New("lc: the long-run covariance of Δx is not positive definite")
	}
	o21 := mat.NewVecDense(k, nil)
	for a := 0; a < k; a++ {
		o21.SetVec(a, omega.At(1+a, 0))
	}
	var g mat.VecDense
	if err := ch.SolveVecTo(&g, o21); err != nil {
		return nil, fmt.Errorf("lc: %w", err)
	}
	dplus := make([]float64, k)
	for a := 0; a < k; a++ {
		v := r.Delta.At(1+a, 0)
		for c := 0; c < k; c++ {
			v -= r.Delta.At(1+a, 1+c) * g.AtVec(c)
		}
		dplus[a] = v
	}
	means := make([]float64, k)
	for a, xc := range x {
		for i := 0; i < n; i++ {
			means[a] += xc[i+1] - xc[i]
		}
		means[a] /= float64(n)
	}
	z := make([]float64, p)
	S := make([]float64, p)
	Ss := mat.NewDense(n, p, nil)
	for i := 0; i < n; i++ {
		t := i + 1
		for j := 0; j < nd; j++ {
			z[j] = detValue(j, t)
		}
		for a, xc := range x {
			z[nd+a] = xc[t]
		}
		u := y[t]
		for a, xc := range x {
			u -= g.AtVec(a) * (xc[t] - xc[t-1] - means[a])
		}
		for j := 0; j < p; j++ {
			u -= z[j] * r.Coef[j]
		}
		for j := 0; j < p; j++ {
			S[j] += z[j] * u
			if j >= nd {
				S[j] -= dplus[j-nd]
			}
		}
		Ss.SetRow(i, S)
	}
	// Σ_t Ŝ_t'(Z'Z)⁻¹Ŝ_t = tr(Ŝ (Z'Z)⁻¹ Ŝ'), with (Z'Z)⁻¹ from the static fit.
	var sm mat.Dense
	sm.Mul(Ss, r.Static.XtXInv())
	var sum float64
	for i := 0; i < n; i++ {
		for j := 0; j < p; j++ {
			sum += sm.At(i, j) * Ss.At(i, j)
		}
	}
	out := &LcTest{Stat: sum / (r.Omega11_2 * float64(n)), M: k}
	out.Crit, out.CritSource = LcCritical(k, det)
	return out, nil
}
