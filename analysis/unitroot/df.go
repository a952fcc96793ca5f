package unitroot

import (
	"fmt"
	"math"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/rules"
	"gonum.org/v1/gonum/mat"
)

// DF is an augmented Dickey–Fuller regression
//
//	Δy_t = det_t + γ y_{t−1} + Σ_{i=1..p} φ_i Δy_{t−i} + e_t,
//
// with τ = γ̂/se(γ̂) (conventional OLS standard error).
type DF struct {
	Case   critical.Case
	Stat   float64 // τ = γ̂/se(γ̂)
	Gamma  float64 // γ̂
	SE     float64 // se(γ̂)
	Lags   int     // p, the number of lagged differences used
	NObs   int     // observations in the regression, T − 1 − p
	MaxLag int     // largest p considered (equal to Lags when fixed)
	Select Selector
	// IC[p] is, for p = 0..MaxLag on the common sample that drops the
	// first MaxLag+1 observations, the criterion value n·ln(SSR/n) + K·c
	// (c = 2 or ln n) for AIC and BIC, |t| of the last lag for TStat
	// (NaN for p = 0 and for rank-deficient designs), or the modified AIC
	// of Ng and Perron (2001) for MAIC (see selectMAIC). Nil when fixed.
	IC []float64
	// Fit is the final regression on all T − 1 − p usable observations.
	// Its columns are [deterministics | y_{t−1} | Δy_{t−1} … Δy_{t−p}],
	// deterministics ordered constant, s, s² with s = 1..NObs over the
	// regression sample; γ is column Case.Deterministics().
	Fit *ols.Fit
}

// DickeyFuller estimates the augmented Dickey–Fuller regression of y
// with the deterministic terms of c and p lagged differences, fixed or
// chosen by r.
//
// Selection compares every p = 0..Max on a common sample (the first
// Max+1 observations dropped) and re-estimates the chosen p on its own
// full sample of T − 1 − p observations, as statsmodels' adfuller does
// (verified in the tests). The criteria for all p come from one QR
// factorisation of the largest design (see nested), not one regression
// per lag. TStat is general-to-specific from Max, dropping the last lag
// while |t| < 1.645. MAIC (Ng and Perron 2001, see selectMAIC) applies to
// case n only, the regression of a detrended series.
func DickeyFuller(y []float64, c critical.Case, r LagRule) (*DF, error) {
	if c < critical.NoConst || c > critical.ConstTrendSq {
		return nil, fmt.Errorf("unitroot: unsupported deterministic case %d", int(c))
	}
	if err := checkSeries(y, 3); err != nil {
		return nil, err
	}
	det, d := caseDet(c)
	reg, err := dfFit(y, det, d, r)
	if err != nil {
		return nil, err
	}
	reg.Case = c
	return reg, nil
}

// dfFit is DickeyFuller with arbitrary deterministics.
func dfFit(y []float64, det detFunc, d int, r LagRule) (*DF, error) {
	tt := len(y)
	out := &DF{Select: r.Select}
	var p int
	switch r.Select {
	case Fixed:
		if r.Lags < 0 {
			return nil, fmt.Errorf("unitroot: lag order %d is negative", r.Lags)
		}
		p = r.Lags
		out.MaxLag = p
	case AIC, BIC, TStat, MAIC:
		max := r.Max
		if max < 0 {
			max = rules.SchwertMax(tt)
			if cap := tt/2 - d - 1; max > cap {
				max = cap
			}
			if max < 0 {
				max = 0
			}
		}
		out.MaxLag = max
		if err := enoughObs(tt, d, max); err != nil {
			return nil, err
		}
		var ic []float64
		var best int
		var err error
		if r.Select == MAIC {
			ic, best, err = selectMAIC(y, d, max)
		} else {
			ic, best, err = selectLag(y, det, d, max, r.Select)
		}
		if err != nil {
			return nil, err
		}
		out.IC = ic
		p = best
	default:
		return nil, fmt.Errorf("unitroot: unknown lag selector %d", int(r.Select))
	}
	if err := enoughObs(tt, d, p); err != nil {
		return nil, err
	}
	a := dfDesign(y, det, d, p, p+1, 0)
	dy := make([]float64, a.Rows)
	for i := range dy {
		dy[i] = y[p+1+i] - y[p+i]
	}
	fit, err := ols.Regress(dy, mat.NewDense(a.Rows, a.Cols, a.Data))
	if err != nil {
		return nil, fmt.Errorf("unitroot: Dickey–Fuller regression with %d lags: %w", p, err)
	}
	out.Lags = p
	out.NObs = fit.N
	out.Fit = fit
	out.Gamma = fit.Coef[d]
	out.SE = math.Sqrt(fit.Sigma2() * fit.XtXInv().At(d, d))
	out.Stat = out.Gamma / out.SE
	return out, nil
}

// enoughObs demands at least one residual degree of freedom in the
// regression with p lags: T − 1 − p > d + 1 + p.
func enoughObs(t, d, p int) error {
	n := t - 1 - p
	k := d + 1 + p
	if n <= k {
		return fmt.Errorf("unitroot: %w: %d observations leave %d for a Dickey–Fuller regression with %d lags and %d regressors",
			ols.ErrTooFewObs, t, n, p, k)
	}
	return nil
}

// selectLag evaluates the criterion for p = 0..max on the common sample
// t = max+1..T−1 from one nested QR of [X_max | Δy] and returns the
// values and the choice.
func selectLag(y []float64, det detFunc, d, max int, sel Selector) ([]float64, int, error) {
	cols, n := selectionSources(y, det, d, max)
	if !tall(n, len(cols)) {
		cols = materialise(cols) // nested scales a small design in place
	}
	ns := nested(cols)
	if !ns.ok[d] {
		return nil, 0, fmt.Errorf("unitroot: y_{t−1} is collinear with the deterministic terms on the comparison sample")
	}
	ic := make([]float64, max+1)
	best := 0
	switch sel {
	case AIC, BIC:
		crit := rules.AIC
		if sel == BIC {
			crit = rules.BIC
		}
		for p := 0; p <= max; p++ {
			j := d + 1 + p
			if !ns.ok[j-1] || ns.ssr[j-1] <= 0 {
				ic[p] = math.Inf(1)
				continue
			}
			ic[p] = crit.Total(ns.ssr[j-1], j, n)
			if ic[p] < ic[best] {
				best = p
			}
		}
	case TStat:
		ic[0] = math.NaN()
		for p := 1; p <= max; p++ {
			ic[p] = math.Abs(ns.t[d+p])
		}
		for p := max; p >= 1; p-- {
			if ic[p] >= tStatStop {
				best = p
				break
			}
		}
	}
	return ic, best, nil
}

// selectionColumns returns the comparison design for p = 0..max in
// column-major form, [deterministics | y_{t−1} | Δy_{t−1} … Δy_{t−max} |
// Δy_t] over t = max+1..T−1, each column its own storage, and its
// number of rows.
func selectionColumns(y []float64, det detFunc, d, max int) ([][]float64, int) {
	src, n := selectionSources(y, det, d, max)
	return materialise(src), n
}

// selectionSources is selectionColumns without the copies: y_{t−1} is a
// window of y and the differences windows of one series Δy (only the
// deterministic columns are stored), so the columns share storage.
func selectionSources(y []float64, det detFunc, d, max int) ([][]float64, int) {
	n := len(y) - 1 - max
	m := d + 1 + max
	cols := make([][]float64, m+1)
	buf := make([]float64, n*d)
	for j := 0; j < d; j++ {
		cols[j] = buf[j*n : (j+1)*n : (j+1)*n]
	}
	row := make([]float64, d)
	for i := 0; i < n; i++ {
		det(max+1+i, i, n, row)
		for j := 0; j < d; j++ {
			cols[j][i] = row[j]
		}
	}
	cols[d] = y[max : max+n : max+n] // y_{t−1}, t = max+1..
	dy := make([]float64, len(y)-1)  // dy[s] = Δy_{s+1}
	for s := range dy {
		dy[s] = y[s+1] - y[s]
	}
	for l := 1; l <= max; l++ { // Δy_{t−l} = dy[t−l−1]
		cols[d+l] = dy[max-l : max-l+n : max-l+n]
	}
	cols[m] = dy[max : max+n : max+n] // Δy_t
	return cols, n
}

// materialise copies columns into one column-major block, each column
// its own storage.
func materialise(src [][]float64) [][]float64 {
	n := len(src[0])
	buf := make([]float64, n*len(src))
	cols := make([][]float64, len(src))
	for j, c := range src {
		cols[j] = buf[j*n : (j+1)*n : (j+1)*n]
		copy(cols[j], c)
	}
	return cols
}
