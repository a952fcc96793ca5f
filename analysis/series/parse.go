package series

import (
	"fmt"
	"strconv"
	"strings"
	"unicode/utf8"
)

// ExprError is a syntax error in an expression: Pos is the 1-based
// character position where the problem was found.
type ExprError struct {
	Expr string
	Pos  int
	Msg  string
}

func (e *ExprError) Error() string {
	return fmt.Sprintf("expression %q, position %d: %s", clip(e.Expr, 60), e.Pos, e.Msg)
}

// ParseExpr parses a series expression:
//
//	expr    = term { ("+" | "-") term }
//	term    = unary { ("*" | "/") unary }
//	unary   = ("-" | "+") unary | power
//	power   = primary [ "^" unary ]          (right-associative)
//	primary = number | column | call | "(" expr ")"
//	column  = letter-or-_ { letter | digit | _ | . }  |  "`" any "`"
//	call    = name "(" expr [ "," integer ] ")"
//
// Functions: log, exp, abs, sqrt; diff(x) = diff(x, 1), diff(x, k) =
// x − lag(x, k); dlog(x) = diff(log(x)); lag(x) = lag(x, 1), lag(x, k)
// with k < 0 a lead; sdiff(x, s) = x − lag(x, s). Inside backquotes a
// doubled backquote stands for one. Errors are *ExprError.
func ParseExpr(s string) (Expr, error) {
	p := &parser{src: s}
	p.next()
	e, err := p.expr()
	if err != nil {
		return nil, err
	}
	if p.tok.kind != tEOF {
		return nil, p.fail("expected an operator or the end, found %s", p.tok.describe())
	}
	return e, nil
}

type tokKind int

const (
	tEOF tokKind = iota
	tNum
	tName   // plain name
	tQuoted // `quoted name`
	tOp     // + - * / ^ ( ) ,
	tBad
)

type token struct {
	kind tokKind
	text string
	pos  int // 1-based character position
	num  float64
}

func (t token) describe() string {
	switch t.kind {
	case tEOF:
		return "the end of the expression"
	case tNum:
		return "number " + t.text
	case tName, tQuoted:
		return "name " + strconv.Quote(t.text)
	}
	return strconv.Quote(t.text)
}

type parser struct {
	src   string
	off   int // byte offset of the next token
	tok   token
	level int // nesting of parentheses, calls and unary operators
}

// enter counts one more level of nesting, refusing absurd depths.
func (p *parser) enter() error {
	p.level++
	if p.level > maxDepth {
		return p.fail("expression nested too deeply (more than %d levels)", maxDepth)
	}
	return nil
}

func (p *parser) fail(format string, args ...any) *ExprError {
	return &ExprError{Expr: p.src, Pos: p.tok.pos, Msg: fmt.Sprintf(format, args...)}
}

// position is the 1-based character position of byte offset off.
func (p *parser) position(off int) int { return utf8.RuneCountInString(p.src[:off]) + 1 }

// next reads the next token into p.tok.
func (p *parser) next() {
	s := p.src
	for p.off < len(s) && (s[p.off] == ' ' || s[p.off] == '\t' || s[p.off] == '\n' || s[p.off] == '\r') {
		p.off++
	}
	start := p.off
	t := token{pos: p.position(start)}
	if start == len(s) {
		t.kind = tEOF
		p.tok = t
		return
	}
	c := s[start]
	switch {
	case c >= '0' && c <= '9' || c == '.' && start+1 < len(s) && s[start+1] >= '0' && s[start+1] <= '9':
		i := start
		for i < len(s) && (s[i] >= '0' && s[i] <= '9' || s[i] == '.') {
			i++
		}
		if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
			j := i + 1
			if j < len(s) && (s[j] == '+' || s[j] == '-') {
				j++
			}
			if j < len(s) && s[j] >= '0' && s[j] <= '9' {
				for j < len(s) && s[j] >= '0' && s[j] <= '9' {
					j++
				}
				i = j
			}
		}
		t.kind, t.text = tNum, s[start:i]
		p.off = i
	case c == '_' || isLetter(rune(c)):
		i := start + 1
		for i < len(s) && (s[i] == '_' || s[i] == '.' || isLetter(rune(s[i])) || s[i] >= '0' && s[i] <= '9') {
			i++
		}
		t.kind, t.text = tName, s[start:i]
		p.off = i
	case c == '`':
		var b strings.Builder
		i := start + 1
		for {
			j := strings.IndexByte(s[i:], '`')
			if j < 0 {
				t.kind, t.text = tBad, "`"
				p.off = len(s)
				p.tok = t
				return
			}
			b.WriteString(s[i : i+j])
			i += j + 1
			if i < len(s) && s[i] == '`' {
				b.WriteByte('`')
				i++
				continue
			}
			break
		}
		t.kind, t.text = tQuoted, b.String()
		p.off = i
	case strings.IndexByte("+-*/^(),", c) >= 0:
		t.kind, t.text = tOp, s[start:start+1]
		p.off = start + 1
	default:
		r, n := utf8.DecodeRuneInString(s[start:])
		t.kind, t.text = tBad, string(r)
		p.off = start + n
	}
	p.tok = t
}

func (p *parser) isOp(op string) bool { return p.tok.kind == tOp && p.tok.text == op }

func (p *parser) expr() (Expr, error) {
	x, err := p.term()
	if err != nil {
		return nil, err
	}
	for p.isOp("+") || p.isOp("-") {
		op := p.tok.text[0]
		p.next()
		y, err := p.term()
		if err != nil {
			return nil, err
		}
		x = Binary{Op: op, X: x, Y: y}
	}
	return x, nil
}

func (p *parser) term() (Expr, error) {
	x, err := p.unary()
	if err != nil {
		return nil, err
	}
	for p.isOp("*") || p.isOp("/") {
		op := p.tok.text[0]
		p.next()
		y, err := p.unary()
		if err != nil {
			return nil, err
		}
		x = Binary{Op: op, X: x, Y: y}
	}
	return x, nil
}

func (p *parser) unary() (Expr, error) {
	if err := p.enter(); err != nil {
		return nil, err
	}
	defer func() { p.level-- }()
	if p.isOp("-") {
		p.next()
		x, err := p.unary()
		if err != nil {
			return nil, err
		}
		return Neg{X: x}, nil
	}
	if p.isOp("+") {
		p.next()
		return p.unary()
	}
	return p.power()
}

func (p *parser) power() (Expr, error) {
	x, err := p.primary()
	if err != nil {
		return nil, err
	}
	if p.isOp("^") {
		p.next()
		y, err := p.unary()
		if err != nil {
			return nil, err
		}
		return Binary{Op: '^', X: x, Y: y}, nil
	}
	return x, nil
}

// maxDepth bounds the nesting of parentheses and unary operators.
const maxDepth = 200

func (p *parser) primary() (Expr, error) {
	t := p.tok
	switch t.kind {
	case tNum:
		v, plain, err := plainNumber(t.text)
		if !plain {
			return nil, p.fail("malformed number %q", t.text)
		}
		if err != nil {
			return nil, p.fail("number %s is too large", t.text)
		}
		p.next()
		return Number{Value: v}, nil
	case tQuoted:
		if t.text == "" {
			return nil, p.fail("empty column name ``")
		}
		p.next()
		return ColumnRef{Name: t.text}, nil
	case tName:
		p.next()
		if p.isOp("(") {
			return p.call(t)
		}
		return ColumnRef{Name: t.text}, nil
	case tOp:
		if t.text == "(" {
			p.next()
			x, err := p.expr()
			if err != nil {
				return nil, err
			}
			if !p.isOp(")") {
				return nil, p.fail("expected \")\" to close the \"(\" at position %d, found %s", t.pos, p.tok.describe())
			}
			p.next()
			return x, nil
		}
	case tBad:
		if t.text == "`" {
			return nil, p.fail("unclosed backquote")
		}
		return nil, p.fail("unexpected character %q", t.text)
	}
	return nil, p.fail("expected a number, a column name, a function or \"(\", found %s", t.describe())
}

// funcs lists the functions: whether they take an integer parameter
// (and whether it is required), and its default.
var funcs = map[string]struct {
	param    bool // takes an integer parameter
	required bool
	def      int
	positive bool // parameter must be ≥ 1
}{
	"log":   {},
	"exp":   {},
	"abs":   {},
	"sqrt":  {},
	"dlog":  {},
	"diff":  {param: true, def: 1, positive: true},
	"lag":   {param: true, def: 1},
	"sdiff": {param: true, required: true, positive: true},
}

func (p *parser) call(name token) (Expr, error) {
	fn, ok := funcs[name.text]
	if !ok {
		return nil, &ExprError{Expr: p.src, Pos: name.pos, Msg: fmt.Sprintf("unknown function %q (known: abs, diff, dlog, exp, lag, log, sdiff, sqrt)", name.text)}
	}
	open := p.tok
	p.next() // (
	x, err := p.expr()
	if err != nil {
		return nil, err
	}
	k := fn.def
	if p.isOp(",") {
		if !fn.param {
			return nil, p.fail("%s takes one argument", name.text)
		}
		p.next()
		neg := false
		if p.isOp("-") {
			neg = true
			p.next()
		}
		if p.tok.kind != tNum {
			return nil, p.fail("expected a whole number of periods for %s, found %s", name.text, p.tok.describe())
		}
		n, err := strconv.Atoi(p.tok.text)
		if err != nil || n > 1e6 {
			return nil, p.fail("expected a whole number of periods for %s (at most 1000000), found %s", name.text, p.tok.describe())
		}
		if neg {
			n = -n
		}
		if fn.positive && n < 1 {
			return nil, p.fail("%s needs a number of periods of at least 1, found %d", name.text, n)
		}
		k = n
		p.next()
	} else if fn.required {
		return nil, p.fail("expected \",\" and the number of periods for %s, found %s", name.text, p.tok.describe())
	}
	if !p.isOp(")") {
		return nil, p.fail("expected \")\" to close %s( at position %d, found %s", name.text, open.pos, p.tok.describe())
	}
	p.next()
	if !fn.param {
		k = 0
	}
	return Call{Func: name.text, X: x, K: k}, nil
}
