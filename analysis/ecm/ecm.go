// Package ecm fits single-equation error-correction models by least
// squares.
//
// The model (Engle and Granger 1987; Davidson, Hendry, Srba and Yeo 1978)
// is
//
//	Δy_t = μ + α z_{t−1} + Σ_{i=1..p} φ_i Δy_{t−i}
//	       + Σ_{k} Σ_{j=0..q} θ_{kj} Δx_{k,t−j} + w_t'δ + ε_t,
//
// where z_t is the equilibrium error (the residual of a long-run relation
// estimated beforehand), x_k are the regressors in levels and w_t are
// optional extra stationary regressors entering at time t. α is the
// speed of adjustment towards equilibrium; error correction requires
// −2 < α < 0.
//
// Because the regressors are stationary, t-ratios are compared with the
// standard normal distribution.
package ecm

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/ols"
)

// Input holds the series of an error-correction model, all aligned on the
// same time index 0..T−1.
type Input struct {
	Y     []float64   // dependent variable in levels
	YName string      // name used in term names; "y" when empty
	X     [][]float64 // regressors in levels, each of length T
	// XNames name the regressors in term names; x1, x2, … when empty.
	XNames []string
	// ECT is the equilibrium error z_t at time t (for example the
	// residual of a long-run regression); it enters lagged once. It may
	// be NaN at the start or the end, where the long-run relation is not
	// defined; those observations are dropped.
	ECT []float64
	// Extra are stationary regressors entering at time t, each of length
	// T, named by ExtraNames (extra1, … when empty). NaN at the start or
	// the end drops those observations.
	Extra      [][]float64
	ExtraNames []string
}

// Spec chooses the lag orders and the covariance estimator.
type Spec struct {
	YLags int         // p: lags Δy_{t−1..t−p} of the dependent variable
	XLags int         // q: Δx_{t..t−q} for every regressor
	Cov   ols.CovSpec // standard errors
}

// Model is a fitted error-correction model.
type Model struct {
	Fit   *ols.Fit
	Names []string   // term names, in the column order of Fit.X()
	Coef  []ols.Coef // estimates, standard errors, t-ratios, normal p-values
	Cov   ols.CovSpec
	// First and Last are the indices (into the inputs) of the first and
	// last observation of Δy_t in the estimation sample.
	First, Last int
	Adjust      Adjustment
}

// Term names, in galley's expression language without spaces: the
// difference of v is "diff(v)", its lag j "lag(diff(v),j)", and the
// equilibrium error lagged once "lag(ect,1)". Tables typeset them
// (Δv_{t−j}); see engine.TermLabel.
const (
	ConstName = "const"
	ECTName   = "lag(ect,1)"
)

// DiffName is the term name of Δv_{t−lag}: "diff(v)" or "lag(diff(v),lag)".
func DiffName(v string, lag int) string {
	if lag == 0 {
		return "diff(" + v + ")"
	}
	return fmt.Sprintf("lag(diff(%s),%d)", v, lag)
}

// Estimate builds the error-correction regression and fits it by least
// squares with the covariance estimator s.Cov. The sample is the longest
// run of observations t ≥ 1 + max(p, q) for which every term is finite;
// a missing value inside that run is an error.
func Estimate(in Input, s Spec) (*Model, error) {
	n := len(in.Y)
	if n == 0 {
		return nil, errors.New("ecm: no observations")
	}
	if s.YLags < 0 || s.XLags < 0 {
		return nil, fmt.Errorf("ecm: lag orders must be non-negative, got p=%d q=%d", s.YLags, s.XLags)
	}
	if len(in.ECT) != n {
		return nil, fmt.Errorf("ecm: equilibrium error has %d observations, y has %d", len(in.ECT), n)
	}
	for k, x := range in.X {
		if len(x) != n {
			return nil, fmt.Errorf("ecm: regressor %d has %d observations, y has %d", k, len(x), n)
		}
	}
	for k, x := range in.Extra {
		if len(x) != n {
			return nil, fmt.Errorf("ecm: extra regressor %d has %d observations, y has %d", k, len(x), n)
		}
	}
	if in.XNames != nil && len(in.XNames) != len(in.X) {
		return nil, fmt.Errorf("ecm: %d regressor names for %d regressors", len(in.XNames), len(in.X))
	}
	if in.ExtraNames != nil && len(in.ExtraNames) != len(in.Extra) {
		return nil, fmt.Errorf("ecm: %d extra names for %d extra regressors", len(in.ExtraNames), len(in.Extra))
	}

	// Columns as functions of t.
	type column struct {
		name string
		at   func(t int) float64
	}
	diff := func(v []float64, lag int) func(int) float64 {
		return func(t int) float64 { return v[t-lag] - v[t-lag-1] }
	}
	yname := in.YName
	if yname == "" {
		yname = "y"
	}
	cols := []column{
		{ConstName, func(int) float64 { return 1 }},
		{ECTName, func(t int) float64 { return in.ECT[t-1] }},
	}
	for i := 1; i <= s.YLags; i++ {
		cols = append(cols, column{DiffName(yname, i), diff(in.Y, i)})
	}
	for k, x := range in.X {
		name := fmt.Sprintf("x%d", k+1)
		if in.XNames != nil {
			name = in.XNames[k]
		}
		for j := 0; j <= s.XLags; j++ {
			cols = append(cols, column{DiffName(name, j), diff(x, j)})
		}
	}
	for k, w := range in.Extra {
		name := fmt.Sprintf("extra%d", k+1)
		if in.ExtraNames != nil {
			name = in.ExtraNames[k]
		}
		w := w
		cols = append(cols, column{name, func(t int) float64 { return w[t] }})
	}
	dy := diff(in.Y, 0)

	start := 1 + max(s.YLags, s.XLags)
	ok := func(t int) bool {
		if !finite(dy(t)) {
			return false
		}
		for _, c := range cols {
			if !finite(c.at(t)) {
				return false
			}
		}
		return true
	}
	first := -1
	for t := start; t < n; t++ {
		if ok(t) {
			first = t
			break
		}
	}
	if first < 0 {
		return nil, fmt.Errorf("ecm: no complete observation (need t ≥ %d with every term finite, T=%d)", start, n)
	}
	last := first
	for last+1 < n && ok(last+1) {
		last++
	}
	for t := last + 1; t < n; t++ {
		if ok(t) {
			return nil, fmt.Errorf("ecm: missing value inside the sample at observation %d", last+1)
		}
	}
	m := last - first + 1
	k := len(cols)
	if m <= k {
		return nil, fmt.Errorf("ecm: %d usable observations for %d terms", m, k)
	}
	y := make([]float64, m)
	x := mat.NewDense(m, k, nil)
	names := make([]string, k)
	for j, c := range cols {
		names[j] = c.name
	}
	for i := 0; i < m; i++ {
		t := first + i
		y[i] = dy(t)
		for j, c := range cols {
			x.Set(i, j, c.at(t))
		}
	}
	fit, err := ols.Regress(y, x)
	if err != nil {
		var ce *ols.CollinearError
		if errors.As(err, &ce) {
			return nil, fmt.Errorf("ecm: term %q is collinear with the terms before it", names[ce.Col])
		}
		return nil, fmt.Errorf("ecm: %w", err)
	}
	if s.Cov.Kind == ols.HAC && s.Cov.Lags >= m {
		return nil, fmt.Errorf("ecm: HAC lag %d not below the %d observations", s.Cov.Lags, m)
	}
	tab := fit.Table(s.Cov, true)
	return &Model{
		Fit: fit, Names: names, Coef: tab, Cov: s.Cov,
		First: first, Last: last,
		Adjust: NewAdjustment(tab[1].Est, tab[1].SE),
	}, nil
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
