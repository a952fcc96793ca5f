package unitroot

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/critical"
)

// ADFResult is the augmented Dickey–Fuller test of a unit root.
type ADFResult struct {
	Stat       float64          // τ
	PValue     float64          // MacKinnon (1994) asymptotic p-value
	Lags       int              // lagged differences used
	NObs       int              // observations in the test regression
	Crit       []critical.Value // 1%, 5%, 10%
	CritSource string
	Reg        *DF // the test regression
}

// ADF tests H0: γ = 0 (a unit root) against γ < 0 in the augmented
// Dickey–Fuller regression of y (see DickeyFuller; Said and Dickey 1984).
// Critical values are MacKinnon's (2010) response surfaces at T = the
// test regression's number of observations; the p-value is MacKinnon's
// (1994) asymptotic approximation.
func ADF(y []float64, c critical.Case, r LagRule) (*ADFResult, error) {
	reg, err := DickeyFuller(y, c, r)
	if err != nil {
		return nil, err
	}
	return tauResult(reg.Stat, c, reg.NObs, reg.Lags, reg)
}

func tauResult(stat float64, c critical.Case, nobs, lags int, reg *DF) (*ADFResult, error) {
	crit, err := critical.MacKinnonTauAll(1, c, nobs)
	if err != nil {
		return nil, err
	}
	p, err := critical.MacKinnonP(stat, 1, c)
	if err != nil {
		return nil, err
	}
	return &ADFResult{
		Stat: stat, PValue: p, Lags: lags, NObs: nobs, Crit: crit,
		CritSource: fmt.Sprintf("MacKinnon (2010) response surface, T=%d", nobs),
		Reg:        reg,
	}, nil
}
