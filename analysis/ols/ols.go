// Package ols fits linear regressions by least squares and computes the
// usual covariance estimators (classical, HC1, Newey–West HAC).
//
// The fit uses a Householder QR factorisation of the design matrix, never
// the normal equations, so that a poorly scaled regressor costs accuracy
// only in proportion to the condition number of X rather than its square.
package ols

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/householder"
)

// ErrTooFewObs is returned when a regression has no residual degrees of freedom.
var ErrTooFewObs = errors.New("too few observations")

// CollinearError reports a regressor that is (numerically) a linear
// combination of the columns before it.
type CollinearError struct {
	Col int // zero-based column index in X
}

func (e *CollinearError) Error() string {
	return fmt.Sprintf("regressor %d is collinear with the regressors before it", e.Col)
}

// Fit is a least-squares fit of y on X.
type Fit struct {
	N, K   int       // observations and regressors
	Coef   []float64 // β̂
	Resid  []float64 // e = y − Xβ̂
	Fitted []float64 // Xβ̂
	SSR    float64   // e'e
	TSS    float64   // centred total sum of squares Σ(y−ȳ)²
	YY     float64   // uncentred total sum of squares Σy²
	Cond   float64   // condition number estimate of X (column-scaled), from R

	x    *mat.Dense
	rinv *mat.TriDense // R⁻¹ from X = QR, so (X'X)⁻¹ = R⁻¹R⁻ᵀ
}

// Regress fits y = Xβ + e by least squares using the Householder QR
// factorisation of the column-scaled X (package householder):
// β̂ = R⁻¹(Qᵀy)_{1..K} (Golub and Van Loan 2013, §5.3.3). Column j is
// collinear when |R_jj| ≤ householder.CollinearTol·‖x_j‖.
// X must have N rows (len(y)) and K < N columns; rows are observations.
func Regress(y []float64, x *mat.Dense) (*Fit, error) {
	fs, err := RegressEach([][]float64{y}, x)
	if err != nil {
		return nil, err
	}
	return fs[0], nil
}

// RegressEach fits y_i = Xβ_i + e_i by least squares for every response
// y_i in ys on the same X, as Regress does one at a time, from one
// Householder QR of the column-scaled X with every response carried as
// an extra column (Qᵀy_i; Golub and Van Loan 2013, §5.3.3, one
// factorisation for several right-hand sides). The reflections act on
// each column separately, so every fit equals Regress(y_i, x) bit for
// bit. Errors are those of Regress (every response is checked before X).
func RegressEach(ys [][]float64, x *mat.Dense) ([]*Fit, error) {
	n, k := x.Dims()
	for _, y := range ys {
		if n != len(y) {
			return nil, fmt.Errorf("ols: %d observations in y but %d rows in X", len(y), n)
		}
	}
	if k == 0 {
		return nil, errors.New("ols: no regressors")
	}
	if n <= k {
		return nil, fmt.Errorf("ols: %w: %d observations for %d regressors", ErrTooFewObs, n, k)
	}
	for _, y := range ys {
		for i, v := range y {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, fmt.Errorf("ols: y[%d] is not finite", i)
			}
		}
	}
	// The responses ride along as columns k, k+1, …, so that they come
	// back as Qᵀy.
	cols := householder.Columns(x, len(ys))
	for r, y := range ys {
		copy(cols[k+r], y)
	}
	qr, scale, rinv, err := factorScaled(cols, k)
	if err != nil {
		return nil, err
	}
	cond := qr.Cond()
	raw := x.RawMatrix()
	out := make([]*Fit, len(ys))
	for ri, y := range ys {
		bs := append([]float64(nil), cols[k+ri][:k]...) // (Qᵀy)_{0..k−1}
		if err := qr.Solve(bs); err != nil {
			return nil, fmt.Errorf("ols: %w", err)
		}
		f := &Fit{N: n, K: k, Coef: make([]float64, k), x: x, Cond: cond}
		if ri == 0 {
			f.rinv = rinv
		} else {
			f.rinv = mat.NewTriDense(k, mat.Upper, nil)
			f.rinv.Copy(rinv)
		}
		for j := 0; j < k; j++ {
			f.Coef[j] = bs[j] / scale[j]
		}
		f.Fitted = make([]float64, n)
		f.Resid = make([]float64, n)
		var ybar float64
		for _, v := range y {
			ybar += v
		}
		ybar /= float64(n)
		for i := 0; i < n; i++ {
			row := raw.Data[i*raw.Stride : i*raw.Stride+k]
			var fit float64
			for j, v := range row {
				fit += v * f.Coef[j]
			}
			f.Fitted[i] = fit
			e := y[i] - fit
			f.Resid[i] = e
			f.SSR += e * e
			d := y[i] - ybar
			f.TSS += d * d
			f.YY += y[i] * y[i]
		}
		out[ri] = f
	}
	return out, nil
}

// DF is the residual degrees of freedom N − K.
func (f *Fit) DF() int { return f.N - f.K }

// Sigma2 is the residual variance s² = e'e/(N−K).
func (f *Fit) Sigma2() float64 { return f.SSR / float64(f.N-f.K) }

// R2 is the centred coefficient of determination R²_c = 1 − e'e/Σ(y−ȳ)²
// (Davidson and MacKinnon 2004, §3.5). It lies in [0, 1] when X contains
// a constant; without one it can be negative (see R2Uncentred). The LM
// statistics N·R² of the auxiliary regressions in analysis/diag use it.
func (f *Fit) R2() float64 {
	if f.TSS == 0 {
		return math.NaN()
	}
	return 1 - f.SSR/f.TSS
}

// R2Adj is the adjusted centred R², 1 − (1−R²_c)(N−1)/(N−K) (Theil's
// R̄²; Davidson and MacKinnon 2004, §3.8).
func (f *Fit) R2Adj() float64 {
	return 1 - (1-f.R2())*float64(f.N-1)/float64(f.N-f.K)
}

// R2Uncentred is the uncentred coefficient of determination
// R²_u = 1 − e'e/y'y = ‖P_X y‖²/‖y‖² (Davidson and MacKinnon 2004, §3.5),
// the measure for a regression without a constant: it lies in [0, 1]
// for any X. It is the R² statsmodels' OLS reports when the model has no
// constant (RegressionResults.rsquared, 1 − ssr/uncentered_tss).
func (f *Fit) R2Uncentred() float64 {
	if f.YY == 0 {
		return math.NaN()
	}
	return 1 - f.SSR/f.YY
}

// R2AdjUncentred is the adjusted uncentred R², 1 − (1−R²_u)·N/(N−K): the
// degrees-of-freedom correction with no constant to discount (the form
// statsmodels' rsquared_adj takes without a constant, with
// k_constant = 0).
func (f *Fit) R2AdjUncentred() float64 {
	return 1 - (1-f.R2Uncentred())*float64(f.N)/float64(f.N-f.K)
}

// DW is the Durbin–Watson statistic Σ(e_t − e_{t−1})² / Σe_t².
func (f *Fit) DW() float64 {
	var num float64
	for t := 1; t < f.N; t++ {
		d := f.Resid[t] - f.Resid[t-1]
		num += d * d
	}
	return num / f.SSR
}

// LogLik is the Gaussian log-likelihood −N/2·(1 + ln 2π + ln(SSR/N)).
func (f *Fit) LogLik() float64 {
	n := float64(f.N)
	return -n / 2 * (1 + math.Log(2*math.Pi) + math.Log(f.SSR/n))
}

// XtXInv returns (X'X)⁻¹ = R⁻¹R⁻ᵀ.
func (f *Fit) XtXInv() *mat.SymDense {
	k := f.K
	out := mat.NewSymDense(k, nil)
	for i := 0; i < k; i++ {
		for j := i; j < k; j++ {
			var s float64
			for l := j; l < k; l++ { // R⁻¹ upper: (R⁻¹)_{il} nonzero for l ≥ i
				s += f.rinv.At(i, l) * f.rinv.At(j, l)
			}
			out.SetSym(i, j, s)
		}
	}
	return out
}

// X returns the design matrix the fit was computed from (not a copy).
func (f *Fit) X() *mat.Dense { return f.x }

// factorScaled scales the columns cols[:k] of X to unit norm (this makes
// the condition estimate scale invariant), factorises them by Householder
// QR carrying cols[k:] (responses) along, and returns the QR, the scales
// and R⁻¹ of the unscaled problem.
func factorScaled(cols [][]float64, k int) (*householder.QR, []float64, *mat.TriDense, error) {
	scale := make([]float64, k)
	for j := 0; j < k; j++ {
		c := cols[j]
		var s float64
		for i, v := range c {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, nil, nil, fmt.Errorf("ols: X[%d,%d] is not finite", i, j)
			}
			s += v * v
		}
		s = math.Sqrt(s)
		if s == 0 {
			return nil, nil, nil, &CollinearError{Col: j}
		}
		scale[j] = s
		for i := range c {
			c[i] /= s
		}
	}
	var qr householder.QR
	if err := qr.Factor(cols, k); err != nil {
		return nil, nil, nil, fmt.Errorf("ols: %w", err)
	}
	if j := qr.Indep(); j < k {
		return nil, nil, nil, &CollinearError{Col: j}
	}
	// R⁻¹ of the unscaled problem: X = Xs·D, Xs = QRs, so X = Q(Rs·D), R = Rs·D, R⁻¹ = D⁻¹Rs⁻¹.
	r := qr.R()
	var rsinv mat.TriDense
	if err := rsinv.InverseTri(r); err != nil {
		return nil, nil, nil, fmt.Errorf("ols: %w", err)
	}
	rinv := mat.NewTriDense(k, mat.Upper, nil)
	for i := 0; i < k; i++ {
		for j := i; j < k; j++ {
			rinv.SetTri(i, j, rsinv.At(i, j)/scale[i])
		}
	}
	return &qr, scale, rinv, nil
}

// EachFit is one equation of RegressEachColumns: the coefficients, the
// residual sum of squares and the classical covariance s²(X'X)⁻¹,
// s² = SSR/(N − K), of a least-squares fit whose residuals the caller
// holds.
type EachFit struct {
	N, K int
	Coef []float64
	SSR  float64
	Cov  *mat.SymDense
}

// RegressEachColumns is RegressEach on storage the caller fills and gives
// up: cols[:k] are the columns of X and cols[k:] the responses y_r, all of
// one length m, overwritten by the factorisation. For the residuals
// e_r = y_r − Xβ̂_r the n > k observations are read again: row(i, x, y)
// must write row i of X (length k) and of the responses (length
// len(cols) − k), and e_ri is stored in resid[r][i] (resid[r] of length n).
//
// The columns are either the data themselves (m = n) or any m ≥ k rows
// [X̃ Ỹ] with the same cross-products, X̃'X̃ = X'X and X̃'Ỹ = X'Y — such as
// the rows of R from a QR of a design whose columns span X and Y, which
// are those of Q'[X Y] (Golub and Van Loan 2013, §5.3): β̂ = (X'X)⁻¹X'y
// and (X'X)⁻¹ depend on the data only through those products, and SSR
// and s² come from the residuals of the n rows. A model fitted after a
// QR of its data (Johansen's short-run equations) so costs a fit on a few
// rows and one pass over the data.
//
// The arithmetic is RegressEach's — Householder QR of the column-scaled
// X̃, β̂ = R⁻¹(Qᵀy)_{1..K}, SSR = e'e, Cov = s²R⁻¹R⁻ᵀ, s² = SSR/(n − K)
// (Golub and Van Loan 2013, §5.3.3) — so with the data as columns every
// number equals RegressEach's bit for bit (tested), without its copies of
// X and of the responses and without fitted values.
func RegressEachColumns(cols [][]float64, k, n int, row func(i int, x, y []float64), resid [][]float64) ([]*EachFit, error) {
	if k <= 0 || len(cols) <= k {
		return nil, fmt.Errorf("ols: %d columns for %d regressors and at least one response", len(cols), k)
	}
	m := len(cols[0])
	for _, c := range cols {
		if len(c) != m {
			return nil, fmt.Errorf("ols: columns of %d and %d rows", len(c), m)
		}
	}
	q := len(cols) - k
	if len(resid) != q {
		return nil, fmt.Errorf("ols: %d residual vectors for %d responses", len(resid), q)
	}
	for _, e := range resid {
		if len(e) != n {
			return nil, fmt.Errorf("ols: a residual vector of length %d for %d observations", len(e), n)
		}
	}
	if n <= k || m < k {
		return nil, fmt.Errorf("ols: %w: %d observations for %d regressors", ErrTooFewObs, min(n, m), k)
	}
	for _, y := range cols[k:] {
		for i, v := range y {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, fmt.Errorf("ols: y[%d] is not finite", i)
			}
		}
	}
	qr, scale, rinv, err := factorScaled(cols, k)
	if err != nil {
		return nil, err
	}
	out := make([]*EachFit, q)
	fits := make([]*Fit, q)
	for ri := range out {
		bs := append([]float64(nil), cols[k+ri][:k]...) // (Qᵀy)_{0..k−1}
		if err := qr.Solve(bs); err != nil {
			return nil, fmt.Errorf("ols: %w", err)
		}
		f := &Fit{N: n, K: k, Coef: make([]float64, k), rinv: rinv}
		for j := 0; j < k; j++ {
			f.Coef[j] = bs[j] / scale[j]
		}
		fits[ri] = f
	}
	xr, yr := make([]float64, k), make([]float64, q)
	for i := 0; i < n; i++ {
		row(i, xr, yr)
		for ri, f := range fits {
			var fit float64
			for j, v := range xr {
				fit += v * f.Coef[j]
			}
			e := yr[ri] - fit
			resid[ri][i] = e
			f.SSR += e * e
		}
	}
	for ri, f := range fits {
		out[ri] = &EachFit{N: n, K: k, Coef: f.Coef, SSR: f.SSR, Cov: f.Cov(CovSpec{Kind: Classical})}
	}
	return out, nil
}
