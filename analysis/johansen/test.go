package johansen

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/householder"
)

// Result holds the reduced-rank regression behind Johansen's rank tests.
type Result struct {
	Case Case
	Lags int // lagged differences k in the VECM (VAR order in levels k+1)
	K    int // number of series
	T    int // observations used (input rows − Lags − 1)
	// NU and NR count the extra unrestricted and restricted regressors
	// (Extra): the unrestricted ones follow the lagged differences among
	// the short-run regressors, the restricted ones follow y_{t−1} and the
	// case's restricted term among the rows of β.
	NU, NR int

	// Eigenvalues λ_1 ≥ ... ≥ λ_K of |λS11 − S10 S00⁻¹ S01| = 0.
	Eigenvalues []float64
	// Trace[r] = −T Σ_{i>r} ln(1−λ_i) and MaxEig[r] = −T ln(1−λ_{r+1}),
	// the statistics for H(r) against H(K) and H(r+1), r = 0..K−1.
	Trace, MaxEig []float64
	// Vectors holds the eigenvectors v_1..v_K as columns, (K+m)×K where m
	// is the number of restricted deterministic terms (1 for RC and RT,
	// whose last row is the constant or trend coefficient), normalised
	// v_i'S11 v_j = δ_ij. The first r columns span the estimated β.
	Vectors *mat.Dense

	// Product-moment matrices of the residuals R0 (Δy_t) and R1 (ỹ_{t−1})
	// after the lagged differences and unrestricted deterministic terms are
	// regressed out: S_ij = T⁻¹ Σ_t R_it R_jt', in the units of y.
	S00, S11 *mat.SymDense
	S01      *mat.Dense

	// The same problem on the internally scaled series yD⁻¹ (scale.go):
	// scale holds d_1..d_K; s00, s11, s01 and the eigenvectors vs are the
	// scaled counterparts of S00, S11, S01 and Vectors, and dz writes the
	// rows of the scaled design (scaled Δy_t, ỹ_{t−1} and short-run
	// regressors) again when they are needed after the factorisation.
	scale    []float64
	s00, s11 *mat.SymDense
	s01, vs  *mat.Dense
	dz       *designer
	// r11 is the R1 block of the QR in reduce (T·s11 = r11'r11) and a the
	// symmetric T⁻¹ R10 S00⁻¹ R10' whose eigenvalues are the λ_i; TestBeta
	// solves the restricted problem from them.
	r11 *mat.TriDense
	a   *mat.SymDense
	// rd is the whole triangular factor of that QR, of the design
	// [zs | z1 | z0]: shortRun fits the short-run equations from it.
	rd *mat.TriDense
}

// P1 is the row count of β: K plus the restricted deterministic term, if any.
func (r *Result) P1() int { return r.K + r.Case.restricted() + r.NR }

// shortCols is the number of short-run regressors (lagged differences,
// unrestricted terms and regressors), 0 without any.
func (r *Result) shortCols() int { return r.dz.ns }

// Extra holds regressors beyond the deterministic terms of the case, each a
// matrix with one row per row of y (nil when there are none).
//
// Unrestricted columns w_t enter every short-run equation at the date of
// Δy_t: centred seasonal dummies, impulse dummies, stationary (I(0))
// conditioning regressors, and step dummies in the cases whose constant is
// unrestricted.
//
// Restricted columns x_t enter the cointegrating relations lagged once,
// beside y_{t−1} — β'(y_{t−1}', [const or trend], x_{t−1}')' — as a step
// dummy does when the level shift it describes lies in the relations
// (Johansen, Mosconi and Nielsen 2000, §2).
type Extra struct {
	Unrestricted, Restricted *mat.Dense
}

func (x Extra) counts() (nu, nr int) {
	if x.Unrestricted != nil {
		_, nu = x.Unrestricted.Dims()
	}
	if x.Restricted != nil {
		_, nr = x.Restricted.Dims()
	}
	return nu, nr
}

// Test performs Johansen's reduced-rank regression (Johansen 1988, 1991;
// Johansen 1995, ch. 6) of the VECM in Case c with lags lagged differences
// on the T×K matrix y of levels (rows are time).
//
// Δy_t and ỹ_{t−1} are each regressed by least squares on the lagged
// differences Δy_{t−1..t−lags} and the unrestricted deterministic terms,
// giving residuals R0t and R1t and S_ij = T⁻¹ Σ R_it R_jt'. The eigenvalues
// solve |λS11 − S10 S00⁻¹ S01| = 0. They are computed from one Householder
// QR factorisation of [short-run regressors | ỹ_{t−1} | Δy_t]: its diagonal
// block R11 is a Cholesky factor of T·S11, and with R10 the block above Δy_t,
// the eigenvalues are those of the symmetric matrix T⁻¹ R10 S00⁻¹ R10'.
//
// The trend term (cases RT and CT) takes the value t at the row t of y (rows
// numbered from 0), so that it counts the observations of y_{t−1} from 1.
//
// The computation runs on the series divided by internal scales d_j (see
// scale.go) and every result is mapped back to the units of y, so that the
// outcome does not depend on the units of measurement: the singularity
// checks are judged on the scaled problem.
func Test(y *mat.Dense, c Case, lags int) (*Result, error) {
	return TestExtra(y, c, lags, Extra{})
}

// TestExtra is Test with extra regressors (Extra): the unrestricted
// columns w_t join the short-run regressors that Δy_t and ỹ_{t−1} are
// regressed on, and the restricted columns x_{t−1} are appended to ỹ_{t−1},
// so that the reduced-rank regression, the eigenvalues and the statistics
// are those of
//
//	Δy_t = α β'(y_{t−1}', ρ', x_{t−1}')' + Σ_{i=1}^{k} Γ_i Δy_{t−i} + Φ d_t + Ψ w_t + ε_t
//
// (Johansen 1995, §5.7 and §6.1, where the deterministic terms are any
// regressors split into restricted and unrestricted parts). Centred
// seasonal and impulse dummies leave the asymptotic distribution of the
// rank statistics unchanged; step dummies restricted to the relations
// change it (Johansen, Mosconi and Nielsen 2000), and any dummy changes
// its finite-sample distribution.
func TestExtra(y *mat.Dense, c Case, lags int, x Extra) (*Result, error) {
	if y == nil {
		return nil, errors.New("johansen: no data")
	}
	if !c.valid() {
		return nil, fmt.Errorf("johansen: invalid deterministic case %d", int(c))
	}
	if lags < 0 {
		return nil, fmt.Errorf("johansen: lagged differences must be non-negative, got %d", lags)
	}
	rows, k := y.Dims()
	if k < 1 {
		return nil, errors.New("johansen: no series")
	}
	if err := checkSeries(y); err != nil {
		return nil, err
	}
	nu, nr := x.counts()
	for _, e := range []*mat.Dense{x.Unrestricted, x.Restricted} {
		if e == nil {
			continue
		}
		if er, _ := e.Dims(); er != rows {
			return nil, fmt.Errorf("johansen: extra regressors have %d rows; y has %d", er, rows)
		}
		if err := checkFinite(e); err != nil {
			return nil, err
		}
	}
	m := c.restricted() + nr
	p1 := k + m
	ns := c.unrestricted() + k*lags + nu
	t := rows - lags - 1
	if need := ns + p1 + k; t <= need {
		return nil, fmt.Errorf("johansen: too few observations: %d rows with %d lagged differences leave %d for estimation; case %s with %d series needs more than %d",
			rows, lags, max(t, 0), c, k, need)
	}
	scale := seriesScale(y)
	dz := newDesigner(scaleColumns(y, scale), c, lags, x)
	res := &Result{Case: c, Lags: lags, K: k, T: t, NU: nu, NR: nr, scale: scale, dz: dz}
	if err := res.reduce(); err != nil {
		return nil, err
	}
	res.unscale()
	return res, nil
}

// unscale sets S00 = D S̃00 D, S11 = D₁ S̃11 D₁, S01 = D S̃01 D₁ and the
// eigenvectors v = D₁⁻¹ ṽ in the units of y (so that v'S11v = ṽ'S̃11ṽ = I).

func (r *Result) unscale() {
	s1 := r.rowScale()
	r.S00 = outerSym(r.scale, r.s00)
	r.S11 = outerSym(s1, r.s11)
	r.S01 = outer(r.scale, r.s01, s1)
	r.Vectors = mulRows(r.vs, s1, true)
}

// checkFinite names the first non-finite value of an extra regressor.
func checkFinite(e *mat.Dense) error {
	rows, cols := e.Dims()
	for j := 0; j < cols; j++ {
		for i := 0; i < rows; i++ {
			if v := e.At(i, j); math.IsNaN(v) || math.IsInf(v, 0) {
				return fmt.Errorf("johansen: extra regressor %d has a missing or infinite value at row %d", j, i)
			}
		}
	}
	return nil
}

// designer writes the design [short-run regressors | ỹ_{t−1} | Δy_t] of
// levels y, one row per observation t = 0..T−1 (row t+lags+1 of y), with
// short-run regressors [1, t (as the case has them), Δy_{t−1}, ...,
// Δy_{t−lags}, w_t] (ns columns) and ỹ_{t−1} = [y_{t−1}, restricted
// term, x_{t−1}] (p1 columns), then the K columns of Δy_t. Its one rule,
// row, feeds the factorisation (householder.TallR, which never holds the
// whole design), builds the row-major design of the recursive estimates,
// and writes the rows the short-run fits read again.
type designer struct {
	y               *mat.Dense
	c               Case
	lags            int
	x               Extra
	k, ns, p1, n, t int
	dn, m, nu, nr   int
}

func newDesigner(y *mat.Dense, c Case, lags int, x Extra) *designer {
	rows, k := y.Dims()
	nu, nr := x.counts()
	g := &designer{y: y, c: c, lags: lags, x: x, k: k, t: rows - lags - 1,
		dn: c.unrestricted(), m: c.restricted(), nu: nu, nr: nr}
	g.ns = g.dn + k*lags + nu
	g.p1 = k + g.m + nr
	g.n = g.ns + g.p1 + k
	return g
}

// row writes row i of the design into row (length n).
func (g *designer) row(i int, row []float64) {
	k, ns := g.k, g.ns
	yr := g.y.RawMatrix()
	yrow := func(i int) []float64 { return yr.Data[i*yr.Stride : i*yr.Stride+k] }
	s := i + g.lags + 1 // row of y for Δy_t
	col := 0
	if g.dn >= 1 {
		row[0] = 1
		col++
	}
	if g.dn == 2 {
		row[1] = float64(s)
		col++
	}
	for l := 1; l <= g.lags; l++ {
		cur, prev := yrow(s-l), yrow(s-l-1)
		for j := 0; j < k; j++ {
			row[col+j] = cur[j] - prev[j]
		}
		col += k
	}
	for j := 0; j < g.nu; j++ {
		row[col+j] = g.x.Unrestricted.At(s, j)
	}
	cur, prev := yrow(s), yrow(s-1)
	copy(row[ns:ns+k], prev)
	switch g.c {
	case RC:
		row[ns+k] = 1
	case RT:
		row[ns+k] = float64(s)
	}
	for j := 0; j < g.nr; j++ {
		row[ns+k+g.m+j] = g.x.Restricted.At(s-1, j)
	}
	for j := 0; j < k; j++ {
		row[ns+g.p1+j] = cur[j] - prev[j]
	}
}

// rows returns the whole design as a T×n matrix.
func (g *designer) rows() *mat.Dense {
	d := mat.NewDense(g.t, g.n, nil)
	raw := d.RawMatrix()
	for i := 0; i < g.t; i++ {
		g.row(i, raw.Data[i*raw.Stride:i*raw.Stride+g.n])
	}
	return d
}

// checkSeries names non-finite values, constant series and identical series.
func checkSeries(y *mat.Dense) error {
	rows, k := y.Dims()
	raw := y.RawMatrix() // read in place: a bootstrap checks every replication
	at := func(i, j int) float64 { return raw.Data[i*raw.Stride+j] }
	// one pass along the rows (the storage's order), each column's
	// smallest and largest value and first non-finite row; reported
	// column by column as a pass down each column would find them
	lo, hi, bad := make([]float64, k), make([]float64, k), make([]int, k)
	for j := range lo {
		lo[j], hi[j], bad[j] = math.Inf(1), math.Inf(-1), -1
	}
	for i := 0; i < rows; i++ {
		row := raw.Data[i*raw.Stride : i*raw.Stride+k]
		for j, v := range row {
			if v-v != 0 { // NaN or ±Inf
				if bad[j] < 0 {
					bad[j] = i
				}
				continue
			}
			// finite, so plain comparisons find what math.Min and
			// math.Max would (up to the sign of a zero, which == ignores)
			if v < lo[j] {
				lo[j] = v
			}
			if v > hi[j] {
				hi[j] = v
			}
		}
	}
	for j := 0; j < k; j++ {
		if bad[j] >= 0 {
			return fmt.Errorf("johansen: series %d has a missing or infinite value at row %d", j, bad[j])
		}
		if lo[j] == hi[j] {
			return fmt.Errorf("johansen: series %d is constant, so the moment matrices are singular", j)
		}
	}
	for a := 0; a < k; a++ {
		for b := a + 1; b < k; b++ {
			same := true
			for i := 0; i < rows && same; i++ {
				same = at(i, a) == at(i, b)
			}
			if same {
				return fmt.Errorf("johansen: series %d and %d are identical, so the moment matrices are singular", a, b)
			}
		}
	}
	return nil
}

// reduce factorises the (scaled) design and solves the eigenproblem,
// setting the scaled moment matrices and eigenvectors. Only R is needed,
// and householder.TallR forms it from the design's rows block by block
// in cache (on every core for a long sample) without holding the design;
// its rank rule is householder's (|R_jj| ≤ 1e-10·‖d_j‖ names column j as
// singular).
func (r *Result) reduce() error {
	t, ns, p1, n := r.dz.t, r.dz.ns, r.dz.p1, r.dz.n
	rd, indep, err := householder.TallR(t, n, r.dz.row)
	if err != nil {
		return fmt.Errorf("johansen: %w", err)
	}
	if indep < n {
		return r.singular(indep, ns, p1)
	}
	r.rd = rd
	return r.solveR(r.rd, t, ns, p1)
}

// solveR sets the scaled moment matrices, the eigenvalues, eigenvectors
// and statistics of the reduced-rank problem from R, the triangular factor
// of the QR of a design [short-run regressors (ns columns) | ỹ_{t−1} (p1) |
// Δy_t (K)] of t rows: the blocks of R after the first ns rows are
// Cholesky factors of T times the moments of the residuals of ỹ_{t−1} and
// Δy_t on the short-run regressors (Golub and Van Loan 2013, §5.3), so the
// rest follows from R alone. The signs of R's rows do not matter. The
// recursive estimates (recursive.go) call it with R of each subsample.
func (r *Result) solveR(rr mat.Matrix, t, ns, p1 int) error {
	k := r.K
	ft := float64(t)
	r11 := mat.NewDense(p1, p1, nil)
	r10 := mat.NewDense(p1, k, nil)
	r00 := mat.NewDense(k, k, nil)
	for i := 0; i < p1; i++ {
		for j := i; j < p1; j++ {
			r11.Set(i, j, rr.At(ns+i, ns+j))
		}
		for j := 0; j < k; j++ {
			r10.Set(i, j, rr.At(ns+i, ns+p1+j))
		}
	}
	for i := 0; i < k; i++ {
		for j := i; j < k; j++ {
			r00.Set(i, j, rr.At(ns+p1+i, ns+p1+j))
		}
	}
	r.s11 = crossSym(r11, nil, ft)
	r.s00 = crossSym(r10, r00, ft)
	r.s01 = mat.NewDense(k, p1, nil)
	r.s01.Mul(r10.T(), r11)
	r.s01.Scale(1/ft, r.s01)

	var ch mat.Cholesky
	if !ch.Factorize(r.s00) {
		return errors.New("johansen: S00, the moment matrix of the differences, is not positive definite (a constant or collinear series?)")
	}
	// A = T⁻¹ R10 S00⁻¹ R10'.
	var x mat.Dense
	if err := ch.SolveTo(&x, r10.T()); err != nil {
		return fmt.Errorf("johansen: S00 is singular: %v", err)
	}
	a := mat.NewSymDense(p1, nil)
	var prod mat.Dense
	prod.Mul(r10, &x)
	for i := 0; i < p1; i++ {
		for j := i; j < p1; j++ {
			a.SetSym(i, j, (prod.At(i, j)+prod.At(j, i))/(2*ft))
		}
	}
	lam, w, ok := eigenDesc(a)
	if !ok {
		return errors.New("johansen: the symmetric eigenproblem did not converge")
	}
	// v = √T R11⁻¹ w for the K largest.
	r.Eigenvalues = lam[:k:k]
	wk := w.Slice(0, p1, 0, k)
	u := mat.NewTriDense(p1, mat.Upper, nil)
	u.Copy(r11)
	var v mat.Dense
	if err := v.Solve(u, wk); err != nil {
		return fmt.Errorf("johansen: S11 is singular: %v", err)
	}
	v.Scale(math.Sqrt(ft), &v)
	for j := 0; j < k; j++ { // sign: first non-zero element positive
		for i := 0; i < p1; i++ {
			if e := v.At(i, j); e != 0 {
				if e < 0 {
					for h := 0; h < p1; h++ {
						v.Set(h, j, -v.At(h, j))
					}
				}
				break
			}
		}
	}
	r.vs = &v
	r.r11, r.a = u, a
	r.Trace, r.MaxEig = statistics(r.Eigenvalues, ft)
	return nil
}

// statistics returns the trace and maximum-eigenvalue statistics.
func statistics(lam []float64, t float64) (trace, maxeig []float64) {
	k := len(lam)
	trace = make([]float64, k)
	maxeig = make([]float64, k)
	var s float64
	for r := k - 1; r >= 0; r-- {
		l := -t * math.Log1p(-lam[r])
		s += l
		trace[r] = s
		maxeig[r] = l
	}
	return trace, maxeig
}

// crossSym returns (A'A + B'B)/t for upper-triangular blocks (B may be nil).
func crossSym(a, b *mat.Dense, t float64) *mat.SymDense {
	_, n := a.Dims()
	var p mat.Dense
	p.Mul(a.T(), a)
	if b != nil {
		var q mat.Dense
		q.Mul(b.T(), b)
		p.Add(&p, &q)
	}
	s := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		for j := i; j < n; j++ {
			s.SetSym(i, j, (p.At(i, j)+p.At(j, i))/(2*t))
		}
	}
	return s
}

// singular names the design column that depends on the ones before it.
func (r *Result) singular(j, ns, p1 int) error {
	k := r.K
	d := r.Case.unrestricted()
	var what string
	switch {
	case j < d && j == 0:
		what = "the constant"
	case j < d:
		what = "the trend"
	case j < ns-r.NU:
		l := (j-d)/k + 1
		what = fmt.Sprintf("lagged difference %d of series %d", l, (j-d)%k)
	case j < ns:
		what = fmt.Sprintf("unrestricted extra regressor %d", j-(ns-r.NU))
	case j < ns+k:
		what = fmt.Sprintf("the lagged level of series %d", j-ns)
	case j < ns+k+r.Case.restricted():
		what = "the restricted " + map[Case]string{RC: "constant", RT: "trend"}[r.Case]
	case j < ns+p1:
		what = fmt.Sprintf("restricted extra regressor %d", j-ns-k-r.Case.restricted())
	default:
		what = fmt.Sprintf("the difference of series %d", j-ns-p1)
	}
	return fmt.Errorf("johansen: singular moment matrix: %s is a linear combination of the other regressors (a constant, duplicated or collinear series?)", what)
}

// SmallSampleFactor is the Reinsel and Ahn (1992) factor (T − K(k+1))/T,
// with k+1 the VAR order in levels, by which the statistics are multiplied
// in small samples.
func (r *Result) SmallSampleFactor() float64 {
	return float64(r.T-r.K*(r.Lags+1)) / float64(r.T)
}

// Statistics returns the trace and maximum-eigenvalue statistics for
// r = 0..K−1, multiplied by SmallSampleFactor when adjust is true.
func (r *Result) Statistics(adjust bool) (trace, maxeig []float64) {
	f := 1.0
	if adjust {
		f = r.SmallSampleFactor()
	}
	trace = make([]float64, r.K)
	maxeig = make([]float64, r.K)
	for i := range trace {
		trace[i] = f * r.Trace[i]
		maxeig[i] = f * r.MaxEig[i]
	}
	return trace, maxeig
}
