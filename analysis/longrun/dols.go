package longrun

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/rules"
)

// Selector chooses how the numbers of leads and lags of a DOLS
// regression are set (rules.Selector; DOLS accepts Fixed, AIC and BIC).
type Selector = rules.Selector

const (
	// Fixed uses DOLSSpec.Lags and DOLSSpec.Leads.
	Fixed = rules.SelectFixed
	// AIC minimises ln(SSR/N) + 2K/N over the grid (rules.AIC.PerObs).
	AIC = rules.SelectAIC
	// BIC minimises ln(SSR/N) + K·ln(N)/N over the grid (rules.BIC.PerObs).
	BIC = rules.SelectBIC
)

// DOLSSpec specifies a dynamic OLS regression.
type DOLSSpec struct {
	Det         critical.Case
	Lags, Leads int // with Select == Fixed
	Select      Selector
	// MaxLags and MaxLeads bound the grid 0..MaxLags × 0..MaxLeads
	// searched by AIC or BIC.
	MaxLags, MaxLeads int
	Cov               ols.CovSpec // normally HAC
}

// DOLSResult is a fitted DOLS regression.
type DOLSResult struct {
	Fit   *ols.Fit
	Names []string   // all terms in column order of Fit.X()
	Table []ols.Coef // all terms; p-values from the standard normal
	// LongRun holds β and its block of the chosen covariance.
	LongRun     Coefs
	Lags, Leads int
	// First and Last index (into the input) the first and last
	// observation of the estimation sample.
	First, Last int
	// IC is the criterion value of the chosen model on the common
	// selection sample (NaN when Select == Fixed).
	IC float64
}

// LeadLagName is the term name of Δx_{t+j}: "lag(diff(x),2)",
// "diff(x)", "lead(diff(x),1)" (galley's expression language; see
// ecm.DiffName).
func LeadLagName(x string, j int) string {
	switch {
	case j < 0:
		return fmt.Sprintf("lag(diff(%s),%d)", x, -j)
	case j > 0:
		return fmt.Sprintf("lead(diff(%s),%d)", x, j)
	}
	return "diff(" + x + ")"
}

// DOLS estimates the cointegrating regression by dynamic OLS (Stock and
// Watson 1993; Saikkonen 1991):
//
//	y_t = d_t'δ + x_t'β + Σ_k Σ_{j=−p..q} γ_{kj} Δx_{k,t+j} + e_t,
//
// with p = lags and q = leads, over t = p+1 .. T−1−q (zero-based) so
// that every Δx_{t+j} exists. The leads and lags of Δx soak up the
// correlation between u_t and the innovations of x, so that β̂ has a
// mixed-normal limit and t-ratios built with a long-run (HAC) variance
// are asymptotically normal.
//
// Columns are ordered d_t, x_t, then for each regressor j = −p..q.
//
// With Select AIC or BIC every (p, q) in 0..MaxLags × 0..MaxLeads is
// fitted on the common sample t = MaxLags+1 .. T−1−MaxLeads, the one with
// the smallest criterion is chosen (ties go to the first found, lags
// outer, leads inner, both ascending), and the chosen model is then
// re-estimated on its own, longer sample.
func DOLS(y []float64, x [][]float64, names []string, s DOLSSpec) (*DOLSResult, error) {
	xn, err := checkInput(y, x, names, s.Det)
	if err != nil {
		return nil, fmt.Errorf("dols: %w", err)
	}
	n := len(y)
	p, q := s.Lags, s.Leads
	ic := math.NaN()
	switch s.Select {
	case Fixed:
		if p < 0 || q < 0 {
			return nil, fmt.Errorf("dols: lags and leads must be non-negative, got %d and %d", p, q)
		}
	case AIC, BIC:
		if s.MaxLags < 0 || s.MaxLeads < 0 {
			return nil, fmt.Errorf("dols: maximum lags and leads must be non-negative, got %d and %d", s.MaxLags, s.MaxLeads)
		}
		crit := rules.AIC
		if s.Select == BIC {
			crit = rules.BIC
		}
		first, last := s.MaxLags+1, n-1-s.MaxLeads
		ic = math.Inf(1)
		for a := 0; a <= s.MaxLags; a++ {
			for b := 0; b <= s.MaxLeads; b++ {
				f, _, err := dolsFit(y, x, xn, s.Det, a, b, first, last)
				if err != nil {
					return nil, fmt.Errorf("dols: selection with %d lags and %d leads: %w", a, b, err)
				}
				v := crit.PerObs(math.Log(f.SSR/float64(f.N)), f.K, f.N)
				if v < ic {
					ic, p, q = v, a, b
				}
			}
		}
	default:
		return nil, fmt.Errorf("dols: unknown lead/lag selector %d", s.Select)
	}
	first, last := p+1, n-1-q
	f, all, err := dolsFit(y, x, xn, s.Det, p, q, first, last)
	if err != nil {
		return nil, fmt.Errorf("dols: %w", err)
	}
	if s.Cov.Kind == ols.HAC && s.Cov.Lags >= f.N {
		return nil, fmt.Errorf("dols: HAC lag %d not below the %d observations", s.Cov.Lags, f.N)
	}
	cov := f.Cov(s.Cov)
	nd := s.Det.Deterministics()
	k := len(x)
	return &DOLSResult{
		Fit:   f,
		Names: all,
		Table: f.Table(s.Cov, true),
		LongRun: Coefs{
			Names: xn,
			Coef:  append([]float64(nil), f.Coef[nd:nd+k]...),
			Cov:   subCov(cov, nd, k),
		},
		Lags: p, Leads: q, First: first, Last: last, IC: ic,
	}, nil
}

// dolsFit fits the DOLS regression with p lags and q leads on
// observations first..last.
func dolsFit(y []float64, x [][]float64, xn []string, det critical.Case, p, q, first, last int) (*ols.Fit, []string, error) {
	if first < p+1 || last > len(y)-1-q {
		return nil, nil, errors.New("sample outside the data")
	}
	m := last - first + 1
	nd := det.Deterministics()
	k := len(x)
	cols := nd + k + k*(p+q+1)
	if m <= cols {
		return nil, nil, fmt.Errorf("%d observations for %d regressors", max(m, 0), cols)
	}
	names := append(detNames(det), xn...)
	for kk := range x {
		for j := -p; j <= q; j++ {
			names = append(names, LeadLagName(xn[kk], j))
		}
	}
	X := mat.NewDense(m, cols, nil)
	yy := make([]float64, m)
	for i := 0; i < m; i++ {
		t := first + i
		yy[i] = y[t]
		c := 0
		for j := 0; j < nd; j++ {
			X.Set(i, c, detValue(j, t))
			c++
		}
		for _, xc := range x {
			X.Set(i, c, xc[t])
			c++
		}
		for _, xc := range x {
			for j := -p; j <= q; j++ {
				X.Set(i, c, xc[t+j]-xc[t+j-1])
				c++
			}
		}
	}
	f, err := ols.Regress(yy, X)
	if err != nil {
		var ce *ols.CollinearError
		if errors.As(err, &ce) {
			return nil, nil, fmt.Errorf("term %q (column %d) is collinear with the terms before it", names[ce.Col], ce.Col)
		}
		return nil, nil, err
	}
	return f, names, nil
}
