package johansen

import (
	"fmt"
	"strings"
)

// Case is the deterministic specification of the VECM, in the usual order of
// the five standard cases (Johansen 1995, §5.7; Osterwald-Lenum 1992).
type Case int

const (
	// N has no deterministic terms: Δy_t = αβ'y_{t−1} + ... + ε_t.
	N Case = iota
	// RC restricts a constant to the cointegrating space:
	// Δy_t = α(β'y_{t−1} + ρ₀) + ... + ε_t.
	RC
	// C has an unrestricted constant: Δy_t = αβ'y_{t−1} + ... + μ₀ + ε_t.
	C
	// RT has an unrestricted constant and a trend restricted to the
	// cointegrating space: Δy_t = α(β'y_{t−1} + ρ₁t) + ... + μ₀ + ε_t.
	RT
	// CT has an unrestricted constant and trend:
	// Δy_t = αβ'y_{t−1} + ... + μ₀ + μ₁t + ε_t.
	CT
)

var caseNames = [...]string{"n", "rc", "c", "rt", "ct"}

// String returns the short name n, rc, c, rt or ct.
func (c Case) String() string {
	if c < N || c > CT {
		return fmt.Sprintf("Case(%d)", int(c))
	}
	return caseNames[c]
}

// ParseCase reads n, rc, c, rt or ct (case-insensitive, spaces trimmed).
func ParseCase(s string) (Case, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	for i, n := range caseNames {
		if t == n {
			return Case(i), nil
		}
	}
	return 0, fmt.Errorf("johansen: unknown deterministic case %q (want n, rc, c, rt or ct)", s)
}

func (c Case) valid() bool { return c >= N && c <= CT }

// restricted is the number of deterministic terms inside the cointegrating
// relations (0 or 1).
func (c Case) restricted() int {
	if c == RC || c == RT {
		return 1
	}
	return 0
}

// unrestricted is the number of deterministic regressors outside the
// cointegrating relations (constant, then trend).
func (c Case) unrestricted() int {
	switch c {
	case C, RT:
		return 1
	case CT:
		return 2
	}
	return 0
}
