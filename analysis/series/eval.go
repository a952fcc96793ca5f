package series

import (
	"fmt"
	"math"
	"strings"
)

// Eval computes the expression over every row of the frame. The result
// is named by the canonical form e.String() and shares the frame's
// (read-only) Dates.
//
// Missing values propagate: any operation on NaN gives NaN, and lags,
// leads and differences are NaN where they reach outside the frame.
// Lags count rows, which for annual, quarterly and monthly frames are
// consecutive periods; for daily frames lag(x, 1) is the previous
// observation, not the previous calendar day.
//
// An operation that is undefined for present data – log or sqrt of a
// value out of their domain, division by zero, a power without a real
// value, overflow – is an error naming the first offending row's date
// and source line, since the data or the expression need fixing. A
// column the frame does not have is an error suggesting the closest
// name. Errors are *DataError.
func Eval(e Expr, f *Frame) (*Series, error) {
	if e == nil || f == nil {
		return nil, fmt.Errorf("series: Eval needs an expression and a frame")
	}
	for _, c := range e.Columns() {
		if !f.Has(c) {
			return nil, unknownColumn(f, c)
		}
	}
	v, err := (&evaluator{f: f, n: f.Len()}).eval(e)
	if err != nil {
		return nil, err
	}
	return &Series{Name: e.String(), Dates: f.Dates, Values: v}, nil
}

func unknownColumn(f *Frame, name string) error {
	msg := fmt.Sprintf("unknown column %q", name)
	if s := f.Closest(name); s != "" {
		msg += fmt.Sprintf(" (did you mean %q?)", s)
	} else {
		names := f.Names
		more := ""
		if len(names) > 12 {
			names, more = names[:12], ", …"
		}
		msg += fmt.Sprintf("; the columns are %s%s", strings.Join(names, ", "), more)
	}
	return &DataError{Source: f.Source, Msg: msg}
}

type evaluator struct {
	f *Frame
	n int
}

// undefined reports the first row where an operation failed.
func (ev *evaluator) undefined(i int, e Expr, format string, args ...any) error {
	de := &DataError{Source: ev.f.Source}
	if i < len(ev.f.Lines) {
		de.Line = ev.f.Lines[i]
	}
	if c, ok := operand(e).(ColumnRef); ok {
		de.Column = c.Name
	}
	de.Msg = fmt.Sprintf("%s is undefined on %s: %s", e, ev.f.Dates[i], fmt.Sprintf(format, args...))
	return de
}

// operand is the (first) argument of an operation, for error columns.
func operand(e Expr) Expr {
	switch x := e.(type) {
	case Call:
		return x.X
	case Neg:
		return x.X
	}
	return nil
}

func (ev *evaluator) eval(e Expr) ([]float64, error) {
	switch x := e.(type) {
	case ColumnRef:
		return append([]float64(nil), ev.f.cols[ev.f.index(x.Name)]...), nil
	case Number:
		out := make([]float64, ev.n)
		for i := range out {
			out[i] = x.Value
		}
		return out, nil
	case Neg:
		v, err := ev.eval(x.X)
		if err != nil {
			return nil, err
		}
		for i := range v {
			v[i] = -v[i]
		}
		return v, nil
	case Binary:
		return ev.binary(x)
	case Call:
		return ev.call(x)
	}
	return nil, fmt.Errorf("series: unknown expression node %T", e)
}

func (ev *evaluator) binary(b Binary) ([]float64, error) {
	a, err := ev.eval(b.X)
	if err != nil {
		return nil, err
	}
	c, err := ev.eval(b.Y)
	if err != nil {
		return nil, err
	}
	for i := range a {
		x, y := a[i], c[i]
		var r float64
		switch b.Op {
		case '+':
			r = x + y
		case '-':
			r = x - y
		case '*':
			r = x * y
		case '/':
			if y == 0 && !math.IsNaN(x) {
				return nil, ev.undefined(i, b, "division by zero")
			}
			r = x / y
		case '^':
			r = math.Pow(x, y)
		}
		if finite(x) && finite(y) && !finite(r) {
			if b.Op == '^' && math.IsNaN(r) {
				return nil, ev.undefined(i, b, "%g^%g has no real value", x, y)
			}
			return nil, ev.undefined(i, b, "the result overflows")
		}
		a[i] = r
	}
	return a, nil
}

func (ev *evaluator) call(c Call) ([]float64, error) {
	v, err := ev.eval(c.X)
	if err != nil {
		return nil, err
	}
	switch c.Func {
	case "log", "dlog":
		for i, x := range v {
			if x <= 0 {
				return nil, ev.undefined(i, c, "the value %g is not positive", x)
			}
			v[i] = math.Log(x)
		}
		if c.Func == "dlog" {
			return difference(v, 1), nil
		}
	case "sqrt":
		for i, x := range v {
			if x < 0 {
				return nil, ev.undefined(i, c, "the value %g is negative", x)
			}
			v[i] = math.Sqrt(x)
		}
	case "exp":
		for i, x := range v {
			r := math.Exp(x)
			if finite(x) && math.IsInf(r, 0) {
				return nil, ev.undefined(i, c, "exp(%g) overflows", x)
			}
			v[i] = r
		}
	case "abs":
		for i, x := range v {
			v[i] = math.Abs(x)
		}
	case "lag":
		return shift(v, c.K), nil
	case "diff", "sdiff":
		return difference(v, c.K), nil
	default:
		return nil, fmt.Errorf("series: unknown function %q", c.Func)
	}
	return v, nil
}

// shift returns out[i] = v[i−k], NaN where i−k is outside 0…n−1.
func shift(v []float64, k int) []float64 {
	out := make([]float64, len(v))
	for i := range out {
		j := i - k
		if j >= 0 && j < len(v) {
			out[i] = v[j]
		} else {
			out[i] = math.NaN()
		}
	}
	return out
}

// difference returns out[i] = v[i] − v[i−k], NaN for i < k.
func difference(v []float64, k int) []float64 {
	out := make([]float64, len(v))
	for i := range out {
		if i >= k {
			out[i] = v[i] - v[i-k]
		} else {
			out[i] = math.NaN()
		}
	}
	return out
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
