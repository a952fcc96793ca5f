// Package coint tests for cointegration among integrated series with
// residual-based tests: the Engle and Granger (1987) two-step
// augmented Dickey–Fuller test and the Phillips and Ouliaris (1990)
// variance-ratio (P̂u) and trace (P̂z) tests.
package coint

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/unitroot"
)

// EGResult is an Engle–Granger cointegration test.
type EGResult struct {
	Stat   float64 // ADF τ of the static residuals
	PValue float64 // MacKinnon (1994) asymptotic p-value; NaN beyond its table
	Lags   int     // lagged differences in the ADF regression
	NObs   int     // observations in the ADF regression
	// Crit are the 1%, 5% and 10% critical values (reject for Stat below
	// them); nil in the no-deterministics case, which MacKinnon (2010)
	// does not tabulate for more than one variable.
	Crit       []critical.Value
	CritSource string
	Det        critical.Case
	Vars       int // N = k + 1 variables
	// Coef are the static (cointegrating) coefficients: deterministic
	// terms (constant, t, t² with t = 1..T), then x1..xk. They are
	// super-consistent but their OLS standard errors are not valid, so
	// none are given.
	Coef   []float64
	Resid  []float64 // static residuals û_t, t = 1..T
	Static *ols.Fit
	ADF    *unitroot.DF
}

// EngleGranger tests the null of no cointegration between y and the
// regressors x (k = len(x) ≥ 1 series) by the two-step method of Engle
// and Granger (1987):
//
//  1. static OLS of y_t on the deterministic terms of det and
//     x_{1t}..x_{kt}, t = 1..T, giving residuals û_t;
//  2. the augmented Dickey–Fuller regression of û_t without
//     deterministic terms (they are already in step 1),
//     Δû_t = γû_{t−1} + Σ_{i≤p} φ_iΔû_{t−i} + e_t, with p by lr, and
//     τ = γ̂/se(γ̂).
//
// τ is compared with MacKinnon's (2010) response-surface critical values
// for N = k + 1 variables and case det, evaluated at T = NObs, the
// number of observations in the ADF regression (T − 1 − p), as for the
// ADF test of package unitroot. (statsmodels 0.13.5 coint evaluates the
// surface at T − 1 whatever p, i.e. the same T when p = 0; the two
// differ by O(p/T²).) The p-value is MacKinnon's (1994) asymptotic
// approximation for N variables.
//
// A collinear regressor gives an error naming its column (0-based, in x).
// More variables than MacKinnon tabulates is an error: critical values
// must then be simulated.
func EngleGranger(y []float64, x [][]float64, det critical.Case, lr unitroot.LagRule) (*EGResult, error) {
	k := len(x)
	if k < 1 {
		return nil, errors.New("coint: Engle–Granger needs at least one regressor")
	}
	nv := k + 1
	if nv > critical.MaxTauN {
		return nil, fmt.Errorf("coint: %d variables is beyond the MacKinnon (2010) tables (at most %d); simulate critical values for this case", nv, critical.MaxTauN)
	}
	if det < critical.NoConst || det > critical.ConstTrendSq {
		return nil, fmt.Errorf("coint: unsupported deterministic case %d", int(det))
	}
	static, err := staticFit(y, x, det)
	if err != nil {
		return nil, err
	}
	if static.TSS > 0 && static.R2() >= 1-100*math.Sqrt(2.220446049250313e-16) {
		return nil, errors.New("coint: y is (almost) an exact linear combination of the regressors; the test is not informative")
	}
	df, err := unitroot.DickeyFuller(static.Resid, critical.NoConst, lr)
	if err != nil {
		return nil, fmt.Errorf("coint: ADF regression on the residuals: %w", err)
	}
	res := &EGResult{
		Stat: df.Stat, Lags: df.Lags, NObs: df.NObs, Det: det, Vars: nv,
		Coef: append([]float64(nil), static.Coef...), Resid: static.Resid,
		Static: static, ADF: df, PValue: math.NaN(),
	}
	if det == critical.NoConst {
		res.CritSource = fmt.Sprintf("none: MacKinnon (2010) has no response surface for case %v with N=%d", det, nv)
	} else {
		if res.Crit, err = critical.MacKinnonTauAll(nv, det, df.NObs); err != nil {
			return nil, fmt.Errorf("coint: %w", err)
		}
		res.CritSource = fmt.Sprintf("MacKinnon (2010) response surface, N=%d, case %v, T=%d", nv, det, df.NObs)
	}
	if nv <= critical.MaxPN {
		if res.PValue, err = critical.MacKinnonP(df.Stat, nv, det); err != nil {
			return nil, fmt.Errorf("coint: %w", err)
		}
	}
	return res, nil
}

// EngleGrangerEach runs EngleGranger with each of the series in vars as
// the dependent variable in turn (the others, in their order, as
// regressors), since the test depends on the normalisation.
func EngleGrangerEach(vars [][]float64, det critical.Case, lr unitroot.LagRule) ([]*EGResult, error) {
	if len(vars) < 2 {
		return nil, errors.New("coint: need at least two series")
	}
	out := make([]*EGResult, len(vars))
	for i := range vars {
		x := make([][]float64, 0, len(vars)-1)
		for j, v := range vars {
			if j != i {
				x = append(x, v)
			}
		}
		r, err := EngleGranger(vars[i], x, det, lr)
		if err != nil {
			return nil, fmt.Errorf("coint: with series %d as dependent: %w", i, err)
		}
		out[i] = r
	}
	return out, nil
}

// staticFit regresses y on the deterministic terms of det (constant,
// t, t², t = 1..T) and the columns x.
func staticFit(y []float64, x [][]float64, det critical.Case) (*ols.Fit, error) {
	n := len(y)
	nd := det.Deterministics()
	for j, c := range x {
		if len(c) != n {
			return nil, fmt.Errorf("coint: regressor %d has %d observations, y has %d", j, len(c), n)
		}
	}
	k := nd + len(x)
	if n <= k+2 {
		return nil, fmt.Errorf("coint: %d observations for %d regressors", n, k)
	}
	X := mat.NewDense(n, k, nil)
	for t := 0; t < n; t++ {
		s := float64(t + 1)
		for j := 0; j < nd; j++ {
			X.Set(t, j, math.Pow(s, float64(j)))
		}
		for j, c := range x {
			X.Set(t, nd+j, c[t])
		}
	}
	f, err := ols.Regress(y, X)
	if err != nil {
		var ce *ols.CollinearError
		if errors.As(err, &ce) {
			if ce.Col < nd {
				return nil, fmt.Errorf("coint: deterministic term %d is collinear: %w", ce.Col, err)
			}
			return nil, fmt.Errorf("coint: regressor x[%d] is collinear with the deterministic terms and the regressors before it: %w", ce.Col-nd, err)
		}
		return nil, fmt.Errorf("coint: static regression: %w", err)
	}
	return f, nil
}
