package unitroot

import (
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/critical"
)

// NgPerronResult holds the M tests of Ng and Perron (2001) on
// GLS-detrended data. Every statistic rejects the unit-root null for
// small values: below its critical value at a level.
type NgPerronResult struct {
	MZa float64 // MZα
	MZt float64 // MZt = MZα · MSB
	MSB float64
	MPT float64

	// Critical values at 1%, 5%, 10% (lower tail), asymptotic, from
	// critical.NgPerron; CritSource names the table.
	CritMZa, CritMZt, CritMSB, CritMPT []critical.Value
	CritSource                         string

	Lags   int // k, lagged differences in the autoregression for s²_AR
	MaxLag int // largest k considered (equal to Lags when fixed)
	Select Selector
	// NObs is T, the number of observations of the series, over which the
	// statistics are formed; the autoregression uses Reg.NObs = T − 1 − k.
	NObs int

	S2AR      float64   // s²_AR, the autoregressive spectral density at frequency zero
	CBar      float64   // c̄: −7 (constant) or −13.5 (trend)
	Beta      []float64 // GLS coefficients of the deterministics (constant, trend)
	Detrended []float64 // ỹ_t = y_t − z_t'β̃
	Reg       *DF       // Δỹ_t = b₀ ỹ_{t−1} + Σ_{j=1..k} b_j Δỹ_{t−j} + e_{tk}
}

// NgPerron computes the M tests of Ng and Perron (2001), "Lag Length
// Selection and the Construction of Unit Root Tests with Good Size and
// Power", Econometrica 69, 1519–1554, Section 2 (the M tests of Perron
// and Ng 1996 on GLS-detrended data), for the constant (c = Const,
// c̄ = −7) or constant-and-trend (c = ConstTrend, c̄ = −13.5) case.
//
// y is detrended by the local-to-unity GLS of Elliott, Rothenberg and
// Stock (1996), exactly as in DFGLS, giving ỹ_1..ỹ_T. With
//
//	κ = T⁻² Σ_{t=2..T} ỹ²_{t−1},
//
// the statistics are
//
//	MZα = (T⁻¹ ỹ²_T − s²_AR) / (2κ),
//	MSB = (κ / s²_AR)^{1/2},
//	MZt = MZα · MSB,
//	MPT = (c̄² κ − c̄ T⁻¹ ỹ²_T) / s²_AR        (constant),
//	MPT = (c̄² κ + (1 − c̄) T⁻¹ ỹ²_T) / s²_AR  (constant and trend).
//
// s²_AR is the autoregressive estimate of the spectral density at
// frequency zero of Perron and Ng (1996, 1998), computed from the
// GLS-detrended data as Ng and Perron (2001) recommend:
//
//	s²_AR = σ̂²_k / (1 − Σ_{j=1..k} b̂_j)²,   σ̂²_k = SSR_k / (T − 1 − k),
//
// from the regression Δỹ_t = b₀ ỹ_{t−1} + Σ_{j=1..k} b_j Δỹ_{t−j} + e_{tk}
// on its T − 1 − k usable observations (the DF-GLS regression; see
// DickeyFuller, case n). The number of lags k is fixed or chosen by r:
// MAIC is the modified AIC of Ng and Perron (2001, see selectMAIC) that
// they recommend; AIC, BIC and TStat are also accepted; a negative Max
// asks for the Schwert (1989) maximum, as in DickeyFuller.
//
// The sums use the observed series t = 1..T with ỹ_T its last value (the
// paper's series starts at t = 0; the difference vanishes
// asymptotically). Critical values: Ng and Perron (2001) Table 1,
// asymptotic (critical.NgPerron).
func NgPerron(y []float64, c critical.Case, r LagRule) (*NgPerronResult, error) {
	g, err := glsDetrend(y, c, "Ng–Perron")
	if err != nil {
		return nil, err
	}
	reg, err := DickeyFuller(g.y, critical.NoConst, r)
	if err != nil {
		return nil, err
	}
	s2, err := s2AR(reg)
	if err != nil {
		return nil, err
	}
	out := &NgPerronResult{
		Lags: reg.Lags, MaxLag: reg.MaxLag, Select: reg.Select, NObs: len(y),
		S2AR: s2, CBar: g.cbar, Beta: g.beta, Detrended: g.y, Reg: reg,
	}
	out.MZa, out.MZt, out.MSB, out.MPT = mStats(g.y, s2, g.cbar, c == critical.ConstTrend)
	for _, t := range []struct {
		s   critical.NgPerronStat
		dst *[]critical.Value
	}{{critical.MZa, &out.CritMZa}, {critical.MZt, &out.CritMZt}, {critical.MSB, &out.CritMSB}, {critical.MPT, &out.CritMPT}} {
		if *t.dst, err = critical.NgPerron(t.s, c); err != nil {
			return nil, err
		}
	}
	out.CritSource = critical.NgPerronSource
	return out, nil
}

// s2AR is σ̂²_k / (1 − Σ_{j=1..k} b̂_j)² from the fitted autoregression of
// the detrended series (no deterministic terms, so b̂_j is column j of
// the fit), with σ̂²_k = SSR/N.
func s2AR(reg *DF) (float64, error) {
	fit := reg.Fit
	var sum float64
	for j := 1; j <= reg.Lags; j++ {
		sum += fit.Coef[j]
	}
	den := (1 - sum) * (1 - sum)
	s2 := fit.SSR / float64(fit.N) / den
	if !(s2 > 0) || math.IsInf(s2, 0) {
		return 0, fmt.Errorf("unitroot: Ng–Perron spectral density s²_AR = %g is not positive and finite (lag coefficients sum to %g with %d lags)", s2, sum, reg.Lags)
	}
	return s2, nil
}

// mStats evaluates MZα, MZt, MSB and MPT from the detrended series yd
// (ỹ_1..ỹ_T), s²_AR and c̄.
func mStats(yd []float64, s2, cbar float64, trend bool) (mza, mzt, msb, mpt float64) {
	tf := float64(len(yd))
	var k float64
	for _, v := range yd[:len(yd)-1] {
		k += v * v
	}
	k /= tf * tf
	last := yd[len(yd)-1] * yd[len(yd)-1] / tf
	mza = (last - s2) / (2 * k)
	msb = math.Sqrt(k / s2)
	mzt = mza * msb
	if trend {
		mpt = (cbar*cbar*k + (1-cbar)*last) / s2
	} else {
		mpt = (cbar*cbar*k - cbar*last) / s2
	}
	return mza, mzt, msb, mpt
}
