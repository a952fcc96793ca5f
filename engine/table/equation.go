package table

import (
	"fmt"
	"math"
	"strings"
)

// Equation is an estimated equation in neutral form: the dependent
// variable, then each term's estimate with a number beneath it (its
// standard error or t-ratio, in parentheses), the way applied papers
// write a fitted model. Symbols are TeX math; every writer typesets the
// equation from TeX().
type Equation struct {
	LHS   string // TeX of the dependent variable
	Terms []EqTerm
	// Below names what is under each estimate ("standard errors", "t-ratios").
	Below string
	// Stats is a line of summary statistics under the equation, as TeX
	// math ("N = 262,\ R^2 = 0.31").
	Stats string
	Notes []string
}

// EqTerm is one term of an estimated equation: the estimate, the number
// beneath it (NaN: none), decimals, and the regressor's TeX ("" for the
// constant).
type EqTerm struct {
	Est, Below float64
	Dec        int
	Stars      int
	Symbol     string
}

// TeX is the equation as display math (amsmath's \underset puts each
// standard error beneath its estimate): y = 0.12 + 0.80 x …
func (e *Equation) TeX() string {
	var b strings.Builder
	b.WriteString(e.LHS + " = ")
	for i, t := range e.Terms {
		est := t.Est
		if i > 0 || est < 0 {
			if est < 0 {
				b.WriteString(" - ")
			} else {
				b.WriteString(" + ")
			}
			est = math.Abs(est)
		}
		num := FixNegZero(fmt.Sprintf("%.*f", t.Dec, est))
		if t.Stars > 0 {
			num += "^{" + strings.Repeat(`\ast`, t.Stars) + "}"
		}
		if !math.IsNaN(t.Below) {
			below := FixNegZero(fmt.Sprintf("%.*f", t.Dec, t.Below))
			b.WriteString(`\underset{(` + below + `)}{` + num + `}`)
		} else {
			b.WriteString(num)
		}
		if t.Symbol != "" {
			b.WriteString(`\,` + t.Symbol)
		}
	}
	return b.String()
}
