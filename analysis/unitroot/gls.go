package unitroot

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
	"gonum.org/v1/gonum/mat"
)

// glsDetrended is a series detrended by local-to-unity GLS.
type glsDetrended struct {
	cbar float64   // c̄
	beta []float64 // β̃, the GLS coefficients of z_t
	y    []float64 // ỹ_t = y_t − z_t'β̃
}

// glsDetrend removes the deterministic terms of y by the local-to-unity
// GLS of Elliott, Rothenberg and Stock (1996): with T = len(y),
// ᾱ = 1 + c̄/T, c̄ = −7 (c = Const, z_t = 1) or −13.5 (c = ConstTrend,
// z_t = (1, t), t = 1..T), β̃ is the least-squares coefficient of
//
//	(y_1, y_2 − ᾱy_1, …, y_T − ᾱy_{T−1}) on (z_1, z_2 − ᾱz_1, …),
//
// and ỹ_t = y_t − z_t'β̃. It is shared by DFGLS and NgPerron.
func glsDetrend(y []float64, c critical.Case, test string) (*glsDetrended, error) {
	var cbar float64
	switch c {
	case critical.Const:
		cbar = -7
	case critical.ConstTrend:
		cbar = -13.5
	default:
		return nil, fmt.Errorf("unitroot: %s supports the constant (c) and trend (ct) cases, not %v", test, c)
	}
	if err := checkSeries(y, 4); err != nil {
		return nil, err
	}
	n := len(y)
	d := c.Deterministics()
	a := 1 + cbar/float64(n)
	ya := make([]float64, n)
	za := mat.NewDense(n, d, nil)
	z := func(t, j int) float64 { // z_t, t zero-based
		if j == 0 {
			return 1
		}
		return float64(t + 1)
	}
	ya[0] = y[0]
	for j := 0; j < d; j++ {
		za.Set(0, j, z(0, j))
	}
	for t := 1; t < n; t++ {
		ya[t] = y[t] - a*y[t-1]
		for j := 0; j < d; j++ {
			za.Set(t, j, z(t, j)-a*z(t-1, j))
		}
	}
	gls, err := ols.Regress(ya, za)
	if err != nil {
		return nil, fmt.Errorf("unitroot: %s detrending: %w", test, err)
	}
	yd := make([]float64, n)
	for t := range y {
		yd[t] = y[t]
		for j := 0; j < d; j++ {
			yd[t] -= z(t, j) * gls.Coef[j]
		}
	}
	return &glsDetrended{cbar: cbar, beta: gls.Coef, y: yd}, nil
}
