package simulate

import (
	"math"
	"math/rand/v2"

	"github.com/galley-econ/galley/analysis/householder"
)

// tauKernel computes Dickey–Fuller τ statistics for one worker, reusing
// its buffers across replications.
type tauKernel struct {
	t, p, d int // series length, lagged differences, deterministic terms
	n       int // observations in the DF regression, T − 1 − p
	y       []float64
	cols    [][]float64 // DF design [det | Δy lags | y_{t−1}] and Δy_t
	detTpl  [][]float64 // deterministic columns of the DF regression
	qr      householder.QR

	// Engle–Granger only: N−1 regressors, static design [det | x] and y.
	nv    int
	xs    [][]float64 // series 2..N
	scols [][]float64
	sdet  [][]float64 // deterministic columns of the static regression
	sd    int
	sqr   householder.QR
	resid []float64
}

// columns allocates m contiguous columns of length n.
func columns(m, n int) [][]float64 {
	buf := make([]float64, m*n)
	out := make([][]float64, m)
	for j := range out {
		out[j] = buf[j*n : (j+1)*n : (j+1)*n]
	}
	return out
}

// polyColumns returns d columns 1, s, s² (s = (i+1)/n, i = 0..n−1). The
// scaling of s leaves every t-ratio and residual unchanged (the column
// space is the same) and keeps the design well conditioned.
func polyColumns(d, n int) [][]float64 {
	c := columns(d, n)
	for i := 0; i < n; i++ {
		s := float64(i+1) / float64(n)
		for j := 0; j < d; j++ {
			c[j][i] = math.Pow(s, float64(j))
		}
	}
	return c
}

// newADFKernel prepares the DF regression with d deterministic terms and
// p lagged differences for series of length t.
func newADFKernel(t, p, d int) *tauKernel {
	n := t - 1 - p
	m := d + p + 1
	return &tauKernel{
		t: t, p: p, d: d, n: n,
		y:      make([]float64, t),
		cols:   columns(m+1, n),
		detTpl: polyColumns(d, n),
	}
}

// newEGKernel prepares the Engle–Granger test of nv variables with static
// deterministic terms sd and p lagged differences in the residual DF
// regression (no deterministic terms there).
func newEGKernel(t, p, sd, nv int) *tauKernel {
	k := newADFKernel(t, p, 0)
	k.nv, k.sd = nv, sd
	k.xs = columns(nv-1, t)
	k.scols = columns(sd+nv, t)
	k.sdet = polyColumns(sd, t)
	k.resid = make([]float64, t)
	return k
}

// walk fills y with a Gaussian random walk y_t = Σ_{s≤t} ε_s, t = 1..T
// (y_0 = 0 before the sample), ε iid N(0, 1).
func walk(r *rand.Rand, y []float64) {
	var s float64
	for i := range y {
		s += r.NormFloat64()
		y[i] = s
	}
}

// adf draws one random walk and returns its ADF τ.
func (k *tauKernel) adf(r *rand.Rand) float64 {
	walk(r, k.y)
	return k.dfTau(k.y, k.detTpl)
}

// eg draws nv independent random walks and returns the Engle–Granger τ:
// static OLS of the first on the deterministic terms and the others,
// then the DF τ (no deterministic terms, p lags) of the residuals.
func (k *tauKernel) eg(r *rand.Rand) float64 {
	walk(r, k.y)
	for _, x := range k.xs {
		walk(r, x)
	}
	return k.egTau(k.y, k.xs)
}

// egTau is the Engle–Granger τ of y on the regressors xs.
func (k *tauKernel) egTau(y []float64, xs [][]float64) float64 {
	m := k.sd + len(xs)
	for j := 0; j < k.sd; j++ {
		copy(k.scols[j], k.sdet[j])
	}
	for j, x := range xs {
		copy(k.scols[k.sd+j], x)
	}
	copy(k.scols[m], y)
	if err := k.sqr.Factor(k.scols[:m+1], m); err != nil || !k.sqr.FullRank() {
		return math.NaN()
	}
	copy(k.resid, k.scols[m])
	for i := 0; i < m; i++ {
		k.resid[i] = 0
	}
	_ = k.sqr.QVec(k.resid) // û = Q [0; Q₂ᵀy]; lengths match by construction
	return k.dfTau(k.resid, nil)
}

// dfTau is τ = γ̂/se(γ̂) of the regression
// Δy_t = det_t + Σ_{l≤p} φ_l Δy_{t−l} + γ y_{t−1} + e_t, t = p+1..T−1
// (zero-based), from one QR: with y_{t−1} the last design column m−1,
// τ = sign(R_{m−1,m−1}) (Qᵀ Δy)_{m−1} / √(SSR/(n−m)).
func (k *tauKernel) dfTau(y []float64, det [][]float64) float64 {
	d, p, n := len(det), k.p, k.n
	m := d + p + 1
	cols := k.cols[:m+1]
	for j := 0; j < d; j++ {
		copy(cols[j], det[j])
	}
	start := p + 1
	for l := 1; l <= p; l++ { // Δy_{t−l} = y[t−l] − y[t−l−1]
		c := cols[d+l-1]
		for i := 0; i < n; i++ {
			t := start + i
			c[i] = y[t-l] - y[t-l-1]
		}
	}
	copy(cols[m-1], y[start-1:start-1+n])
	resp := cols[m]
	for i := 0; i < n; i++ {
		t := start + i
		resp[i] = y[t] - y[t-1]
	}
	if err := k.qr.Factor(cols, m); err != nil || !k.qr.FullRank() {
		return math.NaN()
	}
	ssr := dot(resp[m:], resp[m:])
	s := math.Sqrt(ssr / float64(n-m))
	return math.Copysign(1, k.qr.RAt(m-1, m-1)) * resp[m-1] / s
}
