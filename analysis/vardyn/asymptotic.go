package vardyn

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/ols"
)

// Asymptotic (delta-method) standard errors of impulse responses
// (Lütkepohl 2005, §3.7.1, Proposition 3.6). Throughout, vec stacks the
// columns of a matrix (element (i, j) of a K×K matrix at j·K + i), vech the
// columns of its lower triangle ((i, j), i ≥ j, at j·K − j(j−1)/2 + i − j),
// α = vec[A_1 … A_p] (K²p) and σ = vech(Σ_u). The covariances below are
// those of the estimators themselves (already divided by T), so that a
// standard error is the square root of a diagonal element.

// CoefCov returns the estimated covariance of α̂ = vec[Â_1 … Â_p], the
// least-squares lag coefficients of the VAR (K²p × K²p):
//
//	Σ̂_α̂ = [(ZZ')⁻¹]_AA ⊗ Σ̂_u,
//
// Z the T×(d + Kp) regressors [d_t, y'_{t−1}, …, y'_{t−p}] (rows in time)
// and [·]_AA the block of the lags (the deterministic terms partialled
// out). This is the estimate of the asymptotic covariance of Lütkepohl
// (2005), §3.2, Proposition 3.1, (ZZ'/T)⁻¹ ⊗ Σ̂_u, divided by T, with
// Σ̂_u = Û'Û/(T − Kp − d) (v.Sigma; the estimator with degrees of freedom,
// which the responses and Wald tests of this package use; statsmodels'
// VARResults.cov_params makes the same choice).
func (v *VAR) CoefCov() (*mat.SymDense, error) {
	if v == nil || v.XtXInv == nil || v.Sigma == nil {
		return nil, errors.New("vardyn: the VAR has no coefficient covariance")
	}
	nd := v.Det.count()
	kp := v.K * v.P
	if v.XtXInv.SymmetricDim() != nd+kp || v.Sigma.SymmetricDim() != v.K {
		return nil, fmt.Errorf("vardyn: (X'X)⁻¹ is %d×%d for %d regressors", v.XtXInv.SymmetricDim(), v.XtXInv.SymmetricDim(), nd+kp)
	}
	k := v.K
	out := mat.NewSymDense(kp*k, nil)
	for c1 := 0; c1 < kp; c1++ {
		for c2 := c1; c2 < kp; c2++ {
			g := v.XtXInv.At(nd+c1, nd+c2)
			for r1 := 0; r1 < k; r1++ {
				for r2 := 0; r2 < k; r2++ {
					a, b := c1*k+r1, c2*k+r2
					if a <= b {
						out.SetSym(a, b, g*v.Sigma.At(r1, r2))
					} else {
						out.SetSym(b, a, g*v.Sigma.At(r1, r2))
					}
				}
			}
		}
	}
	return out, nil
}

// VechCov returns the estimated covariance of vech(Σ̂_u) for a Gaussian
// VAR estimated on t observations (K(K+1)/2 square):
//
//	Σ̂_σ̂ = 2 D_K⁺ (Σ̂_u ⊗ Σ̂_u) D_K⁺' / T,  element Cov(σ̂_ij, σ̂_kl) = (σ_ik σ_jl + σ_il σ_jk)/T,
//
// D_K⁺ = (D_K'D_K)⁻¹D_K' the Moore–Penrose inverse of the duplication
// matrix (Lütkepohl 2005, §3.4 and §3.7.1, where Σ_σ̃ is the asymptotic
// covariance of √T(σ̃ − σ); the proposition number, 3.4, is from memory).
func VechCov(sigma mat.Symmetric, t int) (*mat.SymDense, error) {
	if sigma == nil {
		return nil, errors.New("vardyn: no residual covariance")
	}
	if t < 1 {
		return nil, fmt.Errorf("vardyn: %d observations", t)
	}
	k := sigma.SymmetricDim()
	n := k * (k + 1) / 2
	out := mat.NewSymDense(n, nil)
	for j := 0; j < k; j++ {
		for i := j; i < k; i++ {
			a := vechIndex(i, j, k)
			for l := 0; l < k; l++ {
				for m := l; m < k; m++ {
					b := vechIndex(m, l, k)
					if b < a {
						continue
					}
					out.SetSym(a, b, (sigma.At(i, m)*sigma.At(j, l)+sigma.At(i, l)*sigma.At(j, m))/float64(t))
				}
			}
		}
	}
	return out, nil
}

func vechIndex(i, j, k int) int { return j*k - j*(j-1)/2 + i - j }

// MAJacobians returns G_0 … G_h, the derivatives of the moving-average
// coefficients with respect to the lag coefficients, G_s = ∂vec(Φ_s)/∂α'
// (K² × K²p):
//
//	G_0 = 0,  G_s = Σ_{m=0}^{s−1} J (A')^{s−1−m} ⊗ Φ_m,
//
// A the Kp×Kp companion matrix of the VAR and J = [I_K 0 … 0] (K × Kp)
// (Lütkepohl 2005, §3.7.1, Proposition 3.6). phi holds Φ_0 … Φ_h (MA).
func MAJacobians(a []*mat.Dense, phi []*mat.Dense) ([]*mat.Dense, error) {
	if len(a) == 0 || len(phi) == 0 {
		return nil, errors.New("vardyn: no coefficient matrices")
	}
	comp, err := johansen.Companion(a)
	if err != nil {
		return nil, fmt.Errorf("vardyn: %s", strings.TrimPrefix(err.Error(), "johansen: "))
	}
	k, _ := a[0].Dims()
	kp := k * len(a)
	h := len(phi) - 1
	// pow[n] = J (A')^n, K × Kp.
	pow := make([]*mat.Dense, max(h, 1))
	pow[0] = mat.NewDense(k, kp, nil)
	for i := 0; i < k; i++ {
		pow[0].Set(i, i, 1)
	}
	for n := 1; n < h; n++ {
		pow[n] = mat.NewDense(k, kp, nil)
		pow[n].Mul(pow[n-1], comp.T())
	}
	g := make([]*mat.Dense, h+1)
	g[0] = mat.NewDense(k*k, k*kp, nil)
	var kr mat.Dense
	for s := 1; s <= h; s++ {
		g[s] = mat.NewDense(k*k, k*kp, nil)
		for m := 0; m < s; m++ {
			kr.Kronecker(pow[s-1-m], phi[m])
			g[s].Add(g[s], &kr)
		}
	}
	return g, nil
}

// MACov returns the estimated covariances of vec(Φ̂_s), s = 0 … h, the
// moving-average coefficients (responses to unit innovations) of the VAR
// with lag coefficients a and coefficient covariance covA (CoefCov):
//
//	Σ̂_Φ̂s = G_s Σ̂_α̂ G_s'
//
// (Lütkepohl 2005, §3.7.1, Proposition 3.6; G_s from MAJacobians, so
// Σ̂_Φ̂0 = 0).
func MACov(a []*mat.Dense, covA mat.Symmetric, h int) ([]*mat.SymDense, error) {
	phi, err := MA(a, h)
	if err != nil {
		return nil, err
	}
	g, err := MAJacobians(a, phi)
	if err != nil {
		return nil, err
	}
	if err := checkCovA(covA, a); err != nil {
		return nil, err
	}
	out := make([]*mat.SymDense, h+1)
	for s := range out {
		out[s] = ols.LinearCov(g[s], covA)
	}
	return out, nil
}

// OrthogonalisedCov returns the estimated covariances of vec(Θ̂_s),
// s = 0 … h, the orthogonalised responses Θ_s = Φ_s P of Orthogonalised
// (P the Cholesky factor of Σ_u in the ordering order, nil for the series'
// own), given the covariance covA of α̂ (CoefCov) and covSigma of vech(Σ̂_u)
// (VechCov):
//
//	Σ̂_Θ̂s = C_s Σ̂_α̂ C_s' + C̄_s Σ̂_σ̂ C̄_s',
//	C_s = (P' ⊗ I_K) G_s,  C̄_s = (I_K ⊗ Φ_s) H,
//	H = ∂vec(P)/∂vech(Σ_u)' = L_K'{L_K (I_{K²} + K_KK)(P ⊗ I_K) L_K'}⁻¹
//
// (Lütkepohl 2005, §3.7.1, Proposition 3.6; L_K the elimination matrix,
// K_KK the commutation matrix, C_0 = 0). For an ordering other than the
// series' own, H is that of the Cholesky factor L of the reordered Σ_u with
// its rows and columns mapped back: P[o_a, o_b] = L[a, b], and the element
// (a, b) of vech of the reordered Σ_u is σ[o_a, o_b].
func OrthogonalisedCov(a []*mat.Dense, sigma mat.Symmetric, covA, covSigma mat.Symmetric, order []int, h int) ([]*mat.SymDense, error) {
	phi, g, err := responseParts(a, sigma, covA, covSigma, h)
	if err != nil {
		return nil, err
	}
	k := sigma.SymmetricDim()
	o, err := checkOrder(order, k)
	if err != nil {
		return nil, err
	}
	p, err := CholeskyFactor(sigma, o)
	if err != nil {
		return nil, err
	}
	// L[a, b] = P[o_a, o_b] is the factor of the reordered Σ_u.
	l := mat.NewDense(k, k, nil)
	for i := 0; i < k; i++ {
		for j := 0; j < k; j++ {
			l.Set(i, j, p.At(o[i], o[j]))
		}
	}
	hl, err := cholDeriv(l)
	if err != nil {
		return nil, err
	}
	hp := mat.NewDense(k*k, k*(k+1)/2, nil)
	for ai := 0; ai < k; ai++ {
		for bi := 0; bi < k; bi++ {
			row := o[bi]*k + o[ai]
			for d := 0; d < k; d++ {
				for c := d; c < k; c++ {
					hp.Set(row, vechIndex(max(o[c], o[d]), min(o[c], o[d]), k), hl.At(bi*k+ai, vechIndex(c, d, k)))
				}
			}
		}
	}
	var pk mat.Dense
	pk.Kronecker(p.T(), identity(k))
	return combine(phi, g, &pk, hp, covA, covSigma), nil
}

// GeneralisedCov returns the estimated covariances of vec(Ψ̂_s), s = 0 … h,
// the generalised responses Ψ_s = Φ_s Σ_u D^{−1/2} of Generalised
// (Pesaran and Shin 1998; D = diag(σ_11, …, σ_KK)), given covA (CoefCov)
// and covSigma (VechCov). With S = Σ_u D^{−1/2}, by the delta method of
// Lütkepohl (2005), §3.7.1, applied to vec(Ψ_s) = (S' ⊗ I_K) vec(Φ_s) =
// (I_K ⊗ Φ_s) vec(S):
//
//	Σ̂_Ψ̂s = C_s Σ̂_α̂ C_s' + C̄_s Σ̂_σ̂ C̄_s',
//	C_s = (S' ⊗ I_K) G_s,  C̄_s = (I_K ⊗ Φ_s) H_S,
//	H_S = ∂vec(S)/∂vech(Σ_u)' = (D^{−1/2} ⊗ I_K) D_K − ½ (I_K ⊗ Σ_u D^{−3/2}) E,
//
// D_K the duplication matrix and E the K² × K(K+1)/2 matrix with a one at
// (vec index of (j, j), vech index of (j, j)) for each j: ∂S_ij/∂σ_jj
// gains −½ σ_ij σ_jj^{−3/2} from the scaling. (The derivative H_S is
// derived here by the chain rule; the tests check it against a
// complex-step Jacobian.)
func GeneralisedCov(a []*mat.Dense, sigma mat.Symmetric, covA, covSigma mat.Symmetric, h int) ([]*mat.SymDense, error) {
	phi, g, err := responseParts(a, sigma, covA, covSigma, h)
	if err != nil {
		return nil, err
	}
	k := sigma.SymmetricDim()
	sd, err := innovationSD(sigma)
	if err != nil {
		return nil, err
	}
	s := mat.NewDense(k, k, nil)
	hs := mat.NewDense(k*k, k*(k+1)/2, nil)
	for j := 0; j < k; j++ {
		for i := 0; i < k; i++ {
			s.Set(i, j, sigma.At(i, j)/sd[j])
			row := j*k + i
			hs.Set(row, vechIndex(max(i, j), min(i, j), k), 1/sd[j])
			jj := vechIndex(j, j, k)
			hs.Set(row, jj, hs.At(row, jj)-0.5*sigma.At(i, j)/(sd[j]*sd[j]*sd[j]))
		}
	}
	var sk mat.Dense
	sk.Kronecker(s.T(), identity(k))
	return combine(phi, g, &sk, hs, covA, covSigma), nil
}

// Cov returns the estimated covariances of vec(θ̂_s), s = 0 … Horizon, of
// the responses r: OrthogonalisedCov (Lütkepohl 2005, §3.7.1, Proposition
// 3.6) or GeneralisedCov (the same delta method).
func (r Responses) Cov(a []*mat.Dense, sigma mat.Symmetric, covA, covSigma mat.Symmetric) ([]*mat.SymDense, error) {
	if r.Generalised {
		return GeneralisedCov(a, sigma, covA, covSigma, r.Horizon)
	}
	return OrthogonalisedCov(a, sigma, covA, covSigma, r.Order, r.Horizon)
}

// ResponseStdErr returns the asymptotic standard errors of the responses
// r of the least-squares VAR v, indexed like them ([s] K×K, element (i, j)
// the response of series i to shock j): the square roots of the diagonals
// of r.Cov with covA = v.CoefCov() and covSigma = VechCov(v.Sigma, v.T)
// (Lütkepohl 2005, §3.7.1, Proposition 3.6).
func (v *VAR) ResponseStdErr(r Responses) ([]*mat.Dense, error) {
	if v == nil {
		return nil, errors.New("vardyn: no VAR")
	}
	ca, err := v.CoefCov()
	if err != nil {
		return nil, err
	}
	cs, err := VechCov(v.Sigma, v.T)
	if err != nil {
		return nil, err
	}
	cov, err := r.Cov(v.A, v.Sigma, ca, cs)
	if err != nil {
		return nil, err
	}
	return StdErrs(cov), nil
}

// StdErrs returns the standard errors of K×K matrices from the
// covariances of their vec: element (i, j) of out[s] is √cov[s][j·K+i,
// j·K+i] (a diagonal element that rounding has made slightly negative
// counts as zero), the asymptotic standard errors of Lütkepohl (2005),
// §3.7.1.
func StdErrs(cov []*mat.SymDense) []*mat.Dense {
	out := make([]*mat.Dense, len(cov))
	for s, c := range cov {
		n := c.SymmetricDim()
		k := int(math.Round(math.Sqrt(float64(n))))
		out[s] = mat.NewDense(k, k, nil)
		for j := 0; j < k; j++ {
			for i := 0; i < k; i++ {
				out[s].Set(i, j, math.Sqrt(math.Max(c.At(j*k+i, j*k+i), 0)))
			}
		}
	}
	return out
}

// NormalBands are pointwise asymptotic confidence bands for impulse
// responses: Lower and Upper indexed [s][i][j] (horizon, response, shock)
// like Bands, and Z the normal quantile used.
type NormalBands struct {
	Lower, Upper [][][]float64
	Z            float64
}

// AsymptoticBands returns the pointwise bands θ̂ ± z_{(1+c)/2} · se for the
// responses theta and their standard errors se, c = coverage and z_q the
// q-quantile of the standard normal. This is the asymptotic interval of
// Lütkepohl (2005), §3.7.1, from the normal limit of Proposition 3.6.
func AsymptoticBands(theta, se []*mat.Dense, coverage float64) (*NormalBands, error) {
	if !(coverage > 0 && coverage < 1) {
		return nil, fmt.Errorf("vardyn: coverage %g is not between 0 and 1", coverage)
	}
	if len(theta) != len(se) {
		return nil, fmt.Errorf("vardyn: %d responses and %d standard errors", len(theta), len(se))
	}
	z := distuv.UnitNormal.Quantile((1 + coverage) / 2)
	out := &NormalBands{Lower: make([][][]float64, len(theta)), Upper: make([][][]float64, len(theta)), Z: z}
	for s, th := range theta {
		k, c := th.Dims()
		if r2, c2 := se[s].Dims(); r2 != k || c2 != c {
			return nil, fmt.Errorf("vardyn: horizon %d: %d×%d responses and %d×%d standard errors", s, k, c, r2, c2)
		}
		out.Lower[s], out.Upper[s] = make([][]float64, k), make([][]float64, k)
		for i := 0; i < k; i++ {
			out.Lower[s][i], out.Upper[s][i] = make([]float64, c), make([]float64, c)
			for j := 0; j < c; j++ {
				out.Lower[s][i][j] = th.At(i, j) - z*se[s].At(i, j)
				out.Upper[s][i][j] = th.At(i, j) + z*se[s].At(i, j)
			}
		}
	}
	return out, nil
}

// responseParts checks the inputs and returns Φ_0 … Φ_h and G_0 … G_h.
func responseParts(a []*mat.Dense, sigma mat.Symmetric, covA, covSigma mat.Symmetric, h int) ([]*mat.Dense, []*mat.Dense, error) {
	if sigma == nil {
		return nil, nil, errors.New("vardyn: no residual covariance")
	}
	phi, err := MA(a, h)
	if err != nil {
		return nil, nil, err
	}
	k, _ := a[0].Dims()
	if sigma.SymmetricDim() != k {
		return nil, nil, fmt.Errorf("vardyn: the residual covariance is %d×%d for %d series", sigma.SymmetricDim(), sigma.SymmetricDim(), k)
	}
	if err := checkCovA(covA, a); err != nil {
		return nil, nil, err
	}
	if covSigma == nil || covSigma.SymmetricDim() != k*(k+1)/2 {
		return nil, nil, fmt.Errorf("vardyn: the covariance of vech(Σ) must be %d×%d", k*(k+1)/2, k*(k+1)/2)
	}
	g, err := MAJacobians(a, phi)
	if err != nil {
		return nil, nil, err
	}
	return phi, g, nil
}

func checkCovA(covA mat.Symmetric, a []*mat.Dense) error {
	k, _ := a[0].Dims()
	n := k * k * len(a)
	if covA == nil || covA.SymmetricDim() != n {
		return fmt.Errorf("vardyn: the covariance of the lag coefficients must be %d×%d", n, n)
	}
	return nil
}

// combine returns C_s Σ_α C_s' + C̄_s Σ_σ C̄_s' with C_s = m G_s and
// C̄_s = (I_K ⊗ Φ_s) hd, s = 0 … h.
func combine(phi, g []*mat.Dense, m *mat.Dense, hd *mat.Dense, covA, covSigma mat.Symmetric) []*mat.SymDense {
	k, _ := phi[0].Dims()
	out := make([]*mat.SymDense, len(phi))
	var c, ip, cbar mat.Dense
	for s := range phi {
		c.Mul(m, g[s])
		out[s] = ols.LinearCov(&c, covA)
		ip.Kronecker(identity(k), phi[s])
		cbar.Mul(&ip, hd)
		b := ols.LinearCov(&cbar, covSigma)
		out[s].AddSym(out[s], b)
	}
	return out
}

// cholDeriv returns ∂vec(L)/∂vech(Σ)' for the lower-triangular Cholesky
// factor L of Σ = LL':
//
//	H = L_K'{L_K (I_{K²} + K_KK)(L ⊗ I_K) L_K'}⁻¹
//
// (Lütkepohl 2005, §3.7.1, Proposition 3.6; L_K the elimination matrix,
// vech(M) = L_K vec(M), and K_KK the commutation matrix, vec(M') =
// K_KK vec(M)).
func cholDeriv(l *mat.Dense) (*mat.Dense, error) {
	k, _ := l.Dims()
	n := k * (k + 1) / 2
	el := mat.NewDense(n, k*k, nil)
	for j := 0; j < k; j++ {
		for i := j; i < k; i++ {
			el.Set(vechIndex(i, j, k), j*k+i, 1)
		}
	}
	ik := mat.NewDense(k*k, k*k, nil) // I + K_KK
	for j := 0; j < k; j++ {
		for i := 0; i < k; i++ {
			ik.Set(j*k+i, j*k+i, ik.At(j*k+i, j*k+i)+1)
			ik.Set(i*k+j, j*k+i, ik.At(i*k+j, j*k+i)+1)
		}
	}
	var lk, t1, t2, b mat.Dense
	lk.Kronecker(l, identity(k))
	t1.Mul(el, ik)
	t2.Mul(&t1, &lk)
	b.Mul(&t2, el.T())
	var inv mat.Dense
	if err := inv.Inverse(&b); err != nil {
		return nil, errors.New("vardyn: the derivative of the Cholesky factor is singular (a zero innovation variance)")
	}
	out := mat.NewDense(k*k, n, nil)
	out.Mul(el.T(), &inv)
	return out, nil
}

func identity(k int) *mat.Dense {
	m := mat.NewDense(k, k, nil)
	for i := 0; i < k; i++ {
		m.Set(i, i, 1)
	}
	return m
}
