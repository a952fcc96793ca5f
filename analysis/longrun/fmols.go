package longrun

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
)

// FMOLSSpec specifies a fully modified OLS estimation.
type FMOLSSpec struct {
	Det    critical.Case
	Kernel Kernel
	// Bandwidth b of the kernel; 0 selects it automatically by
	// AndrewsBandwidth on w_t = (û_t, v̂_t').
	Bandwidth float64
}

// FMOLSResult is a fully modified OLS estimate.
type FMOLSResult struct {
	Names []string  // deterministic terms, then the regressors
	Coef  []float64 // θ̂⁺ = (δ̂⁺, β̂⁺)
	Cov   *mat.SymDense
	Table []ols.Coef // p-values from the standard normal
	// LongRun holds β̂⁺ and its covariance block.
	LongRun Coefs
	// Omega is Ω̂ and Delta is Δ̂ for w_t = (û_t, v̂_t'), u first.
	Omega     *mat.SymDense
	Delta     *mat.Dense
	Omega11_2 float64 // ω̂_{1·2}, long-run variance of u given v
	Bandwidth float64 // bandwidth used
	N         int     // observations used (T − 1)
	First     int     // index into the input of the first observation used (1)
	Static    *ols.Fit
	Resid     []float64 // y_t − z_t'θ̂⁺ (uncorrected y)
}

// FMOLS estimates the cointegrating regression by fully modified OLS
// (Phillips and Hansen 1990). On the observations t = 2..T for which
// Δx_t exists:
//
//  1. static OLS of y_t on z_t = (d_t', x_t')' gives û_t;
//  2. v̂_t = Δx_t − mean(Δx) (demeaned so that a drift in x does not
//     enter the long-run covariance; our choice, asymptotically
//     immaterial without drift);
//  3. Ω̂ and Δ̂ of w_t = (û_t, v̂_t') by LongRunCov, with blocks 1 for u
//     and 2 for v;
//  4. y⁺_t = y_t − ω̂₁₂Ω̂₂₂⁻¹v̂_t (endogeneity correction) and
//     Δ̂⁺₂₁ = Δ̂₂₁ − Δ̂₂₂Ω̂₂₂⁻¹ω̂₂₁ (serial-correlation correction);
//  5. θ̂⁺ = (Z'Z)⁻¹ (Z'y⁺ − N·(0', Δ̂⁺₂₁')'), the correction acting on
//     the rows of x only, with N = T − 1 observations;
//  6. Cov(θ̂⁺) = ω̂₁·₂ (Z'Z)⁻¹, ω̂₁·₂ = ω̂₁₁ − ω̂₁₂Ω̂₂₂⁻¹ω̂₂₁.
//
// β̂⁺ has a mixed-normal limit, so t-ratios and Wald statistics are
// asymptotically normal and χ².
func FMOLS(y []float64, x [][]float64, names []string, s FMOLSSpec) (*FMOLSResult, error) {
	xn, err := checkInput(y, x, names, s.Det)
	if err != nil {
		return nil, fmt.Errorf("fmols: %w", err)
	}
	if s.Bandwidth < 0 || math.IsNaN(s.Bandwidth) || math.IsInf(s.Bandwidth, 0) {
		return nil, fmt.Errorf("fmols: bandwidth must be positive, or 0 for automatic, got %g", s.Bandwidth)
	}
	n := len(y) - 1
	nd := s.Det.Deterministics()
	k := len(x)
	p := nd + k
	if n <= p+1 {
		return nil, fmt.Errorf("fmols: %d observations for %d regressors", max(n, 0), p)
	}
	allNames := append(detNames(s.Det), xn...)
	Z := mat.NewDense(n, p, nil)
	yy := make([]float64, n)
	for i := 0; i < n; i++ {
		t := i + 1
		yy[i] = y[t]
		for j := 0; j < nd; j++ {
			Z.Set(i, j, detValue(j, t))
		}
		for kk, xc := range x {
			Z.Set(i, nd+kk, xc[t])
		}
	}
	static, err := ols.Regress(yy, Z)
	if err != nil {
		var ce *ols.CollinearError
		if errors.As(err, &ce) {
			return nil, fmt.Errorf("fmols: term %q (column %d) is collinear with the terms before it", allNames[ce.Col], ce.Col)
		}
		return nil, fmt.Errorf("fmols: %w", err)
	}
	w := mat.NewDense(n, 1+k, nil)
	for kk, xc := range x {
		var mean float64
		for i := 0; i < n; i++ {
			mean += xc[i+1] - xc[i]
		}
		mean /= float64(n)
		for i := 0; i < n; i++ {
			w.Set(i, 1+kk, xc[i+1]-xc[i]-mean)
		}
	}
	for i := 0; i < n; i++ {
		w.Set(i, 0, static.Resid[i])
	}
	b := s.Bandwidth
	if b == 0 {
		if b, err = AndrewsBandwidth(w, s.Kernel); err != nil {
			return nil, fmt.Errorf("fmols: %w", err)
		}
	}
	omega, delta, err := LongRunCov(w, s.Kernel, b)
	if err != nil {
		return nil, fmt.Errorf("fmols: %w", err)
	}
	o22 := subCov(omega, 1, k)
	var ch mat.Cholesky
	if !ch.Factorize(o22) {
		return nil, errors.New("fmols: the long-run covariance of Δx is not positive definite")
	}
	o21 := mat.NewVecDense(k, nil)
	for a := 0; a < k; a++ {
		o21.SetVec(a, omega.At(1+a, 0))
	}
	var g mat.VecDense // Ω̂₂₂⁻¹ω̂₂₁
	if err := ch.SolveVecTo(&g, o21); err != nil {
		return nil, fmt.Errorf("fmols: %w", err)
	}
	o112 := omega.At(0, 0) - mat.Dot(o21, &g)
	if !(o112 > 0) {
		return nil, fmt.Errorf("fmols: conditional long-run variance ω₁·₂ = %g is not positive", o112)
	}
	// Δ̂⁺₂₁ = Δ̂₂₁ − Δ̂₂₂ g
	dplus := make([]float64, k)
	for a := 0; a < k; a++ {
		v := delta.At(1+a, 0)
		for c := 0; c < k; c++ {
			v -= delta.At(1+a, 1+c) * g.AtVec(c)
		}
		dplus[a] = v
	}
	// Z'y⁺ − N(0, Δ̂⁺₂₁)
	rhs := mat.NewVecDense(p, nil)
	for i := 0; i < n; i++ {
		yp := yy[i]
		for a := 0; a < k; a++ {
			yp -= g.AtVec(a) * w.At(i, 1+a)
		}
		for j := 0; j < p; j++ {
			rhs.SetVec(j, rhs.AtVec(j)+Z.At(i, j)*yp)
		}
	}
	for a := 0; a < k; a++ {
		rhs.SetVec(nd+a, rhs.AtVec(nd+a)-float64(n)*dplus[a])
	}
	inv := static.XtXInv()
	var th mat.VecDense
	th.MulVec(inv, rhs)
	cov := mat.NewSymDense(p, nil)
	cov.ScaleSym(o112, inv)
	res := &FMOLSResult{
		Names: allNames, Coef: make([]float64, p), Cov: cov, Table: make([]ols.Coef, p),
		Omega: omega, Delta: delta, Omega11_2: o112, Bandwidth: b, N: n, First: 1,
		Static: static, Resid: make([]float64, n),
	}
	for j := 0; j < p; j++ {
		res.Coef[j] = th.AtVec(j)
		se := math.Sqrt(cov.At(j, j))
		tr := res.Coef[j] / se
		res.Table[j] = ols.Coef{Est: res.Coef[j], SE: se, T: tr, P: ols.TwoSidedP(tr, 0, true)}
	}
	for i := 0; i < n; i++ {
		e := yy[i]
		for j := 0; j < p; j++ {
			e -= Z.At(i, j) * res.Coef[j]
		}
		res.Resid[i] = e
	}
	res.LongRun = Coefs{Names: xn, Coef: append([]float64(nil), res.Coef[nd:]...), Cov: subCov(cov, nd, k)}
	return res, nil
}
