package series

import (
	"fmt"
	"math"
)

// parseValue reads one data cell. Missing values (an empty cell, NA, .
// or NaN in any case) give NaN. Anything that is not a
// plain decimal number (optional sign, digits with an optional decimal
// point, optional exponent) is refused, as are infinite values and
// numbers too large for float64. It does not allocate unless it fails.
func parseValue(s string) (float64, error) {
	s = trimSpace(s)
	if isMissing(s) {
		return math.NaN(), nil
	}
	v, plain, err := plainNumber(s)
	if !plain {
		if isInfText(s) {
			return 0, fmt.Errorf("infinite value %q (write an empty cell or NA for a missing value)", s)
		}
		return 0, fmt.Errorf("not a number: %q", clip(s, 40))
	}
	if err != nil {
		return 0, fmt.Errorf("value %s is too large for a 64-bit float", clip(s, 40))
	}
	return v, nil
}

// isMissing reports whether s is one of the missing-value marks.
func isMissing(s string) bool {
	switch len(s) {
	case 0:
		return true
	case 1:
		return s == "."
	case 2:
		return (s[0]|0x20) == 'n' && (s[1]|0x20) == 'a'
	case 3:
		return (s[0]|0x20) == 'n' && (s[1]|0x20) == 'a' && (s[2]|0x20) == 'n'
	}
	return false
}

// isInfText reports whether s spells an infinity (inf, +Infinity, …).
func isInfText(s string) bool {
	if s != "" && (s[0] == '+' || s[0] == '-') {
		s = s[1:]
	}
	return equalFold(s, "inf") || equalFold(s, "infinity")
}

func equalFold(s, lower string) bool {
	if len(s) != len(lower) {
		return false
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		if 'A' <= c && c <= 'Z' {
			c += 'a' - 'A'
		}
		if c != lower[i] {
			return false
		}
	}
	return true
}
