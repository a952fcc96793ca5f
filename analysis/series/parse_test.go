package series

import (
	"reflect"
	"strings"
	"testing"
)

func TestParseExprCanonical(t *testing.T) {
	tests := []struct{ in, want string }{
		{"gdp", "gdp"},
		{"  log( gdp )", "log(gdp)"},
		{"a+b*c", "a + b * c"},
		{"(a+b)*c", "(a + b) * c"},
		{"a-(b-c)", "a - (b - c)"},
		{"(a-b)-c", "a - b - c"},
		{"a/(b*c)", "a / (b * c)"},
		{"a/b/c", "a / b / c"},
		{"a^b^c", "a^b^c"},
		{"(a^b)^c", "(a^b)^c"},
		{"-a^2", "-a^2"},
		{"(-a)^2", "(-a)^2"},
		{"a^-1", "a^-1"},
		{"--a", "--a"},
		{"+a", "a"},
		{"-(a+b)", "-(a + b)"},
		{"-(a*b)", "-(a * b)"},
		{"a - -b", "a - -b"},
		{"2*x", "2 * x"},
		{"1e3 + .5 + 2.50", "1000 + 0.5 + 2.5"},
		{"diff(x)", "diff(x)"},
		{"diff(x,1)", "diff(x)"},
		{"diff(x, 4)", "diff(x, 4)"},
		{"dlog(x)", "dlog(x)"},
		{"lag(x)", "lag(x, 1)"},
		{"lag(x,-2)", "lag(x, -2)"},
		{"sdiff(x,12)", "sdiff(x, 12)"},
		{"abs(x)+sqrt(y)+exp(z)", "abs(x) + sqrt(y) + exp(z)"},
		{"100*diff(log(p),4)", "100 * diff(log(p), 4)"},
		{"real.gdp_2", "real.gdp_2"},
		{"`GDP (bn)`", "`GDP (bn)`"},
		{"`a``b`", "`a``b`"},
		{"`x`", "x"},
		{"log", "log"},
		{"`2x` + _y", "`2x` + _y"},
	}
	for _, tc := range tests {
		e, err := ParseExpr(tc.in)
		if err != nil {
			t.Errorf("ParseExpr(%q): %v", tc.in, err)
			continue
		}
		if got := e.String(); got != tc.want {
			t.Errorf("ParseExpr(%q).String() = %q, want %q", tc.in, got, tc.want)
		}
		again, err := ParseExpr(e.String())
		if err != nil || !reflect.DeepEqual(again, e) {
			t.Errorf("%q does not reparse to the same tree: %v", e.String(), err)
		}
	}
}

func TestParseExprTree(t *testing.T) {
	e, err := ParseExpr("-x^2 + lag(`a b`, -1)")
	if err != nil {
		t.Fatal(err)
	}
	want := Binary{Op: '+', X: Neg{X: Binary{Op: '^', X: ColumnRef{"x"}, Y: Number{2}}}, Y: Call{Func: "lag", X: ColumnRef{"a b"}, K: -1}}
	if !reflect.DeepEqual(e, want) {
		t.Errorf("got %#v", e)
	}
	e, _ = ParseExpr("log(y) - log(x) * y + dlog(z)")
	if got := e.Columns(); !reflect.DeepEqual(got, []string{"y", "x", "z"}) {
		t.Errorf("Columns = %v", got)
	}
	e, _ = ParseExpr("2 + 3")
	if got := e.Columns(); len(got) != 0 {
		t.Errorf("Columns = %v", got)
	}
}

func TestParseExprErrors(t *testing.T) {
	tests := []struct{ in, want string }{
		{"", `expression "", position 1: expected a number, a column name, a function or "(", found the end of the expression`},
		{"a +", `expression "a +", position 4: expected a number, a column name, a function or "(", found the end of the expression`},
		{"a b", `expression "a b", position 3: expected an operator or the end, found name "b"`},
		{"(a + b", `expression "(a + b", position 7: expected ")" to close the "(" at position 1, found the end of the expression`},
		{"a)", `expression "a)", position 2: expected an operator or the end, found ")"`},
		{"foo(x)", `expression "foo(x)", position 1: unknown function "foo" (known: abs, diff, dlog, exp, lag, log, sdiff, sqrt)`},
		{"log(x, 2)", `expression "log(x, 2)", position 6: log takes one argument`},
		{"lag(x, 1.5)", `expression "lag(x, 1.5)", position 8: expected a whole number of periods for lag (at most 1000000), found number 1.5`},
		{"lag(x, y)", `expression "lag(x, y)", position 8: expected a whole number of periods for lag, found name "y"`},
		{"diff(x, 0)", `expression "diff(x, 0)", position 9: diff needs a number of periods of at least 1, found 0`},
		{"diff(x, -1)", `expression "diff(x, -1)", position 10: diff needs a number of periods of at least 1, found -1`},
		{"sdiff(x)", `expression "sdiff(x)", position 8: expected "," and the number of periods for sdiff, found ")"`},
		{"lag(x, 1", `expression "lag(x, 1", position 9: expected ")" to close lag( at position 4, found the end of the expression`},
		{"log(", `expression "log(", position 5: expected a number, a column name, a function or "(", found the end of the expression`},
		{"x # 2", `expression "x # 2", position 3: expected an operator or the end, found "#"`},
		{"# 2", `expression "# 2", position 1: unexpected character "#"`},
		{"`abc", "expression \"`abc\", position 1: unclosed backquote"},
		{"``", "expression \"``\", position 1: empty column name ``"},
		{"1.2.3", `expression "1.2.3", position 1: malformed number "1.2.3"`},
		{"1e999", `expression "1e999", position 1: number 1e999 is too large`},
		{"é + 1", `expression "é + 1", position 1: unexpected character "é"`},
		{"x + é", `expression "x + é", position 5: unexpected character "é"`},
		{"2 ^ ^ 3", `expression "2 ^ ^ 3", position 5: expected a number, a column name, a function or "(", found "^"`},
		{"lag(x, 99999999999)", `expression "lag(x, 99999999999)", position 8: expected a whole number of periods for lag (at most 1000000), found number 99999999999`},
		{strings.Repeat("(", 300) + "x" + strings.Repeat(")", 300), ""},
	}
	for _, tc := range tests {
		_, err := ParseExpr(tc.in)
		if err == nil {
			t.Errorf("ParseExpr(%q): no error", clip(tc.in, 30))
			continue
		}
		if _, ok := err.(*ExprError); !ok {
			t.Errorf("%q: error type %T", tc.in, err)
		}
		if tc.want == "" {
			if !strings.Contains(err.Error(), "nested too deeply") {
				t.Errorf("deep nesting: %v", err)
			}
			continue
		}
		if err.Error() != tc.want {
			t.Errorf("ParseExpr(%q):\n got %s\nwant %s", tc.in, err, tc.want)
		}
	}
}
