package unitroot

import (
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/critical"
)

// PPResult is the Phillips–Perron test of a unit root.
type PPResult struct {
	Stat       float64          // Z(t)
	PValue     float64          // MacKinnon (1994) asymptotic p-value of Z(t)
	Bandwidth  int              // Bartlett truncation lag L
	NObs       int              // observations in the regression, T − 1
	Crit       []critical.Value // Z(t): 1%, 5%, 10%
	CritSource string

	StatAlpha       float64          // Z(α)
	CritAlpha       []critical.Value // Z(α): 1%, 2.5%, 5%, 10%
	CritAlphaSource string

	Rho    float64 // ρ̂ = 1 + γ̂ of the Dickey–Fuller regression without lags
	Gamma0 float64 // γ0 = SSR/T
	LRV    float64 // λ², the Bartlett long-run variance of the residuals
	Reg    *DF
}

// PP computes the Phillips and Perron (1988) statistics from the
// Dickey–Fuller regression without lags, Δy_t = det_t + γ y_{t−1} + u_t
// (T observations, s² = SSR/(T−K), σ̂ = se(γ̂), t = γ̂/σ̂), in the form of
// Hamilton (1994, Time Series Analysis, section 17.6):
//
//	Z(α) = T γ̂ − ½ (T² σ̂²/s²) (λ² − γ0),
//	Z(t) = (γ0/λ²)^{1/2} t − ½ (λ² − γ0) λ⁻¹ (T σ̂/s),
//
// γ0 = SSR/T and λ² the Newey–West Bartlett long-run variance of the
// residuals with truncation lag from bw (Bandwidth.ResolveFor on those
// residuals: the rule at n = T, or the automatic lag of the residuals). Cases n, c
// and ct. Z(t) has the Dickey–Fuller τ distribution: critical values
// MacKinnon (2010) at T, p-value MacKinnon (1994). Z(α) has that of
// T(ρ̂−1): asymptotic critical values from Fuller (1976, Table 8.5.1).
func PP(y []float64, c critical.Case, bw Bandwidth) (*PPResult, error) {
	if c != critical.NoConst && c != critical.Const && c != critical.ConstTrend {
		return nil, fmt.Errorf("unitroot: Phillips–Perron supports cases n, c and ct, not %v", c)
	}
	reg, err := DickeyFuller(y, c, LagRule{Select: Fixed})
	if err != nil {
		return nil, err
	}
	n := reg.NObs
	l, err := bw.ResolveFor(reg.Fit.Resid)
	if err != nil {
		return nil, err
	}
	lrv, g0 := longRunVar(reg.Fit.Resid, l)
	d := c.Deterministics()
	// D = T⁻² Σ ỹ²_{t−1}, ỹ the lagged level net of the deterministics,
	// so that T σ̂/s = D^{−1/2}.
	dd := 1 / (float64(n) * float64(n) * reg.Fit.XtXInv().At(d, d))
	za, zt := ppStats(n, reg.Gamma, reg.Stat, g0, lrv, dd)
	if math.IsNaN(zt) || lrv <= 0 {
		return nil, fmt.Errorf("unitroot: Phillips–Perron long-run variance %g is not positive with bandwidth %d", lrv, l)
	}
	tr, err := tauResult(zt, c, n, 0, reg)
	if err != nil {
		return nil, err
	}
	ca, err := critical.FullerRho(c)
	if err != nil {
		return nil, err
	}
	return &PPResult{
		Stat: zt, PValue: tr.PValue, Bandwidth: l, NObs: n, Crit: tr.Crit, CritSource: tr.CritSource,
		StatAlpha: za, CritAlpha: ca, CritAlphaSource: "Fuller (1976) Table 8.5.1, asymptotic",
		Rho: 1 + reg.Gamma, Gamma0: g0, LRV: lrv, Reg: reg,
	}, nil
}

// ppStats evaluates Z(α) and Z(t) from T, γ̂, the OLS t-ratio, γ0, λ²
// and D = T⁻² Σ ỹ²_{t−1} (so that T²σ̂²/s² = 1/D).
func ppStats(n int, gamma, t, g0, lrv, d float64) (za, zt float64) {
	tf := float64(n)
	za = tf*gamma - 0.5*(lrv-g0)/d
	zt = math.Sqrt(g0/lrv)*t - 0.5*(lrv-g0)/math.Sqrt(lrv)/math.Sqrt(d)
	return za, zt
}
