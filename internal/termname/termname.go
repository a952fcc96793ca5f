// Package termname translates term names written in the suffix notation
// galley used before (and that statsmodels-style fixture scripts still
// write) — "ect(-1)", "d.x", "d.x(-2)", "d.x(+1)", "x(-1)" — into
// galley's term names, which are its own expression language without
// spaces: "lag(ect,1)", "diff(x)", "lag(diff(x),2)", "lead(diff(x),1)",
// "lag(x,1)". It serves the fixtures' tests and the hint a manuscript
// with an old spelling gets.
package termname

import (
	"regexp"
	"strconv"
	"strings"
)

// FromSuffix translates s; ok is false when s is not in the suffix
// notation (it is returned as it is).
func FromSuffix(s string) (name string, ok bool) {
	body, k := s, 0
	if m := suffix.FindStringSubmatch(s); m != nil {
		body = m[1]
		k, _ = strconv.Atoi(strings.TrimPrefix(m[2], "+"))
	}
	v, diff := strings.CutPrefix(body, "d.")
	if !diff && k == 0 {
		return s, false
	}
	if diff {
		body = "diff(" + v + ")"
	}
	switch {
	case k < 0:
		return "lag(" + body + "," + strconv.Itoa(-k) + ")", true
	case k > 0:
		return "lead(" + body + "," + strconv.Itoa(k) + ")", true
	}
	return body, true
}

var suffix = regexp.MustCompile(`^(.*)\(([-+]\d+)\)$`)

// Balanced reports whether s opens as many parentheses as it closes,
// never closing more than it has opened.
func Balanced(s string) bool {
	d := 0
	for _, r := range s {
		switch r {
		case '(':
			d++
		case ')':
			if d--; d < 0 {
				return false
			}
		}
	}
	return d == 0
}
