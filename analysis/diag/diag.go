// Package diag computes residual diagnostics for a least-squares fit:
// tests for serial correlation (Breusch–Godfrey, Ljung–Box, Durbin–Watson),
// for normality (Jarque–Bera), for heteroskedasticity (ARCH-LM,
// Breusch–Pagan) and for functional form (RESET).
//
// Every test returns a Test value. Auxiliary regressions are fitted with
// package ols (Householder QR).
package diag

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"
)

// Test is the outcome of one diagnostic test.
//
// For a χ² statistic DF is its degrees of freedom and DF2 is zero; for an
// F statistic DF and DF2 are the numerator and denominator degrees of
// freedom. PValue is NaN when the statistic has no tabulated null
// distribution that does not depend on the regressors (Durbin–Watson).
type Test struct {
	Name   string
	Stat   float64
	DF     int
	DF2    int
	PValue float64
}

// ErrNoFit is returned when a nil fit is passed.
var ErrNoFit = errors.New("diag: nil regression fit")

// chi2Test builds a χ²(df) test.
func chi2Test(name string, stat float64, df int) Test {
	return Test{Name: name, Stat: stat, DF: df, PValue: chi2SF(stat, df)}
}

// chi2SF is P(χ²(df) > x).
func chi2SF(x float64, df int) float64 {
	if math.IsNaN(x) || df <= 0 {
		return math.NaN()
	}
	if x <= 0 {
		return 1
	}
	return distuv.ChiSquared{K: float64(df)}.Survival(x)
}

// fSF is P(F(d1, d2) > x).
func fSF(x float64, d1, d2 int) float64 {
	if math.IsNaN(x) || d1 <= 0 || d2 <= 0 {
		return math.NaN()
	}
	if x <= 0 {
		return 1
	}
	return distuv.F{D1: float64(d1), D2: float64(d2)}.Survival(x)
}

// hasConst reports whether some column of x is constant and non-zero.
func hasConst(x mat.Matrix) bool {
	n, k := x.Dims()
	for j := 0; j < k; j++ {
		v := x.At(0, j)
		if v == 0 {
			continue
		}
		c := true
		for i := 1; i < n; i++ {
			if x.At(i, j) != v {
				c = false
				break
			}
		}
		if c {
			return true
		}
	}
	return false
}

// design stacks the columns of base (may be nil), then a constant column
// when withConst is true, then the given extra columns.
func design(base mat.Matrix, withConst bool, n int, extra ...[]float64) *mat.Dense {
	kb := 0
	if base != nil {
		_, kb = base.Dims()
	}
	k := kb + len(extra)
	if withConst {
		k++
	}
	d := mat.NewDense(n, k, nil)
	for i := 0; i < n; i++ {
		j := 0
		for ; j < kb; j++ {
			d.Set(i, j, base.At(i, j))
		}
		if withConst {
			d.Set(i, j, 1)
			j++
		}
		for _, c := range extra {
			d.Set(i, j, c[i])
			j++
		}
	}
	return d
}

func checkFinite(what string, e []float64) error {
	for i, v := range e {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("diag: %s[%d] is not finite", what, i)
		}
	}
	return nil
}

// finiteMean is the mean ē = N⁻¹ Σ e_t of a series that must be finite
// (what names it in the error).
func finiteMean(what string, e []float64) (float64, error) {
	if err := checkFinite(what, e); err != nil {
		return 0, err
	}
	var mean float64
	for _, v := range e {
		mean += v
	}
	return mean / float64(len(e)), nil
}
