package critical

import (
	"fmt"
	"strings"
)

// Case is the deterministic part of a Dickey–Fuller type regression, in
// MacKinnon's labelling: n (none), c (constant), ct (constant and linear
// trend), ctt (constant, linear and quadratic trend).
type Case int

const (
	NoConst      Case = iota // n: no deterministic terms
	Const                    // c: constant
	ConstTrend               // ct: constant and linear trend
	ConstTrendSq             // ctt: constant, linear and quadratic trend
)

// String returns MacKinnon's label: "n", "c", "ct" or "ctt".
func (c Case) String() string {
	switch c {
	case NoConst:
		return "n"
	case Const:
		return "c"
	case ConstTrend:
		return "ct"
	case ConstTrendSq:
		return "ctt"
	}
	return fmt.Sprintf("Case(%d)", int(c))
}

// Deterministics is the number of deterministic regressors of the case
// (0 for n up to 3 for ctt).
func (c Case) Deterministics() int { return int(c) }

func (c Case) valid() bool { return c >= NoConst && c <= ConstTrendSq }

// ParseCase reads a case label, case-insensitively: n|c|ct|ctt or the
// words none|constant|trend|quadratic.
func ParseCase(s string) (Case, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "n", "none":
		return NoConst, nil
	case "c", "constant":
		return Const, nil
	case "ct", "trend":
		return ConstTrend, nil
	case "ctt", "quadratic":
		return ConstTrendSq, nil
	}
	return 0, fmt.Errorf("unknown deterministic case %q (want n, c, ct or ctt, or none, constant, trend or quadratic)", s)
}

// Value is a critical value at a significance level (0.05 for 5%).
type Value struct {
	Level float64
	Value float64
}

// levelIndex maps a significance level to a column of a table whose
// levels are given, within 1e-9.
func levelIndex(level float64, levels []float64) (int, error) {
	for i, l := range levels {
		if d := level - l; d < 1e-9 && d > -1e-9 {
			return i, nil
		}
	}
	return 0, fmt.Errorf("significance level %g is not tabulated (have %v)", level, levels)
}
