// Package longrun estimates cointegrating (long-run) relations
//
//	y_t = d_t'δ + x_t'β + u_t,
//
// with x_t integrated of order one, by dynamic OLS (Stock and Watson
// 1993), fully modified OLS (Phillips and Hansen 1990) and the canonical
// cointegrating regression (Park 1992), and tests
// linear restrictions on β with Wald statistics.
//
// The deterministic part d_t is chosen by a critical.Case: none, a
// constant, a constant and linear trend, or a constant, linear and
// quadratic trend. The trend is t = 1, 2, … counted from the first
// observation of the input.
package longrun

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
)

// Coefs are estimated long-run coefficients β with their covariance.
type Coefs struct {
	Names []string
	Coef  []float64
	Cov   *mat.SymDense
}

// SE returns the standard errors of the long-run coefficients.
func (c Coefs) SE() []float64 {
	out := make([]float64, len(c.Coef))
	for i := range out {
		out[i] = math.Sqrt(c.Cov.At(i, i))
	}
	return out
}

// Names of the deterministic terms.
const (
	ConstName   = "const"
	TrendName   = "trend"
	TrendSqName = "trend^2"
)

// detNames returns the names of the deterministic terms of case c.
func detNames(c critical.Case) []string {
	return []string{ConstName, TrendName, TrendSqName}[:c.Deterministics()]
}

// detValue is deterministic term j at zero-based observation t.
func detValue(j, t int) float64 {
	s := float64(t + 1)
	switch j {
	case 0:
		return 1
	case 1:
		return s
	}
	return s * s
}

// checkInput validates y, x and the names, returning the regressor names.
func checkInput(y []float64, x [][]float64, names []string, det critical.Case) ([]string, error) {
	if det < critical.NoConst || det > critical.ConstTrendSq {
		return nil, fmt.Errorf("unknown deterministic case %v", det)
	}
	if len(x) == 0 {
		return nil, errors.New("no regressors")
	}
	if names != nil && len(names) != len(x) {
		return nil, fmt.Errorf("%d names for %d regressors", len(names), len(x))
	}
	n := len(y)
	for i, v := range y {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("y[%d] is not finite", i)
		}
	}
	out := make([]string, len(x))
	for k, c := range x {
		if len(c) != n {
			return nil, fmt.Errorf("regressor %d has %d observations, y has %d", k, len(c), n)
		}
		for i, v := range c {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return nil, fmt.Errorf("regressor %d, observation %d is not finite", k, i)
			}
		}
		if names != nil {
			out[k] = names[k]
		} else {
			out[k] = fmt.Sprintf("x%d", k+1)
		}
	}
	return out, nil
}

// subCov returns the block of c for indices off..off+k−1.
func subCov(c mat.Symmetric, off, k int) *mat.SymDense {
	out := mat.NewSymDense(k, nil)
	for i := 0; i < k; i++ {
		for j := i; j < k; j++ {
			out.SetSym(i, j, c.At(off+i, off+j))
		}
	}
	return out
}
