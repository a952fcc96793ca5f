package series

import (
	"strconv"
	"strings"
)

// Expr is a parsed series expression, such as dlog(gdp) or
// lag(r, 1) - 100*diff(log(p), 4). Build one with ParseExpr.
type Expr interface {
	// String is the canonical form: one space around + - * /, none
	// around ^, "f(x, k)" for calls, the fewest parentheses that keep
	// the meaning, backquotes around column names that need them.
	// ParseExpr(e.String()) gives an equal expression.
	String() string
	// Columns lists the column names the expression reads, in order of
	// first appearance, each once.
	Columns() []string

	prec() int // binding strength, for String
	walk(fn func(Expr))
}

// Precedences, weakest first.
const (
	precSum   = 1 // a + b, a - b
	precProd  = 2 // a * b, a / b
	precUnary = 3 // -a
	precPow   = 4 // a ^ b
	precAtom  = 5 // column, number, call, (…)
)

// ColumnRef is a column of the frame.
type ColumnRef struct{ Name string }

// Number is a numeric constant.
type Number struct{ Value float64 }

// Neg is unary minus.
type Neg struct{ X Expr }

// Binary is X Op Y with Op one of + - * / ^.
type Binary struct {
	Op   byte
	X, Y Expr
}

// Call is a function applied to a series, with an integer parameter
// for diff, lag and sdiff (K; 0 when the function has none).
type Call struct {
	Func string // log, exp, abs, sqrt, diff, dlog, lag, sdiff
	X    Expr
	K    int
}

func (ColumnRef) prec() int { return precAtom }
func (Number) prec() int    { return precAtom }
func (Neg) prec() int       { return precUnary }
func (Call) prec() int      { return precAtom }
func (b Binary) prec() int {
	switch b.Op {
	case '+', '-':
		return precSum
	case '*', '/':
		return precProd
	}
	return precPow
}

func (e ColumnRef) walk(fn func(Expr)) { fn(e) }
func (e Number) walk(fn func(Expr))    { fn(e) }
func (e Neg) walk(fn func(Expr))       { fn(e); e.X.walk(fn) }
func (e Binary) walk(fn func(Expr))    { fn(e); e.X.walk(fn); e.Y.walk(fn) }
func (e Call) walk(fn func(Expr))      { fn(e); e.X.walk(fn) }

func (e ColumnRef) String() string {
	if plainName(e.Name) {
		return e.Name
	}
	return "`" + strings.ReplaceAll(e.Name, "`", "``") + "`"
}

func (e Number) String() string {
	return strconv.FormatFloat(e.Value, 'g', -1, 64)
}

func (e Neg) String() string { return "-" + wrap(e.X, precUnary, false) }

func (e Binary) String() string {
	p := e.prec()
	if e.Op == '^' {
		// right-associative: a^b^c = a^(b^c); the base needs
		// parentheses unless it is an atom.
		return wrap(e.X, precAtom, false) + "^" + wrap(e.Y, precUnary, false)
	}
	return wrap(e.X, p, false) + " " + string(e.Op) + " " + wrap(e.Y, p, true)
}

func (e Call) String() string {
	switch e.Func {
	case "lag":
		return "lag(" + e.X.String() + ", " + strconv.Itoa(e.K) + ")"
	case "sdiff":
		return "sdiff(" + e.X.String() + ", " + strconv.Itoa(e.K) + ")"
	case "diff":
		if e.K != 1 {
			return "diff(" + e.X.String() + ", " + strconv.Itoa(e.K) + ")"
		}
	}
	return e.Func + "(" + e.X.String() + ")"
}

// wrap formats x as an operand that must bind at least as strongly as
// p (strictly more strongly if right, for left-associative operators).
func wrap(x Expr, p int, right bool) string {
	q := x.prec()
	if q < p || (right && q == p) {
		return "(" + x.String() + ")"
	}
	return x.String()
}

func columns(e Expr) []string {
	var out []string
	seen := map[string]bool{}
	e.walk(func(x Expr) {
		if c, ok := x.(ColumnRef); ok && !seen[c.Name] {
			seen[c.Name] = true
			out = append(out, c.Name)
		}
	})
	return out
}

func (e ColumnRef) Columns() []string { return columns(e) }
func (e Number) Columns() []string    { return nil }
func (e Neg) Columns() []string       { return columns(e) }
func (e Binary) Columns() []string    { return columns(e) }
func (e Call) Columns() []string      { return columns(e) }

// plainName reports whether a column name can be written without
// backquotes: a letter or underscore, then letters, digits, underscores
// and dots.
func plainName(s string) bool {
	if s == "" {
		return false
	}
	for i, r := range s {
		switch {
		case r == '_' || isLetter(r):
		case i > 0 && (r == '.' || (r >= '0' && r <= '9')):
		default:
			return false
		}
	}
	return true
}

func isLetter(r rune) bool {
	return (r >= 'a' && r <= 'z') || (r >= 'A' && r <= 'Z')
}
