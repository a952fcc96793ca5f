package unitroot

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/galley-econ/galley/analysis/ols"
	"gonum.org/v1/gonum/mat"
)

// BandwidthRule says how the Bartlett truncation lag L of a long-run
// variance is set.
type BandwidthRule int

const (
	// Short is L = ⌊4·(n/100)^{1/4}⌋ (common practice after Schwert 1989).
	Short BandwidthRule = iota
	// Long is L = ⌊12·(n/100)^{1/4}⌋.
	Long
	// Given is L = Bandwidth.Lags.
	Given
)

// Bandwidth is the truncation lag of the Newey–West (Bartlett) long-run
// variance used by PP and KPSS.
type Bandwidth struct {
	Rule BandwidthRule
	Lags int // L when Rule == Given
}

// ParseBandwidth reads "short", "long" or a non-negative whole number.
func ParseBandwidth(s string) (Bandwidth, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	switch t {
	case "short":
		return Bandwidth{Rule: Short}, nil
	case "long":
		return Bandwidth{Rule: Long}, nil
	}
	l, err := strconv.Atoi(t)
	if err != nil || l < 0 {
		return Bandwidth{}, fmt.Errorf("unknown bandwidth %q (want short, long or a non-negative whole number)", s)
	}
	return Bandwidth{Rule: Given, Lags: l}, nil
}

// String returns "short", "long" or the number.
func (b Bandwidth) String() string {
	switch b.Rule {
	case Short:
		return "short"
	case Long:
		return "long"
	}
	return strconv.Itoa(b.Lags)
}

// Resolve returns L for a long-run variance computed from n observations.
func (b Bandwidth) Resolve(n int) (int, error) {
	var l int
	switch b.Rule {
	case Short:
		l = int(math.Floor(4 * math.Pow(float64(n)/100, 0.25)))
	case Long:
		l = int(math.Floor(12 * math.Pow(float64(n)/100, 0.25)))
	case Given:
		l = b.Lags
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
