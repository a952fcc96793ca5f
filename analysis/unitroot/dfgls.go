package unitroot

import (
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/critical"
)

// DFGLSResult is the DF-GLS test of Elliott, Rothenberg and Stock (1996).
type DFGLSResult struct {
	Stat float64 // τ of the Dickey–Fuller regression of the detrended series
	// PValue is MacKinnon's (1994) no-constant p-value in the constant
	// case, whose asymptotic distribution it shares; NaN in the trend
	// case, for which no published p-value function is used here.
	PValue     float64
	Lags       int
	NObs       int
	Crit       []critical.Value // 1%, 5%, 10%
	CritSource string
	CBar       float64   // c̄: −7 (constant) or −13.5 (trend)
	Beta       []float64 // GLS coefficients of the deterministics (constant, trend)
	Detrended  []float64 // ỹ_t = y_t − z_t'β̃
	Reg        *DF       // Δỹ_t = γ ỹ_{t−1} + Σ φ_i Δỹ_{t−i} + e_t
}

// DFGLS computes the DF-GLS test of Elliott, Rothenberg and Stock (1996):
// with ᾱ = 1 + c̄/T, c̄ = −7 (c = Const, z_t = 1) or −13.5
// (c = ConstTrend, z_t = (1, t), t = 1..T), β̃ is the least-squares
// coefficient of
//
//	(y_1, y_2 − ᾱy_1, …, y_T − ᾱy_{T−1}) on (z_1, z_2 − ᾱz_1, …),
//
// ỹ_t = y_t − z_t'β̃, and the statistic is the τ of the Dickey–Fuller
// regression of ỹ without deterministic terms, with lags from r (any
// selector, including the MAIC of Ng and Perron 2001).
//
// Critical values: constant case, the Dickey–Fuller no-constant
// distribution, MacKinnonTau(1, NoConst, NObs); trend case, ERS (1996)
// Table 1 at T = len(y), interpolated in 1/T.
func DFGLS(y []float64, c critical.Case, r LagRule) (*DFGLSResult, error) {
	g, err := glsDetrend(y, c, "DF-GLS")
	if err != nil {
		return nil, err
	}
	n, cbar, yd := len(y), g.cbar, g.y
	reg, err := DickeyFuller(yd, critical.NoConst, r)
	if err != nil {
		return nil, err
	}
	out := &DFGLSResult{
		Stat: reg.Stat, Lags: reg.Lags, NObs: reg.NObs, CBar: cbar,
		Beta: g.beta, Detrended: yd, Reg: reg, PValue: math.NaN(),
	}
	if c == critical.Const {
		out.Crit, err = critical.MacKinnonTauAll(1, critical.NoConst, reg.NObs)
		if err != nil {
			return nil, err
		}
		out.CritSource = fmt.Sprintf("MacKinnon (2010) response surface, no-constant case, T=%d", reg.NObs)
		if out.PValue, err = critical.MacKinnonP(reg.Stat, 1, critical.NoConst); err != nil {
			return nil, err
		}
	} else {
		out.Crit, out.CritSource, err = critical.ERSTau(n)
		if err != nil {
			return nil, err
		}
	}
	return out, nil
}
