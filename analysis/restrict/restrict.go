// Package restrict reads linear restrictions Rθ = r on named
// coefficients θ, written as equations such as "log(fuel) = 1",
// "2*log(north) - log(south) = 0; const = 0" or "a = -b".
//
// One grammar serves every restriction in the program: Wald tests on
// long-run coefficients (any right-hand side) and likelihood-ratio tests
// of β = Hφ on cointegrating relations (homogeneous, Options.Homogeneous).
// In EBNF (ISO 14977 style; spaces are allowed between any two symbols
// and are insignificant inside a term name):
//
//	restriction = equation , { ";" , equation } ;
//	equation    = side , "=" , side ;
//	side        = [ signs ] , item , { signs , item } ;
//	signs       = sign , { sign } ;
//	sign        = "+" | "-" | "−" ;
//	item        = number , [ [ "*" ] , term ]   (* coefficient·term, or a constant *)
//	            | term ;
//	number      = ( digits , [ "." , [ digits ] ] | "." , digits ) ,
//	              [ ( "e" | "E" ) , [ "+" | "-" ] , digits ] ;
//	term        = name | "`" , { any character except "`" } , "`" ;
//	name        = (* one of the caller's term names, written as given,
//	                 spaces ignored, followed by a sign or the end of the side *) ;
//
// Term names are given by the caller and may contain parentheses, commas,
// digits or operators ("log(fuel)", "lag(x, 2)"); at each place the
// longest name that fits is taken, so "x10" is not read as "x1" followed
// by junk. A name between backquotes is matched exactly. A run of signs
// multiplies ("a - -b" is a + b). Terms may stand on both sides; a term on
// the right moves to the left with its sign changed, and numbers on the
// left move to the right, so "a + 1 = 2*b" is the row (1, −2) with r = −1.
// A term may appear at most once on each side.
//
// Every malformed input gives an *Error (never a panic) that wraps one of
// ErrSyntax, ErrUnknownTerm, ErrDuplicateTerm, ErrNoTerm and
// ErrNotHomogeneous, for errors.Is.
package restrict

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// The kinds of error; every error from Parse is an *Error wrapping one.
var (
	// ErrSyntax: no or several "=", an empty side or equation, a missing
	// term after a sign, unbalanced parentheses or backquotes, a bad
	// number, or junk after a term.
	ErrSyntax = errors.New("syntax")
	// ErrUnknownTerm: a term that is none of the caller's names.
	ErrUnknownTerm = errors.New("unknown term")
	// ErrDuplicateTerm: a term named twice on one side of an equation.
	ErrDuplicateTerm = errors.New("term named twice")
	// ErrNoTerm: an equation whose coefficients are all zero (no term,
	// or terms that cancel), which restricts nothing.
	ErrNoTerm = errors.New("no term")
	// ErrNotHomogeneous: a non-zero right-hand side where the caller asked
	// for homogeneous restrictions (Rθ = 0).
	ErrNotHomogeneous = errors.New("not homogeneous")
)

// Error describes what is wrong with one equation of a restriction.
type Error struct {
	Kind     error  // one of ErrSyntax … ErrNotHomogeneous
	Equation string // the equation as written (trimmed), or the whole text
	Index    int    // zero-based position of the equation in the text
	Term     string // the offending term or fragment, if any
	Msg      string // the explanation
}

func (e *Error) Error() string {
	return fmt.Sprintf("%q: %s", e.Equation, e.Msg)
}

// Unwrap returns the kind, for errors.Is.
func (e *Error) Unwrap() error { return e.Kind }

// Options select the form of restriction a caller accepts.
type Options struct {
	// Homogeneous demands r = 0 in every equation (restrictions β = Hφ on
	// cointegrating vectors are statements about directions, not levels).
	Homogeneous bool
}

// Linear is a parsed restriction Rθ = r.
type Linear struct {
	Equations []string    // each equation as written, trimmed
	R         [][]float64 // one row per equation, one column per name
	Rhs       []float64   // r, one entry per equation
}

// Parse reads the restriction text (one or more equations joined by ";")
// on the coefficients named by names and returns R (len(names) columns)
// and r; see the package comment for the grammar.
func Parse(text string, names []string, opt Options) (*Linear, error) {
	p := parser{names: names}
	p.prepare()
	if strings.TrimSpace(text) == "" {
		return nil, &Error{Kind: ErrSyntax, Equation: text, Msg: "no equation"}
	}
	if msg := checkNesting(text); msg != "" {
		return nil, &Error{Kind: ErrSyntax, Equation: strings.TrimSpace(text), Msg: msg}
	}
	out := &Linear{}
	for i, eq := range splitTop(text, ';') {
		row, rhs, err := p.equation(eq)
		if err != nil {
			err.Index = i
			err.Equation = strings.TrimSpace(eq)
			return nil, err
		}
		if opt.Homogeneous && rhs != 0 {
			return nil, &Error{Kind: ErrNotHomogeneous, Equation: strings.TrimSpace(eq), Index: i,
				Msg: fmt.Sprintf("the restriction must be homogeneous (right-hand side 0 once the terms are collected on the left), not %g", rhs)}
		}
		out.Equations = append(out.Equations, strings.TrimSpace(eq))
		out.R = append(out.R, row)
		out.Rhs = append(out.Rhs, rhs)
	}
	return out, nil
}

// parser holds the names, normalised (no spaces) and sorted longest first.
type parser struct {
	names []string
	norm  []string
	byLen []int // indices into names, longest normalised name first
}

func (p *parser) prepare() {
	p.norm = make([]string, len(p.names))
	p.byLen = make([]int, 0, len(p.names))
	for i, n := range p.names {
		p.norm[i] = stripSpace(n)
		if p.norm[i] != "" {
			p.byLen = append(p.byLen, i)
		}
	}
	sort.SliceStable(p.byLen, func(a, b int) bool { return len(p.norm[p.byLen[a]]) > len(p.norm[p.byLen[b]]) })
}

func stripSpace(s string) string {
	return strings.Map(func(r rune) rune {
		if unicode.IsSpace(r) {
			return -1
		}
		return r
	}, s)
}

// checkNesting reports unbalanced parentheses or an unclosed backquote.
func checkNesting(s string) string {
	depth, quoted := 0, false
	for _, r := range s {
		switch {
		case r == '`':
			quoted = !quoted
		case quoted:
		case r == '(':
			depth++
		case r == ')':
			depth--
			if depth < 0 {
				return "unbalanced parentheses: \")\" without \"(\""
			}
		}
	}
	if quoted {
		return "a backquote is not closed"
	}
	if depth != 0 {
		return "unbalanced parentheses: \"(\" not closed"
	}
	return ""
}

// splitTop splits s at sep outside parentheses and backquotes.
func splitTop(s string, sep byte) []string {
	var out []string
	depth, quoted, start := 0, false, 0
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c == '`':
			quoted = !quoted
		case quoted:
		case c == '(':
			depth++
		case c == ')':
			depth--
		case c == sep && depth == 0:
			out = append(out, s[start:i])
			start = i + 1
		}
	}
	return append(out, s[start:])
}

func isSign(s string, i int) (neg bool, width int) {
	switch {
	case i >= len(s):
		return false, 0
	case s[i] == '+':
		return false, 1
	case s[i] == '-':
		return true, 1
	case strings.HasPrefix(s[i:], "−"):
		return true, len("−")
	}
	return false, 0
}

func skipSpace(s string, i int) int {
	for i < len(s) {
		r, w := utf8.DecodeRuneInString(s[i:])
		if !unicode.IsSpace(r) {
			break
		}
		i += w
	}
	return i
}

// equation reads "side = side" into a row and r.
func (p *parser) equation(eq string) ([]float64, float64, *Error) {
	if strings.TrimSpace(eq) == "" {
		return nil, 0, &Error{Kind: ErrSyntax, Msg: "an equation is empty (a stray \";\"?)"}
	}
	sides := splitTop(eq, '=')
	if len(sides) != 2 {
		ex := "log(a) = 1"
		if len(p.names) > 0 {
			ex = p.names[0] + " = 1"
		}
		return nil, 0, &Error{Kind: ErrSyntax, Msg: fmt.Sprintf("write one \"=\" per equation, e.g. %q", ex)}
	}
	row := make([]float64, len(p.names))
	rhs := 0.0
	named := false
	for side, text := range sides {
		where := [2]string{"left", "right"}[side]
		sideSign := 1.0
		if side == 1 {
			sideSign = -1
		}
		items, err := p.side(text, where)
		if err != nil {
			return nil, 0, err
		}
		seen := make(map[int]bool)
		for _, it := range items {
			if it.term < 0 {
				rhs -= sideSign * it.coef
				continue
			}
			if seen[it.term] {
				return nil, 0, &Error{Kind: ErrDuplicateTerm, Term: p.names[it.term],
					Msg: fmt.Sprintf("%s is named twice on the %s-hand side; write it once with the combined coefficient", p.names[it.term], where)}
			}
			seen[it.term] = true
			named = true
			row[it.term] += sideSign * it.coef
		}
	}
	if !named {
		return nil, 0, &Error{Kind: ErrNoTerm, Msg: "names no term, so it restricts nothing"}
	}
	nonzero := false
	for _, v := range row {
		nonzero = nonzero || v != 0
	}
	if !nonzero {
		return nil, 0, &Error{Kind: ErrNoTerm, Msg: "the coefficients cancel, so it restricts nothing"}
	}
	if math.IsInf(rhs, 0) || math.IsNaN(rhs) {
		return nil, 0, &Error{Kind: ErrSyntax, Msg: "the right-hand side is not a finite number"}
	}
	return row, rhs, nil
}

// item is coef·θ_term, or the constant coef when term < 0.
type item struct {
	coef float64
	term int
}

// side reads a signed sum of items.
func (p *parser) side(s, where string) ([]item, *Error) {
	i := skipSpace(s, 0)
	if i == len(s) {
		return nil, &Error{Kind: ErrSyntax, Msg: fmt.Sprintf("the %s-hand side is empty", where)}
	}
	var out []item
	for i < len(s) {
		sign, nsigns := 1.0, 0
		for {
			neg, w := isSign(s, i)
			if w == 0 {
				break
			}
			if neg {
				sign = -sign
			}
			nsigns++
			i = skipSpace(s, i+w)
		}
		if nsigns == 0 && len(out) > 0 {
			return nil, &Error{Kind: ErrSyntax, Term: strings.TrimSpace(s[i:]),
				Msg: fmt.Sprintf("expected + or − before %q on the %s-hand side", strings.TrimSpace(s[i:]), where)}
		}
		if i == len(s) {
			return nil, &Error{Kind: ErrSyntax, Msg: fmt.Sprintf("a term is missing after the last sign on the %s-hand side", where)}
		}
		it, next, err := p.item(s, i)
		if err != nil {
			return nil, err
		}
		it.coef *= sign
		out = append(out, it)
		i = skipSpace(s, next)
	}
	return out, nil
}

// item reads number [[*] term] | term at s[i:] (i at a non-space).
func (p *parser) item(s string, i int) (item, int, *Error) {
	if t, next, ok := p.term(s, i); ok {
		return item{coef: 1, term: t}, next, nil
	} else if next != 0 {
		return item{}, 0, p.junk(s, i, next)
	}
	n := numberLen(s[i:])
	if n == 0 {
		return item{}, 0, p.unknown(s, i)
	}
	v, err := strconv.ParseFloat(s[i:i+n], 64)
	if err != nil || math.IsInf(v, 0) {
		return item{}, 0, &Error{Kind: ErrSyntax, Term: s[i : i+n], Msg: fmt.Sprintf("%q is not a finite number", s[i:i+n])}
	}
	j := skipSpace(s, i+n)
	star := j < len(s) && s[j] == '*'
	if star {
		j = skipSpace(s, j+1)
	}
	if _, w := isSign(s, j); j == len(s) || w > 0 {
		if star {
			return item{}, 0, &Error{Kind: ErrSyntax, Term: s[i:j],
				Msg: fmt.Sprintf("the coefficient %s* needs a term after it", s[i:i+n])}
		}
		return item{coef: v, term: -1}, j, nil
	}
	t, next, ok := p.term(s, j)
	if !ok {
		if next != 0 {
			return item{}, 0, p.junk(s, j, next)
		}
		return item{}, 0, p.unknown(s, j)
	}
	return item{coef: v, term: t}, next, nil
}

// term matches a backquoted name or the longest name (spaces ignored) at
// s[i:] that is followed by a sign or the end. With ok false, next is −1
// for a backquoted text that is no name, the end of the longest name
// that matched but is followed by something else than a sign, or 0 when
// no name matches.
func (p *parser) term(s string, i int) (t, next int, ok bool) {
	if s[i] == '`' {
		j := strings.IndexByte(s[i+1:], '`')
		if j < 0 {
			return 0, -1, false
		}
		inner := s[i+1 : i+1+j]
		for k, n := range p.names {
			if n == inner || n == "`"+inner+"`" {
				if after := skipSpace(s, i+j+2); after < len(s) {
					if _, w := isSign(s, after); w == 0 {
						return 0, i + j + 2, false
					}
				}
				return k, i + j + 2, true
			}
		}
		return 0, -1, false
	}
	junk := 0
	for _, k := range p.byLen {
		end, ok := matchSpaced(s, i, p.norm[k])
		if !ok {
			continue
		}
		after := skipSpace(s, end)
		if _, w := isSign(s, after); after == len(s) || w > 0 {
			return k, end, true
		}
		if junk == 0 {
			junk = end
		}
	}
	return 0, junk, false
}

// junk reports what follows a term at s[end:] (or an unknown backquoted
// name when end < 0).
func (p *parser) junk(s string, i, end int) *Error {
	if end < 0 {
		return p.unknown(s, i)
	}
	rest := strings.TrimSpace(s[end:])
	return &Error{Kind: ErrSyntax, Term: rest,
		Msg: fmt.Sprintf("expected + or − between %q and %q", strings.TrimSpace(s[i:end]), rest)}
}

// matchSpaced matches the space-free name at s[i:], skipping spaces in s
// between its characters, and returns the end of the match.
func matchSpaced(s string, i int, name string) (int, bool) {
	for _, r := range name {
		i = skipSpace(s, i)
		c, w := utf8.DecodeRuneInString(s[i:])
		if w == 0 || c != r {
			return 0, false
		}
		i += w
	}
	return i, true
}

// numberLen is the length of the number at the start of s, or 0.
func numberLen(s string) int {
	digits := func(i int) int {
		j := i
		for j < len(s) && s[j] >= '0' && s[j] <= '9' {
			j++
		}
		return j - i
	}
	i := digits(0)
	if i < len(s) && s[i] == '.' {
		f := digits(i + 1)
		if i == 0 && f == 0 {
			return 0
		}
		i += 1 + f
	}
	if i == 0 {
		return 0
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		if d := digits(j); d > 0 {
			i = j + d
		}
	}
	return i
}

// unknown describes the fragment at s[i:] that is no term: the text up to
// the next sign or space outside parentheses. (The caller, which knows
// how the program phrases suggestions, may offer the closest name.)
func (p *parser) unknown(s string, i int) *Error {
	if s[i] == '`' {
		j := strings.IndexByte(s[i+1:], '`')
		if j >= 0 {
			inner := s[i+1 : i+1+j]
			return &Error{Kind: ErrUnknownTerm, Term: inner,
				Msg: fmt.Sprintf("%q is not one of the terms (%s)", inner, strings.Join(p.names, ", "))}
		}
		return &Error{Kind: ErrSyntax, Msg: "a backquote is not closed"}
	}
	depth, j := 0, i
	for j < len(s) {
		r, w := utf8.DecodeRuneInString(s[j:])
		if depth == 0 && j > i {
			if _, sw := isSign(s, j); sw > 0 || unicode.IsSpace(r) {
				break
			}
		}
		switch r {
		case '(':
			depth++
		case ')':
			depth--
		}
		j += w
	}
	word := s[i:j]
	if !strings.ContainsFunc(word, func(r rune) bool { return unicode.IsLetter(r) || r == '_' }) {
		return &Error{Kind: ErrSyntax, Term: word, Msg: fmt.Sprintf("unexpected %q", word)}
	}
	return &Error{Kind: ErrUnknownTerm, Term: word,
		Msg: fmt.Sprintf("%q is not one of the terms (%s)", word, strings.Join(p.names, ", "))}
}
