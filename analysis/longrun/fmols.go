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
	st, err := newRelationStage(y, x, names, s.Det, s.Kernel, s.Bandwidth)
	if err != nil {
		return nil, fmt.Errorf("fmols: %w", err)
	}
	n, nd, k, p := st.n, st.nd, st.k, st.p
	Z, yy, w, g, delta := st.Z, st.y, st.w, st.g, st.delta
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
	inv := st.static.XtXInv()
	var th mat.VecDense
	th.MulVec(inv, rhs)
	cov := mat.NewSymDense(p, nil)
	cov.ScaleSym(st.o112, inv)
	res := &FMOLSResult{
		Names: st.names, Coef: make([]float64, p), Cov: cov, Table: make([]ols.Coef, p),
		Omega: st.omega, Delta: delta, Omega11_2: st.o112, Bandwidth: st.b, N: n, First: 1,
		Static: st.static, Resid: make([]float64, n),
	}
	for j := 0; j < p; j++ {
		res.Coef[j] = th.AtVec(j)
	}
	res.Table = normalTable(res.Coef, cov)
	for i := 0; i < n; i++ {
		e := yy[i]
		for j := 0; j < p; j++ {
			e -= Z.At(i, j) * res.Coef[j]
		}
		res.Resid[i] = e
	}
	res.LongRun = Coefs{Names: st.xn, Coef: append([]float64(nil), res.Coef[nd:]...), Cov: subCov(cov, nd, k)}
	return res, nil
}

// normalTable returns the coefficient rows of estimates with covariance
// cov: standard errors √cov_jj, t-ratios, and two-sided p-values from the
// standard normal (the mixed-normal limit of FMOLS and CCR).
func normalTable(coef []float64, cov mat.Symmetric) []ols.Coef {
	out := make([]ols.Coef, len(coef))
	for j, b := range coef {
		se := math.Sqrt(cov.At(j, j))
		tr := b / se
		out[j] = ols.Coef{Est: b, SE: se, T: tr, P: ols.TwoSidedP(tr, 0, true)}
	}
	return out
}

// ShortSampleError: N = T − 1 observations are too few for a regression
// on Terms terms (FMOLS and CCR need N > Terms + 1).
type ShortSampleError struct{ N, Terms int }

func (e *ShortSampleError) Error() string {
	return fmt.Sprintf("%d observations after differencing for %d terms; more than %d are needed", e.N, e.Terms, e.Terms+1)
}

// ConstantRegressorError: regressor Index (named Name) takes one value
// over the estimation sample, so it is not an integrated series.
type ConstantRegressorError struct {
	Index int
	Name  string
}

func (e *ConstantRegressorError) Error() string {
	return fmt.Sprintf("regressor %q is constant over the sample; the regressors of a cointegrating relation must be integrated series", e.Name)
}

// relationStage is the first stage FMOLS and CCR share, on the
// observations t = 2..T (zero-based 1..T−1, N = T − 1) for which Δx_t
// exists: the design z_t = (d_t', x_t')', the static OLS fit of y_t on
// z_t, w_t = (û_t, v̂_t') with v̂_t = Δx_t − mean(Δx), the bandwidth,
// Ω̂ and Δ̂ of w_t (LongRunCov), g = Ω̂₂₂⁻¹ω̂₂₁ and
// ω̂₁·₂ = ω̂₁₁ − ω̂₁₂Ω̂₂₂⁻¹ω̂₂₁.
type relationStage struct {
	n, nd, k, p int
	names, xn   []string // all terms; the regressors
	Z           *mat.Dense
	y           []float64 // y_t, t = 2..T
	static      *ols.Fit
	w           *mat.Dense // rows (û_t, v̂_t')
	b           float64
	omega       *mat.SymDense
	delta       *mat.Dense
	g           *mat.VecDense
	o112        float64
}

// newRelationStage computes the shared first stage; bandwidth 0 chooses
// it by AndrewsBandwidth on w_t.
func newRelationStage(y []float64, x [][]float64, names []string, det critical.Case, kern Kernel, bandwidth float64) (*relationStage, error) {
	xn, err := checkInput(y, x, names, det)
	if err != nil {
		return nil, err
	}
	if bandwidth < 0 || math.IsNaN(bandwidth) || math.IsInf(bandwidth, 0) {
		return nil, fmt.Errorf("bandwidth must be positive, or 0 for automatic, got %g", bandwidth)
	}
	n := len(y) - 1
	nd := det.Deterministics()
	k := len(x)
	p := nd + k
	if n <= p+1 {
		return nil, &ShortSampleError{N: max(n, 0), Terms: p}
	}
	for kk, xc := range x {
		constant := true
		for i := 2; i <= n && constant; i++ {
			constant = xc[i] == xc[1]
		}
		if constant {
			return nil, &ConstantRegressorError{Index: kk, Name: xn[kk]}
		}
	}
	st := &relationStage{n: n, nd: nd, k: k, p: p, xn: xn, names: append(detNames(det), xn...)}
	st.Z = mat.NewDense(n, p, nil)
	st.y = make([]float64, n)
	for i := 0; i < n; i++ {
		t := i + 1
		st.y[i] = y[t]
		for j := 0; j < nd; j++ {
			st.Z.Set(i, j, detValue(j, t))
		}
		for kk, xc := range x {
			st.Z.Set(i, nd+kk, xc[t])
		}
	}
	if st.static, err = ols.Regress(st.y, st.Z); err != nil {
		var ce *ols.CollinearError
		if errors.As(err, &ce) {
			return nil, fmt.Errorf("term %q (column %d) is collinear with the terms before it", st.names[ce.Col], ce.Col)
		}
		return nil, err
	}
	st.w = mat.NewDense(n, 1+k, nil)
	for kk, xc := range x {
		var mean float64
		for i := 0; i < n; i++ {
			mean += xc[i+1] - xc[i]
		}
		mean /= float64(n)
		for i := 0; i < n; i++ {
			st.w.Set(i, 1+kk, xc[i+1]-xc[i]-mean)
		}
	}
	for i := 0; i < n; i++ {
		st.w.Set(i, 0, st.static.Resid[i])
	}
	st.b = bandwidth
	if st.b == 0 {
		if st.b, err = AndrewsBandwidth(st.w, kern); err != nil {
			return nil, err
		}
	}
	if st.omega, st.delta, err = LongRunCov(st.w, kern, st.b); err != nil {
		return nil, err
	}
	o22 := subCov(st.omega, 1, k)
	var ch mat.Cholesky
	if !ch.Factorize(o22) {
		return nil, errors.New("the long-run covariance of Δx is not positive definite")
	}
	o21 := mat.NewVecDense(k, nil)
	for a := 0; a < k; a++ {
		o21.SetVec(a, st.omega.At(1+a, 0))
	}
	st.g = mat.NewVecDense(k, nil)
	if err := ch.SolveVecTo(st.g, o21); err != nil {
		return nil, err
	}
	st.o112 = st.omega.At(0, 0) - mat.Dot(o21, st.g)
	if !(st.o112 > 0) {
		return nil, fmt.Errorf("conditional long-run variance ω₁·₂ = %g is not positive", st.o112)
	}
	return st, nil
}
