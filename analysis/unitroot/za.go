package unitroot

import (
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/critical"
)

// ZAResult is the Zivot–Andrews test of a unit root against a
// trend-stationary alternative with one break at an unknown date.
type ZAResult struct {
	Stat float64 // min over break dates of the t-ratio of α − 1
	// PValue is NaN: no published p-value function is used.
	PValue float64
	// Break is the number of observations before the break: DU_t = 1
	// and DT_t = t − Break for t > Break (t = 1..T), so y[Break] is the
	// first observation of the new regime (zero-based index).
	Break      int
	Lags       int // lagged differences at the chosen break
	NObs       int // observations in the regression at the chosen break
	Trim       float64
	Crit       []critical.Value // 1%, 2.5%, 5%, 10%
	CritSource string
	// Stats[k] is the t-ratio with the break after observation First+k
	// (NaN where the regression is rank deficient); LagsAt the lag used.
	First  int
	Stats  []float64
	LagsAt []int
	Reg    *DF // the regression at the chosen break
}

// ZA computes the Zivot and Andrews (1992) statistic. For every break
// date TB = z with λ = z/T in [trim, 1 − trim] (trim ≤ 0 means 0.15) it
// fits
//
//	Δy_t = μ + βt + θ DU_t + ψ DT_t + γ y_{t−1} + Σ_{i=1..p} φ_i Δy_{t−i} + e_t,
//
// DU_t = 1(t > z), DT_t = (t − z)·1(t > z), keeping DU (model A,
// BreakIntercept), DT (model B, BreakTrend) or both (model C), and takes
// the minimum over z of t(γ̂) (γ = α − 1 of the levels form). Lags are
// fixed or selected by r separately at each date (as DickeyFuller does).
// Critical values: Zivot and Andrews (1992), asymptotic, trimming 0.15.
func ZA(y []float64, m critical.BreakModel, trim float64, r LagRule) (*ZAResult, error) {
	if m < critical.BreakIntercept || m > critical.BreakBoth {
		return nil, fmt.Errorf("unitroot: unknown break model %d", int(m))
	}
	if trim <= 0 {
		trim = 0.15
	}
	if trim >= 0.5 {
		return nil, fmt.Errorf("unitroot: trimming %g must be below 0.5", trim)
	}
	if err := checkSeries(y, 8); err != nil {
		return nil, err
	}
	n := len(y)
	first := int(math.Ceil(trim * float64(n)))
	last := int(math.Floor((1 - trim) * float64(n)))
	if first < 2 {
		first = 2
	}
	if last > n-2 {
		last = n - 2
	}
	if last < first {
		return nil, fmt.Errorf("unitroot: %d observations leave no break dates with trimming %g", n, trim)
	}
	d := 3
	if m == critical.BreakBoth {
		d = 4
	}
	out := &ZAResult{PValue: math.NaN(), Trim: trim, First: first, Break: -1, Stat: math.Inf(1)}
	var firstErr error
	for z := first; z <= last; z++ {
		zz := z
		det := func(t, i, nn int, row []float64) {
			tf := float64(t + 1) // time 1..T of the observation
			row[0] = 1
			row[1] = tf
			after := t+1 > zz
			j := 2
			if m != critical.BreakTrend {
				if after {
					row[j] = 1
				} else {
					row[j] = 0
				}
				j++
			}
			if m != critical.BreakIntercept {
				if after {
					row[j] = tf - float64(zz)
				} else {
					row[j] = 0
				}
			}
		}
		reg, err := dfFit(y, det, d, r)
		if err != nil {
			if firstErr == nil {
				firstErr = err
			}
			out.Stats = append(out.Stats, math.NaN())
			out.LagsAt = append(out.LagsAt, -1)
			continue
		}
		out.Stats = append(out.Stats, reg.Stat)
		out.LagsAt = append(out.LagsAt, reg.Lags)
		if reg.Stat < out.Stat {
			out.Stat, out.Break, out.Reg = reg.Stat, z, reg
		}
	}
	if out.Reg == nil {
		return nil, fmt.Errorf("unitroot: Zivot–Andrews: no break date gave a regression: %w", firstErr)
	}
	out.Lags, out.NObs = out.Reg.Lags, out.Reg.NObs
	crit, err := critical.ZivotAndrews(m)
	if err != nil {
		return nil, err
	}
	out.Crit = crit
	out.CritSource = "Zivot and Andrews (1992), asymptotic, trimming 0.15"
	if trim != 0.15 {
		out.CritSource += fmt.Sprintf(" (this test used trimming %g)", trim)
	}
	return out, nil
}
