package unitroot

import (
	"errors"
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/critical"
	"gonum.org/v1/gonum/mat"
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

// detColumn returns deterministic regressor k (0 constant, 1 trend,
// 2 squared trend) at position s = 1..n of the regression sample.
func detColumn(k int, s float64) float64 {
	switch k {
	case 0:
		return 1
	case 1:
		return s
	}
	return s * s
}

// dfDesign builds the Dickey–Fuller regression with p lagged differences
// on observations t = start..T−1 (zero-based, start ≥ p+1):
// columns [deterministics | y_{t−1} | Δy_{t−1} … Δy_{t−p}], response Δy_t.
// The trend is s = 1..n over the regression sample.
func dfDesign(y []float64, c critical.Case, p, start int) (*mat.Dense, []float64) {
	d := c.Deterministics()
	n := len(y) - start
	k := d + 1 + p
	x := mat.NewDense(n, k, nil)
	dy := make([]float64, n)
	raw := x.RawMatrix()
	for i := 0; i < n; i++ {
		t := start + i
		row := raw.Data[i*raw.Stride : i*raw.Stride+k]
		for j := 0; j < d; j++ {
			row[j] = detColumn(j, float64(i+1))
		}
		row[d] = y[t-1]
		for l := 1; l <= p; l++ {
			row[d+l] = y[t-l] - y[t-l-1]
		}
		dy[i] = y[t] - y[t-1]
	}
	return x, dy
}
