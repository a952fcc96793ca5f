package vardyn

import (
	"errors"
	"fmt"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/ols"
)

// VECMCoefCov returns the estimated covariance of α̂ = vec[Â_1 … Â_{k+1}],
// the coefficients of the VECM m written as a VAR in levels (VARForm),
// with the cointegrating vectors β held at their estimate (K²(k+1) square).
// β̂ converges faster than the other estimators, so that the loadings and
// short-run coefficients have the limit they would have with β known, and
// the VAR-form coefficients inherit it through a linear map (Lütkepohl
// 2005, §7.2, and ch. 9 for the impulse responses of a VECM, whose
// covariance of α̂ is singular; the section numbers are from memory;
// statsmodels' VECMResults.cov_var_repr computes the same matrix). With the regression of each equation on
// X_t = [β̂'ỹ_{t−1}, short-run terms] (Δy_{t−1} … Δy_{t−k}, unrestricted
// deterministic and extra terms), M the block of (X'X)⁻¹ of the loadings
// and the lagged differences (the other terms partialled out), β_y the rows
// of β̂ for the series and C = [Π_y, Γ_1, …, Γ_k] = [α, Γ_1, …, Γ_k] B',
// B = diag(β_y, I_{Kk}):
//
//	Σ̂_α̂ = (W' B M B' W) ⊗ Ω̂,   [A_1 … A_{k+1}] = C W,
//
// W the K(k+1)-square block matrix with I_K in blocks (0, 0) and
// (j+1, j), j < k, and −I_K in blocks (j, j), 1 ≤ j ≤ k (A_1 = I + Π_y +
// Γ_1, A_i = Γ_i − Γ_{i−1}, A_{k+1} = −Γ_k; the constant I does not
// vary), and Ω̂ the ML residual covariance (m.Omega, the one the VECM's
// responses use). (X'X)⁻¹ is read from the least-squares covariance of the
// first equation, s_1²(X'X)⁻¹ (johansen's EquationCov), divided by
// s_1² = ê_1'ê_1/(T − m).
func VECMCoefCov(m *johansen.VECM) (*mat.SymDense, error) {
	if m == nil || m.Alpha == nil || m.Beta == nil || m.Omega == nil || m.Resid == nil {
		return nil, errors.New("vardyn: no estimated VECM")
	}
	k, r := m.Alpha.Dims()
	lags := 0
	for _, tm := range m.Terms {
		if tm.Kind == johansen.LagDiff && tm.Lag > lags {
			lags = tm.Lag
		}
	}
	cov0, df, err := m.EquationCov(0)
	if err != nil {
		return nil, err
	}
	if df < 1 {
		return nil, fmt.Errorf("vardyn: the VECM leaves %d residual degrees of freedom", df)
	}
	t, _ := m.Resid.Dims()
	var ss float64
	for i := 0; i < t; i++ {
		e := m.Resid.At(i, 0)
		ss += e * e
	}
	if !(ss > 0) {
		return nil, errors.New("vardyn: the first equation of the VECM fits exactly")
	}
	s2 := ss / float64(df)
	// pos[q] is the row in X of coefficient q of [α (r), Γ_1 … Γ_k (K each)].
	n := r + k*lags
	pos := make([]int, n)
	for q := 0; q < r; q++ {
		pos[q] = q
	}
	found := r
	for c, tm := range m.Terms {
		if tm.Kind == johansen.LagDiff {
			pos[r+(tm.Lag-1)*k+tm.Series] = r + c
			found++
		}
	}
	if found != n || cov0.SymmetricDim() != r+len(m.Terms) {
		return nil, fmt.Errorf("vardyn: the VECM's terms do not match its covariance")
	}
	mm := mat.NewDense(n, n, nil)
	for a := 0; a < n; a++ {
		for b := 0; b < n; b++ {
			mm.Set(a, b, cov0.At(pos[a], pos[b])/s2)
		}
	}
	kk := k * (lags + 1)
	bm := mat.NewDense(kk, n, nil)
	bm.Slice(0, k, 0, r).(*mat.Dense).Copy(m.Beta.Slice(0, k, 0, r))
	for i := 0; i < k*lags; i++ {
		bm.Set(k+i, r+i, 1)
	}
	w := mat.NewDense(kk, kk, nil)
	for i := 0; i < k; i++ {
		w.Set(i, i, 1)
		for j := 0; j <= lags; j++ {
			if j < lags {
				w.Set((j+1)*k+i, j*k+i, 1)
			}
			if j >= 1 {
				w.Set(j*k+i, j*k+i, -1)
			}
		}
	}
	var bw mat.Dense
	bw.Mul(w.T(), bm) // W'B
	g := ols.LinearCov(&bw, mat.NewSymDense(n, symData(mm)))
	out := mat.NewSymDense(kk*k, nil)
	for c1 := 0; c1 < kk; c1++ {
		for c2 := c1; c2 < kk; c2++ {
			gv := g.At(c1, c2)
			for r1 := 0; r1 < k; r1++ {
				for r2 := 0; r2 < k; r2++ {
					a, b := c1*k+r1, c2*k+r2
					if a > b {
						a, b = b, a
					}
					out.SetSym(a, b, gv*m.Omega.At(r1, r2))
				}
			}
		}
	}
	return out, nil
}

// VECMResponseStdErr returns the asymptotic standard errors of the
// responses r of the VECM m in its VAR form (indexed like them): the
// square roots of the diagonals of r.Cov with covA = VECMCoefCov(m) and
// covSigma = VechCov(Ω̂, T), T the observations the VECM was estimated on
// (Lütkepohl 2005, §3.7.1, Proposition 3.6, with the covariance of
// VECMCoefCov, ch. 9).
func VECMResponseStdErr(m *johansen.VECM, r Responses) ([]*mat.Dense, error) {
	ca, err := VECMCoefCov(m)
	if err != nil {
		return nil, err
	}
	t, _ := m.Resid.Dims()
	cs, err := VechCov(m.Omega, t)
	if err != nil {
		return nil, err
	}
	cov, err := r.Cov(m.VARForm(), m.Omega, ca, cs)
	if err != nil {
		return nil, err
	}
	return StdErrs(cov), nil
}

// symData returns the row-major data of the symmetric part of a square
// matrix, (a + a')/2.
func symData(a *mat.Dense) []float64 {
	n, _ := a.Dims()
	out := make([]float64, n*n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			out[i*n+j] = (a.At(i, j) + a.At(j, i)) / 2
		}
	}
	return out
}
