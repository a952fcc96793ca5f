package rules

import (
	"fmt"
	"math"
)

// NeweyWestPrelim returns the preliminary lag n that Newey and West (1994)
// suggest for kernel k at sample size T: NeweyWest94Bartlett.Lag(T) =
// ⌊4(T/100)^{2/9}⌋ for the Bartlett kernel and NeweyWest94QS.Lag(T) =
// ⌊4(T/100)^{2/25}⌋ for the quadratic-spectral kernel (values from
// memory of the paper).
func NeweyWestPrelim(k Kernel, t int) (int, error) {
	switch k {
	case Bartlett:
		return NeweyWest94Bartlett.Lag(t), nil
	case QuadraticSpectral:
		return NeweyWest94QS.Lag(t), nil
	}
	return 0, fmt.Errorf("bandwidth: unknown kernel %v", k)
}

// HobijnPrelim returns ⌊T^{2/9}⌋ (0 when T ≤ 0), the preliminary lag of Hobijn, Franses
// and Ooms (1998), who replace Newey and West's (1994) ⌊4(T/100)^{2/9}⌋
// by it in the Bartlett bandwidth for the KPSS test; statsmodels'
// kpss(nlags="auto") does the same.
func HobijnPrelim(t int) int {
	if t <= 0 {
		return 0
	}
	return int(math.Floor(math.Pow(float64(t), 2.0/9)))
}

// NeweyWestBandwidth is the automatic bandwidth of Newey and West (1994)
// for the series e_1..e_T (used as given, not demeaned) with kernel k and
// preliminary lag n:
//
//	σ̂_j  = T⁻¹ Σ_{t=j+1..T} e_t e_{t−j},
//	ŝ(0) = σ̂_0 + 2 Σ_{j=1..n} σ̂_j,   ŝ(q) = 2 Σ_{j=1..n} j^q σ̂_j,
//	γ̂    = c_γ ((ŝ(q)/ŝ(0))²)^{1/(2q+1)},
//	b    = γ̂ T^{1/(2q+1)},
//
// with q = 1, c_γ = 1.1447 for the Bartlett kernel and q = 2, c_γ =
// 1.3221 for the quadratic-spectral kernel. b is real-valued; the
// Bartlett truncation lag is L = ⌊b⌋ (as in Hobijn, Franses and Ooms
// 1998). NeweyWestPrelim gives the paper's n, HobijnPrelim the variant
// of Hobijn, Franses and Ooms (1998). n must lie in 0..T−1, and ŝ(0)
// must not be zero.
func NeweyWestBandwidth(e []float64, k Kernel, n int) (float64, error) {
	t := len(e)
	if t < 2 {
		return 0, fmt.Errorf("bandwidth: %d observations, need at least 2", t)
	}
	var q, cg float64
	switch k {
	case Bartlett:
		q, cg = 1, 1.1447
	case QuadraticSpectral:
		q, cg = 2, 1.3221
	default:
		return 0, fmt.Errorf("bandwidth: unknown kernel %v", k)
	}
	if n < 0 || n >= t {
		return 0, fmt.Errorf("bandwidth: preliminary lag %d outside 0..%d", n, t-1)
	}
	for i, v := range e {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, fmt.Errorf("bandwidth: observation %d is %g", i+1, v)
		}
	}
	tf := float64(t)
	var s0, sq float64
	for _, v := range e {
		s0 += v * v
	}
	s0 /= tf
	for j := 1; j <= n; j++ {
		var g float64
		for i := j; i < t; i++ {
			g += e[i] * e[i-j]
		}
		g = 2 * g / tf
		s0 += g
		sq += math.Pow(float64(j), q) * g
	}
	if s0 == 0 {
		return 0, fmt.Errorf("bandwidth: the estimated spectral density at zero, ŝ(0), is zero")
	}
	r := sq / s0
	p := 1 / (2*q + 1)
	b := cg * math.Pow(r*r, p) * math.Pow(tf, p)
	if math.IsNaN(b) || math.IsInf(b, 0) {
		return 0, fmt.Errorf("bandwidth: no usable bandwidth (%g)", b)
	}
	return b, nil
}

// HobijnBandwidth is NeweyWestBandwidth(e, Bartlett, HobijnPrelim(T)),
// the Bartlett bandwidth of Hobijn, Franses and Ooms (1998) that
// statsmodels' kpss(nlags="auto") truncates to its lag.
func HobijnBandwidth(e []float64) (float64, error) {
	return NeweyWestBandwidth(e, Bartlett, HobijnPrelim(len(e)))
}
