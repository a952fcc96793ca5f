package simulate

import (
	"fmt"
	"math"
	"math/rand/v2"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/householder"
)

// checkGH validates a Gregory–Hansen experiment: Case is the model (c,
// ct or cs), N = m + 1 variables (2..MaxVars), Lags the fixed number of
// lagged differences (gh-adf) or the Bartlett truncation lag (gh-zt,
// gh-za), Trim the trimming of the break dates.
func (s Spec) checkGH(p *plan) error {
	m, err := coint.ParseGHModel(s.Case)
	if err != nil {
		return fmt.Errorf("simulate: %s: %w", p.test, err)
	}
	p.ghModel, p.caseStr = m, m.Code()
	if s.N < 2 || s.N > MaxVars {
		return fmt.Errorf("simulate: %s needs N = 2..%d variables, not %d", p.test, MaxVars, s.N)
	}
	p.trim = s.Trim
	if p.trim == 0 {
		p.trim = coint.DefaultGHTrim
	}
	k := s.N - 1
	cols := len(coint.GHTerms(m, make([]string, k)))
	if s.T < cols+8 {
		return fmt.Errorf("simulate: T = %d is too short for the Gregory–Hansen model %s with %d regressors", s.T, m, k)
	}
	if _, _, err := coint.GHBreakRange(s.T, p.trim, coint.GHMinRegime(m, k)); err != nil {
		return fmt.Errorf("simulate: %w", err)
	}
	if p.test == GHADF {
		if n := s.T - 1 - s.Lags; n-(s.Lags+1) < 1 {
			return fmt.Errorf("simulate: T = %d is too short for %d lagged differences", s.T, s.Lags)
		}
	} else if s.Lags >= s.T-1 {
		return fmt.Errorf("simulate: bandwidth %d needs more than %d observations", s.Lags, s.T-1)
	}
	p.nobs = s.T
	return nil
}

// ghKernel computes one Gregory–Hansen statistic per replication: N
// independent Gaussian random walks, the static regression of the first
// on the model's terms and the others at every candidate break date
// (the columns of coint.GHDesign), and the minimum over the dates of the
// ADF t-ratio with fixed lags (gh-adf) or of Zt or Zα with a fixed
// Bartlett lag (coint.GHZ): the statistics of coint.GregoryHansen.
//
// The columns that do not move with the date, A = [1, (t), x], are
// orthonormalised once per replication (U, with U'U = I); for the
// columns that do, B_b = [φ_b, (φ_b x)], U'B_b, B_b'B_b and B_b'ỹ are
// sums over t ≥ b, updated by one row as b falls, so that by
// Frisch–Waugh (ỹ = M_A y, B̃ = M_A B_b = B_b − U U'B_b)
//
//	γ̂ = (B_b'B_b − (U'B_b)'(U'B_b))⁻¹ B_b'ỹ,   ê = ỹ − B_b γ̂ + U (U'B_b) γ̂
//
// costs O(T) per date instead of a QR factorisation.
type ghKernel struct {
	test        string
	model       coint.GHModel
	t, m, a, q  int
	lags        int
	first, last int
	y           []float64
	xs          [][]float64
	u           [][]float64 // a orthonormal columns spanning A
	yt          []float64   // ỹ = M_A y
	resid, v    []float64
	// suffix sums over t ≥ b
	sU   []float64 // a×q, column-major: U'B_b
	sBB  []float64 // q×q: B_b'B_b
	sBy  []float64 // q: B_b'ỹ
	h    []float64 // q×q work
	g, w []float64
	df   *tauKernel // the residual DF regression (adf only)
}

func newGHKernel(s Spec, p plan) *ghKernel {
	m := s.N - 1
	a := 1 + m
	if p.ghModel == coint.GHLevelTrend {
		a++
	}
	q := 1
	if p.ghModel == coint.GHRegime {
		q += m
	}
	first, last, _ := coint.GHBreakRange(s.T, p.trim, coint.GHMinRegime(p.ghModel, m))
	k := &ghKernel{
		test: p.test, model: p.ghModel, t: s.T, m: m, a: a, q: q, lags: s.Lags, first: first, last: last,
		y: make([]float64, s.T), xs: columns(m, s.T), u: columns(a, s.T), yt: make([]float64, s.T),
		resid: make([]float64, s.T), v: make([]float64, s.T-1),
		sU: make([]float64, a*q), sBB: make([]float64, q*q), sBy: make([]float64, q), h: make([]float64, q*q),
		g: make([]float64, q), w: make([]float64, a),
	}
	if p.test == GHADF {
		k.df = newADFKernel(s.T, s.Lags, 0)
	}
	return k
}

// stat draws one replication and returns the statistic.
func (k *ghKernel) stat(r *rand.Rand) float64 {
	walk(r, k.y)
	for _, x := range k.xs {
		walk(r, x)
	}
	return k.minOver(k.y, k.xs)
}

// bval is column j of B at observation t ≥ b: φ = 1, then x_{j−1,t}.
func (k *ghKernel) bval(xs [][]float64, j, t int) float64 {
	if j == 0 {
		return 1
	}
	return xs[j-1][t]
}

// minOver is the minimum of the kernel's statistic over the break dates
// for the series y on xs (NaN for a singular design).
func (k *ghKernel) minOver(y []float64, xs [][]float64) float64 {
	n, a, q := k.t, k.a, k.q
	// U: modified Gram–Schmidt, twice, on 1, (s = (t+1)/n), x.
	c := 0
	for i := range k.u[0] {
		k.u[0][i] = 1
	}
	c++
	if k.model == coint.GHLevelTrend {
		for i := range k.u[c] {
			k.u[c][i] = float64(i+1) / float64(n)
		}
		c++
	}
	for _, x := range xs {
		copy(k.u[c], x)
		c++
	}
	for j := 0; j < a; j++ {
		col := k.u[j]
		nrm0 := math.Sqrt(dot(col, col))
		for pass := 0; pass < 2; pass++ {
			for i := 0; i < j; i++ {
				axpy(-dot(k.u[i], col), k.u[i], col)
			}
		}
		nrm := math.Sqrt(dot(col, col))
		if !(nrm > householder.CollinearTol*nrm0) {
			return math.NaN()
		}
		for i := range col {
			col[i] /= nrm
		}
	}
	copy(k.yt, y)
	for pass := 0; pass < 2; pass++ {
		for i := 0; i < a; i++ {
			axpy(-dot(k.u[i], k.yt), k.u[i], k.yt)
		}
	}
	clear(k.sU)
	clear(k.sBB)
	clear(k.sBy)
	add := func(t int) {
		for j := 0; j < q; j++ {
			bj := k.bval(xs, j, t)
			for i := 0; i < a; i++ {
				k.sU[j*a+i] += k.u[i][t] * bj
			}
			for l := 0; l < q; l++ {
				k.sBB[j*q+l] += bj * k.bval(xs, l, t)
			}
			k.sBy[j] += bj * k.yt[t]
		}
	}
	for t := n - 1; t > k.last; t-- {
		add(t)
	}
	best := math.Inf(1)
	for b := k.last; b >= k.first; b-- {
		add(b)
		// H = B'B − S'S (q×q, row-major), γ = H⁻¹ B'ỹ.
		for j := 0; j < q; j++ {
			for l := 0; l < q; l++ {
				k.h[j*q+l] = k.sBB[j*q+l] - dot(k.sU[j*a:(j+1)*a], k.sU[l*a:(l+1)*a])
			}
		}
		if !cholesky(k.h, q) {
			return math.NaN()
		}
		copy(k.g, k.sBy)
		cholSolve(k.h, q, k.g)
		// w = S γ
		for i := 0; i < a; i++ {
			var s float64
			for j := 0; j < q; j++ {
				s += k.sU[j*a+i] * k.g[j]
			}
			k.w[i] = s
		}
		copy(k.resid, k.yt)
		for i := 0; i < a; i++ {
			axpy(k.w[i], k.u[i], k.resid)
		}
		e := k.resid[b:]
		for i := range e {
			e[i] -= k.g[0]
		}
		for j := 1; j < q; j++ {
			axpy(-k.g[j], xs[j-1][b:], e)
		}
		var s float64
		switch k.test {
		case GHADF:
			s = k.df.dfTau(k.resid, nil)
		case GHZt:
			_, s = k.z()
		default:
			s, _ = k.z()
		}
		if s < best {
			best = s
		}
	}
	return best
}

// cholSolve overwrites z with (LLᵀ)⁻¹z, L in the lower triangle of the
// row-major n×n a (from cholesky).
func cholSolve(a []float64, n int, z []float64) {
	for i := 0; i < n; i++ {
		s := z[i]
		for j := 0; j < i; j++ {
			s -= a[i*n+j] * z[j]
		}
		z[i] = s / a[i*n+i]
	}
	for i := n - 1; i >= 0; i-- {
		s := z[i]
		for j := i + 1; j < n; j++ {
			s -= a[j*n+i] * z[j]
		}
		z[i] = s / a[i*n+i]
	}
}

// z is coint.GHZ of the kernel's residuals with its fixed lag, without
// allocating.
func (k *ghKernel) z() (za, zt float64) {
	e, n := k.resid, k.t
	see := dot(e[:n-1], e[:n-1])
	sxy := dot(e[:n-1], e[1:])
	rho := sxy / see
	for t := 1; t < n; t++ {
		k.v[t-1] = e[t] - rho*e[t-1]
	}
	v := k.v
	g0 := dot(v, v) / float64(n)
	var lam float64
	for j := 1; j <= k.lags && j < len(v); j++ {
		lam += (1 - float64(j)/float64(k.lags+1)) * dot(v[j:], v[:len(v)-j]) / float64(n)
	}
	rs := (sxy - float64(n-1)*lam) / see
	return float64(n) * (rs - 1), (rs - 1) / math.Sqrt((g0+2*lam)/see)
}
