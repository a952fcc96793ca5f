package ols

import (
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// Coef is one row of a coefficient table.
type Coef struct {
	Est, SE, T, P float64
}

// Table returns estimate, standard error, t-ratio and two-sided p-value
// for every coefficient. With normal true the p-values come from the
// standard normal (for statistics whose theory is asymptotic); otherwise
// from Student's t with N−K degrees of freedom.
func (f *Fit) Table(c CovSpec, normal bool) []Coef {
	se := SE(f.Cov(c))
	out := make([]Coef, f.K)
	for j := range out {
		t := f.Coef[j] / se[j]
		out[j] = Coef{Est: f.Coef[j], SE: se[j], T: t, P: TwoSidedP(t, f.DF(), normal)}
	}
	return out
}

// TwoSidedP is P(|T| > |t|) for Student's t with df degrees of freedom, or
// for the standard normal when normal is true.
func TwoSidedP(t float64, df int, normal bool) float64 {
	if math.IsNaN(t) {
		return math.NaN()
	}
	if normal {
		return 2 * distuv.UnitNormal.Survival(math.Abs(t))
	}
	d := distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(df)}
	return 2 * d.Survival(math.Abs(t))
}
