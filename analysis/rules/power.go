package rules

import "math"

// PowerRule is the lag rule L(T) = ⌊C·(T/100)^P⌋ for a sample of T
// observations.
type PowerRule struct {
	C, P float64
}

// The power rules in use. The values are common practice; the sources are
// cited from memory.
var (
	// Schwert12 is ⌊12·(T/100)^{1/4}⌋, Schwert's (1989) l12: the usual
	// maximum number of lagged differences in a unit-root regression, and
	// the larger of the two common Newey–West truncation lags.
	Schwert12 = PowerRule{C: 12, P: 0.25}
	// Schwert4 is ⌊4·(T/100)^{1/4}⌋, Schwert's (1989) l4: the smaller of
	// the two common Newey–West truncation lags.
	Schwert4 = PowerRule{C: 4, P: 0.25}
	// NeweyWest94Bartlett is ⌊4·(T/100)^{2/9}⌋, the preliminary lag n of
	// Newey and West (1994) for the Bartlett kernel, also used on its own
	// as a Bartlett HAC truncation lag (common practice).
	NeweyWest94Bartlett = PowerRule{C: 4, P: 2.0 / 9}
	// NeweyWest94QS is ⌊4·(T/100)^{2/25}⌋, the preliminary lag n of Newey
	// and West (1994) for the quadratic-spectral kernel.
	NeweyWest94QS = PowerRule{C: 4, P: 2.0 / 25}
)

// Lag returns ⌊C·(T/100)^P⌋. It returns 0 when T ≤ 0 or when the value
// is not a finite non-negative number (a rule with C < 0 or a NaN field),
// and at most math.MaxInt32.
func (r PowerRule) Lag(t int) int {
	if t <= 0 {
		return 0
	}
	v := math.Floor(r.C * math.Pow(float64(t)/100, r.P))
	if !(v >= 0) {
		return 0
	}
	if v > math.MaxInt32 {
		return math.MaxInt32
	}
	return int(v)
}

// SchwertMax is Schwert12.Lag(t) = ⌊12·(T/100)^{1/4}⌋ (Schwert 1989), the
// default largest lag order searched by a criterion (common practice).
func SchwertMax(t int) int {
	return Schwert12.Lag(t)
}
