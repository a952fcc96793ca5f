package stability

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// ErrNoFullRank is returned when the regressors never reach full column
// rank, so no recursive residual can be formed.
var ErrNoFullRank = errors.New("stability: regressors never reach full column rank")

// rankTol is the threshold on |R_jj| relative to the Euclidean norm of
// column j of the rows processed so far below which column j counts as
// not yet identified.
const rankTol = 1e-10

// Recursive holds the recursive least-squares results for y on X with N
// observations and K regressors. First is the zero-based row of the first
// recursive residual: the smallest m ≥ K such that rows 0..m−1 of X have
// full column rank (m = K unless early rows are degenerate, e.g. a dummy
// that is zero at the start of the sample).
type Recursive struct {
	N, K  int
	First int

	// Resid holds the recursive residuals (BDE 1975, eq. 2)
	//
	//	w_t = (y_t − x_t'b_{t−1}) / √(1 + x_t'(X_{t−1}'X_{t−1})⁻¹x_t),  t ≥ First,
	//
	// where b_{t−1} is the least-squares estimate from rows 0..t−1. Under
	// constant β and iid N(0,σ²) errors they are iid N(0,σ²).
	Resid []float64

	// Coef[t][j] is b_{t,j}, the least-squares estimate of β_j from rows
	// 0..t, defined for t ≥ First−1.
	Coef [][]float64

	// SE[t][j] is the classical standard error of b_{t,j},
	// s_t √[(X_t'X_t)⁻¹]_jj with s_t² = S_t/(t+1−K), S_t the residual sum
	// of squares of rows 0..t; defined when t+1 > K.
	SE [][]float64

	// SSR is S_{N−1}, the full-sample residual sum of squares, which
	// equals the initial fit's SSR plus Σ w_t² (BDE 1975, eq. 4).
	SSR float64
}

// Compute runs the recursion for y on X (rows are observations).
//
// Method: the triangular factor R and z = Q'y of the rows seen so far are
// updated one row at a time by Givens rotations (orthogonal, so no
// normal equations are formed); the prediction b_{t−1} = R⁻¹z and the
// variance factor 1 + ‖R⁻ᵀx_t‖² come from triangular solves before the
// update.
func Compute(y []float64, x *mat.Dense) (*Recursive, error) {
	if x == nil {
		return nil, errors.New("stability: nil design matrix")
	}
	n, k := x.Dims()
	if n != len(y) {
		return nil, fmt.Errorf("stability: %d observations in y but %d rows in X", len(y), n)
	}
	if k == 0 {
		return nil, errors.New("stability: no regressors")
	}
	for t := 0; t < n; t++ {
		if v := y[t]; math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("stability: y[%d] is not finite", t)
		}
		for j := 0; j < k; j++ {
			if v := x.At(t, j); math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, fmt.Errorf("stability: X[%d,%d] is not finite", t, j)
			}
		}
	}
	if n <= k {
		return nil, fmt.Errorf("stability: %d observations for %d regressors leave no recursive residual", n, k)
	}

	r := &Recursive{N: n, K: k, First: -1,
		Resid: nanSlice(n), Coef: make([][]float64, n), SE: make([][]float64, n)}
	for t := 0; t < n; t++ {
		r.Coef[t] = nanSlice(k)
		r.SE[t] = nanSlice(k)
	}

	R := make([]float64, k*k) // upper triangular, row-major
	z := make([]float64, k)
	colSS := make([]float64, k)
	var ssr float64
	xt := make([]float64, k)
	b := make([]float64, k)
	u := make([]float64, k)
	rinv := make([]float64, k*k)
	full := false
	for t := 0; t < n; t++ {
		for j := 0; j < k; j++ {
			xt[j] = x.At(t, j)
		}
		if full {
			backSolve(R, z, b, k)
			forwardSolveT(R, xt, u, k)
			var f, pred float64
			for j := 0; j < k; j++ {
				f += u[j] * u[j]
				pred += xt[j] * b[j]
			}
			w := (y[t] - pred) / math.Sqrt(1+f)
			r.Resid[t] = w
			ssr += w * w
			givensAdd(R, z, xt, y[t], k)
		} else {
			for j := 0; j < k; j++ {
				colSS[j] += xt[j] * xt[j]
			}
			ssr += givensAdd(R, z, xt, y[t], k)
			if t+1 >= k && fullRank(R, colSS, k) {
				full = true
				r.First = t + 1
			}
		}
		if !full {
			continue
		}
		backSolve(R, z, r.Coef[t], k)
		if df := t + 1 - k; df > 0 {
			s2 := ssr / float64(df)
			invUpper(R, rinv, k)
			for j := 0; j < k; j++ {
				var d float64
				for l := j; l < k; l++ {
					d += rinv[j*k+l] * rinv[j*k+l]
				}
				r.SE[t][j] = math.Sqrt(s2 * d)
			}
		}
	}
	if r.First < 0 || r.First >= n {
		return nil, fmt.Errorf("%w (%d observations, %d regressors)", ErrNoFullRank, n, k)
	}
	r.SSR = ssr
	return r, nil
}

// Residuals returns the number of recursive residuals, N − First.
func (r *Recursive) Residuals() int { return r.N - r.First }

// Sigma is σ̂ = √(S_T/(T−K)), the full-sample regression standard error
// used to scale the CUSUM (BDE 1975, section 2.3).
func (r *Recursive) Sigma() float64 { return math.Sqrt(r.SSR / float64(r.N-r.K)) }

// CoefBand returns, for regressor j, the recursive estimate b_{t,j} and
// the band b_{t,j} ± z·SE[t][j] with z = 1.959964 (normal 97.5% point; a
// pointwise 95% band, common practice). Entries are NaN where undefined.
func (r *Recursive) CoefBand(j int) (est, lo, hi []float64, err error) {
	if j < 0 || j >= r.K {
		return nil, nil, nil, fmt.Errorf("stability: regressor %d out of range 0..%d", j, r.K-1)
	}
	const z = 1.959963984540054
	est, lo, hi = nanSlice(r.N), nanSlice(r.N), nanSlice(r.N)
	for t := 0; t < r.N; t++ {
		est[t] = r.Coef[t][j]
		lo[t] = est[t] - z*r.SE[t][j]
		hi[t] = est[t] + z*r.SE[t][j]
	}
	return est, lo, hi, nil
}

// givensAdd rotates the row [x, y] into the triangular system (R, z) and
// returns the square of what is left of y, the increase in the residual
// sum of squares. x is overwritten.
func givensAdd(R, z, x []float64, y float64, k int) float64 {
	for j := 0; j < k; j++ {
		xj := x[j]
		if xj == 0 {
			continue
		}
		rjj := R[j*k+j]
		h := math.Hypot(rjj, xj)
		c, s := rjj/h, xj/h
		R[j*k+j] = h
		x[j] = 0
		for l := j + 1; l < k; l++ {
			a, bb := R[j*k+l], x[l]
			R[j*k+l] = c*a + s*bb
			x[l] = -s*a + c*bb
		}
		a := z[j]
		z[j] = c*a + s*y
		y = -s*a + c*y
	}
	return y * y
}

func fullRank(R, colSS []float64, k int) bool {
	for j := 0; j < k; j++ {
		if colSS[j] == 0 || math.Abs(R[j*k+j]) <= rankTol*math.Sqrt(colSS[j]) {
			return false
		}
	}
	return true
}

// backSolve solves R b = z for upper-triangular R.
func backSolve(R, z, b []float64, k int) {
	for i := k - 1; i >= 0; i-- {
		s := z[i]
		for l := i + 1; l < k; l++ {
			s -= R[i*k+l] * b[l]
		}
		b[i] = s / R[i*k+i]
	}
}

// forwardSolveT solves R'u = x for upper-triangular R.
func forwardSolveT(R, x, u []float64, k int) {
	for i := 0; i < k; i++ {
		s := x[i]
		for l := 0; l < i; l++ {
			s -= R[l*k+i] * u[l]
		}
		u[i] = s / R[i*k+i]
	}
}

// invUpper writes R⁻¹ (upper triangular) into out.
func invUpper(R, out []float64, k int) {
	for i := range out {
		out[i] = 0
	}
	for c := 0; c < k; c++ {
		// solve R v = e_c; v_i = 0 for i > c
		for i := c; i >= 0; i-- {
			var s float64
			if i == c {
				s = 1
			}
			for l := i + 1; l <= c; l++ {
				s -= R[i*k+l] * out[l*k+c]
			}
			out[i*k+c] = s / R[i*k+i]
		}
	}
}

func nanSlice(n int) []float64 {
	s := make([]float64, n)
	for i := range s {
		s[i] = math.NaN()
	}
	return s
}
