package sysdiag

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"

	"github.com/galley-econ/galley/analysis/ols"
)

// Test is the outcome of one system test. For a χ² statistic DF is its
// degrees of freedom and DF2 is zero; for an F statistic DF and DF2 are
// the numerator and denominator degrees of freedom (DF2 need not be a
// whole number: the Edgerton–Shukur denominator is Ns − q).
type Test struct {
	Stat float64
	DF   int
	DF2  float64
	P    float64
}

// DefaultOrder is the lag order of the autocorrelation and ARCH tests when
// none is given: 4, whatever the frequency. The system statistics have
// hK² and qK²(K+1)²/4 degrees of freedom, so the orders used for single
// equations on monthly data (12) would ask far more of a system's sample;
// a small h is common practice for the LM test (Lütkepohl 2005, §4.4.4),
// and galley's choice of 4 is its own.
const DefaultOrder = 4

// ErrTooFewObs is wrapped by the errors of tests whose auxiliary
// regression or moments need more observations than there are.
var ErrTooFewObs = errors.New("too few observations")

func chi2(stat float64, df int) Test {
	p := math.NaN()
	switch {
	case math.IsNaN(stat) || df <= 0:
	case stat <= 0:
		p = 1
	default:
		p = distuv.ChiSquared{K: float64(df)}.Survival(stat)
	}
	return Test{Stat: stat, DF: df, P: p}
}

func fTest(stat float64, d1 int, d2 float64) Test {
	p := math.NaN()
	switch {
	case math.IsNaN(stat) || d1 <= 0 || !(d2 > 0):
	case stat <= 0:
		p = 1
	default:
		p = distuv.F{D1: float64(d1), D2: d2}.Survival(stat)
	}
	return Test{Stat: stat, DF: d1, DF2: d2, P: p}
}

// checkResid returns T and K of u, or an error when u is empty or holds a
// value that is not finite.
func checkResid(u *mat.Dense) (int, int, error) {
	if u == nil {
		return 0, 0, errors.New("sysdiag: no residuals")
	}
	t, k := u.Dims()
	if t == 0 || k == 0 {
		return 0, 0, errors.New("sysdiag: no residuals")
	}
	for i := 0; i < t; i++ {
		for j := 0; j < k; j++ {
			if v := u.At(i, j); math.IsNaN(v) || math.IsInf(v, 0) {
				return 0, 0, fmt.Errorf("sysdiag: residual %d of equation %d is not finite", i+1, j+1)
			}
		}
	}
	return t, k, nil
}

// residualsOn regresses every column of u on x by least squares
// (ols.Regress, Householder QR) and returns the T×K residuals; with no
// regressors (x nil) it returns a copy of u.
func residualsOn(u, x *mat.Dense) (*mat.Dense, error) {
	t, k := u.Dims()
	out := mat.NewDense(t, k, nil)
	if x == nil {
		out.Copy(u)
		return out, nil
	}
	col := make([]float64, t)
	for j := 0; j < k; j++ {
		mat.Col(col, j, u)
		f, err := ols.Regress(col, x)
		if err != nil {
			return nil, err
		}
		out.SetCol(j, f.Resid)
	}
	return out, nil
}

// moment returns E'E/T.
func moment(e *mat.Dense) *mat.SymDense {
	t, k := e.Dims()
	s := mat.NewSymDense(k, nil)
	s.SymOuterK(1/float64(t), e.T())
	return s
}

// Serial is the multivariate LM test of residual autocorrelation up to
// order h in both forms.
type Serial struct {
	Order int
	LM    Test // χ²(hK²)
	F     Test // Edgerton–Shukur F(hK², Ns − q)
	// RSquared is Rao's R²_r = 1 − |Σ̃_e|/|Σ̃_R| behind the F form.
	RSquared float64
}

// SerialLM is the multivariate Breusch–Godfrey LM test of residual
// autocorrelation of orders 1 … h (Lütkepohl 2005, §4.4.4; for a VECM
// given β̂, §8.4; Johansen 1995, §6.3) and its F form, Rao's approximation
// proposed for systems by Edgerton and Shukur (1999).
//
// The auxiliary regression of the residuals û_t (T×K) on the original
// regressors x_t (n of them) and h lags of the residuals,
//
//	û_t = B x_t + D_1 û_{t−1} + … + D_h û_{t−h} + ε_t,  t = 1 … T,
//
// sets the presample residuals û_0, …, û_{1−h} to zero, so that all T
// observations are kept. With Σ̃_e = T⁻¹ Σ ε̂_t ε̂_t' its residual
// covariance and Σ̃_R the same for the regression on x_t alone (Σ̂_u when
// û_t are least-squares residuals on x_t),
//
//	LM_h = T (K − tr(Σ̃_R⁻¹ Σ̃_e)),  asymptotically χ²(hK²),
//
// and with m = Kh, R²_r = 1 − |Σ̃_e|/|Σ̃_R|,
// s = ((K²m² − 4)/(K² + m² − 5))^{1/2} (s = 1 when K² + m² − 5 ≤ 0 or
// K²m² − 4 ≤ 0), q = Km/2 − 1, N = T − n − m − (K − m + 1)/2,
//
//	LMF_h = [(1 − R²_r)^{−1/s} − 1] (Ns − q)/(Km),  approximately F(hK², Ns − q).
//
// For K = 1 (and a constant among the regressors) LM_h is T·R² of the
// single-equation Breusch–Godfrey regression and LMF_h its F statistic
// with (h, T − n − h) degrees of freedom. x may be nil (no regressors);
// its columns must not be collinear.
func SerialLM(u, x *mat.Dense, h int) (*Serial, error) {
	t, k, err := checkResid(u)
	if err != nil {
		return nil, err
	}
	if h < 1 {
		return nil, fmt.Errorf("sysdiag: the autocorrelation order must be 1 or more, not %d", h)
	}
	n := 0
	if x != nil {
		var tx int
		tx, n = x.Dims()
		if tx != t {
			return nil, fmt.Errorf("sysdiag: %d rows of residuals but %d of regressors", t, tx)
		}
	}
	m := k * h
	nf := float64(t-n-m) - 0.5*float64(k-m+1)
	if t-n-m <= k || nf <= 0 {
		return nil, fmt.Errorf("sysdiag: %w: the autocorrelation test of order %d needs more than %d observations (%d regressors, %d lagged residuals and %d equations), have %d",
			ErrTooFewObs, h, n+m+k, n, m, k, t)
	}
	z := mat.NewDense(t, n+m, nil)
	if n > 0 {
		z.Slice(0, t, 0, n).(*mat.Dense).Copy(x)
	}
	for l := 1; l <= h; l++ {
		for i := l; i < t; i++ {
			for j := 0; j < k; j++ {
				z.Set(i, n+(l-1)*k+j, u.At(i-l, j))
			}
		}
	}
	er, err := residualsOn(u, x)
	if err != nil {
		return nil, fmt.Errorf("sysdiag: autocorrelation test, regression on the original regressors: %w", err)
	}
	ee, err := residualsOn(u, z)
	if err != nil {
		var ce *ols.CollinearError
		if errors.As(err, &ce) && ce.Col >= n {
			return nil, fmt.Errorf("sysdiag: autocorrelation test of order %d: the lagged residuals are collinear with the regressors (lag %d of equation %d)", h, (ce.Col-n)/k+1, (ce.Col-n)%k+1)
		}
		return nil, fmt.Errorf("sysdiag: autocorrelation test, auxiliary regression: %w", err)
	}
	sr, se := moment(er), moment(ee)
	var ch mat.Cholesky
	if !ch.Factorize(sr) {
		return nil, errors.New("sysdiag: autocorrelation test: the residual covariance is singular")
	}
	var a mat.Dense
	if err := ch.SolveTo(&a, se); err != nil {
		return nil, fmt.Errorf("sysdiag: autocorrelation test: %w", err)
	}
	lm := float64(t) * (float64(k) - mat.Trace(&a))
	var che mat.Cholesky
	if !che.Factorize(se) {
		return nil, errors.New("sysdiag: autocorrelation test: the auxiliary residual covariance is singular")
	}
	logLambda := che.LogDet() - ch.LogDet() // ln(1 − R²_r)
	s := 1.0
	kk, mm := float64(k*k), float64(m*m)
	if num, den := kk*mm-4, kk+mm-5; num > 0 && den > 0 {
		s = math.Sqrt(num / den)
	}
	q := 0.5*float64(k*m) - 1
	df2 := nf*s - q
	if !(df2 > 0) {
		return nil, fmt.Errorf("sysdiag: %w for the Edgerton–Shukur F form of order %d (denominator degrees of freedom %.3g)", ErrTooFewObs, h, df2)
	}
	lmf := math.Expm1(-logLambda/s) * df2 / float64(k*m)
	return &Serial{Order: h, LM: chi2(lm, k*m), F: fTest(lmf, k*m, df2), RSquared: -math.Expm1(logLambda)}, nil
}

// Normality is the system Jarque–Bera test: the skewness part, the
// kurtosis part (χ²(K) each) and their sum (χ²(2K)).
type Normality struct {
	Skew, Kurt, Joint Test
}

// JarqueBera is Lütkepohl's (2005, §4.5) multivariate Jarque–Bera test of
// normality on Cholesky-standardised residuals. With ū the mean residual,
// Σ̃_u = T⁻¹ Σ (û_t − ū)(û_t − ū)' = P P' (P lower triangular, the
// Cholesky factor) and w_t = P⁻¹(û_t − ū), let b_1 and b_2 be the K-vectors
// of the third and fourth moments T⁻¹ Σ w_kt³ and T⁻¹ Σ w_kt⁴. Then
//
//	λ_s = T b_1'b_1/6 ~ χ²(K),  λ_k = T (b_2 − 3)'(b_2 − 3)/24 ~ χ²(K),
//	λ_sk = λ_s + λ_k ~ χ²(2K)
//
// asymptotically under normal errors. The statistics depend on the order of
// the equations through P (Lütkepohl 2005, §4.5).
func JarqueBera(u *mat.Dense) (*Normality, error) {
	t, k, err := checkResid(u)
	if err != nil {
		return nil, err
	}
	if t <= k {
		return nil, fmt.Errorf("sysdiag: %w: the Jarque–Bera test of %d equations needs more than %d observations, have %d", ErrTooFewObs, k, k, t)
	}
	c := centred(u)
	var ch mat.Cholesky
	if !ch.Factorize(moment(c)) {
		return nil, errors.New("sysdiag: Jarque–Bera test: the residual covariance is singular")
	}
	var l mat.TriDense
	ch.LTo(&l)
	// w_t' = (P⁻¹ c_t)' for every row: solve W P' = C, i.e. P W' = C'.
	var wt mat.Dense
	if err := wt.Solve(&l, c.T()); err != nil {
		return nil, fmt.Errorf("sysdiag: Jarque–Bera test: %w", err)
	}
	var ls, lk float64
	for j := 0; j < k; j++ {
		var m3, m4 float64
		for i := 0; i < t; i++ {
			w := wt.At(j, i)
			w2 := w * w
			m3 += w2 * w
			m4 += w2 * w2
		}
		m3 /= float64(t)
		m4 /= float64(t)
		ls += m3 * m3
		lk += (m4 - 3) * (m4 - 3)
	}
	ls *= float64(t) / 6
	lk *= float64(t) / 24
	return &Normality{Skew: chi2(ls, k), Kurt: chi2(lk, k), Joint: chi2(ls+lk, 2*k)}, nil
}

// centred returns u minus its column means.
func centred(u *mat.Dense) *mat.Dense {
	t, k := u.Dims()
	c := mat.NewDense(t, k, nil)
	for j := 0; j < k; j++ {
		var m float64
		for i := 0; i < t; i++ {
			m += u.At(i, j)
		}
		m /= float64(t)
		for i := 0; i < t; i++ {
			c.Set(i, j, u.At(i, j)-m)
		}
	}
	return c
}

// Omnibus is the Doornik–Hansen test: the transformed skewness z1 and
// kurtosis z2 of each of the K orthogonalised components, and the
// statistic Σ z1² + z2².
type Omnibus struct {
	Z1, Z2 []float64
	Test   Test // χ²(2K)
}

// DoornikHansen is the Doornik–Hansen (2008) omnibus test of multivariate
// normality. The centred residuals X̃ (T×K) are standardised and
// orthogonalised with the correlation matrix rather than a Cholesky factor,
// so that the outcome does not depend on the order of the equations:
// S = T⁻¹X̃'X̃, V = diag(S)^{−1/2}, C = VSV = HΛH', and y_t = HΛ^{−1/2}H'V x̃_t.
// For each component of y_t, with √b1 its sample skewness m3/m2^{3/2} and
// b2 its kurtosis m4/m2² (moments with divisor n = T), b1 = (√b1)²:
//
// z1 by D'Agostino's (1970) transformation of √b1:
//
//	β = 3(n² + 27n − 70)(n + 1)(n + 3) / ((n − 2)(n + 5)(n + 7)(n + 9)),
//	ω² = −1 + (2(β − 1))^{1/2},  δ = (ln ω)^{−1/2},
//	y = √b1 ((ω² − 1)(n + 1)(n + 3) / (12(n − 2)))^{1/2},
//	z1 = δ ln(y + (y² + 1)^{1/2});
//
// z2 by Wilson and Hilferty's cube root of a gamma approximation to b2:
//
//	δ = (n − 3)(n + 1)(n² + 15n − 4),
//	a = (n − 2)(n + 5)(n + 7)(n² + 27n − 70) / (6δ),
//	c = (n − 7)(n + 5)(n + 7)(n² + 2n − 5) / (6δ),
//	k = (n + 5)(n + 7)(n³ + 37n² + 11n − 313) / (12δ),
//	α = a + b1 c,  χ = 2k(b2 − 1 − b1),
//	z2 = ((χ/(2α))^{1/3} − 1 + 1/(9α)) (9α)^{1/2}.
//
// The statistic E = Σ_k (z1_k² + z2_k²) is approximately χ²(2K) under
// normality (Doornik and Hansen 2008). Needs T ≥ 8.
func DoornikHansen(u *mat.Dense) (*Omnibus, error) {
	t, k, err := checkResid(u)
	if err != nil {
		return nil, err
	}
	if t < 8 || t <= k {
		return nil, fmt.Errorf("sysdiag: %w: the Doornik–Hansen test needs at least 8 observations and more than %d, have %d", ErrTooFewObs, k, t)
	}
	c := centred(u)
	s := moment(c)
	v := make([]float64, k)
	for j := range v {
		if !(s.At(j, j) > 0) {
			return nil, fmt.Errorf("sysdiag: Doornik–Hansen test: the residuals of equation %d are constant", j+1)
		}
		v[j] = 1 / math.Sqrt(s.At(j, j))
	}
	corr := mat.NewSymDense(k, nil)
	for i := 0; i < k; i++ {
		for j := i; j < k; j++ {
			corr.SetSym(i, j, v[i]*s.At(i, j)*v[j])
		}
	}
	var es mat.EigenSym
	if !es.Factorize(corr, true) {
		return nil, errors.New("sysdiag: Doornik–Hansen test: the eigen-decomposition of the residual correlation failed")
	}
	lam := es.Values(nil)
	for _, l := range lam {
		if !(l > 1e-12) {
			return nil, errors.New("sysdiag: Doornik–Hansen test: the residual correlation matrix is singular")
		}
	}
	var hm mat.Dense
	es.VectorsTo(&hm)
	// A = H Λ^{−1/2} H' V; y_t' = x̃_t' A'.
	hs := mat.DenseCopyOf(&hm)
	for j, l := range lam {
		for i := 0; i < k; i++ {
			hs.Set(i, j, hs.At(i, j)/math.Sqrt(l))
		}
	}
	var a mat.Dense
	a.Mul(hs, hm.T())
	for i := 0; i < k; i++ {
		for j := 0; j < k; j++ {
			a.Set(i, j, a.At(i, j)*v[j])
		}
	}
	var y mat.Dense
	y.Mul(c, a.T())
	n := float64(t)
	out := &Omnibus{Z1: make([]float64, k), Z2: make([]float64, k)}
	var e float64
	col := make([]float64, t)
	for j := 0; j < k; j++ {
		mat.Col(col, j, &y)
		var mean float64
		for _, x := range col {
			mean += x
		}
		mean /= n
		var m2, m3, m4 float64
		for _, x := range col {
			d := x - mean
			d2 := d * d
			m2 += d2
			m3 += d2 * d
			m4 += d2 * d2
		}
		m2, m3, m4 = m2/n, m3/n, m4/n
		rb1 := m3 / math.Pow(m2, 1.5)
		b2 := m4 / (m2 * m2)
		out.Z1[j] = skewZ(rb1, n)
		out.Z2[j] = kurtZ(rb1*rb1, b2, n)
		e += out.Z1[j]*out.Z1[j] + out.Z2[j]*out.Z2[j]
	}
	out.Test = chi2(e, 2*k)
	return out, nil
}

// skewZ is D'Agostino's (1970) normalising transformation of the sample
// skewness √b1 of n observations (see DoornikHansen).
func skewZ(rb1, n float64) float64 {
	beta := 3 * (n*n + 27*n - 70) * (n + 1) * (n + 3) / ((n - 2) * (n + 5) * (n + 7) * (n + 9))
	w2 := -1 + math.Sqrt(2*(beta-1))
	delta := 1 / math.Sqrt(0.5*math.Log(w2))
	y := rb1 * math.Sqrt((w2-1)*(n+1)*(n+3)/(12*(n-2)))
	return delta * math.Asinh(y)
}

// kurtZ is Doornik and Hansen's (2008) Wilson–Hilferty transformation of
// the sample kurtosis b2 given b1 = skewness² (see DoornikHansen).
func kurtZ(b1, b2, n float64) float64 {
	d := (n - 3) * (n + 1) * (n*n + 15*n - 4)
	a := (n - 2) * (n + 5) * (n + 7) * (n*n + 27*n - 70) / (6 * d)
	c := (n - 7) * (n + 5) * (n + 7) * (n*n + 2*n - 5) / (6 * d)
	kk := (n + 5) * (n + 7) * (n*n*n + 37*n*n + 11*n - 313) / (12 * d)
	alpha := a + b1*c
	chi := 2 * kk * (b2 - 1 - b1)
	return (math.Cbrt(chi/(2*alpha)) - 1 + 1/(9*alpha)) * math.Sqrt(9*alpha)
}

// ARCH is the multivariate ARCH-LM test of order q (Lütkepohl 2005,
// ch. 16). With v_t = vech(û_t û_t'), the K(K+1)/2 distinct squares and
// cross-products of the residuals, the auxiliary regression
//
//	v_t = b_0 + B_1 v_{t−1} + … + B_q v_{t−q} + e_t,  t = q+1 … T,
//
// is fitted on the T_q = T − q observations for which every lag exists.
// With Ω̂ = T_q⁻¹ Σ ê_t ê_t' and Ω̂_0 the same for the regression on the
// constant alone (the covariance of v_t),
//
//	R²_m = 1 − 2/(K(K+1)) tr(Ω̂ Ω̂_0⁻¹),
//	MARCH_LM(q) = ½ T_q K(K+1) R²_m,  asymptotically χ²(qK²(K+1)²/4)
//
// under no ARCH. For K = 1 it is Engle's (T − q)R² of the regression of
// û_t² on a constant and its q lags (as analysis/diag.ARCH).
func ARCH(u *mat.Dense, q int) (Test, error) {
	t, k, err := checkResid(u)
	if err != nil {
		return Test{}, err
	}
	if q < 1 {
		return Test{}, fmt.Errorf("sysdiag: the ARCH order must be 1 or more, not %d", q)
	}
	p := k * (k + 1) / 2
	tq := t - q
	if tq <= 1+q*p+p {
		return Test{}, fmt.Errorf("sysdiag: %w: the ARCH test of order %d for %d equations needs more than %d observations, have %d", ErrTooFewObs, q, k, 1+q*p+p+q, t)
	}
	v := mat.NewDense(t, p, nil)
	for i := 0; i < t; i++ {
		c := 0
		for b := 0; b < k; b++ {
			for a := b; a < k; a++ {
				v.Set(i, c, u.At(i, a)*u.At(i, b))
				c++
			}
		}
	}
	y := mat.DenseCopyOf(v.Slice(q, t, 0, p))
	x := mat.NewDense(tq, 1+q*p, nil)
	for i := 0; i < tq; i++ {
		x.Set(i, 0, 1)
		for l := 1; l <= q; l++ {
			for j := 0; j < p; j++ {
				x.Set(i, 1+(l-1)*p+j, v.At(q+i-l, j))
			}
		}
	}
	e, err := residualsOn(y, x)
	if err != nil {
		return Test{}, fmt.Errorf("sysdiag: ARCH test of order %d, auxiliary regression: %w", q, err)
	}
	omega := moment(e)
	omega0 := moment(centred(y))
	var ch mat.Cholesky
	if !ch.Factorize(omega0) {
		return Test{}, errors.New("sysdiag: ARCH test: the squares and cross-products of the residuals are collinear")
	}
	var a mat.Dense
	if err := ch.SolveTo(&a, omega); err != nil {
		return Test{}, fmt.Errorf("sysdiag: ARCH test: %w", err)
	}
	r2 := 1 - 2/float64(k*(k+1))*mat.Trace(&a)
	stat := 0.5 * float64(tq*k*(k+1)) * r2
	return chi2(stat, q*p*p), nil
}
