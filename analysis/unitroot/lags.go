package unitroot

import (
	"fmt"
	"strings"

	"github.com/galley-econ/galley/analysis/rules"
)

// Selector says how the number of lagged differences is chosen.
type Selector int

const (
	// Fixed uses LagRule.Lags lagged differences.
	Fixed Selector = iota
	// AIC minimises Akaike's criterion n·ln(SSR/n) + 2K over 0..Max lags
	// (rules.AIC.Total).
	AIC
	// BIC minimises Schwarz's criterion n·ln(SSR/n) + K·ln n over 0..Max
	// lags (rules.BIC.Total).
	BIC
	// TStat is general-to-specific: start from Max and drop the last lag
	// while its |t| < 1.645 (the 10% two-sided normal value).
	TStat
	// MAIC minimises the modified AIC of Ng and Perron (2001) over 0..Max
	// lags (see selectMAIC); it needs a regression without deterministic
	// terms, as on a GLS-detrended series (DFGLS, NgPerron).
	MAIC
)

// String returns "fixed", "aic", "bic", "tstat" or "maic".
func (s Selector) String() string {
	switch s {
	case Fixed:
		return "fixed"
	case AIC:
		return "aic"
	case BIC:
		return "bic"
	case TStat:
		return "tstat"
	case MAIC:
		return "maic"
	}
	return fmt.Sprintf("Selector(%d)", int(s))
}

// ParseSelector reads "fixed", "aic", "bic", "tstat" or "maic"
// (case-insensitive).
func ParseSelector(s string) (Selector, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "fixed":
		return Fixed, nil
	case "aic":
		return AIC, nil
	case "bic", "sic", "schwarz":
		return BIC, nil
	case "tstat", "t":
		return TStat, nil
	case "maic":
		return MAIC, nil
	}
	return 0, fmt.Errorf("unknown lag selector %q (want fixed, aic, bic, tstat or maic)", s)
}

// LagRule fixes or selects the number of lagged differences p.
//
// With Select == Fixed, p = Lags. Otherwise p is chosen in 0..Max; a
// negative Max asks for the default rules.SchwertMax(T) =
// ⌊12·(T/100)^{1/4}⌋ (Schwert 1989, common practice), T the length of
// the series, capped at ⌊T/2⌋ − d − 1 (d deterministic terms) so that the
// comparison sample keeps about half the series.
type LagRule struct {
	Lags   int
	Select Selector
	Max    int
}

// SchwertMax is ⌊12·(T/100)^{1/4}⌋ (Schwert 1989); it is
// rules.SchwertMax, kept here for callers of this package.
func SchwertMax(t int) int {
	return rules.SchwertMax(t)
}

// tStatStop is the standard normal 95% quantile, the two-sided 10% value.
const tStatStop = 1.6448536269514722
