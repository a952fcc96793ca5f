package longrun

import (
	"errors"
	"fmt"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
)

// CCRSpec specifies a canonical cointegrating regression. Its kernel and
// bandwidth are those of FMOLSSpec, and mean the same.
type CCRSpec struct {
	Det    critical.Case
	Kernel Kernel
	// Bandwidth b of the kernel; 0 selects it automatically by
	// AndrewsBandwidth on w_t = (û_t, v̂_t').
	Bandwidth float64
}

// CCRResult is a canonical cointegrating regression.
type CCRResult struct {
	Names []string  // deterministic terms, then the regressors
	Coef  []float64 // θ̂* = (δ̂*, β̂*)
	Cov   *mat.SymDense
	Table []ols.Coef // p-values from the standard normal
	// LongRun holds β̂* and its covariance block.
	LongRun Coefs
	// Omega, Delta and Sigma are Ω̂, Δ̂ and Σ̂ = Γ̂(0) of
	// w_t = (û_t, v̂_t'), u first.
	Omega, Sigma *mat.SymDense
	Delta        *mat.Dense
	// Pi is Π̂ = Σ̂⁻¹Γ̂₂, (1+k)×k, the loading of ŵ_t in x*_t.
	Pi        *mat.Dense
	Omega11_2 float64 // ω̂_{1·2}
	Bandwidth float64 // bandwidth used
	N         int     // observations used (T − 1)
	First     int     // index into the input of the first observation used (1)
	Static    *ols.Fit
	// Fit is the OLS fit of y* on (d_t', x*_t')'; YStar and XStar (one
	// slice per regressor) are the transformed data, t = 2..T.
	Fit   *ols.Fit
	YStar []float64
	XStar [][]float64
	Resid []float64 // y_t − z_t'θ̂* on the untransformed data
}

// CCR estimates the cointegrating regression
//
//	y_t = d_t'δ + x_t'β + u_t,   Δx_t = v_t,
//
// by the canonical cointegrating regression of Park (1992). On the
// observations t = 2..T (N = T − 1) for which Δx_t exists, with the first
// stage FMOLS uses (static OLS β̂ and û_t; ŵ_t = (û_t, v̂_t')', v̂_t the
// demeaned Δx_t; the same kernel and bandwidth):
//
//	Σ̂  = N⁻¹ Σ_t ŵ_t ŵ_t'                      (contemporaneous covariance),
//	Ω̂, Δ̂                                      (LongRunCov: Δ̂ estimates Σ_{j≥0} E w_0 w_j'),
//	Γ̂₂ = (Δ̂₂₁, Δ̂₂₂)'                           ((1+k)×k: Σ_{j≥0} E w_j v_0'),
//	x*_t = x_t − Γ̂₂'Σ̂⁻¹ŵ_t,
//	y*_t = y_t − (Σ̂⁻¹Γ̂₂β̂ + (0, ω̂₁₂Ω̂₂₂⁻¹)')'ŵ_t,
//
// then OLS (ols.Regress) of y*_t on z*_t = (d_t', x*_t')', the deterministic
// terms untransformed: θ̂* = (Z*'Z*)⁻¹Z*'y*, with Cov(θ̂*) = ω̂₁·₂ (Z*'Z*)⁻¹,
// ω̂₁·₂ = ω̂₁₁ − ω̂₁₂Ω̂₂₂⁻¹ω̂₂₁ (the FMOLS one).
//
// Why these transformations (Park 1992, Section 3): y*_t = d_t'δ + x*_t'β
// + u*_t with u*_t = u_t − ω₁₂Ω₂₂⁻¹v_t, which is independent in the limit
// of the regressors' innovations (the endogeneity is gone), and the
// one-sided bias of Σ x*_t u*_t, Σ_{j≥0} E(v_0 u*_j) − Γ₂'Σ⁻¹E(w_t u*_t),
// is zero because E(w_t u*_t) = Σ(1, −ω₁₂Ω₂₂⁻¹)'; so β̂* has the same
// mixed-normal limit as FMOLS and t-ratios and Wald statistics (Wald) are
// asymptotically normal and χ². Replacing β by the consistent β̂ in y*_t
// changes y*_t by O_p(N⁻¹). The notation Σ, Γ₂ and the form of the two
// transformations are Park's (his equations for x*_t and y*_t in
// Section 3) as we recall them; the paper could not be consulted, so the
// equation numbers are not given here, and the direction of Γ₂ (leads of
// w against v_0) is the one the bias calculation above requires.
func CCR(y []float64, x [][]float64, names []string, s CCRSpec) (*CCRResult, error) {
	st, err := newRelationStage(y, x, names, s.Det, s.Kernel, s.Bandwidth)
	if err != nil {
		return nil, fmt.Errorf("ccr: %w", err)
	}
	n, nd, k, p := st.n, st.nd, st.k, st.p
	m := 1 + k
	sigma := mat.NewSymDense(m, nil)
	for a := 0; a < m; a++ {
		for c := a; c < m; c++ {
			var v float64
			for i := 0; i < n; i++ {
				v += st.w.At(i, a) * st.w.At(i, c)
			}
			sigma.SetSym(a, c, v/float64(n))
		}
	}
	var ch mat.Cholesky
	if !ch.Factorize(sigma) {
		return nil, errors.New("ccr: the covariance of (û_t, Δx_t) is not positive definite")
	}
	gamma2 := mat.NewDense(m, k, nil)
	for i := 0; i < m; i++ {
		for c := 0; c < k; c++ {
			gamma2.Set(i, c, st.delta.At(1+c, i))
		}
	}
	pi := mat.NewDense(m, k, nil)
	if err := ch.SolveTo(pi, gamma2); err != nil {
		return nil, fmt.Errorf("ccr: %w", err)
	}
	// a = Π̂β̂ + (0, g')', the loading of ŵ_t in y*_t.
	bOLS := mat.NewVecDense(k, append([]float64(nil), st.static.Coef[nd:]...))
	var load mat.VecDense
	load.MulVec(pi, bOLS)
	for c := 0; c < k; c++ {
		load.SetVec(1+c, load.AtVec(1+c)+st.g.AtVec(c))
	}
	var shift mat.Dense // rows ŵ_t'Π̂
	shift.Mul(st.w, pi)
	zs := mat.DenseCopyOf(st.Z)
	ys := make([]float64, n)
	xs := make([][]float64, k)
	for c := range xs {
		xs[c] = make([]float64, n)
	}
	for i := 0; i < n; i++ {
		ys[i] = st.y[i] - mat.Dot(st.w.RowView(i), &load)
		for c := 0; c < k; c++ {
			v := st.Z.At(i, nd+c) - shift.At(i, c)
			zs.Set(i, nd+c, v)
			xs[c][i] = v
		}
	}
	fit, err := ols.Regress(ys, zs)
	if err != nil {
		var ce *ols.CollinearError
		if errors.As(err, &ce) {
			return nil, fmt.Errorf("ccr: transformed term %q (column %d) is collinear with the terms before it", st.names[ce.Col], ce.Col)
		}
		return nil, fmt.Errorf("ccr: %w", err)
	}
	cov := mat.NewSymDense(p, nil)
	cov.ScaleSym(st.o112, fit.XtXInv())
	res := &CCRResult{
		Names: st.names, Coef: append([]float64(nil), fit.Coef...), Cov: cov,
		Omega: st.omega, Sigma: sigma, Delta: st.delta, Pi: pi, Omega11_2: st.o112,
		Bandwidth: st.b, N: n, First: 1, Static: st.static, Fit: fit, YStar: ys, XStar: xs,
		Resid: make([]float64, n),
	}
	res.Table = normalTable(res.Coef, cov)
	for i := 0; i < n; i++ {
		e := st.y[i]
		for j := 0; j < p; j++ {
			e -= st.Z.At(i, j) * res.Coef[j]
		}
		res.Resid[i] = e
	}
	res.LongRun = Coefs{Names: st.xn, Coef: append([]float64(nil), res.Coef[nd:]...), Cov: subCov(cov, nd, k)}
	return res, nil
}
