package stability

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// CUSUM returns the cumulative sum of scaled recursive residuals
// (BDE 1975, section 2.3)
//
//	W_t = Σ_{i=First..t} w_i / σ̂,  σ̂² = S_T/(T−K),
//
// aligned with the observations (NaN before First). BDE's σ̂ is the
// full-sample regression standard error; some programs divide by the
// sample standard deviation of the w_i instead, which changes W_t by a
// constant factor.
func (r *Recursive) CUSUM() []float64 {
	out := nanSlice(r.N)
	s := r.Sigma()
	var c float64
	for t := r.First; t < r.N; t++ {
		c += r.Resid[t]
		out[t] = c / s
	}
	return out
}

// CUSUMSquares returns the cumulative sum of squared recursive residuals
// relative to their total (BDE 1975, section 2.4)
//
//	s_t = Σ_{i=First..t} w_i² / Σ_{i=First..T−1} w_i²,
//
// which rises from near 0 to 1 with mean (t+1−First)/(T−First) under
// constancy. Aligned with the observations (NaN before First).
func (r *Recursive) CUSUMSquares() []float64 {
	out := nanSlice(r.N)
	var tot float64
	for t := r.First; t < r.N; t++ {
		tot += r.Resid[t] * r.Resid[t]
	}
	var c float64
	for t := r.First; t < r.N; t++ {
		c += r.Resid[t] * r.Resid[t]
		out[t] = c / tot
	}
	return out
}

// CUSUMBand returns the half-width of the CUSUM significance band at each
// observation (NaN before First): the straight lines of BDE 1975 through
// (K, ±a√(T−K)) and (T, ±3a√(T−K)),
//
//	±a [√n + 2r/√n],  n = T−First residuals, r = t+1−First = 1..n,
//
// with a = CUSUMConst(alpha). The boundary is crossed with probability
// about alpha under constancy.
func (r *Recursive) CUSUMBand(alpha float64) ([]float64, error) {
	a, err := CUSUMConst(alpha)
	if err != nil {
		return nil, err
	}
	out := nanSlice(r.N)
	n := float64(r.Residuals())
	for t := r.First; t < r.N; t++ {
		rr := float64(t + 1 - r.First)
		out[t] = a * (math.Sqrt(n) + 2*rr/math.Sqrt(n))
	}
	return out, nil
}

// CUSUMSquaresBand returns the lower and upper CUSUM-of-squares lines
// (r/n − c₀, r/n + c₀), n = T−First, r = t+1−First, with
// c₀ = CUSUMSquaresConst(n, alpha) (BDE 1975, section 2.4). NaN before
// First.
func (r *Recursive) CUSUMSquaresBand(alpha float64) (lo, hi []float64, err error) {
	n := r.Residuals()
	c0, err := CUSUMSquaresConst(n, alpha)
	if err != nil {
		return nil, nil, err
	}
	lo, hi = nanSlice(r.N), nanSlice(r.N)
	for t := r.First; t < r.N; t++ {
		m := float64(t+1-r.First) / float64(n)
		lo[t] = m - c0
		hi[t] = m + c0
	}
	return lo, hi, nil
}

// cusumCross is the BDE (1975, eq. 9) probability that a standard
// Brownian motion on [0,1] crosses either line ±(a + 2a·s):
//
//	2 [Q(3a) + exp(−4a²) (1 − Q(a))],  Q(z) = 1 − Φ(z).
//
// (The expression is recalled from memory; it reproduces BDE's tabulated
// constants 0.850, 0.948 and 1.143 for 10%, 5% and 1% to three decimals,
// which the tests check.)
func cusumCross(a float64) float64 {
	q := func(z float64) float64 { return distuv.UnitNormal.Survival(z) }
	return 2 * (q(3*a) + math.Exp(-4*a*a)*(1-q(a)))
}

// CUSUMConst returns the constant a of the CUSUM band for a test at level
// alpha, solving cusumCross(a) = alpha by bisection. For alpha = 0.10,
// 0.05 and 0.01 it gives the usual 0.850, 0.948 and 1.143 (to rounding;
// the unrounded roots are returned). alpha must lie in (0, 0.5).
func CUSUMConst(alpha float64) (float64, error) {
	if !(alpha > 0 && alpha < 0.5) {
		return 0, fmt.Errorf("stability: CUSUM significance level %v outside (0, 0.5)", alpha)
	}
	lo, hi := 0.1, 10.0 // cusumCross is decreasing in a; cusumCross(0.1) > 0.9
	for i := 0; i < 200 && hi-lo > 1e-14; i++ {
		mid := (lo + hi) / 2
		if cusumCross(mid) > alpha {
			lo = mid
		} else {
			hi = mid
		}
	}
	return (lo + hi) / 2, nil
}
