// Package householder is the one QR factorisation of the analysis
// packages: Householder reflections without column pivoting, on
// column-major storage owned by the caller, so that a Monte Carlo kernel
// can refactorise a design per replication without allocating and a
// regression can carry its responses through the same reflections.
//
// Every least-squares fit, rank check, orthonormal basis and residual
// projection in analysis/ goes through QR.Factor; see the package's
// callers (ols, unitroot, johansen, diag, simulate). References are to
// Golub and Van Loan (2013), Matrix Computations, 4th ed.
package householder

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"sync"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
)

// CollinearTol is the rank rule shared by every caller: column k of X
// counts as numerically a linear combination of columns 0..k−1 when
//
//	|R_kk| ≤ CollinearTol · ‖x_k‖₂,
//
// ‖x_k‖ the Euclidean norm of the column as given. The rule is scale
// invariant column by column; a relative tolerance on the diagonal of R
// of an unpivoted QR is common practice for a full-rank check.
const CollinearTol = 1e-10

// QR is the Householder factorisation X = QR of an n×m matrix X, n ≥ m,
// held in place in the caller's columns:
//
//	Q = H_0 H_1 ⋯ H_{m−1},  H_k = I − τ_k v_k v_kᵀ,
//
// with v_k zero in rows 0..k−1. After Factor, column j of the storage
// holds R_ij (i < j) in rows 0..j−1 and v_j in rows j..n−1 (j < m); the
// diagonal R_kk and τ_k are kept in the QR. Further columns given to
// Factor (responses) hold Qᵀy: its first m entries are the coordinates
// of the projection of y on the column space, the rest those of the
// residual.
//
// The zero value is ready for Factor; a QR reused for matrices of the
// same width allocates nothing.
type QR struct {
	cols  [][]float64
	n, m  int
	diag  []float64
	tau   []float64
	indep int
}

// ErrShape is returned (wrapped) when the storage given to Factor is not
// an n×m matrix with n ≥ m ≥ 1, or a vector has the wrong length.
var ErrShape = errors.New("householder: shape")

// Factor computes the Householder QR of the first m of cols (each of the
// same length n ≥ m, the columns of X) in place, applying every
// reflection also to cols[m:] (responses, which come back as Qᵀy).
//
// Step k (Golub and Van Loan 2013, Alg. 5.1.1 and 5.2.1) takes the
// subcolumn x = X[k:, k] of the partly reduced matrix, α = ‖x‖ and
//
//	β = −sign(x_0) α,  v = x − β e_0,  τ = 2/vᵀv = −1/(β v_0),
//
// (vᵀv = 2α² − 2βx_0 = −2βv_0), so H x = β e_0 and R_kk = β; the sign of β
// avoids cancellation in v_0. When x_1.. are all zero no reflection is
// applied (τ = 0, R_kk = x_0), as in LAPACK's dlarfg (Anderson et al.
// 1999), so that R and Q agree with LAPACK's to rounding. Every further
// column c becomes H c = c − τ (vᵀc) v. The cost is 2m²(n − m/3) flops
// for X plus 4nm per response column.
//
// For a large matrix (parallelMinEntries) the reflection of a step is
// applied to two halves of the further columns concurrently; each
// column's arithmetic is unchanged, so the result is the same bit for bit.
//
// The rank rule CollinearTol is applied as the columns are reduced; see
// Indep. Factor returns an error only for a malformed shape or a
// non-finite entry met in a column norm.
func (f *QR) Factor(cols [][]float64, m int) error {
	if m < 1 || len(cols) < m {
		return fmt.Errorf("%w: %d columns given, %d to factorise", ErrShape, len(cols), m)
	}
	n := len(cols[0])
	if n < m {
		return fmt.Errorf("%w: %d rows for %d columns", ErrShape, n, m)
	}
	for j, c := range cols {
		if len(c) != n {
			return fmt.Errorf("%w: column %d has %d rows, column 0 has %d", ErrShape, j, len(c), n)
		}
	}
	f.cols, f.n, f.m, f.indep = cols, n, m, m
	if cap(f.diag) < m {
		f.diag = make([]float64, m)
		f.tau = make([]float64, m)
	}
	f.diag, f.tau = f.diag[:m], f.tau[:m]
	for k := 0; k < m; k++ {
		c := cols[k]
		x := c[k:]
		x0 := x[0]
		sigma2 := floats.Dot(x[1:], x[1:])
		alpha2 := x0*x0 + sigma2
		if math.IsNaN(alpha2) || math.IsInf(alpha2, 0) {
			return fmt.Errorf("householder: column %d has a non-finite or overflowing entry", k)
		}
		var beta, tau float64
		if sigma2 == 0 {
			beta, tau = x0, 0 // H_k = I
		} else {
			beta = -math.Copysign(math.Sqrt(alpha2), x0)
			x[0] = x0 - beta // x is now v_k
			tau = -1 / (beta * x[0])
			reflect(cols[k+1:], k, x, tau)
		}
		f.diag[k], f.tau[k] = beta, tau
		if f.indep == m {
			// ‖x_k‖² = Σ_{i<k} R_ik² + α² (orthogonal invariance).
			above := c[:k]
			norm := math.Sqrt(floats.Dot(above, above) + alpha2)
			if math.Abs(beta) <= CollinearTol*norm {
				f.indep = k
			}
		}
	}
	return nil
}

// parallelMinEntries is the number of entries below row k of the columns
// after column k from which Factor applies a reflection to two halves of
// those columns at once (each column's arithmetic is the same either way).
var parallelMinEntries = 1 << 17

// reflect applies H = I − τvvᵀ to rows k.. of every column of cols, each
// c ← c − τ(vᵀc)v. The columns are independent, so when there are many
// entries and more than one processor, two goroutines take a half of the
// columns each; the result is the same bit for bit.
func reflect(cols [][]float64, k int, v []float64, tau float64) {
	if len(cols) < 2 || len(v)*len(cols) < parallelMinEntries || runtime.GOMAXPROCS(0) < 2 {
		applyReflection(cols, k, v, tau)
		return
	}
	reflectBoth(cols, k, v, tau)
}

// reflectBoth is reflect on two goroutines (kept apart so that the serial
// path allocates nothing).
func reflectBoth(cols [][]float64, k int, v []float64, tau float64) {
	half := len(cols) / 2
	var wg sync.WaitGroup
	wg.Add(1)
	go func() {
		defer wg.Done()
		applyReflection(cols[half:], k, v, tau)
	}()
	applyReflection(cols[:half], k, v, tau)
	wg.Wait()
}

func applyReflection(cols [][]float64, k int, v []float64, tau float64) {
	for _, c := range cols {
		cj := c[k:]
		floats.AddScaled(cj, -tau*floats.Dot(v, cj), v)
	}
}

// Dims returns n and m of the factorised X.
func (f *QR) Dims() (n, m int) { return f.n, f.m }

// Indep is the number of leading columns of X that pass the rank rule
// CollinearTol: m when X has full column rank, otherwise the first column
// that is numerically a combination of the ones before it (and then every
// sub-design X[:, :j] with j > Indep is rank deficient).
func (f *QR) Indep() int { return f.indep }

// FullRank reports Indep() == m.
func (f *QR) FullRank() bool { return f.indep == f.m }

// RAt returns R_ij (zero below the diagonal), 0 ≤ i, j < m.
func (f *QR) RAt(i, j int) float64 {
	switch {
	case i > j:
		return 0
	case i == j:
		return f.diag[i]
	}
	return f.cols[j][i]
}

// R returns the m×m upper-triangular factor.
func (f *QR) R() *mat.TriDense {
	r := mat.NewTriDense(f.m, mat.Upper, nil)
	for i := 0; i < f.m; i++ {
		for j := i; j < f.m; j++ {
			r.SetTri(i, j, f.RAt(i, j))
		}
	}
	return r
}

// QTVec overwrites z (length n) with Qᵀz = H_{m−1} ⋯ H_0 z, each
// H_k z = z − τ_k (v_kᵀz) v_k, at 4nm flops (Golub and Van Loan 2013,
// §5.1).
func (f *QR) QTVec(z []float64) error {
	if len(z) != f.n {
		return fmt.Errorf("%w: vector of length %d for Qᵀ of order %d", ErrShape, len(z), f.n)
	}
	for k := 0; k < f.m; k++ {
		if f.tau[k] != 0 {
			v, c := f.cols[k][k:], z[k:]
			floats.AddScaled(c, -f.tau[k]*floats.Dot(v, c), v)
		}
	}
	return nil
}

// QVec overwrites z (length n) with Qz = H_0 ⋯ H_{m−1} z.
func (f *QR) QVec(z []float64) error {
	if len(z) != f.n {
		return fmt.Errorf("%w: vector of length %d for Q of order %d", ErrShape, len(z), f.n)
	}
	for k := f.m - 1; k >= 0; k-- {
		if f.tau[k] != 0 {
			v, c := f.cols[k][k:], z[k:]
			floats.AddScaled(c, -f.tau[k]*floats.Dot(v, c), v)
		}
	}
	return nil
}

// Solve overwrites b (length m, on entry the first m entries of Qᵀy)
// with the least-squares coefficients β̂ = R⁻¹(Qᵀy)_{0..m−1} by back
// substitution (Golub and Van Loan 2013, Alg. 3.1.2 and §5.3.3). It fails
// when X does not pass the rank rule.
func (f *QR) Solve(b []float64) error {
	if len(b) != f.m {
		return fmt.Errorf("%w: %d right-hand sides for R of order %d", ErrShape, len(b), f.m)
	}
	if f.indep < f.m {
		return fmt.Errorf("householder: R is singular: column %d is collinear with the columns before it", f.indep)
	}
	for i := f.m - 1; i >= 0; i-- {
		s := b[i]
		for j := i + 1; j < f.m; j++ {
			s -= f.cols[j][i] * b[j]
		}
		b[i] = s / f.diag[i]
	}
	return nil
}

// Q returns the first w columns of Q (n×w, m ≤ w ≤ n; w = m is the thin
// Q, an orthonormal basis of the column space of X, and columns m..n−1
// span its orthogonal complement), as Q e_j for each unit vector e_j.
func (f *QR) Q(w int) (*mat.Dense, error) {
	if w < 1 || w > f.n {
		return nil, fmt.Errorf("%w: %d columns of Q of order %d", ErrShape, w, f.n)
	}
	q := mat.NewDense(f.n, w, nil)
	e := make([]float64, f.n)
	for j := 0; j < w; j++ {
		for i := range e {
			e[i] = 0
		}
		e[j] = 1
		if err := f.QVec(e); err != nil {
			return nil, err
		}
		q.SetCol(j, e)
	}
	return q, nil
}

// Cond returns the 2-norm condition number σ_max(R)/σ_min(R) = κ₂(X), from
// the singular values of R (Golub and Van Loan 2013, §2.4, §5.3.8), +Inf
// when R is singular or the SVD fails. With columns of X scaled to unit
// length first it is the scaled condition number of the design.
func (f *QR) Cond() float64 {
	var svd mat.SVD
	if !svd.Factorize(f.R(), mat.SVDNone) {
		return math.Inf(1)
	}
	s := svd.Values(nil)
	if s[len(s)-1] == 0 {
		return math.Inf(1)
	}
	return s[0] / s[len(s)-1]
}

// Columns copies the r×c matrix x into c contiguous column slices of one
// backing array (column-major storage for Factor), with extra further
// zero columns for responses.
func Columns(x mat.Matrix, extra int) [][]float64 {
	r, c := x.Dims()
	buf := make([]float64, r*(c+extra))
	cols := make([][]float64, c+extra)
	for j := range cols {
		cols[j] = buf[j*r : (j+1)*r : (j+1)*r]
	}
	if rm, ok := x.(mat.RawMatrixer); ok {
		// a dense matrix: read its rows in place (At checks bounds
		// and goes through an interface at every entry)
		raw := rm.RawMatrix()
		for i := 0; i < r; i++ {
			row := raw.Data[i*raw.Stride : i*raw.Stride+c]
			for j, v := range row {
				cols[j][i] = v
			}
		}
		return cols
	}
	for j := 0; j < c; j++ {
		for i := 0; i < r; i++ {
			cols[j][i] = x.At(i, j)
		}
	}
	return cols
}
