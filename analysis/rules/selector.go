package rules

import (
	"fmt"
	"strings"
)

// Selector says how a lag order (or a number of leads and lags) is set:
// fixed, or chosen by an information criterion over a grid compared on a
// common sample, or by a unit-root test's own rule. Each estimator says
// which selectors it accepts; the criteria are the Criterion formulas of
// this package.
type Selector int

const (
	// SelectFixed uses the order given.
	SelectFixed Selector = iota
	// SelectAIC minimises Akaike's criterion (AIC).
	SelectAIC
	// SelectBIC minimises Schwarz's criterion (BIC).
	SelectBIC
	// SelectTStat is general-to-specific: start from the maximum and drop
	// the last lag while its |t| < 1.645 (the 10% two-sided normal value;
	// common practice for unit-root regressions).
	SelectTStat
	// SelectMAIC minimises the modified AIC of Ng and Perron (2001), for
	// a regression on a GLS-detrended series.
	SelectMAIC
)

// String returns "fixed", "aic", "bic", "tstat" or "maic".
func (s Selector) String() string {
	switch s {
	case SelectFixed:
		return "fixed"
	case SelectAIC:
		return "aic"
	case SelectBIC:
		return "bic"
	case SelectTStat:
		return "tstat"
	case SelectMAIC:
		return "maic"
	}
	return fmt.Sprintf("Selector(%d)", int(s))
}

// ParseSelector reads "fixed", "aic", "bic" (also "sic", "schwarz"),
// "tstat" (also "t") or "maic", case-insensitive.
func ParseSelector(s string) (Selector, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "fixed":
		return SelectFixed, nil
	case "aic":
		return SelectAIC, nil
	case "bic", "sic", "schwarz":
		return SelectBIC, nil
	case "tstat", "t":
		return SelectTStat, nil
	case "maic":
		return SelectMAIC, nil
	}
	return 0, fmt.Errorf("unknown lag selector %q (want fixed, aic, bic, tstat or maic)", s)
}
