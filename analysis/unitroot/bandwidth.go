package unitroot

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/ols"
	"github.com/galley-econ/galley/analysis/rules"
	"gonum.org/v1/gonum/mat"
)

// BandwidthRule says how the Bartlett truncation lag L of a long-run
// variance is set.
type BandwidthRule int

const (
	// Schwert4 is L = ⌊4·(n/100)^{1/4}⌋ (rules.Schwert4; common practice
	// after Schwert 1989).
	Schwert4 BandwidthRule = iota
	// Schwert12 is L = ⌊12·(n/100)^{1/4}⌋ (rules.Schwert12).
	Schwert12
	// Given is L = Bandwidth.Lags.
	Given
	// AutoNeweyWest is L = ⌊b⌋ with b the automatic Bartlett bandwidth of
	// Newey and West (1994) of the residuals e, preliminary lag
	// ⌊4·(n/100)^{2/9}⌋: rules.NeweyWestBandwidth(e, rules.Bartlett,
	// rules.NeweyWest94Bartlett.Lag(n)), at most n − 1.
	AutoNeweyWest
	// AutoHobijn is L = ⌊b⌋ with b the Bartlett bandwidth of Hobijn,
	// Franses and Ooms (1998), preliminary lag ⌊n^{2/9}⌋:
	// rules.HobijnBandwidth(e), at most n − 1 (the lag of statsmodels'
	// kpss(nlags="auto")).
	AutoHobijn
)

// Bandwidth is the truncation lag of the Newey–West (Bartlett) long-run
// variance used by PP and KPSS.
type Bandwidth struct {
	Rule BandwidthRule
	Lags int // L when Rule == Given
}

// ParseBandwidth reads, case-insensitive,
//
//	"rule4"      Schwert4,  ⌊4·(n/100)^{1/4}⌋,
//	"rule12"     Schwert12, ⌊12·(n/100)^{1/4}⌋,
//	"auto"       AutoNeweyWest, Newey and West (1994),
//	"auto-hfo"   AutoHobijn, Hobijn, Franses and Ooms (1998),
//
// or a non-negative whole number (Given). The former spellings "short"
// and "long" are refused with an error that names rule4 and rule12.
func ParseBandwidth(s string) (Bandwidth, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	if now, ok := formerBandwidths[t]; ok {
		return Bandwidth{}, fmt.Errorf("bandwidth %q is now written %s", s, now)
	}
	switch t {
	case "rule4":
		return Bandwidth{Rule: Schwert4}, nil
	case "rule12":
		return Bandwidth{Rule: Schwert12}, nil
	case "auto":
		return Bandwidth{Rule: AutoNeweyWest}, nil
	case "auto-hfo":
		return Bandwidth{Rule: AutoHobijn}, nil
	}
	l, err := strconv.Atoi(t)
	if err != nil || l < 0 {
		return Bandwidth{}, fmt.Errorf("unknown bandwidth %q (want rule4, rule12, auto, auto-hfo or a non-negative whole number)", s)
	}
	return Bandwidth{Rule: Given, Lags: l}, nil
}

// formerBandwidths are spellings ParseBandwidth no longer reads, with
// the ones that replace them.
var formerBandwidths = map[string]string{
	"short": "rule4 (⌊4(T/100)^¼⌋)",
	"long":  "rule12 (⌊12(T/100)^¼⌋)",
}

// String returns "rule4", "rule12", "auto", "auto-hfo" or the number, the
// spellings ParseBandwidth reads.
func (b Bandwidth) String() string {
	switch b.Rule {
	case Schwert4:
		return "rule4"
	case Schwert12:
		return "rule12"
	case AutoNeweyWest:
		return "auto"
	case AutoHobijn:
		return "auto-hfo"
	}
	return strconv.Itoa(b.Lags)
}

// Auto reports whether the lag depends on the residuals (AutoNeweyWest,
// AutoHobijn) rather than on their number alone.
func (b Bandwidth) Auto() bool {
	return b.Rule == AutoNeweyWest || b.Rule == AutoHobijn
}

// Resolve returns L for a long-run variance computed from n observations;
// for the automatic rules, which need the residuals, it returns an error
// (use ResolveFor).
func (b Bandwidth) Resolve(n int) (int, error) {
	var l int
	switch b.Rule {
	case Schwert4:
		l = rules.Schwert4.Lag(n)
	case Schwert12:
		l = rules.Schwert12.Lag(n)
	case Given:
		l = b.Lags
	case AutoNeweyWest, AutoHobijn:
		return 0, fmt.Errorf("unitroot: bandwidth %s is chosen from the residuals, not from the number of observations alone", b)
	default:
		return 0, fmt.Errorf("unitroot: unknown bandwidth rule %d", int(b.Rule))
	}
	if l < 0 {
		return 0, fmt.Errorf("unitroot: bandwidth %d is negative", l)
	}
	if l >= n {
		return 0, fmt.Errorf("unitroot: bandwidth %d needs more than %d observations", l, n)
	}
	return l, nil
}

// ResolveFor returns L for the long-run variance of the residuals e: for
// the automatic rules ⌊b⌋ with b from rules.NeweyWestBandwidth or
// rules.HobijnBandwidth (see the constants), capped at n − 1 as
// statsmodels' kpss caps its automatic lag; for the other rules
// Resolve(len(e)).
func (b Bandwidth) ResolveFor(e []float64) (int, error) {
	n := len(e)
	var bw float64
	var err error
	switch b.Rule {
	case AutoNeweyWest:
		bw, err = rules.NeweyWestBandwidth(e, rules.Bartlett, rules.NeweyWest94Bartlett.Lag(n))
	case AutoHobijn:
		bw, err = rules.HobijnBandwidth(e)
	default:
		return b.Resolve(n)
	}
	if err != nil {
		return 0, fmt.Errorf("unitroot: automatic bandwidth: %w", err)
	}
	l := n - 1
	if bw < float64(l) {
		l = int(math.Floor(bw))
	}
	return l, nil
}

// longRunVar returns the Newey–West (1987) Bartlett estimate
//
//	λ² = γ0 + 2 Σ_{j=1..L} (1 − j/(L+1)) γ_j,   γ_j = (1/n) Σ_{t>j} e_t e_{t−j},
//
// together with γ0.
func longRunVar(e []float64, l int) (lrv, gamma0 float64) {
	n := len(e)
	u := mat.NewDense(n, 1, append([]float64(nil), e...))
	s := ols.BartlettLRV(u, l).At(0, 0)
	var g0 float64
	for _, v := range e {
		g0 += v * v
	}
	return s / float64(n), g0 / float64(n)
}
