package unitroot

import (
	"math"

	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// nestedLS holds, for a design X (n×m) and response y, the residual sum
// of squares and the t-ratio of the last coefficient of every leading
// sub-design X[:, :j], j = 1..m, from a single Householder QR of
// [X | y] (nested least squares):
//
//	[X | y] = Q [R r; 0 ρ],  SSR_j = Σ_{i≥j} r_i² + ρ²,
//	t_j = sign(R_{j−1,j−1}) r_{j−1} / √(SSR_j/(n−j)),
//
// the last because the last row of R_j⁻¹ is e_jᵀ/R_{j−1,j−1}, so
// se(β̂_j) = s_j/|R_{j−1,j−1}| and β̂_j = r_{j−1}/R_{j−1,j−1}.
// Columns are scaled to unit length first, which changes neither SSR nor
// t. ok[j−1] is false when column j−1 is numerically a combination of
// the columns before it, and then every larger sub-design is rank
// deficient too.
type nestedLS struct {
	n   int
	ssr []float64 // ssr[j−1] = SSR_j
	t   []float64 // t[j−1] = t_j
	ok  []bool
}

// nested factorises a (n×(m+1), row-major, last column the response) in
// place. a must have n > m.
func nested(a blas64.General) nestedLS {
	n, m := a.Rows, a.Cols-1
	for j := 0; j < m; j++ { // unit column length for the design
		var s float64
		for i := 0; i < n; i++ {
			v := a.Data[i*a.Stride+j]
			s += v * v
		}
		if s == 0 {
			continue
		}
		s = 1 / math.Sqrt(s)
		for i := 0; i < n; i++ {
			a.Data[i*a.Stride+j] *= s
		}
	}
	tau := make([]float64, a.Cols)
	work := make([]float64, 1)
	lapack64.Geqrf(a, tau, work, -1)
	work = make([]float64, int(work[0]))
	lapack64.Geqrf(a, tau, work, len(work))

	at := func(i, j int) float64 { return a.Data[i*a.Stride+j] }
	rho := at(m, m)
	out := nestedLS{n: n, ssr: make([]float64, m), t: make([]float64, m), ok: make([]bool, m)}
	tail := rho * rho // SSR_m = ρ²
	for j := m; j >= 1; j-- {
		out.ssr[j-1] = tail
		r := at(j-1, m)
		tail += r * r // SSR_{j−1} = SSR_j + r_{j−1}²
	}
	good := true
	for j := 1; j <= m; j++ {
		d := at(j-1, j-1)
		good = good && math.Abs(d) > collinearTol
		out.ok[j-1] = good
		if !good || n <= j {
			out.t[j-1] = math.NaN()
			continue
		}
		s := math.Sqrt(out.ssr[j-1] / float64(n-j))
		out.t[j-1] = math.Copysign(1, d) * at(j-1, m) / s
	}
	return out
}

// collinearTol is the threshold on |R_jj| of the unit-column design
// below which column j counts as collinear (as in package ols).
const collinearTol = 1e-10
