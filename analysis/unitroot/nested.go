package unitroot

import (
	"math"

	"gonum.org/v1/gonum/floats"

	"github.com/galley-econ/galley/analysis/householder"
)

// nestedLS holds, for a design X (n×m) and response y, the residual sum
// of squares and the t-ratio of the last coefficient of every leading
// sub-design X[:, :j], j = 1..m, from a single Householder QR of
// [X | y] (nested least squares, householder.QR.Nested):
//
//	[X | y] = Q [R r; 0 ρ],  SSR_j = Σ_{i≥j} r_i² + ρ²,
//	t_j = sign(R_{j−1,j−1}) r_{j−1} / √(SSR_j/(n−j)).
//
// Columns are scaled to unit length first, which changes neither SSR nor
// t. ok[j−1] is false when column j−1 is numerically a combination of
// the columns before it (householder.CollinearTol), and then every
// larger sub-design is rank deficient too.
type nestedLS struct {
	n   int
	ssr []float64 // ssr[j−1] = SSR_j
	t   []float64 // t[j−1] = t_j
	ok  []bool
}

// nested factorises the columns cols[0..m−1] of X and the response
// cols[m] (each of length n > m). A design of at most tallBytes is
// scaled and factorised in place, so its columns must not share
// storage; a larger one is factorised in blocks of rows
// (householder.NestedTallScaled; the same R to rounding, so the
// criteria agree to about 1e-15 relative), each block scaled as it is
// copied, and cols are left unchanged and may be windows of one series.
func nested(cols [][]float64) nestedLS {
	m := len(cols) - 1
	n := len(cols[0])
	scale := make([]float64, m) // unit column length for the design
	for j := range scale {
		scale[j] = 1
		if s := math.Sqrt(floats.Dot(cols[j], cols[j])); s > 0 {
			scale[j] = 1 / s
		}
	}
	out := nestedLS{n: n, ssr: make([]float64, m), t: make([]float64, m), ok: make([]bool, m)}
	var indep int
	var err error
	if tall(n, len(cols)) {
		// a design larger than the cache: the same factorisation in
		// blocks of rows (equal to rounding)
		indep, err = householder.NestedTallScaled(cols, scale, out.ssr, out.t)
	} else {
		for j, s := range scale {
			floats.Scale(s, cols[j])
		}
		var f householder.QR
		if err = f.Factor(cols, m); err == nil {
			err = f.Nested(m, out.ssr, out.t)
		}
		indep = f.Indep()
	}
	if err != nil { // shape or non-finite data: no sub-design is usable
		for j := range out.t {
			out.ssr[j], out.t[j] = math.NaN(), math.NaN()
		}
		return out
	}
	for j := 1; j <= m; j++ {
		out.ok[j-1] = j <= indep
	}
	return out
}

// tall reports whether a design of n rows and w columns (response
// included) is factorised by nested in blocks of rows.
func tall(n, w int) bool { return n*w*8 > tallBytes }

// tallBytes is the size of [X | y] above which nested factorises it in
// blocks of rows (householder.NestedTall) rather than sweeping whole
// columns: below it the design stays in cache and one QR is as fast,
// and gives the figures of every published check bit for bit.
const tallBytes = 8 * householder.TallBlockBytes
