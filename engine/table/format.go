package table

import (
	"math"
	"strconv"
	"strings"
)

// NumText formats a number cell's digits with an ASCII minus, and
// reports whether it is negative. NaN is "·" so that a table never shows
// a misleading number.
func NumText(c Cell) (string, bool) {
	if math.IsNaN(c.Num) {
		return "n/a", false
	}
	if math.IsInf(c.Num, 0) {
		if c.Num > 0 {
			return "∞", false
		}
		return "∞", true
	}
	s := FixNegZero(strconv.FormatFloat(c.Num, 'f', c.Dec, 64))
	if strings.HasPrefix(s, "-") {
		return s[1:], true
	}
	return s, false
}

func Stars(n int) string { return strings.Repeat("*", n) }

// FixNegZero turns "-0.000" into "0.000".
func FixNegZero(s string) string {
	if strings.HasPrefix(s, "-") && strings.Trim(s[1:], "0.") == "" {
		return s[1:]
	}
	return s
}
