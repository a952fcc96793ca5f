package simulate

import (
	"math"
	"math/rand/v2"

	"github.com/galley-econ/galley/analysis/ardl"
	"github.com/galley-econ/galley/analysis/householder"
)

// Test names of the ARDL bounds statistics (Pesaran, Shin and Smith
// 2001): the F statistic and the t statistic of the lagged level of y,
// with the regressors I(0) (white noise, the lower bound) or I(1)
// (random walks, the upper bound).
const (
	ARDLF0 = "ardl-f-i0"
	ARDLF1 = "ardl-f-i1"
	ARDLT0 = "ardl-t-i0"
	ARDLT1 = "ardl-t-i1"
)

func isARDL(test string) bool {
	return test == ARDLF0 || test == ARDLF1 || test == ARDLT0 || test == ARDLT1
}

// ardlKernel computes one bounds statistic per replication, reusing its
// buffers. Under the null of no level relationship (PSS 2001, §6, the
// design of their Tables CI and CII) y_t is a Gaussian random walk and
// the k regressors are independent Gaussian random walks (I(1)) or
// Gaussian white noise (I(0)), all independent of y, starting at zero.
// The regression, for t = L+1 … T−1 (zero-based, n = T−1−L observations),
// is the conditional error-correction form
//
//	Δy_t = d_t + π_y y_{t−1} + π'x_{t−1} + ω'Δx_t
//	       + Σ_{l=1..L} (γ_l Δy_{t−l} + ψ_l'Δx_{t−l}) + e_t,
//
// with the deterministic terms d_t of the case (the restricted intercept
// or trend of cases rc and rt among the tested terms). The columns are
// ordered [unrestricted terms | tested terms … y_{t−1}] so that one
// Householder QR gives both statistics: with r = Qᵀ(Δy) and m tested
// columns, F = (Σ_{last m} r_i²/m)/(SSR/(n−K)) and t = sign(R_KK) r_K/s.
type ardlKernel struct {
	t, k, lags, n int
	c             ardl.Case
	i1, wantT     bool
	y             []float64
	x             [][]float64
	cols          [][]float64
	det           [][]float64 // 1 and s = (i+1)/n over the regression sample
	qr            householder.QR
	m, tested     int
}

func newARDLKernel(test string, c ardl.Case, k, t, lags int) *ardlKernel {
	n := t - 1 - lags
	a := &ardlKernel{t: t, k: k, lags: lags, n: n, c: c,
		i1: test == ARDLF1 || test == ARDLT1, wantT: test == ARDLT0 || test == ARDLT1}
	a.y = make([]float64, t)
	a.x = columns(k, t)
	nd := 0
	if c.HasConst() {
		nd++
	}
	if c.HasTrend() {
		nd++
	}
	a.m = nd + 1 + k + k + lags*(1+k)
	a.tested = 1 + k
	if c.Restricted() {
		a.tested++
	}
	a.cols = columns(a.m+1, n)
	a.det = polyColumns(2, n)
	return a
}

// nobsARDL is the number of observations of the regression.
func nobsARDL(t, lags int) int { return t - 1 - lags }

func (a *ardlKernel) stat(r *rand.Rand) float64 {
	walk(r, a.y)
	for _, x := range a.x {
		if a.i1 {
			walk(r, x)
		} else {
			for i := range x {
				x[i] = r.NormFloat64()
			}
		}
	}
	n, L := a.n, a.lags
	start := L + 1
	j := 0
	put := func(f func(t int) float64) {
		col := a.cols[j]
		for i := 0; i < n; i++ {
			col[i] = f(start + i)
		}
		j++
	}
	// unrestricted deterministic terms
	if a.c.HasConst() && a.c != ardl.RestConst {
		copy(a.cols[j], a.det[0])
		j++
	}
	if a.c == ardl.ConstTrend {
		copy(a.cols[j], a.det[1])
		j++
	}
	for _, x := range a.x {
		x := x
		put(func(t int) float64 { return x[t] - x[t-1] })
	}
	for l := 1; l <= L; l++ {
		l := l
		put(func(t int) float64 { return a.y[t-l] - a.y[t-l-1] })
		for _, x := range a.x {
			x := x
			put(func(t int) float64 { return x[t-l] - x[t-l-1] })
		}
	}
	// tested terms, y_{t−1} last
	switch a.c {
	case ardl.RestConst:
		copy(a.cols[j], a.det[0])
		j++
	case ardl.RestTrend:
		copy(a.cols[j], a.det[1])
		j++
	}
	for _, x := range a.x {
		x := x
		put(func(t int) float64 { return x[t-1] })
	}
	put(func(t int) float64 { return a.y[t-1] })
	resp := a.cols[a.m]
	for i := 0; i < n; i++ {
		t := start + i
		resp[i] = a.y[t] - a.y[t-1]
	}
	if err := a.qr.Factor(a.cols, a.m); err != nil || !a.qr.FullRank() {
		return math.NaN()
	}
	ssr := dot(resp[a.m:], resp[a.m:])
	s2 := ssr / float64(n-a.m)
	if a.wantT {
		return math.Copysign(1, a.qr.RAt(a.m-1, a.m-1)) * resp[a.m-1] / math.Sqrt(s2)
	}
	var num float64
	for i := a.m - a.tested; i < a.m; i++ {
		num += resp[i] * resp[i]
	}
	return num / float64(a.tested) / s2
}

// newARDLKernelSize is the number of regressors of the bounds regression.
func newARDLKernelSize(c ardl.Case, k, lags int) int {
	nd := 0
	if c.HasConst() {
		nd++
	}
	if c.HasTrend() {
		nd++
	}
	return nd + 1 + k + k + lags*(1+k)
}
