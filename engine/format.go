package engine

import (
	"math"
	"strconv"
	"strings"
)

// numText formats a number cell's digits with an ASCII minus, and
// reports whether it is negative. NaN is "·" so that a table never shows
// a misleading number.
func numText(c Cell) (string, bool) {
	if math.IsNaN(c.Num) {
		return "n/a", false
	}
	if math.IsInf(c.Num, 0) {
		if c.Num > 0 {
			return "∞", false
		}
		return "∞", true
	}
	s := fixNegZero(strconv.FormatFloat(c.Num, 'f', c.Dec, 64))
	if strings.HasPrefix(s, "-") {
		return s[1:], true
	}
	return s, false
}

func stars(n int) string { return strings.Repeat("*", n) }
