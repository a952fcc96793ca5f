package householder

import (
	"fmt"
	"math"
)

// Nested fills, for every leading sub-design X[:, :j], j = 1..m, of the
// factorised X, ssr[j−1] with the residual sum of squares SSR_j of the
// least-squares regression of the response y = cols[resp] (resp ≥ m, a
// column carried through Factor) on it, and t[j−1] with the t-ratio of
// its last coefficient. One QR serves all m regressions (nested least
// squares): with [X | y] = Q [R r; 0 ρ],
//
//	SSR_j = Σ_{i≥j} r_i² + ‖ρ‖²,
//	t_j = sign(R_{j−1,j−1}) r_{j−1} / √(SSR_j/(n−j)),
//
// because the QR of X[:, :j] is the leading part of the QR of X, and the
// last row of R_j⁻¹ is e_jᵀ/R_{j−1,j−1}, so se(β̂_j) = s_j/|R_{j−1,j−1}| and
// β̂_j = r_{j−1}/R_{j−1,j−1} (Golub and Van Loan 2013, §5.3.3). t[j−1] is NaN when j > Indep() (rank deficient) or
// n ≤ j (no degrees of freedom); ssr is filled for every j, meaningful
// for j ≤ Indep().
func (f *QR) Nested(resp int, ssr, t []float64) error {
	if resp < f.m || resp >= len(f.cols) {
		return fmt.Errorf("%w: response column %d is not one of %d..%d", ErrShape, resp, f.m, len(f.cols)-1)
	}
	if len(ssr) != f.m || len(t) != f.m {
		return fmt.Errorf("%w: %d and %d outputs for %d sub-designs", ErrShape, len(ssr), len(t), f.m)
	}
	r := f.cols[resp]
	tail := 0.0
	for _, v := range r[f.m:] {
		tail += v * v // ‖ρ‖² = SSR_m
	}
	for j := f.m; j >= 1; j-- {
		ssr[j-1] = tail
		tail += r[j-1] * r[j-1] // SSR_{j−1} = SSR_j + r_{j−1}²
	}
	for j := 1; j <= f.m; j++ {
		if j > f.indep || f.n <= j {
			t[j-1] = math.NaN()
			continue
		}
		s := math.Sqrt(ssr[j-1] / float64(f.n-j))
		t[j-1] = math.Copysign(1, f.diag[j-1]) * r[j-1] / s
	}
	return nil
}
