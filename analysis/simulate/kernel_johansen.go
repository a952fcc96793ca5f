package simulate

import (
	"math"
	"math/rand/v2"

	"github.com/galley-econ/galley/analysis/johansen"
)

// Johansen statistics from product moments.
//
// With lags = L lagged differences, the regressors of observation t are
// laid out as z_t = [1, τ_t, τ_t², Δy_{t−1}, …, Δy_{t−L}, Δy_t, y_{t−1}]
// with τ_t = s/T (s the row of y holding Δy_t, as in johansen.Test;
// scaling the trend changes no statistic) and M = Σ_t z_t z_tᵀ. For a case and a
// dimension the rows and columns of M are picked in the order
// [U | R0 | R1]: U the unrestricted terms (deterministic, lagged
// differences), R0 = Δy_t, R1 = y_{t−1} and the restricted deterministic
// term. In the Cholesky factor L of that matrix, L10 (R1 rows, R0
// columns) and L11 (R1 block) give B = L11⁻¹L10, whose squared singular
// values ν_i are λ_i/(1−λ_i) for the eigenvalues λ_i of
// |λS11 − S10S00⁻¹S01| = 0 (all moments after U is partialled out), since
// S11 − S10S00⁻¹S01 = L11L11ᵀ and S10S00⁻¹S01 = L10L10ᵀ. Hence
//
//	trace(0) = −T Σ ln(1−λ_i) = T Σ ln(1+ν_i),   maxeig(0) = T ln(1+ν_max),
//
// T the number of observations (Johansen 1995, ch. 6).
//
// Drift limit. The tabulated null distributions of cases C and CT
// (Johansen 1995, Tables 15.3 and 15.5; Osterwald-Lenum 1992, Tables 1
// and 2; MacKinnon, Haug and Michelis 1999) assume that the data have a
// linear (C) or quadratic (CT) trend in some direction, α⊥'μ ≠ 0; the
// limit process then has the trend (C) or the squared trend (CT) as its
// last coordinate. With driftLimit (the default for simulation) the last
// series is y_K = W_K + μ·s (C) or W_K + μ·s² (CT) with μ → ∞: its
// differences, with the deterministic terms partialled out, are those of
// W_K, and its lagged level is proportional to τ (C) or τ² (CT), which
// replaces y_{K,t−1} in R1. The statistics are invariant to a non-singular
// linear transformation of y, so the drift's direction does not matter.
// Cases N and RC assume no drift and case RT's statistics do not depend
// on it; they use the driftless walks as they are.
//
// Design. With a Design (spec.go) z_t continues with its unrestricted
// columns w_t (at the row s of Δy_t) and its restricted columns x_{s−1},
// z_t = [1, τ_t, τ_t², Δy_{t−1}, …, Δy_{t−L}, Δy_t, y_{t−1}, w_t, x_{t−1}];
// w joins U after the lagged differences and x joins R1 after the
// restricted deterministic term, as in johansen.TestExtra. In cases C and
// CT the drift limit keeps its trend without a break: the steps' effects
// are zero in the simulated systems. Without a design z_t, M and every
// statistic are those of the kernel before designs existed, bit for bit.
type johKernel struct {
	driftLimit bool
	k, lags, t int // series, lagged differences, series length
	nz         int // columns of z
	design     *Design
	y          [][]float64
	z          []float64
	m          []float64 // nz×nz moments, upper triangle
	work       []float64
	b          []float64
	g          []float64
	eig        []float64
	idx        []int
}

func newJohKernel(k, lags, t int, d *Design) *johKernel {
	nu, nr := d.counts()
	nz := 3 + k*(lags+2) + nu + nr
	n := nz + 1
	if nu+nr == 0 {
		d = nil
	}
	return &johKernel{
		k: k, lags: lags, t: t, nz: nz, driftLimit: true, design: d,
		y:    columns(k, t),
		z:    make([]float64, nz),
		m:    make([]float64, nz*nz),
		work: make([]float64, n*n),
		b:    make([]float64, (k+1+nr)*k),
		g:    make([]float64, k*k),
		eig:  make([]float64, k),
		idx:  make([]int, 0, n),
	}
}

// moments accumulates M from the series in y (each of length ≥ rows),
// using the first rows observations.
func (j *johKernel) moments(y [][]float64, rows int) (nobs int) {
	k, L, nz := j.k, j.lags, j.nz
	m := j.m
	for i := range m {
		m[i] = 0
	}
	z := j.z
	nobs = rows - L - 1
	ft := float64(rows)
	for i := 0; i < nobs; i++ {
		s := i + L + 1
		tau := float64(s) / ft
		z[0], z[1], z[2] = 1, tau, tau*tau
		for l := 1; l <= L; l++ {
			o := 3 + (l-1)*k
			for h := 0; h < k; h++ {
				z[o+h] = y[h][s-l] - y[h][s-l-1]
			}
		}
		o0, o1 := 3+k*L, 3+k*L+k
		for h := 0; h < k; h++ {
			z[o0+h] = y[h][s] - y[h][s-1]
			z[o1+h] = y[h][s-1]
		}
		if d := j.design; d != nil {
			o := o1 + k
			for h, w := range d.Unrestricted {
				z[o+h] = w[s]
			}
			o += len(d.Unrestricted)
			for h, x := range d.Restricted {
				z[o+h] = x[s-1]
			}
		}
		for a := 0; a < nz; a++ { // upper triangle
			za := z[a]
			axpy(za, z[a:], m[a*nz+a:a*nz+nz])
		}
	}
	return nobs
}

// layout returns the index list [U | R0 | R1] of case c for the first dim
// series, and the sizes of U and R1.
func (j *johKernel) layout(c johansen.Case, dim int) (idx []int, nu, p1 int) {
	k, L := j.k, j.lags
	idx = j.idx[:0]
	switch c {
	case johansen.C, johansen.RT:
		idx = append(idx, 0)
	case johansen.CT:
		idx = append(idx, 0, 1)
	}
	for l := 1; l <= L; l++ {
		for h := 0; h < dim; h++ {
			idx = append(idx, 3+(l-1)*k+h)
		}
	}
	dnu, dnr := j.design.counts()
	for h := 0; h < dnu; h++ {
		idx = append(idx, 3+k*(L+2)+h)
	}
	nu = len(idx)
	for h := 0; h < dim; h++ {
		idx = append(idx, 3+k*L+h)
	}
	for h := 0; h < dim; h++ {
		idx = append(idx, 3+k*L+k+h)
	}
	if j.driftLimit {
		switch c {
		case johansen.C:
			idx[len(idx)-1] = 1 // τ for y_{dim,t−1}
		case johansen.CT:
			idx[len(idx)-1] = 2 // τ²
		}
	}
	switch c {
	case johansen.RC:
		idx = append(idx, 0)
	case johansen.RT:
		idx = append(idx, 1)
	}
	for h := 0; h < dnr; h++ {
		idx = append(idx, 3+k*(L+2)+dnu+h)
	}
	return idx, nu, len(idx) - nu - dim
}

// stats returns the trace and maximum-eigenvalue statistics for r = 0 of
// case c and dimension dim from the moments in j.m, with nobs
// observations. ok is false for a singular moment matrix.
func (j *johKernel) stats(c johansen.Case, dim, nobs int) (trace, maxeig float64, ok bool) {
	idx, nu, p1 := j.layout(c, dim)
	n := len(idx)
	w := j.work[:n*n]
	nz := j.nz
	for a, ia := range idx {
		for b := a; b < n; b++ {
			ib := idx[b]
			if ia <= ib {
				w[a*n+b] = j.m[ia*nz+ib]
			} else {
				w[a*n+b] = j.m[ib*nz+ia]
			}
		}
	}
	if !cholesky(w, n) {
		return 0, 0, false
	}
	// B = L11⁻¹ L10 (p1×dim), by forward substitution column by column.
	o1 := nu + dim
	bm := j.b[:p1*dim]
	for col := 0; col < dim; col++ {
		for r := 0; r < p1; r++ {
			row := w[(o1+r)*n:]
			v := row[nu+col]
			for q := 0; q < r; q++ {
				v -= row[o1+q] * bm[q*dim+col]
			}
			bm[r*dim+col] = v / row[o1+r]
		}
	}
	g := j.g[:dim*dim]
	for a := 0; a < dim; a++ {
		for b := a; b < dim; b++ {
			var s float64
			for r := 0; r < p1; r++ {
				s += bm[r*dim+a] * bm[r*dim+b]
			}
			g[a*dim+b], g[b*dim+a] = s, s
		}
	}
	eig := j.eig[:dim]
	jacobiEigen(g, dim, eig)
	ft := float64(nobs)
	nmax := 0.0
	for _, v := range eig {
		if v < 0 {
			v = 0 // rounding below an exact zero
		}
		trace += math.Log1p(v)
		nmax = math.Max(nmax, v)
	}
	return ft * trace, ft * math.Log1p(nmax), true
}

// draw fills the k series with independent random walks.
func (j *johKernel) draw(r *rand.Rand) {
	for _, y := range j.y {
		walk(r, y)
	}
}
