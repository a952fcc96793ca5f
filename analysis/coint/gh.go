package coint

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/unitroot"
)

// GHModel is the shift allowed under the alternative of the
// Gregory–Hansen (1996) tests.
type GHModel int

const (
	// GHLevel is model C, a level shift:
	// y_t = μ₁ + μ₂φ_t + α'x_t + e_t.
	GHLevel GHModel = iota
	// GHLevelTrend is model C/T, a level shift with a trend:
	// y_t = μ₁ + μ₂φ_t + βt + α'x_t + e_t.
	GHLevelTrend
	// GHRegime is model C/S, a regime shift:
	// y_t = μ₁ + μ₂φ_t + α₁'x_t + α₂'x_tφ_t + e_t.
	GHRegime
)

// String is the model's label in Gregory and Hansen (1996): "C", "C/T"
// or "C/S".
func (m GHModel) String() string {
	switch m {
	case GHLevel:
		return "C"
	case GHLevelTrend:
		return "C/T"
	case GHRegime:
		return "C/S"
	}
	return fmt.Sprintf("GHModel(%d)", int(m))
}

// Code is a short lower-case code of the model: "c", "ct" or "cs".
func (m GHModel) Code() string {
	return strings.ToLower(strings.ReplaceAll(m.String(), "/", ""))
}

// ParseGHModel reads a model by its code ("c", "ct", "cs") or label
// ("C", "C/T", "C/S"), case-insensitive.
func ParseGHModel(s string) (GHModel, error) {
	switch strings.ToLower(strings.ReplaceAll(strings.TrimSpace(s), "/", "")) {
	case "c":
		return GHLevel, nil
	case "ct":
		return GHLevelTrend, nil
	case "cs":
		return GHRegime, nil
	}
	return 0, fmt.Errorf("coint: unknown Gregory–Hansen model %q (want c, ct or cs)", s)
}

// DefaultGHTrim is the share of the sample cut at each end of the
// candidate break dates, 0.15 as in Gregory and Hansen (1996), whose
// critical values assume it.
const DefaultGHTrim = 0.15

// GHStat is one of the three Gregory–Hansen statistics, minimised over
// the candidate break dates.
type GHStat struct {
	Stat float64
	// Break is the zero-based index of the first observation of the new
	// regime at the minimising date (φ_t = 1 from there on).
	Break int
	// Lags is, for ADF*, the number of lagged differences at that date;
	// for Zt* and Zα*, the Bartlett truncation lag.
	Lags int
	// Crit are the 1%, 5% and 10% critical values (reject for Stat
	// below them); nil when not tabulated.
	Crit []critical.Value
}

// GHResult holds the Gregory–Hansen tests of no cointegration against
// cointegration with one shift at an unknown date.
type GHResult struct {
	ADF, Zt, Za GHStat
	Model       GHModel
	Regressors  int // m, the number of regressors x
	NObs        int // n, observations of the static regression
	Trim        float64
	// First and Last bound the candidate break indices (inclusive).
	First, Last int
	CritSource  string
	MaxLag      int // largest lag order the ADF lag choice considered
	// Path holds, for each candidate break index First+i, the statistics
	// ADF(τ), Zt(τ) and Zα(τ) and the lags and bandwidth used there.
	PathADF, PathZt, PathZa []float64
	PathLags, PathBW        []int
	// Coef are the static coefficients at the ADF* break, in the order
	// of GHTerms; Resid the static residuals there, t = 1..n.
	Coef  []float64
	Resid []float64
}

// GHTerms names the static regression's columns: "const", "shift"
// (φ_t), "trend" (model C/T), the regressors, then for model C/S each
// regressor times φ_t as "shift*NAME".
func GHTerms(m GHModel, xnames []string) []string {
	out := []string{"const", "shift"}
	if m == GHLevelTrend {
		out = append(out, "trend")
	}
	out = append(out, xnames...)
	if m == GHRegime {
		for _, x := range xnames {
			out = append(out, "shift*"+x)
		}
	}
	return out
}

// GHBreakRange returns the candidate break indices k = First..Last of n
// observations with trimming trim: k = ⌈trim·n⌉ … ⌊(1 − trim)·n⌋, k
// being the number of observations before the shift, so that φ_t = 1
// for t > k (one-based), as in Gregory and Hansen (1996), who let
// τ = k/n run over [0.15, 0.85]. Each regime keeps at least minRegime
// observations. An empty range is an error.
func GHBreakRange(n int, trim float64, minRegime int) (first, last int, err error) {
	if !(trim > 0) || trim >= 0.5 {
		return 0, 0, fmt.Errorf("coint: trimming %g must lie strictly between 0 and 0.5", trim)
	}
	first = int(math.Ceil(trim*float64(n) - 1e-9))
	last = int(math.Floor((1-trim)*float64(n) + 1e-9))
	first = max(first, minRegime)
	last = min(last, n-minRegime)
	if last < first {
		return 0, 0, fmt.Errorf("coint: %d observations leave no candidate break date with trimming %g (each regime needs at least %d observations)", n, trim, minRegime)
	}
	return first, last, nil
}

// GHMinRegime is the fewest observations a regime may have in model m
// with k regressors: 2, or k + 2 in model C/S, whose regime-specific
// slopes need them.
func GHMinRegime(m GHModel, k int) int {
	if m == GHRegime {
		return k + 2
	}
	return 2
}

// GHDesign fills the static design of model m at break index b (φ_t =
// 1 for zero-based t ≥ b): columns as in GHTerms, the trend t = 1..n.
func GHDesign(x [][]float64, m GHModel, b int) *mat.Dense {
	n := len(x[0])
	k := len(x)
	cols := 2 + k
	if m == GHLevelTrend {
		cols++
	}
	if m == GHRegime {
		cols += k
	}
	X := mat.NewDense(n, cols, nil)
	for t := 0; t < n; t++ {
		phi := 0.0
		if t >= b {
			phi = 1
		}
		X.Set(t, 0, 1)
		X.Set(t, 1, phi)
		c := 2
		if m == GHLevelTrend {
			X.Set(t, c, float64(t+1))
			c++
		}
		for j := range x {
			X.Set(t, c+j, x[j][t])
		}
		if m == GHRegime {
			for j := range x {
				X.Set(t, c+k+j, phi*x[j][t])
			}
		}
	}
	return X
}

// GHZ returns the Phillips-type statistics of residuals e_1..e_n with
// Bartlett truncation lag L, in the form of Gregory and Hansen (1996,
// Section 3):
//
//	ρ̂   = Σ_{t=1..n−1} e_t e_{t+1} / Σ_{t=1..n−1} e_t²,
//	v̂_t = e_t − ρ̂ e_{t−1},  t = 2..n,
//	γ̂(j) = n⁻¹ Σ_{t=j+2..n} v̂_t v̂_{t−j},
//	λ̂   = Σ_{j=1..L} (1 − j/(L+1)) γ̂(j),   ω̂² = γ̂(0) + 2λ̂,
//	ρ̂*  = Σ_{t=1..n−1} (e_t e_{t+1} − λ̂) / Σ_{t=1..n−1} e_t²,
//	Zα  = n(ρ̂* − 1),   Zt = (ρ̂* − 1)/ŝ,   ŝ² = ω̂² / Σ_{t=1..n−1} e_t².
//
// (Bartlett weights w(j/M) = 1 − j/M with M = L + 1.) The correction
// enters the numerator of ρ̂* once per term of the sum, n − 1 times, as
// the paper writes it; Phillips (1987) has n, which is the same
// asymptotically.
func GHZ(e []float64, L int) (za, zt float64) {
	n := len(e)
	var see, sxy float64
	for t := 0; t < n-1; t++ {
		see += e[t] * e[t]
		sxy += e[t] * e[t+1]
	}
	rho := sxy / see
	v := ghV(e, rho)
	g0, lam := bartlettParts(v, L, n)
	omega2 := g0 + 2*lam
	rs := (sxy - float64(n-1)*lam) / see
	za = float64(n) * (rs - 1)
	zt = (rs - 1) / math.Sqrt(omega2/see)
	return za, zt
}

// ghV is v̂_t = e_t − ρ̂e_{t−1}, t = 2..n.
func ghV(e []float64, rho float64) []float64 {
	v := make([]float64, len(e)-1)
	for t := 1; t < len(e); t++ {
		v[t-1] = e[t] - rho*e[t-1]
	}
	return v
}

// bartlettParts returns γ̂(0) and λ̂ = Σ_{j=1..L} (1 − j/(L+1)) γ̂(j),
// γ̂(j) = div⁻¹ Σ_t v_t v_{t−j}.
func bartlettParts(v []float64, L, div int) (g0, lam float64) {
	for _, a := range v {
		g0 += a * a
	}
	g0 /= float64(div)
	for j := 1; j <= L && j < len(v); j++ {
		var g float64
		for t := j; t < len(v); t++ {
			g += v[t] * v[t-j]
		}
		lam += (1 - float64(j)/float64(L+1)) * g / float64(div)
	}
	return g0, lam
}

// GregoryHansen tests the null of no cointegration between y and the
// regressors x (m = len(x) ≥ 1) against cointegration with one shift at
// an unknown date, by the residual-based tests of Gregory and Hansen
// (1996). For every candidate break index k (GHBreakRange: τ = k/n in
// [trim, 1 − trim]) the static regression of model m (GHDesign) is
// fitted by OLS and its residuals ê_tτ give
//
//   - ADF(τ): the t-ratio of γ in Δê_t = γê_{t−1} + Σ_{i≤p} φ_iΔê_{t−i} + u_t
//     (no deterministic terms; p fixed or chosen at each date by lr, as
//     unitroot.DickeyFuller does);
//   - Zα(τ) and Zt(τ): GHZ with the Bartlett truncation lag of bw
//     resolved on v̂ at each date (Bandwidth.ResolveFor: a rule of the
//     n − 1 observations of v̂, a number, or an automatic choice);
//
// and ADF* = inf ADF(τ), Zt* = inf Zt(τ), Zα* = inf Zα(τ), each with its
// own minimising date (the first, if tied). All three reject no
// cointegration for small values. Critical values: GHCritical, for
// m ≤ 4 regressors (nil beyond).
func GregoryHansen(y []float64, x [][]float64, m GHModel, trim float64, lr unitroot.LagRule, bw unitroot.Bandwidth) (*GHResult, error) {
	k := len(x)
	if k < 1 {
		return nil, errors.New("coint: Gregory–Hansen needs at least one regressor")
	}
	if m < GHLevel || m > GHRegime {
		return nil, fmt.Errorf("coint: unknown Gregory–Hansen model %d", int(m))
	}
	if trim == 0 {
		trim = DefaultGHTrim
	}
	n := len(y)
	if err := finite("y", y); err != nil {
		return nil, err
	}
	for j, c := range x {
		if len(c) != n {
			return nil, fmt.Errorf("coint: regressor %d has %d observations, y has %d", j, len(c), n)
		}
		if err := finite(fmt.Sprintf("x[%d]", j), c); err != nil {
			return nil, err
		}
	}
	ncols := len(GHTerms(m, make([]string, k)))
	if n < ncols+8 {
		return nil, fmt.Errorf("coint: %d observations are too few for model %s with %d regressors (need at least %d)", n, m, k, ncols+8)
	}
	first, last, err := GHBreakRange(n, trim, GHMinRegime(m, k))
	if err != nil {
		return nil, err
	}
	res := &GHResult{Model: m, Regressors: k, NObs: n, Trim: trim, First: first, Last: last}
	res.ADF.Stat, res.Zt.Stat, res.Za.Stat = math.Inf(1), math.Inf(1), math.Inf(1)
	for b := first; b <= last; b++ {
		f, err := ols.Regress(y, GHDesign(x, m, b))
		if err != nil {
			var ce *ols.CollinearError
			if errors.As(err, &ce) {
				return nil, fmt.Errorf("coint: Gregory–Hansen regression with the shift at observation %d: column %q is collinear with the columns before it", b+1, GHTerms(m, xNames(k))[ce.Col])
			}
			return nil, fmt.Errorf("coint: Gregory–Hansen regression with the shift at observation %d: %w", b+1, err)
		}
		df, err := unitroot.DickeyFuller(f.Resid, critical.NoConst, lr)
		if err != nil {
			return nil, fmt.Errorf("coint: Gregory–Hansen ADF regression with the shift at observation %d: %w", b+1, err)
		}
		e := f.Resid
		var see, sxy float64
		for t := 0; t < n-1; t++ {
			see += e[t] * e[t]
			sxy += e[t] * e[t+1]
		}
		L, err := bw.ResolveFor(ghV(e, sxy/see))
		if err != nil {
			return nil, fmt.Errorf("coint: Gregory–Hansen with the shift at observation %d: %w", b+1, err)
		}
		za, zt := GHZ(e, L)
		res.MaxLag = df.MaxLag
		res.PathADF = append(res.PathADF, df.Stat)
		res.PathZt = append(res.PathZt, zt)
		res.PathZa = append(res.PathZa, za)
		res.PathLags = append(res.PathLags, df.Lags)
		res.PathBW = append(res.PathBW, L)
		if df.Stat < res.ADF.Stat {
			res.ADF = GHStat{Stat: df.Stat, Break: b, Lags: df.Lags}
			res.Coef = append([]float64(nil), f.Coef...)
			res.Resid = append([]float64(nil), f.Resid...)
		}
		if zt < res.Zt.Stat {
			res.Zt = GHStat{Stat: zt, Break: b, Lags: L}
		}
		if za < res.Za.Stat {
			res.Za = GHStat{Stat: za, Break: b, Lags: L}
		}
	}
	for _, s := range []float64{res.ADF.Stat, res.Zt.Stat, res.Za.Stat} {
		if math.IsNaN(s) || math.IsInf(s, 0) {
			return nil, errors.New("coint: Gregory–Hansen statistics are not finite (residuals without variation?)")
		}
	}
	if tz, ta, ok := GHCritical(k, m); ok {
		res.ADF.Crit, res.Zt.Crit, res.Za.Crit = tz, tz, ta
		res.CritSource = fmt.Sprintf("Gregory and Hansen (1996) Table 1, m=%d regressors, model %s, trimming 0.15", k, m)
		if math.Abs(trim-DefaultGHTrim) > 1e-12 {
			res.CritSource += fmt.Sprintf(" (this test used trimming %g)", trim)
		}
	} else {
		res.CritSource = fmt.Sprintf("none: Gregory and Hansen (1996) tabulate m ≤ %d regressors, not %d", MaxGHRegressors, k)
	}
	return res, nil
}

func xNames(k int) []string {
	out := make([]string, k)
	for i := range out {
		out[i] = fmt.Sprintf("x%d", i+1)
	}
	return out
}

func finite(name string, v []float64) error {
	for i, a := range v {
		if math.IsNaN(a) || math.IsInf(a, 0) {
			return fmt.Errorf("coint: %s[%d] is not finite", name, i)
		}
	}
	return nil
}
