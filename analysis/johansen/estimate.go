package johansen

import (
	"fmt"
	"math"
	"slices"

	"github.com/galley-econ/galley/analysis/ols"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/mat"
)

// TermKind names a short-run regressor of the VECM.
type TermKind int

const (
	Constant  TermKind = iota // unrestricted constant
	Trend                     // unrestricted trend (case CT)
	LagDiff                   // lagged difference Δy_{Series, t−Lag}
	ExtraTerm                 // unrestricted extra regressor number Series (Extra)
)

// Term describes one short-run regressor.
type Term struct {
	Kind   TermKind
	Lag    int // for LagDiff: 1..Lags
	Series int // for LagDiff: column of y; for ExtraTerm: column of Extra.Unrestricted
}

// Terms lists the short-run regressors in their column order: the
// unrestricted deterministic terms, then Δy_{t−1} (all series), ...,
// Δy_{t−Lags}, then the unrestricted extra regressors.
func (r *Result) Terms() []Term {
	var out []Term
	if d := r.Case.unrestricted(); d >= 1 {
		out = append(out, Term{Kind: Constant})
		if d == 2 {
			out = append(out, Term{Kind: Trend})
		}
	}
	for l := 1; l <= r.Lags; l++ {
		for j := 0; j < r.K; j++ {
			out = append(out, Term{Kind: LagDiff, Lag: l, Series: j})
		}
	}
	for j := 0; j < r.NU; j++ {
		out = append(out, Term{Kind: ExtraTerm, Series: j})
	}
	return out
}

// VECM is the estimated error-correction model of a given rank.
type VECM struct {
	Rank int
	Norm []int // rows of β set to the identity

	// Beta is P1×Rank with Beta[Norm[j], i] = δ_ij; BetaSE holds the
	// asymptotic standard errors (zero on the normalised rows).
	Beta, BetaSE *mat.Dense
	// Alpha is K×Rank; AlphaSE are the OLS standard errors given β.
	Alpha, AlphaSE *mat.Dense
	// Pi = αβ', K×P1.
	Pi *mat.Dense
	// Omega is the ML residual covariance S00 − S01β(β'S11β)⁻¹β'S10.
	Omega *mat.SymDense
	// Short holds the short-run coefficients (Γ_i and unrestricted
	// deterministic terms), K×len(Terms), with OLS standard errors ShortSE.
	Short, ShortSE *mat.Dense
	Terms          []Term

	// eqCov[i] is the classical OLS covariance s_i²(X'X)⁻¹ of equation
	// i's coefficients (α_i', then the short-run terms), in the units of y;
	// dfResid = T − rank − len(Terms).
	eqCov   []*mat.SymDense
	dfResid int

	// Resid holds the residuals ε̂_t of the short-run equations given β
	// (T×K, in the units of y); row t belongs to row t + Lags + 1 of the
	// levels.
	Resid *mat.Dense
}

// EquationCov returns the classical least-squares covariance matrix
// s_i²(X'X)⁻¹, s_i² = e_i'e_i/(T − m), of the coefficients of equation i
// given β: first the loadings α_i1..α_ir, then the short-run terms in the
// order of Terms (the regression of Estimate), with T − m, the residual
// degrees of freedom. Wald tests of zero restrictions in one equation
// (Granger causality in the VECM) are built from it.
func (m *VECM) EquationCov(i int) (*mat.SymDense, int, error) {
	if i < 0 || i >= len(m.eqCov) {
		return nil, 0, fmt.Errorf("johansen: equation %d is outside 0..%d", i, len(m.eqCov)-1)
	}
	return m.eqCov[i], m.dfResid, nil
}

// VARForm returns the coefficient matrices A_1..A_{k+1} of the VECM
// written as a VAR in levels, y_t = Σ_{i=1}^{k+1} A_i y_{t−i} + ... + ε_t
// (Lütkepohl 2005, §6.1):
//
//	A_1 = I_K + Π_y + Γ_1,  A_i = Γ_i − Γ_{i−1} (1 < i ≤ k),  A_{k+1} = −Γ_k,
//
// Π_y = αβ_y' with β_y the rows of β for the series (the restricted terms
// belong to the deterministic part); with k = 0, A_1 = I_K + Π_y.
func (m *VECM) VARForm() []*mat.Dense {
	k, _ := m.Alpha.Dims()
	lags := 0
	for _, tm := range m.Terms {
		if tm.Kind == LagDiff && tm.Lag > lags {
			lags = tm.Lag
		}
	}
	gamma := make([]*mat.Dense, lags+1) // gamma[l], l = 1..lags
	for l := 1; l <= lags; l++ {
		gamma[l] = mat.NewDense(k, k, nil)
	}
	for c, tm := range m.Terms {
		if tm.Kind == LagDiff {
			for i := 0; i < k; i++ {
				gamma[tm.Lag].Set(i, tm.Series, m.Short.At(i, c))
			}
		}
	}
	var piY mat.Dense
	piY.Mul(m.Alpha, m.Beta.Slice(0, k, 0, m.Rank).T())
	out := make([]*mat.Dense, lags+1)
	for i := range out {
		out[i] = mat.NewDense(k, k, nil)
	}
	for i := 0; i < k; i++ {
		out[0].Set(i, i, 1)
	}
	out[0].Add(out[0], &piY)
	if lags >= 1 {
		out[0].Add(out[0], gamma[1])
		for i := 2; i <= lags; i++ {
			out[i-1].Sub(gamma[i], gamma[i-1])
		}
		out[lags].Scale(-1, gamma[lags])
	}
	return out
}

// Estimate returns the rank-r VECM (Johansen 1995, §6.1 and ch. 13).
//
// β̂ spans the first r eigenvectors V_r and is normalised as
// β̂ = V_r (c'V_r)⁻¹, c the columns of the identity picked by norm (one series
// index per relation, e.g. {0} for rank 1 normalised on the first series),
// so that c'β̂ = I. α̂ = S01β̂(β̂'S11β̂)⁻¹ and Π̂ = α̂β̂'.
//
// The free rows θ of β̂ (those not in norm) have Johansen's asymptotic
// covariance (Johansen 1995, Thm 13.3)
//
//	Var(vec θ̂') = (T S_bb)⁻¹ ⊗ (α̂'Ω̂⁻¹α̂)⁻¹,
//
// S_bb the block of S11 for those rows and Ω̂ the ML residual covariance.
//
// Given β̂, the short-run equations Δy_it = α_i'β̂'ỹ_{t−1} + Σ Γ_i Δy_{t−i} +
// Φ_i d_t + ε_it are estimated by OLS equation by equation; α̂ and the
// short-run coefficients carry the classical OLS standard errors
// s²(X'X)⁻¹, s² = e'e/(T − number of regressors).
func (r *Result) Estimate(rank int, norm []int) (*VECM, error) {
	if err := r.checkRank(rank); err != nil {
		return nil, err
	}
	if len(norm) != rank {
		return nil, fmt.Errorf("johansen: normalisation needs one series per relation: %d given for rank %d", len(norm), rank)
	}
	p1 := r.P1()
	seen := make(map[int]bool)
	for _, n := range norm {
		if n < 0 || n >= r.K {
			return nil, fmt.Errorf("johansen: normalisation series %d is outside 0..%d", n, r.K-1)
		}
		if seen[n] {
			return nil, fmt.Errorf("johansen: normalisation series %d given twice", n)
		}
		seen[n] = true
	}
	// Everything is computed on the scaled problem (scale.go) and mapped
	// back. With C = diag(d_norm[1..r]), the scaled relations normalised
	// the same way are β̃ = Ṽ_r(c'Ṽ_r)⁻¹ = D₁βC⁻¹ (c'β̃ = I, so their
	// columns are comparable in size), with loadings α̃ = D⁻¹αC.
	vr := r.vs.Slice(0, p1, 0, rank)
	cv := mat.NewDense(rank, rank, nil)
	for i, n := range norm {
		for j := 0; j < rank; j++ {
			cv.Set(i, j, vr.At(n, j))
		}
	}
	var cvInv mat.Dense
	if err := cvInv.Inverse(cv); err != nil {
		return nil, fmt.Errorf("johansen: cannot normalise on series %v: their coefficients in the first %d eigenvectors are singular", norm, rank)
	}
	betaS := mat.NewDense(p1, rank, nil)
	betaS.Mul(vr, &cvInv)
	for i, n := range norm { // exact identity on the normalised rows
		for j := 0; j < rank; j++ {
			betaS.Set(n, j, b2f(i == j))
		}
	}
	s1 := r.rowScale()
	c := make([]float64, rank)
	cInv := make([]float64, rank)
	for j, n := range norm {
		c[j], cInv[j] = r.scale[n], 1/r.scale[n]
	}
	inv := func(x []float64) []float64 {
		out := make([]float64, len(x))
		for i, v := range x {
			out[i] = 1 / v
		}
		return out
	}
	beta := outer(inv(s1), betaS, c) // β = D₁⁻¹β̃C
	for i, n := range norm {
		for j := 0; j < rank; j++ {
			beta.Set(n, j, b2f(i == j))
		}
	}
	alphaS, omegaS, err := r.loadings(betaS)
	if err != nil {
		return nil, err
	}
	v := &VECM{Rank: rank, Norm: append([]int(nil), norm...), Beta: beta, Omega: outerSym(r.scale, omegaS), Terms: r.Terms()}
	seS, err := r.betaSE(betaS, alphaS, omegaS, seen)
	if err != nil {
		return nil, err
	}
	v.BetaSE = outer(inv(s1), seS, c)
	if err := r.shortRun(v, betaS); err != nil {
		return nil, err
	}
	r.unscaleShortRun(v, cInv)
	v.Pi = mat.NewDense(r.K, p1, nil)
	v.Pi.Mul(v.Alpha, beta.T())
	return v, nil
}

// unscaleShortRun maps the OLS estimates of the scaled short-run equations
// and their standard errors to the units of y: α = Dα̃C⁻¹ (cInv holds
// C⁻¹), Γ_i = DΓ̃_iD⁻¹ and Φ = DΦ̃ (the scales are positive, so standard
// errors map alike).
func (r *Result) unscaleShortRun(v *VECM, cInv []float64) {
	d := r.scale
	v.Alpha = outer(d, v.Alpha, cInv)
	v.AlphaSE = outer(d, v.AlphaSE, cInv)
	col := make([]float64, len(v.Terms))
	for j, tm := range v.Terms {
		col[j] = 1
		if tm.Kind == LagDiff {
			col[j] = 1 / d[tm.Series]
		}
	}
	if v.Short != nil {
		v.Short = outer(d, v.Short, col)
		v.ShortSE = outer(d, v.ShortSE, col)
	}
	// Equation i's coefficients map by d_i times the column factor
	// (C⁻¹ for the loadings, col for the short-run terms).
	f := append(slices.Clone(cInv), col...)
	for i, c := range v.eqCov {
		g := make([]float64, len(f))
		for j := range f {
			g[j] = d[i] * f[j]
		}
		v.eqCov[i] = outerSym(g, c)
	}
}

func b2f(b bool) float64 {
	if b {
		return 1
	}
	return 0
}

func (r *Result) checkRank(rank int) error {
	if rank < 1 || rank > r.K-1 {
		return fmt.Errorf("johansen: cointegrating rank %d is outside 1..K−1 = 1..%d", rank, r.K-1)
	}
	return nil
}

// loadings returns α = S01β(β'S11β)⁻¹ and Ω = S00 − α(β'S11β)α' on the
// scaled problem (β in scaled units).
func (r *Result) loadings(beta *mat.Dense) (*mat.Dense, *mat.SymDense, error) {
	var sb, bsb, inv mat.Dense
	sb.Mul(r.s11, beta)
	bsb.Mul(beta.T(), &sb)
	if err := inv.Inverse(&bsb); err != nil {
		return nil, nil, fmt.Errorf("johansen: β'S11β is singular: %v", err)
	}
	var s0b, alpha mat.Dense
	s0b.Mul(r.s01, beta)
	alpha.Mul(&s0b, &inv)
	var fit mat.Dense
	fit.Mul(&alpha, s0b.T())
	k := r.K
	omega := mat.NewSymDense(k, nil)
	for i := 0; i < k; i++ {
		for j := i; j < k; j++ {
			omega.SetSym(i, j, r.s00.At(i, j)-(fit.At(i, j)+fit.At(j, i))/2)
		}
	}
	return &alpha, omega, nil
}

// betaSE returns the asymptotic standard errors of the free rows of β on
// the scaled problem (β, α, Ω in scaled units). With β̃ = D₁βC⁻¹ and
// α̃ = D⁻¹αC, normalised as β, the standard errors of β are D₁⁻¹ SE(β̃) C,
// since α̃'Ω̃⁻¹α̃ = Cα'Ω⁻¹αC and S̃_bb = D_b⁻¹S_bb D_b⁻¹ with D_b the scales of
// the free rows.
func (r *Result) betaSE(beta, alpha *mat.Dense, omega *mat.SymDense, fixed map[int]bool) (*mat.Dense, error) {
	p1, rank := beta.Dims()
	var free []int
	for i := 0; i < p1; i++ {
		if !fixed[i] {
			free = append(free, i)
		}
	}
	sbb := mat.NewSymDense(len(free), nil)
	for a, i := range free {
		for b, j := range free {
			if b >= a {
				sbb.SetSym(a, b, r.s11.At(i, j))
			}
		}
	}
	var ch mat.Cholesky
	if !ch.Factorize(sbb) {
		return nil, fmt.Errorf("johansen: the moment matrix of the free rows of β is singular")
	}
	var sbbInv mat.SymDense
	if err := ch.InverseTo(&sbbInv); err != nil {
		return nil, err
	}
	var och mat.Cholesky
	if !och.Factorize(omega) {
		return nil, fmt.Errorf("johansen: the residual covariance Ω is singular")
	}
	var oa mat.Dense
	if err := och.SolveTo(&oa, alpha); err != nil {
		return nil, err
	}
	var aoa, aoaInv mat.Dense
	aoa.Mul(alpha.T(), &oa)
	if err := aoaInv.Inverse(&aoa); err != nil {
		return nil, fmt.Errorf("johansen: α'Ω⁻¹α is singular: %v", err)
	}
	se := mat.NewDense(p1, rank, nil)
	t := float64(r.T)
	for a, i := range free {
		for j := 0; j < rank; j++ {
			se.Set(i, j, math.Sqrt(sbbInv.At(a, a)*aoaInv.At(j, j)/t))
		}
	}
	return se, nil
}

// shortRun fits each scaled equation by OLS on [β̃'ỹ_{t−1}, short-run
// regressors], β̃ in scaled units (shortFit); unscaleShortRun maps the
// result back.
func (r *Result) shortRun(v *VECM, beta *mat.Dense) error {
	t, k := r.T, r.K
	rank := v.Rank
	ns := r.shortCols()
	fits, resid, err := r.shortFit(beta, rank)
	if err != nil {
		return fmt.Errorf("johansen: short-run equations: %v", err)
	}
	v.Alpha = mat.NewDense(k, rank, nil)
	v.AlphaSE = mat.NewDense(k, rank, nil)
	if ns > 0 {
		v.Short = mat.NewDense(k, ns, nil)
		v.ShortSE = mat.NewDense(k, ns, nil)
	}
	v.eqCov = make([]*mat.SymDense, k)
	v.dfResid = t - rank - ns
	v.Resid = mat.NewDense(t, k, nil)
	vr := v.Resid.RawMatrix()
	for i, f := range fits {
		v.eqCov[i] = f.Cov
		for h, e := range resid[i] {
			vr.Data[h*vr.Stride+i] = e * r.scale[i]
		}
		se := ols.SE(f.Cov)
		for j := 0; j < rank; j++ {
			v.Alpha.Set(i, j, f.Coef[j])
			v.AlphaSE.Set(i, j, se[j])
		}
		for j := 0; j < ns; j++ {
			v.Short.Set(i, j, f.Coef[rank+j])
			v.ShortSE.Set(i, j, se[rank+j])
		}
	}
	return nil
}

// shortFit fits, equation by equation, the scaled Δy_t on [β̃'ỹ_{t−1},
// short-run regressors] by OLS (β̃ the first rank columns of beta, P1
// rows, scaled units) and returns the fits and the residuals, one slice
// per equation; it needs at least one regressor.
//
// The fit needs the data only through the cross-products of those
// regressors and Δy_t, and reduce already factorised the design
// D = [zs | z1 | z0] = QR: with Q orthonormal, X = [z1β̃, zs] = Q[R_1β̃, R_s]
// and z0 = QR_0 (R_s, R_1, R_0 the column blocks of R), so the columns
// [R_1β̃, R_s, R_0] — n = ns+P1+K rows instead of T — have the same
// cross-products (Golub and Van Loan 2013, §5.3), and
// ols.RegressEachColumns fits them, writing the design's rows again
// (designer.row) for the residuals and s².
func (r *Result) shortFit(beta *mat.Dense, rank int) ([]*ols.EachFit, [][]float64, error) {
	g := r.dz
	t, k, ns, p1, n := g.t, g.k, g.ns, g.p1, g.n
	w := rank + ns + k
	buf := make([]float64, n*w)
	cols := make([][]float64, w)
	for j := range cols {
		cols[j] = buf[j*n : (j+1)*n : (j+1)*n]
	}
	rd := r.rd.RawTriangular()
	rAt := func(i, j int) float64 { return rd.Data[i*rd.Stride+j] } // i ≤ j
	b := mat.DenseCopyOf(beta.Slice(0, p1, 0, rank)).RawMatrix()
	for j := 0; j < rank; j++ {
		for i := 0; i < ns+p1; i++ {
			var s float64
			for l := max(i-ns, 0); l < p1; l++ {
				s += rAt(i, ns+l) * b.Data[l*b.Stride+j]
			}
			cols[j][i] = s
		}
	}
	for j := 0; j < ns; j++ {
		for i := 0; i <= j; i++ {
			cols[rank+j][i] = rAt(i, j)
		}
	}
	for j := 0; j < k; j++ {
		for i := 0; i <= ns+p1+j; i++ {
			cols[rank+ns+j][i] = rAt(i, ns+p1+j)
		}
	}
	d := make([]float64, n)
	row := func(h int, x, y []float64) {
		g.row(h, d)
		z1 := d[ns : ns+p1]
		for j := 0; j < rank; j++ {
			var s float64
			for l, v := range z1 {
				s += v * b.Data[l*b.Stride+j]
			}
			x[j] = s
		}
		copy(x[rank:], d[:ns])
		copy(y, d[ns+p1:])
	}
	rbuf := make([]float64, t*k)
	resid := make([][]float64, k)
	for i := range resid {
		resid[i] = rbuf[i*t : (i+1)*t : (i+1)*t]
	}
	// every equation has the same regressors: one factorisation
	fits, err := ols.RegressEachColumns(cols, rank+ns, t, row, resid)
	if err != nil {
		return nil, nil, err
	}
	return fits, resid, nil
}

// Relations returns the estimated cointegrating relations over the rows
// of y (the levels, T×K, in the order Test saw them):
//
//	z_jt = β_j'ỹ_t,  ỹ_t = y_t (cases N, C, CT), (y_t', 1)' (RC), (y_t', t+1)' (RT),
//
// followed, when the model has restricted extra regressors, by their
// values x_t (xr, one row per row of y; nil otherwise).
//
// one slice per relation. The restricted trend takes the value t+1 at row
// t, as in the VECM, where β'ỹ_{t−1} pairs y_{t−1} with the trend value of
// the row of Δy_t (see Test). In cases N and RC z_jt is the equilibrium
// error as estimated, level included; in C, RT and CT the unrestricted
// constant absorbs any shift of the relation, so its level is arbitrary
// (and in CT it may carry a linear trend, absorbed by the unrestricted
// trend).
func (m *VECM) Relations(c Case, y, xr *mat.Dense) [][]float64 {
	rows, k := y.Dims()
	nr := 0
	if xr != nil {
		_, nr = xr.Dims()
	}
	m0 := c.restricted()
	nb := m.Beta.RawMatrix().Rows
	yr := y.RawMatrix()
	var xrr blas64.General
	if xr != nil {
		xrr = xr.RawMatrix()
	}
	out := make([][]float64, m.Rank)
	b := make([]float64, nb) // column j of β
	for j := range out {
		for i := range b {
			b[i] = m.Beta.At(i, j)
		}
		z := make([]float64, rows)
		for t := range z {
			// the same operations in the same order as the formula above
			// (y's and xr's rows read in place)
			row := yr.Data[t*yr.Stride : t*yr.Stride+k]
			var v float64
			for i, yi := range row {
				v += b[i] * yi
			}
			switch c {
			case RC:
				v += b[k]
			case RT:
				v += b[k] * float64(t+1)
			}
			for h := 0; h < nr && k+m0+h < nb; h++ {
				v += b[k+m0+h] * xrr.Data[t*xrr.Stride+h]
			}
			z[t] = v
		}
		out[j] = z
	}
	return out
}
