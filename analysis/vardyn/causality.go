package vardyn

import (
	"errors"
	"fmt"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"

	"github.com/galley-econ/galley/analysis/johansen"
)

// Wald is a Wald test of q zero restrictions with its χ² and F forms.
type Wald struct {
	Stat float64 // W = b_R' V_R⁻¹ b_R
	DF   int     // q
	P    float64 // χ²(q) upper tail of W
	F    float64 // W/q
	DF2  int     // denominator degrees of freedom of the F form
	PF   float64 // F(q, DF2) upper tail of W/q
}

// wald computes W = b' V⁻¹ b for the restricted coefficients b with
// covariance V, and both p-values.
func wald(b []float64, v *mat.SymDense, df2 int) (Wald, error) {
	q := len(b)
	if q == 0 {
		return Wald{}, errors.New("vardyn: no restriction to test")
	}
	var ch mat.Cholesky
	if !ch.Factorize(v) {
		return Wald{}, errors.New("vardyn: the covariance of the restricted coefficients is singular")
	}
	bv := mat.NewVecDense(q, b)
	var x mat.VecDense
	if err := ch.SolveVecTo(&x, bv); err != nil {
		return Wald{}, err
	}
	w := mat.Dot(bv, &x)
	out := Wald{Stat: w, DF: q, F: w / float64(q), DF2: df2}
	out.P = distuv.ChiSquared{K: float64(q)}.Survival(w)
	out.PF = distuv.F{D1: float64(q), D2: float64(df2)}.Survival(out.F)
	return out, nil
}

func checkPair(caused, causing []int, k int) error {
	if len(caused) == 0 || len(causing) == 0 {
		return errors.New("vardyn: name at least one caused and one causing series")
	}
	in := map[int]bool{}
	for _, i := range caused {
		if i < 0 || i >= k {
			return fmt.Errorf("vardyn: series %d is outside 0..%d", i, k-1)
		}
		in[i] = true
	}
	for _, j := range causing {
		if j < 0 || j >= k {
			return fmt.Errorf("vardyn: series %d is outside 0..%d", j, k-1)
		}
		if in[j] {
			return fmt.Errorf("vardyn: series %d is both caused and causing", j)
		}
	}
	return nil
}

// Granger tests that the series causing do not Granger-cause the series
// caused in the VAR (Granger 1969; Lütkepohl 2005, §3.6.1): H0: A_l[i, j] = 0
// for every lag l ≤ lags, i in caused, j in causing. With b the restricted
// coefficients and Cov(vec) = Σ̂ ⊗ (X'X)⁻¹ (Σ̂ with T − Kp − d degrees of
// freedom),
//
//	W = b' [Σ̂ ⊗ (X'X)⁻¹]_R⁻¹ b ~ χ²(q),  q = lags·|caused|·|causing|,
//
// and the F form W/q is referred to F(q, K(T − Kp − d)), as Lütkepohl's
// (2005, §3.6.1) small-sample approximation. lags ≤ P; Granger uses
// lags = P, TodaYamamoto fewer.
func (v *VAR) Granger(caused, causing []int, lags int) (Wald, error) {
	if err := checkPair(caused, causing, v.K); err != nil {
		return Wald{}, err
	}
	if lags < 1 || lags > v.P {
		return Wald{}, fmt.Errorf("vardyn: cannot restrict %d lags of a VAR(%d)", lags, v.P)
	}
	nd := v.Det.count()
	type coef struct{ eq, col int }
	var idx []coef
	var b []float64
	for _, i := range caused {
		for l := 0; l < lags; l++ {
			for _, j := range causing {
				idx = append(idx, coef{i, nd + l*v.K + j})
				b = append(b, v.A[l].At(i, j))
			}
		}
	}
	cov := mat.NewSymDense(len(idx), nil)
	for a, ca := range idx {
		for c := a; c < len(idx); c++ {
			cb := idx[c]
			cov.SetSym(a, c, v.Sigma.At(ca.eq, cb.eq)*v.XtXInv.At(ca.col, cb.col))
		}
	}
	return wald(b, cov, v.K*v.DFResid())
}

// TodaYamamoto is the lag-augmented Wald test of Toda and Yamamoto (1995):
// fit the VAR in levels with p + dmax lags (dmax the highest order of
// integration suspected) and test the Granger restrictions on the first p
// lags only; the extra dmax lags make W asymptotically χ²(p·|caused|·|causing|)
// whatever the integration and cointegration of the series.
func TodaYamamoto(y *mat.Dense, p, dmax int, det Det, caused, causing []int) (Wald, *VAR, error) {
	if dmax < 0 {
		return Wald{}, nil, fmt.Errorf("vardyn: dmax %d is negative", dmax)
	}
	v, err := Fit(y, p+dmax, det)
	if err != nil {
		return Wald{}, nil, err
	}
	w, err := v.Granger(caused, causing, p)
	return w, v, err
}

// CausalityKind names a Granger-causality test in a VECM.
type CausalityKind int

const (
	// ShortRun: the lagged differences of the causing series are zero in
	// the caused equation, Γ_l[i, j] = 0 for l = 1..k.
	ShortRun CausalityKind = iota
	// LongRun: the caused series does not adjust to the relations, α_i = 0
	// (its row of loadings), so the levels of the system do not feed it.
	LongRun
	// Strong: both at once.
	Strong
)

// VECMCausality tests Granger non-causality from the series causing to
// the series caused (one equation) in a VECM of rank r ≥ 1 given its
// estimated β, by a Wald test on the least-squares coefficients of that
// equation with the classical covariance s²(X'X)⁻¹ (johansen.VECM.EquationCov;
// β is superconsistent, so treating it as known leaves the limit
// distribution unchanged): short run Γ_l[i, j] = 0 (q = k·|causing|), long
// run α_i = 0 (q = r), strong both (e.g. Lütkepohl 2005, §7.6.3; Asafu-Adjaye
// 2000). W ~ χ²(q); the F form W/q is referred to F(q, T − m), m the
// equation's coefficients. With k = 0 the short-run test has nothing to
// restrict and is an error.
func VECMCausality(m *johansen.VECM, caused int, causing []int, kind CausalityKind) (Wald, error) {
	k, _ := m.Alpha.Dims()
	if err := checkPair([]int{caused}, causing, k); err != nil {
		return Wald{}, err
	}
	cov, df, err := m.EquationCov(caused)
	if err != nil {
		return Wald{}, err
	}
	var idx []int
	var b []float64
	if kind == LongRun || kind == Strong {
		for j := 0; j < m.Rank; j++ {
			idx = append(idx, j)
			b = append(b, m.Alpha.At(caused, j))
		}
	}
	if kind == ShortRun || kind == Strong {
		n := 0
		for c, tm := range m.Terms {
			if tm.Kind != johansen.LagDiff {
				continue
			}
			for _, j := range causing {
				if tm.Series == j {
					idx = append(idx, m.Rank+c)
					b = append(b, m.Short.At(caused, c))
					n++
				}
			}
		}
		if n == 0 {
			return Wald{}, errors.New("vardyn: the VECM has no lagged differences, so there is no short-run causality to test")
		}
	}
	v := mat.NewSymDense(len(idx), nil)
	for a, i := range idx {
		for c := a; c < len(idx); c++ {
			v.SetSym(a, c, cov.At(i, idx[c]))
		}
	}
	return wald(b, v, df)
}
