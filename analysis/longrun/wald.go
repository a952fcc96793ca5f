package longrun

import (
	"fmt"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"
)

// WaldTest is a Wald test of q linear restrictions.
type WaldTest struct {
	Stat   float64
	DF     int // q
	PValue float64
}

// Wald tests H₀: Rβ = r on long-run coefficients with
//
//	W = (Rβ̂ − r)' (R V R')⁻¹ (Rβ̂ − r),
//
// V the covariance of β̂, asymptotically χ²(q) under H₀ for q rows of R
// (valid for DOLS with a HAC covariance and for FMOLS and CCR, whose
// long-run coefficients have mixed-normal limits). R is q×k with k = len(c.Coef);
// r may be nil for zeros.
func Wald(c Coefs, R *mat.Dense, r []float64) (WaldTest, error) {
	k := len(c.Coef)
	if R == nil {
		return WaldTest{}, fmt.Errorf("wald: no restriction matrix")
	}
	q, kr := R.Dims()
	if kr != k {
		return WaldTest{}, fmt.Errorf("wald: restriction matrix has %d columns for %d coefficients", kr, k)
	}
	if r == nil {
		r = make([]float64, q)
	}
	if len(r) != q {
		return WaldTest{}, fmt.Errorf("wald: %d right-hand values for %d restrictions", len(r), q)
	}
	if q > k {
		return WaldTest{}, fmt.Errorf("wald: %d restrictions on %d coefficients", q, k)
	}
	d := mat.NewVecDense(q, nil)
	d.MulVec(R, mat.NewVecDense(k, append([]float64(nil), c.Coef...)))
	d.SubVec(d, mat.NewVecDense(q, append([]float64(nil), r...)))
	var rv, rvr mat.Dense
	rv.Mul(R, c.Cov)
	rvr.Mul(&rv, R.T())
	sym := mat.NewSymDense(q, nil)
	for i := 0; i < q; i++ {
		for j := i; j < q; j++ {
			sym.SetSym(i, j, (rvr.At(i, j)+rvr.At(j, i))/2)
		}
	}
	var ch mat.Cholesky
	if !ch.Factorize(sym) {
		return WaldTest{}, fmt.Errorf("wald: R V R' is not positive definite (restrictions linearly dependent?)")
	}
	var sol mat.VecDense
	if err := ch.SolveVecTo(&sol, d); err != nil {
		return WaldTest{}, fmt.Errorf("wald: %w", err)
	}
	w := mat.Dot(d, &sol)
	return WaldTest{Stat: w, DF: q, PValue: distuv.ChiSquared{K: float64(q)}.Survival(w)}, nil
}
