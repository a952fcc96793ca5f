package johansen

import (
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"

	"github.com/galley-econ/galley/analysis/householder"
)

// LR is a likelihood-ratio test of restrictions on a rank-r VECM.
type LR struct {
	Stat float64 // T Σ_{i≤r} ln((1−λ*_i)/(1−λ_i))
	DF   int
	P    float64 // χ²(DF) upper-tail probability
	// Eigenvalues λ*_i of the restricted problem, descending.
	Eigenvalues []float64
	// Beta is the restricted β̂ (P1×r), columns normalised v'S11v = 1.
	Beta *mat.Dense
}

func (r *Result) lr(rank int, lam []float64, beta *mat.Dense, df int) *LR {
	var s float64
	for i := 0; i < rank; i++ {
		s += math.Log1p(-lam[i]) - math.Log1p(-r.Eigenvalues[i])
	}
	s *= float64(r.T)
	p := math.NaN()
	if df > 0 {
		p = distuv.ChiSquared{K: float64(df)}.Survival(s)
	}
	return &LR{Stat: s, DF: df, P: p, Eigenvalues: lam, Beta: beta}
}

// TestBeta tests the linear restriction β = Hφ on the rank-r cointegrating
// relations (Johansen 1995, §7.2, Thm 7.2), H a known P1×s matrix of full
// column rank with r ≤ s ≤ P1 (for RC and RT the last row of β is the
// restricted deterministic term). The restricted eigenvalues solve
// |λH'S11H − H'S10 S00⁻¹ S01 H| = 0 and
//
//	LR = T Σ_{i=1}^{r} ln((1−λ*_i)/(1−λ_i)) ~ χ²(r(P1 − s)).
//
// They are computed without forming H'S11H: with T·S11 = R11'R11 and
// T·S01 = R10'R11 from the QR of the design (see Test), and the thin QR
// R11·H = Q₁R̃, H'S11H = T⁻¹R̃'R̃ and the λ*_i are the eigenvalues w of
// Q₁'AQ₁, A = T⁻¹R10 S00⁻¹ R10' the matrix whose eigenvalues are the λ_i;
// φ = √T R̃⁻¹w. The restricted problem is then as well conditioned as the
// unrestricted one (the LR is a small difference of logarithms, so an
// error in λ*_i is magnified by 1/LR in its relative error).
//
// Homogeneity of the first two series, for example, is H with columns
// (1, −1, 0, ...)' and the remaining unit vectors.
func (r *Result) TestBeta(rank int, h *mat.Dense) (*LR, error) {
	if err := r.checkRank(rank); err != nil {
		return nil, err
	}
	if h == nil {
		return nil, fmt.Errorf("johansen: no restriction matrix H")
	}
	p1 := r.P1()
	hr, s := h.Dims()
	if hr != p1 {
		return nil, fmt.Errorf("johansen: H has %d rows; β has %d", hr, p1)
	}
	if s < rank || s > p1 {
		return nil, fmt.Errorf("johansen: H has %d columns; need between the rank %d and %d", s, rank, p1)
	}
	// On the scaled problem β̃ = D₁β = (D₁H)φ, and only the column space of
	// D₁H matters: an orthonormal basis Q of it keeps Q'S̃11Q as well
	// conditioned as S̃11.
	q, err := orthoBasis(mulRows(h, r.rowScale(), false))
	if err != nil {
		return nil, fmt.Errorf("johansen: H does not have full column rank (column %d)", err.col)
	}
	lam, vecs, rerr := r.restrictedBeta(q)
	if rerr != nil {
		return nil, fmt.Errorf("johansen: β = Hφ: %v (does H have full column rank?)", rerr)
	}
	var betaS mat.Dense
	betaS.Mul(q, vecs.Slice(0, s, 0, rank))
	beta := mulRows(&betaS, r.rowScale(), true)
	return r.lr(rank, lam, beta, rank*(p1-s)), nil
}

// restrictedBeta returns the eigenvalues λ*, descending, and the vectors
// φ (s×s, φ'Q'S̃11Qφ = I) of |λQ'S̃11Q − Q'S̃10 S̃00⁻¹ S̃01Q| = 0 for the
// P1×s orthonormal q, from the QR of R11·q (see TestBeta).
func (r *Result) restrictedBeta(q *mat.Dense) ([]float64, *mat.Dense, error) {
	_, s := q.Dims()
	var g mat.Dense
	g.Mul(r.r11, q)
	var qr householder.QR
	if err := qr.Factor(householder.Columns(&g, 0), s); err != nil {
		return nil, nil, err
	}
	if !qr.FullRank() {
		return nil, nil, fmt.Errorf("the moment matrix of the levels is singular")
	}
	q1, err := qr.Q(s)
	if err != nil {
		return nil, nil, err
	}
	var aq, b mat.Dense
	aq.Mul(r.a, q1)
	b.Mul(q1.T(), &aq)
	lam, ws, ok := eigenDesc(symOf(&b))
	if !ok {
		return nil, nil, fmt.Errorf("the symmetric eigenproblem did not converge")
	}
	var phi mat.Dense
	if err := phi.Solve(qr.R(), ws); err != nil {
		return nil, nil, err
	}
	phi.Scale(math.Sqrt(float64(r.T)), &phi)
	return lam, &phi, nil
}

// rankError names the first column of a matrix that depends on the ones
// before it.
type rankError struct{ col int }

// orthoBasis returns an orthonormal basis (n×m, the thin Q of a Householder
// QR) of the column space of the n×m matrix a (n ≥ m), or the first column
// that fails the rank rule householder.CollinearTol.
func orthoBasis(a *mat.Dense) (*mat.Dense, *rankError) {
	_, m := a.Dims()
	q, j := qBasis(a, m)
	if q == nil {
		return nil, &rankError{col: j}
	}
	return q, nil
}

// qBasis returns the first w columns of Q in the Householder QR of the n×m
// matrix a (n ≥ m, m ≤ w ≤ n): the first m span the columns of a, the rest
// their orthogonal complement. When a fails the rank rule
// householder.CollinearTol it returns nil and the first dependent column.
func qBasis(a *mat.Dense, w int) (*mat.Dense, int) {
	_, m := a.Dims()
	var qr householder.QR
	if err := qr.Factor(householder.Columns(a, 0), m); err != nil {
		return nil, 0
	}
	if j := qr.Indep(); j < m {
		return nil, j
	}
	q, err := qr.Q(w)
	if err != nil {
		return nil, 0
	}
	return q, m
}

// TestAlpha tests α = Aψ for the rank-r loadings (Johansen 1995, §8.2,
// Thm 8.1), A a known K×m matrix of full column rank with r ≤ m < K. With
// B = A⊥, the a-part A'R0 and R1 are corrected for the b-part B'R0:
//
//	S_aa.b = A'S00A − A'S00B(B'S00B)⁻¹B'S00A,  S_a1.b = A'S01 − A'S00B(B'S00B)⁻¹B'S01,
//	S_11.b = S11 − S10B(B'S00B)⁻¹B'S01,
//
// the restricted eigenvalues solve |λS_11.b − S_1a.b S_aa.b⁻¹ S_a1.b| = 0 and
//
//	LR = T Σ_{i=1}^{r} ln((1−λ*_i)/(1−λ_i)) ~ χ²(r(K − m)).
func (r *Result) TestAlpha(rank int, a *mat.Dense) (*LR, error) {
	if err := r.checkRank(rank); err != nil {
		return nil, err
	}
	if a == nil {
		return nil, fmt.Errorf("johansen: no restriction matrix A")
	}
	k := r.K
	ar, m := a.Dims()
	if ar != k {
		return nil, fmt.Errorf("johansen: A has %d rows; α has %d", ar, k)
	}
	if m < rank || m >= k {
		return nil, fmt.Errorf("johansen: A has %d columns; need at least the rank %d and fewer than K = %d", m, rank, k)
	}
	// On the scaled problem α̃ = D⁻¹α = (D⁻¹A)ψ. The LR statistic depends
	// only on the column space of D⁻¹A, so A is replaced by an orthonormal
	// basis of it (the first m columns of Q) and B = A⊥ by the rest of Q.
	as := mulRows(a, r.scale, true)
	q, j := qBasis(as, k)
	if q == nil {
		return nil, fmt.Errorf("johansen: A does not have full column rank (column %d)", j)
	}
	b := q.Slice(0, k, m, k)
	a = mat.DenseCopyOf(q.Slice(0, k, 0, m))

	var s00b, bs00b mat.Dense
	s00b.Mul(r.s00, b)
	bs00b.Mul(b.T(), &s00b)
	var bch mat.Cholesky
	if !bch.Factorize(symOf(&bs00b)) {
		return nil, fmt.Errorf("johansen: B'S00B is singular")
	}
	// G = (B'S00B)⁻¹ B'[S00A  S01].
	var s00a mat.Dense
	s00a.Mul(r.s00, a)
	var bs00a, bs01 mat.Dense
	bs00a.Mul(b.T(), &s00a)
	bs01.Mul(b.T(), r.s01)
	var ga, g1 mat.Dense
	if err := bch.SolveTo(&ga, &bs00a); err != nil {
		return nil, err
	}
	if err := bch.SolveTo(&g1, &bs01); err != nil {
		return nil, err
	}
	var saa, corr mat.Dense
	saa.Mul(a.T(), &s00a)
	corr.Mul(bs00a.T(), &ga)
	saa.Sub(&saa, &corr)
	var sa1 mat.Dense
	sa1.Mul(a.T(), r.s01)
	corr.Reset()
	corr.Mul(bs00a.T(), &g1)
	sa1.Sub(&sa1, &corr)
	var s11 mat.Dense
	s11.CloneFrom(r.s11)
	corr.Reset()
	corr.Mul(bs01.T(), &g1)
	s11.Sub(&s11, &corr)
	lam, vecs, err := reducedRank(symOf(&saa), &sa1, symOf(&s11))
	if err != nil {
		return nil, fmt.Errorf("johansen: α = Aψ: %v", err)
	}
	beta := mulRows(vecs.Slice(0, r.P1(), 0, rank), r.rowScale(), true)
	return r.lr(rank, lam, beta, rank*(k-m)), nil
}

// WeakExogeneity tests that the listed series do not adjust to the rank-r
// relations (their rows of α are zero; Johansen 1995, §8.2), as α = Aψ with
// A the identity less those columns: LR ~ χ²(r·len(series)).
func (r *Result) WeakExogeneity(rank int, series ...int) (*LR, error) {
	k := r.K
	drop := make(map[int]bool)
	for _, s := range series {
		if s < 0 || s >= k {
			return nil, fmt.Errorf("johansen: series %d is outside 0..%d", s, k-1)
		}
		if drop[s] {
			return nil, fmt.Errorf("johansen: series %d given twice", s)
		}
		drop[s] = true
	}
	if len(drop) == 0 {
		return nil, fmt.Errorf("johansen: no series named for the weak-exogeneity test")
	}
	a := mat.NewDense(k, k-len(drop), nil)
	c := 0
	for i := 0; i < k; i++ {
		if !drop[i] {
			a.Set(i, c, 1)
			c++
		}
	}
	if k-len(drop) < rank {
		return nil, fmt.Errorf("johansen: %d weakly exogenous series leave fewer adjusting series than the rank %d", len(drop), rank)
	}
	return r.TestAlpha(rank, a)
}

// reducedRank solves |λS11 − S10 S00⁻¹ S01| = 0 through the Cholesky factor
// S11 = LL': the eigenvalues are those of the symmetric L⁻¹S10 S00⁻¹ S01 L⁻ᵀ,
// descending, with eigenvectors v = L⁻ᵀw (so that v'S11v = I).
func reducedRank(s00 *mat.SymDense, s01 *mat.Dense, s11 *mat.SymDense) ([]float64, *mat.Dense, error) {
	var c00, c11 mat.Cholesky
	if !c00.Factorize(s00) {
		return nil, nil, fmt.Errorf("the moment matrix of the differences is singular")
	}
	if !c11.Factorize(s11) {
		return nil, nil, fmt.Errorf("the moment matrix of the levels is singular")
	}
	var l mat.TriDense
	c11.LTo(&l)
	// X = L⁻¹ S10, M = X S00⁻¹ X'.
	var x mat.Dense
	if err := x.Solve(&l, s01.T()); err != nil {
		return nil, nil, err
	}
	var y mat.Dense
	if err := c00.SolveTo(&y, x.T()); err != nil {
		return nil, nil, err
	}
	var m mat.Dense
	m.Mul(&x, &y)
	lam, ws, ok := eigenDesc(symOf(&m))
	if !ok {
		return nil, nil, fmt.Errorf("the symmetric eigenproblem did not converge")
	}
	var v mat.Dense
	if err := v.Solve(l.T(), ws); err != nil {
		return nil, nil, err
	}
	return lam, &v, nil
}

// eigenDesc factorises the symmetric matrix a and returns its eigenvalues
// in decreasing order (stable among ties), any below zero — the rounding
// of an exact zero — set to zero, with the eigenvectors as the columns of
// w in the same order; ok is false if the eigenproblem did not converge.
func eigenDesc(a mat.Symmetric) (lam []float64, w *mat.Dense, ok bool) {
	var es mat.EigenSym
	if !es.Factorize(a, true) {
		return nil, nil, false
	}
	vals := es.Values(nil)
	var vecs mat.Dense
	es.VectorsTo(&vecs)
	n := len(vals)
	order := make([]int, n)
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return vals[order[a]] > vals[order[b]] })
	lam = make([]float64, n)
	w = mat.NewDense(n, n, nil)
	for j, o := range order {
		lam[j] = math.Max(vals[o], 0)
		for i := 0; i < n; i++ {
			w.Set(i, j, vecs.At(i, o))
		}
	}
	return lam, w, true
}

// symOf returns the symmetric part of a square matrix.
func symOf(a mat.Matrix) *mat.SymDense {
	n, _ := a.Dims()
	s := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		for j := i; j < n; j++ {
			s.SetSym(i, j, (a.At(i, j)+a.At(j, i))/2)
		}
	}
	return s
}
