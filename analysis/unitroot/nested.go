package unitroot

import (
	"math"

	"gonum.org/v1/gonum/floats"
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

// nested factorises the columns cols[0..m−1] of X and the response
// cols[m] (each of length n > m, contiguous: column-major storage) in
// place.
func nested(cols [][]float64) nestedLS {
	m := len(cols) - 1
	n := len(cols[0])
	for j := 0; j < m; j++ { // unit column length for the design
		if s := math.Sqrt(floats.Dot(cols[j], cols[j])); s > 0 {
			floats.Scale(1/s, cols[j])
		}
	}
	diag := make([]float64, m)
	for k := 0; k < m; k++ {
		x := cols[k][k:]
		alpha := math.Sqrt(floats.Dot(x, x))
		if alpha == 0 {
			continue // diag[k] = 0: collinear
		}
		beta := -math.Copysign(alpha, x[0])
		x[0] -= beta // x is now the Householder vector v
		// H = I − τ v vᵀ with v = x − βe₁ and τ = 2/vᵀv; with x₀ the
		// original first entry, vᵀv = 2α² − 2βx₀ = −2β(x₀ − β) = −2β v₀,
		// so τ = −1/(β v₀).
		tau := -1 / (beta * x[0])
		for j := k + 1; j <= m; j++ {
			c := cols[j][k:]
			s := tau * floats.Dot(x, c)
			floats.AddScaled(c, -s, x)
		}
		diag[k] = beta
	}
	r := func(i int) float64 { return cols[m][i] } // r_i = (Qᵀy)_i
	tail := 0.0
	for _, v := range cols[m][m:] {
		tail += v * v // ρ² = SSR_m
	}
	out := nestedLS{n: n, ssr: make([]float64, m), t: make([]float64, m), ok: make([]bool, m)}
	for j := m; j >= 1; j-- {
		out.ssr[j-1] = tail
		tail += r(j-1) * r(j-1) // SSR_{j−1} = SSR_j + r_{j−1}²
	}
	good := true
	for j := 1; j <= m; j++ {
		d := diag[j-1]
		good = good && math.Abs(d) > collinearTol
		out.ok[j-1] = good
		if !good || n <= j {
			out.t[j-1] = math.NaN()
			continue
		}
		s := math.Sqrt(out.ssr[j-1] / float64(n-j))
		out.t[j-1] = math.Copysign(1, d) * r(j-1) / s
	}
	return out
}

// collinearTol is the threshold on |R_jj| of the unit-column design
// below which column j counts as collinear (as in package ols).
const collinearTol = 1e-10
