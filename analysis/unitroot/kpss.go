package unitroot

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
	"gonum.org/v1/gonum/mat"
)

// KPSSResult is the KPSS test of stationarity.
type KPSSResult struct {
	Stat   float64 // η
	PValue float64 // interpolated in KPSS (1992) Table 1
	// PClipped is true when the statistic lies outside the table, so that
	// PValue is the table end: the true p-value is above 0.10 (PValue =
	// 0.10) or below 0.01 (PValue = 0.01).
	PClipped   bool
	Bandwidth  int
	NObs       int
	Crit       []critical.Value // 10%, 5%, 2.5%, 1% (upper tail)
	CritSource string
	LRV        float64 // λ², the Bartlett long-run variance of the residuals
	Resid      []float64
}

// KPSS computes the statistic of Kwiatkowski, Phillips, Schmidt and Shin
// (1992) for the null of level stationarity (c = Const) or trend
// stationarity (c = ConstTrend):
//
//	η = T⁻² Σ_{t=1..T} S_t² / λ²,   S_t = Σ_{s≤t} e_s,
//
// e the residuals of y on a constant (and the trend t = 1..T), λ² their
// Newey–West Bartlett long-run variance with truncation lag from bw
// (Bandwidth.ResolveFor on e: the rule at n = T, or the automatic lag of
// e; AutoHobijn is the lag of statsmodels' kpss(nlags="auto")).
func KPSS(y []float64, c critical.Case, bw Bandwidth) (*KPSSResult, error) {
	if c != critical.Const && c != critical.ConstTrend {
		return nil, fmt.Errorf("unitroot: KPSS supports the level (c) and trend (ct) cases, not %v", c)
	}
	if err := checkSeries(y, 4); err != nil {
		return nil, err
	}
	n := len(y)
	if !bw.Auto() {
		// Check a fixed lag before any fitting.
		if _, err := bw.Resolve(n); err != nil {
			return nil, err
		}
	}
	d := c.Deterministics()
	x := mat.NewDense(n, d, nil)
	for t := 0; t < n; t++ {
		x.Set(t, 0, 1)
		if d > 1 {
			x.Set(t, 1, float64(t+1))
		}
	}
	fit, err := ols.Regress(y, x)
	if err != nil {
		return nil, fmt.Errorf("unitroot: KPSS detrending: %w", err)
	}
	l, err := bw.ResolveFor(fit.Resid)
	if err != nil {
		return nil, err
	}
	lrv, _ := longRunVar(fit.Resid, l)
	if !(lrv > 0) {
		return nil, fmt.Errorf("unitroot: KPSS long-run variance %g is not positive with bandwidth %d", lrv, l)
	}
	var s, sum float64
	for _, e := range fit.Resid {
		s += e
		sum += s * s
	}
	eta := sum / (float64(n) * float64(n) * lrv)
	crit, err := critical.KPSS(c)
	if err != nil {
		return nil, err
	}
	p, clipped, err := critical.KPSSP(eta, c)
	if err != nil {
		return nil, err
	}
	return &KPSSResult{
		Stat: eta, PValue: p, PClipped: clipped, Bandwidth: l, NObs: n,
		Crit: crit, CritSource: "Kwiatkowski, Phillips, Schmidt and Shin (1992) Table 1",
		LRV: lrv, Resid: fit.Resid,
	}, nil
}
