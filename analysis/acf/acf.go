// Package acf computes sample autocorrelations and partial
// autocorrelations of a series, with the usual large-sample band.
package acf

import (
	"errors"
	"fmt"
	"math"
)

// ErrShort is returned when a series is too short for the lags asked for.
var ErrShort = errors.New("acf: series too short")

// check validates x and nlags: x must be finite, not constant, and have
// more than nlags observations; nlags must be non-negative.
func check(x []float64, nlags int) error {
	if nlags < 0 {
		return fmt.Errorf("acf: number of lags %d is negative", nlags)
	}
	if len(x) < 2 || nlags >= len(x) {
		return fmt.Errorf("%w: %d observations for %d lags", ErrShort, len(x), nlags)
	}
	for i, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("acf: observation %d is not finite (drop missing values first)", i)
		}
	}
	return nil
}

// Autocov returns the biased sample autocovariances
//
//	c_j = (1/T) Σ_{t=j+1..T} (x_t − x̄)(x_{t−j} − x̄),  j = 0..nlags,
//
// the estimator with divisor T (not T−j), which keeps the implied
// autocovariance matrix positive semi-definite (Box and Jenkins; common
// practice).
func Autocov(x []float64, nlags int) ([]float64, error) {
	if err := check(x, nlags); err != nil {
		return nil, err
	}
	n := len(x)
	var mean float64
	for _, v := range x {
		mean += v
	}
	mean /= float64(n)
	d := make([]float64, n)
	for i, v := range x {
		d[i] = v - mean
	}
	c := make([]float64, nlags+1)
	for j := range c {
		var s float64
		for t := j; t < n; t++ {
			s += d[t] * d[t-j]
		}
		c[j] = s / float64(n)
	}
	if c[0] == 0 {
		return nil, errors.New("acf: series is constant")
	}
	return c, nil
}

// ACF returns the sample autocorrelations r_j = c_j / c_0, j = 0..nlags
// (r_0 = 1), from the biased autocovariances of Autocov.
func ACF(x []float64, nlags int) ([]float64, error) {
	c, err := Autocov(x, nlags)
	if err != nil {
		return nil, err
	}
	r := make([]float64, len(c))
	for j := range c {
		r[j] = c[j] / c[0]
	}
	return r, nil
}

// PACF returns the sample partial autocorrelations φ_jj, j = 0..nlags
// (φ_00 = 1), the last coefficient of the order-j Yule–Walker
// autoregression fitted to the autocorrelations r_j of ACF. They are
// computed by the Durbin–Levinson recursion (Durbin 1960):
//
//	φ_jj = (r_j − Σ_{i<j} φ_{j−1,i} r_{j−i}) / (1 − Σ_{i<j} φ_{j−1,i} r_i),
//	φ_ji = φ_{j−1,i} − φ_jj φ_{j−1,j−i}.
func PACF(x []float64, nlags int) ([]float64, error) {
	r, err := ACF(x, nlags)
	if err != nil {
		return nil, err
	}
	return durbinLevinson(r), nil
}

// durbinLevinson maps autocorrelations r_0..r_p to partial
// autocorrelations φ_00..φ_pp.
func durbinLevinson(r []float64) []float64 {
	p := len(r) - 1
	out := make([]float64, p+1)
	out[0] = 1
	phi := make([]float64, p+1) // φ_{j,1..j}
	prev := make([]float64, p+1)
	v := 1.0 // innovation variance ratio 1 − Σ φ_{j−1,i} r_i
	for j := 1; j <= p; j++ {
		num := r[j]
		for i := 1; i < j; i++ {
			num -= prev[i] * r[j-i]
		}
		if v <= 0 {
			out[j] = math.NaN()
			continue
		}
		a := num / v
		phi[j] = a
		for i := 1; i < j; i++ {
			phi[i] = prev[i] - a*prev[j-i]
		}
		v *= 1 - a*a
		out[j] = a
		copy(prev, phi)
	}
	return out
}

// Band is the half-width 1.96/√T of the approximate 95% band for a sample
// autocorrelation or partial autocorrelation of white noise of length T
// (Bartlett 1946 at lag 1; Quenouille 1949 for the partials; common
// practice to draw it at every lag).
func Band(t int) float64 {
	if t <= 0 {
		return math.NaN()
	}
	return 1.96 / math.Sqrt(float64(t))
}

// Correlogram holds both functions for lags 0..len−1 with the band.
type Correlogram struct {
	N    int       // observations used
	ACF  []float64 // r_0..r_p
	PACF []float64 // φ_00..φ_pp
	Band float64   // 1.96/√N
}

// Compute returns the correlogram of x up to nlags.
func Compute(x []float64, nlags int) (*Correlogram, error) {
	r, err := ACF(x, nlags)
	if err != nil {
		return nil, err
	}
	return &Correlogram{N: len(x), ACF: r, PACF: durbinLevinson(r), Band: Band(len(x))}, nil
}
