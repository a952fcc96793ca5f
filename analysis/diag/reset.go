package diag

import (
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/ols"
)

// RESET is Ramsey's (1969) regression specification error test in F
// form. The fit y = Xβ + e is augmented with the powers ŷ², …, ŷ^h of its
// fitted values (h = maxPower ≥ 2; h = 3 is common practice) and
//
//	F = ((SSR_r − SSR_u)/q) / (SSR_u/(N − K − q)),  q = h − 1,
//
// is compared with F(q, N − K − q). The powers are taken of the fitted
// values scaled by their largest absolute value; the F statistic is
// invariant to that scaling, which only keeps the augmented design well
// conditioned.
func RESET(f *ols.Fit, maxPower int) (Test, error) {
	if f == nil {
		return Test{}, ErrNoFit
	}
	if maxPower < 2 {
		return Test{}, fmt.Errorf("diag: RESET highest power must be at least 2, got %d", maxPower)
	}
	q := maxPower - 1
	n := f.N
	if n <= f.K+q {
		return Test{}, fmt.Errorf("diag: RESET with powers up to %d needs more than %d observations, have %d", maxPower, f.K+q, n)
	}
	var scale float64
	for _, v := range f.Fitted {
		scale = math.Max(scale, math.Abs(v))
	}
	if scale == 0 {
		return Test{}, fmt.Errorf("diag: RESET: the fitted values are all zero")
	}
	y := make([]float64, n)
	cols := make([][]float64, q)
	for j := range cols {
		cols[j] = make([]float64, n)
	}
	for t := 0; t < n; t++ {
		y[t] = f.Fitted[t] + f.Resid[t]
		z := f.Fitted[t] / scale
		for j := range cols {
			cols[j][t] = math.Pow(z, float64(j+2))
		}
	}
	aux, err := ols.Regress(y, design(f.X(), false, n, cols...))
	if err != nil {
		return Test{}, fmt.Errorf("diag: RESET augmented regression: %w", err)
	}
	df2 := n - f.K - q
	stat := (f.SSR - aux.SSR) / float64(q) / (aux.SSR / float64(df2))
	return Test{Name: fmt.Sprintf("RESET F (powers 2..%d)", maxPower), Stat: stat, DF: q, DF2: df2, PValue: fSF(stat, q, df2)}, nil
}
