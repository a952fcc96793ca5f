package unitroot

import (
	"github.com/galley-econ/galley/analysis/rules"
)

// Selector says how the number of lagged differences is chosen: the
// one selector type of the analysis packages (rules.Selector).
type Selector = rules.Selector

// The selectors a unit-root regression accepts.
const (
	// Fixed uses LagRule.Lags lagged differences.
	Fixed = rules.SelectFixed
	// AIC minimises Akaike's criterion n·ln(SSR/n) + 2K over 0..Max lags
	// (rules.AIC.Total).
	AIC = rules.SelectAIC
	// BIC minimises Schwarz's criterion n·ln(SSR/n) + K·ln n over 0..Max
	// lags (rules.BIC.Total).
	BIC = rules.SelectBIC
	// TStat is general-to-specific: start from Max and drop the last lag
	// while its |t| < 1.645 (the 10% two-sided normal value).
	TStat = rules.SelectTStat
	// MAIC minimises the modified AIC of Ng and Perron (2001) over 0..Max
	// lags (see selectMAIC); it needs a regression without deterministic
	// terms, as on a GLS-detrended series (DFGLS, NgPerron).
	MAIC = rules.SelectMAIC
)

// ParseSelector reads a selector name (rules.ParseSelector).
func ParseSelector(s string) (Selector, error) { return rules.ParseSelector(s) }

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
