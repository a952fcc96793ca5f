package ardl

import (
	"fmt"
	"strings"
)

// Case is one of the five deterministic specifications of Pesaran, Shin
// and Smith (2001), §4: the labels are galley's, the same as those of
// the Johansen cases.
type Case int

const (
	NoDet      Case = iota // n, PSS case I: no intercept, no trend
	RestConst              // rc, case II: restricted intercept, no trend
	Const                  // c, case III: unrestricted intercept, no trend
	RestTrend              // rt, case IV: unrestricted intercept, restricted trend
	ConstTrend             // ct, case V: unrestricted intercept, unrestricted trend
)

var caseLabels = []string{"n", "rc", "c", "rt", "ct"}
var caseRoman = []string{"I", "II", "III", "IV", "V"}

// String returns the label n, rc, c, rt or ct.
func (c Case) String() string {
	if c < NoDet || c > ConstTrend {
		return fmt.Sprintf("Case(%d)", int(c))
	}
	return caseLabels[c]
}

// Roman returns PSS's numbering, I … V.
func (c Case) Roman() string {
	if c < NoDet || c > ConstTrend {
		return "?"
	}
	return caseRoman[c]
}

// Describe is a phrase for notes.
func (c Case) Describe() string {
	switch c {
	case NoDet:
		return "no intercept, no trend"
	case RestConst:
		return "restricted intercept, no trend"
	case Const:
		return "unrestricted intercept, no trend"
	case RestTrend:
		return "unrestricted intercept, restricted trend"
	case ConstTrend:
		return "unrestricted intercept, unrestricted trend"
	}
	return c.String()
}

// ParseCase reads n, rc, c, rt or ct (case-insensitive).
func ParseCase(s string) (Case, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	for i, l := range caseLabels {
		if t == l {
			return Case(i), nil
		}
	}
	return 0, fmt.Errorf("unknown deterministic case %q (want n, rc, c, rt or ct)", s)
}

// HasConst and HasTrend say whether the regression holds an intercept
// and a linear trend.
func (c Case) HasConst() bool { return c != NoDet }
func (c Case) HasTrend() bool { return c == RestTrend || c == ConstTrend }

// Restricted reports whether a deterministic term enters the level
// relation and so the bounds F test: the intercept in case II, the trend
// in case IV.
func (c Case) Restricted() bool { return c == RestConst || c == RestTrend }

// HasT reports whether PSS define the bounds t test in the case (I, III
// and V; Table CII).
func (c Case) HasT() bool { return c == NoDet || c == Const || c == ConstTrend }
