package johansen

import (
	"errors"
	"fmt"
	"runtime"
	"strings"
	"sync"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/householder"
)

// Form says which parameters a recursive estimate re-estimates on each
// subsample (Hansen and Johansen 1999, §3).
type Form int

const (
	// XForm re-estimates every parameter of the VECM on each subsample:
	// the short-run dynamics and unrestricted deterministic terms are
	// concentrated out on the subsample itself.
	XForm Form = iota
	// RForm concentrates the short-run dynamics and the unrestricted
	// deterministic terms out on the full sample once; only the
	// reduced-rank regression of the residuals is recursive.
	RForm
)

// String returns "X" or "R".
func (f Form) String() string {
	switch f {
	case XForm:
		return "X"
	case RForm:
		return "R"
	}
	return fmt.Sprintf("Form(%d)", int(f))
}

// Recursion holds the eigenvalues and trace statistics of the
// reduced-rank problem estimated on expanding subsamples that all start at
// the first observation of the sample.
type Recursion struct {
	Form Form
	Case Case
	K    int
	Lags int
	// End[i] is the number of observations T_i of subsample i: the
	// estimation rows 0..T_i−1, which are the rows Lags+1..T_i+Lags of y
	// (the rows before supply lags). End runs from the first window up to
	// T, one observation at a time.
	End []int
	// Eigenvalues[i] holds λ_1(T_i) ≥ … ≥ λ_K(T_i); Trace[i][r] is
	// −T_i Σ_{j>r} ln(1 − λ_j(T_i)), r = 0..K−1.
	Eigenvalues, Trace [][]float64
}

// blockSize is the number of consecutive subsamples one worker updates
// after factorising its first subsample afresh: at least 128, and at most
// 16 blocks in all, since each fresh factorisation costs as much as
// adding all its rows one by one. It depends only on the number m of
// subsamples, so that the results do not depend on the number of cores.
func blockSize(m int) int { return max(128, (m+15)/16) }

// Recursive estimates the reduced-rank regression of TestExtra (same y,
// case, lagged differences and extra regressors) on the expanding
// subsamples t = first, first+1, …, T of the estimation sample (Hansen and
// Johansen 1999, "Some tests for parameter constancy in cointegrated
// VAR-models", Econometrics Journal 2, 306–333, §3).
//
// With R_0t and R_1t the residuals of Δy_t and ỹ_{t−1} on the short-run
// regressors Z_2t (lagged differences, unrestricted deterministic terms and
// unrestricted extra regressors), each subsample t solves
//
//	|λ S_11(t) − S_10(t) S_00(t)⁻¹ S_01(t)| = 0,  S_ij(t) = t⁻¹ Σ_{s≤t} R_is R_js',
//
// giving λ_1(t) ≥ … ≥ λ_K(t) and the trace statistics
// −t Σ_{j>r} ln(1 − λ_j(t)). In the X-form (form XForm) the residuals are
// those of the regression on the first t observations, so every parameter
// is re-estimated: subsample t is exactly TestExtra on rows 0..t+lags of y
// (and of the extra regressors). In the R-form (RForm) R_0t and R_1t are
// the residuals of the full-sample regression on Z_2t, fixed once, so the
// short-run parameters are held at their full-sample estimates and only the
// long-run problem is recursive. Without short-run regressors the two
// forms coincide.
//
// An extra regressor that is zero over the whole of a subsample (an
// impulse or step dummy dated after its end) is left out of that
// subsample's X-form, where it has no observation to explain.
//
// Method: the triangular factor R of the QR of each subsample's design
// [Z_2 | ỹ_{−1} | Δy] (or [R_1 | R_0] in the R-form) is obtained from the
// previous one by adding one row, [R_{t−1}; d_t] = Q R_t, with package
// householder's QR of that (m+1)×m matrix, and the eigenproblem follows
// from R_t exactly as in TestExtra. Every blockSize subsamples the
// factor is computed afresh from the rows, so that blocks run in parallel
// on workers goroutines (0: every core) with results that do not depend on
// their number. first must exceed the number of columns of the design
// (short-run regressors, rows of β and K).
func Recursive(y *mat.Dense, c Case, lags int, x Extra, first int, form Form, workers int) (*Recursion, error) {
	if form != XForm && form != RForm {
		return nil, fmt.Errorf("johansen: unknown recursive form %d", int(form))
	}
	full, err := TestExtra(y, c, lags, x)
	if err != nil {
		return nil, err
	}
	t, k, p1 := full.T, full.K, full.dz.p1
	ns := full.shortCols()
	n := ns + p1 + k
	if first <= n || first > t {
		return nil, fmt.Errorf("johansen: the first window of %d observations must exceed the %d columns of the design and not exceed the %d observations of the sample", first, n, t)
	}
	d := full.dz.rows()
	// The columns of d an all-zero prefix may leave out: the extra
	// regressors, unrestricted (after the lagged differences) and
	// restricted (after the levels and the case's restricted term).
	var extraCols []int
	nu, nr := x.counts()
	for j := 0; j < nu; j++ {
		extraCols = append(extraCols, ns-nu+j)
	}
	for j := 0; j < nr; j++ {
		extraCols = append(extraCols, ns+p1-nr+j)
	}
	rc := &recursion{k: k, c: c, lags: lags, nu: nu, nr: nr}
	if form == RForm && ns > 0 {
		if d, err = concentrate(d, ns); err != nil {
			return nil, err
		}
		// The residual columns of extra regressors are not zero on a
		// prefix in general; none is dropped.
		ns, extraCols, rc.nu = 0, nil, 0
	}
	rc.d, rc.ns, rc.p1 = d, ns, p1
	_, nd := d.Dims()
	rc.startOf = make([]int, nd)
	for _, j := range extraCols {
		rc.startOf[j] = t // never non-zero: always left out
		for i := 0; i < t; i++ {
			if d.At(i, j) != 0 {
				rc.startOf[j] = i
				break
			}
		}
	}
	out := &Recursion{Form: form, Case: c, K: k, Lags: lags}
	m := t - first + 1
	out.End = make([]int, m)
	out.Eigenvalues = make([][]float64, m)
	out.Trace = make([][]float64, m)
	for i := range out.End {
		out.End[i] = first + i
	}
	bs := blockSize(m)
	blocks := (m + bs - 1) / bs
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	workers = min(workers, blocks)
	errs := make([]error, blocks)
	next := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for b := range next {
				lo := first + b*bs
				hi := min(lo+bs, t+1)
				errs[b] = rc.block(lo, hi, out.Eigenvalues[lo-first:hi-first], out.Trace[lo-first:hi-first])
			}
		}()
	}
	for b := 0; b < blocks; b++ {
		next <- b
	}
	close(next)
	wg.Wait()
	for _, e := range errs {
		if e != nil {
			return nil, e
		}
	}
	return out, nil
}

// SubsampleError reports the first subsample of a recursion that cannot
// be analysed (its moment matrices are singular), by its number of
// observations End.
type SubsampleError struct {
	End int
	Err error
}

func (e *SubsampleError) Error() string {
	return fmt.Sprintf("johansen: the subsample of the first %d observations: %s", e.End, strings.TrimPrefix(e.Err.Error(), "johansen: "))
}

func (e *SubsampleError) Unwrap() error { return e.Err }

// recursion is the shared, read-only state of one Recursive call.
type recursion struct {
	d            *mat.Dense // the (scaled) design, all T rows
	k, ns, p1    int
	c            Case
	lags, nu, nr int
	startOf      []int // for extra-regressor columns: first non-zero row (T if none); 0 otherwise
}

// active lists the columns of the design used by the subsample of the
// first t rows: every column but the extra regressors that are still zero.
// It returns them with the number of short-run columns and rows of β
// among them.
func (rc *recursion) active(t int) (cols []int, ns, p1 int) {
	for j := range rc.startOf {
		if rc.startOf[j] < t {
			cols = append(cols, j)
			switch {
			case j < rc.ns:
				ns++
			case j < rc.ns+rc.p1:
				p1++
			}
		}
	}
	return cols, ns, p1
}

// block computes the subsamples lo..hi−1 (numbers of rows), writing their
// eigenvalues and trace statistics.
func (rc *recursion) block(lo, hi int, eig, trace [][]float64) error {
	var qr householder.QR
	var cols []int
	var ns, p1 int
	var st []float64 // column-major (m+1)×m storage of [R; new row]
	var sc [][]float64
	for t := lo; t < hi; t++ {
		ac, ans, ap1 := rc.active(t)
		if t == lo || len(ac) != len(cols) {
			// factorise the first t rows afresh
			cols, ns, p1 = ac, ans, ap1
			m := len(cols)
			buf := make([]float64, t*m)
			fc := make([][]float64, m)
			for j, c := range cols {
				fc[j] = buf[j*t : (j+1)*t : (j+1)*t]
				for i := 0; i < t; i++ {
					fc[j][i] = rc.d.At(i, c)
				}
			}
			if err := qr.Factor(fc, m); err != nil {
				return fmt.Errorf("johansen: %w", err)
			}
			st = make([]float64, (m+1)*m)
			sc = make([][]float64, m)
			for j := range sc {
				sc[j] = st[j*(m+1) : (j+1)*(m+1) : (j+1)*(m+1)]
			}
		} else {
			// add row t−1 to the factor of the first t−1 rows
			m := len(cols)
			for j := 0; j < m; j++ {
				for i := 0; i < m; i++ {
					sc[j][i] = qr.RAt(i, j)
				}
				sc[j][m] = rc.d.At(t-1, cols[j])
			}
			if err := qr.Factor(sc, m); err != nil {
				return fmt.Errorf("johansen: %w", err)
			}
		}
		if j := qr.Indep(); j < len(cols) {
			r := &Result{Case: rc.c, K: rc.k, NU: rc.nu - (rc.ns - ns), NR: p1 - rc.k - rc.c.restricted()}
			return &SubsampleError{End: t, Err: r.singular(j, ns, p1)}
		}
		r := &Result{K: rc.k}
		if err := r.solveR(qrView{&qr}, t, ns, p1); err != nil {
			return &SubsampleError{End: t, Err: err}
		}
		eig[t-lo] = r.Eigenvalues
		trace[t-lo] = r.Trace
	}
	return nil
}

// qrView is the R factor of a QR as a mat.Matrix, read in place.
type qrView struct{ qr *householder.QR }

func (v qrView) Dims() (int, int)    { _, m := v.qr.Dims(); return m, m }
func (v qrView) At(i, j int) float64 { return v.qr.RAt(i, j) }
func (v qrView) T() mat.Matrix       { return mat.Transpose{Matrix: v} }

// concentrate returns [R_1 | R_0], the residuals of the columns of d after
// the first ns (ỹ_{t−1} and Δy_t) on those first ns (the short-run
// regressors), by package householder's QR: with Qᵀy computed alongside
// the factorisation, the residual is Q(0, (Qᵀy)_{ns:}).
func concentrate(d *mat.Dense, ns int) (*mat.Dense, error) {
	t, n := d.Dims()
	cols := householder.Columns(d, 0)
	var qr householder.QR
	if err := qr.Factor(cols, ns); err != nil {
		return nil, fmt.Errorf("johansen: %w", err)
	}
	if !qr.FullRank() {
		return nil, errors.New("johansen: the short-run regressors are collinear")
	}
	out := mat.NewDense(t, n-ns, nil)
	for j := ns; j < n; j++ {
		z := cols[j]
		for i := 0; i < ns; i++ {
			z[i] = 0
		}
		if err := qr.QVec(z); err != nil {
			return nil, fmt.Errorf("johansen: %w", err)
		}
		out.SetCol(j-ns, z)
	}
	return out, nil
}

// ScaledTrace returns the trace statistics of each subsample divided by
// the asymptotic critical value at level (0.10, 0.05 or 0.01) for
// dimension K − r in the recursion's case (CriticalValues), so that a
// ratio above one rejects H(r) at that level; with it the critical values
// used, r = 0..K−1. Drawing recursive trace statistics relative to their
// 5% critical value, so that the line at one is the test, is common
// practice. The asymptotic critical value is the same for every
// subsample; with dummies or extra regressors it is only a guide (see
// TestExtra).
func (r *Recursion) ScaledTrace(level float64) ([][]float64, []float64, error) {
	li, err := levelIndex(level)
	if err != nil {
		return nil, nil, err
	}
	cv := make([]float64, r.K)
	for rank := range cv {
		c, err := CriticalValues(r.Case, TraceStat, r.K-rank)
		if err != nil {
			return nil, nil, err
		}
		cv[rank] = c[li]
	}
	out := make([][]float64, len(r.Trace))
	for i, tr := range r.Trace {
		out[i] = make([]float64, r.K)
		for rank, v := range tr {
			out[i][rank] = v / cv[rank]
		}
	}
	return out, cv, nil
}
