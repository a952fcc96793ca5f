package unitroot

import (
	"errors"
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/critical"
	"gonum.org/v1/gonum/blas/blas64"
)

// checkSeries rejects series with non-finite values, too few values or
// no variation.
func checkSeries(y []float64, min int) error {
	if len(y) < min {
		return fmt.Errorf("unitroot: %d observations, need at least %d", len(y), min)
	}
	for i, v := range y {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("unitroot: observation %d is not finite (%v)", i+1, v)
		}
	}
	for _, v := range y[1:] {
		if v != y[0] {
			return nil
		}
	}
	return errors.New("unitroot: the series is constant")
}

// detFunc writes the deterministic regressors of the observation with
// zero-based index t in y, at position i = 0..n−1 of a regression sample
// of n observations, into row.
type detFunc func(t, i, n int, row []float64)

// caseDet returns the deterministics of a Dickey–Fuller case: constant,
// s, s² with s = i+1 over the regression sample.
func caseDet(c critical.Case) (detFunc, int) {
	d := c.Deterministics()
	return func(t, i, n int, row []float64) {
		s := float64(i + 1)
		for j := 0; j < d; j++ {
			switch j {
			case 0:
				row[j] = 1
			case 1:
				row[j] = s
			default:
				row[j] = s * s
			}
		}
	}, d
}

// dfDesign builds the Dickey–Fuller regression with p lagged differences
// on observations t = start..T−1 (zero-based, start ≥ p+1):
// columns [deterministics (d) | y_{t−1} | Δy_{t−1} … Δy_{t−p}], response
// Δy_t, written into a row-major n×(d+1+p+extra) buffer whose remaining
// columns are left zero.
func dfDesign(y []float64, det detFunc, d, p, start, extra int) blas64.General {
	n := len(y) - start
	k := d + 1 + p + extra
	a := blas64.General{Rows: n, Cols: k, Stride: k, Data: make([]float64, n*k)}
	for i := 0; i < n; i++ {
		t := start + i
		row := a.Data[i*k : (i+1)*k]
		det(t, i, n, row)
		row[d] = y[t-1]
		for l := 1; l <= p; l++ {
			row[d+l] = y[t-l] - y[t-l-1]
		}
	}
	return a
}
