package restrict

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"
)

// Expected rows are worked by hand from the grammar; the first groups
// are the forms that the two parsers this package replaces accepted in
// the project's tests, testdata and example manuscripts (β restrictions
// with "const", homogeneous; Wald restrictions on long-run coefficients),
// with the same R and r.
func TestParse(t *testing.T) {
	beta := []string{"log(north)", "log(south)", "log(fuel)", "const"}
	dk := []string{"LRM", "LRY", "IBO", "IDE"}
	lr := []string{"log(north)", "log(fuel)"}
	for _, tc := range []struct {
		name  string
		text  string
		names []string
		homog bool
		R     [][]float64
		r     []float64
	}{
		// β restrictions (homogeneous, terms on both sides, "const").
		{"β: a = −b", "log(north) = -log(fuel)", beta, true, [][]float64{{1, 0, 1, 0}}, []float64{0}},
		{"β: difference = 0", "log(south) - log(north) = 0", beta, true, [][]float64{{-1, 1, 0, 0}}, []float64{0}},
		{"β: const on the right, 0.8*", "-log(north) + 0.8*log(fuel) = const", beta, true, [][]float64{{-1, 0, 0.8, -1}}, []float64{0}},
		{"β: coefficient without *, spaces in the name", "2 log( fuel ) = 0", beta, true, [][]float64{{0, 0, 2, 0}}, []float64{0}},
		{"β: exponent, term on both sides", "1e-1*log(south) = log(south) - log(north)", beta, true, [][]float64{{1, 0.1 - 1, 0, 0}}, []float64{0}},
		{"β: const = 0", "const = 0", beta, true, [][]float64{{0, 0, 0, 1}}, []float64{0}},
		{"β: Danish homogeneity", "LRM = -LRY", dk, true, [][]float64{{1, 1, 0, 0}}, []float64{0}},
		{"β: second equation", "IBO = -IDE", dk, true, [][]float64{{0, 0, 1, 1}}, []float64{0}},
		{"β: 2 LRM + 2*LRY = 0", "2 LRM + 2*LRY = 0", dk, true, [][]float64{{2, 2, 0, 0}}, []float64{0}},
		{"β: unicode minus", "LRM = −LRY", dk, true, [][]float64{{1, 1, 0, 0}}, []float64{0}},
		{"β: repeated leading signs", "--LRM = LRY", dk, true, [][]float64{{1, -1, 0, 0}}, []float64{0}},
		{"β: 0 as a term", "LRM - LRY + 0 = 0", dk, true, [][]float64{{1, -1, 0, 0}}, []float64{0}},
		{"β: fuel = 0", "log(fuel) = 0", beta, true, [][]float64{{0, 0, 1, 0}}, []float64{0}},
		// Wald restrictions (right-hand side a number, ";" joins).
		{"Wald: a = 1", "log(fuel) = 1", lr, false, [][]float64{{0, 1}}, []float64{1}},
		{"Wald: a = 0.8", "log(fuel) = 0.8", lr, false, [][]float64{{0, 1}}, []float64{0.8}},
		{"Wald: 2*a = 1", "2*log(fuel) = 1", lr, false, [][]float64{{0, 2}}, []float64{1}},
		{"Wald: joint", "log(north) - log(fuel) = 0; log(fuel) = 0", lr, false, [][]float64{{1, -1}, {0, 1}}, []float64{0, 0}},
		{"Wald: 0.5 without *", "log(north) + 0.5 log(fuel) = 1", lr, false, [][]float64{{1, 0.5}}, []float64{1}},
		{"Wald: plain name", "x = 2", []string{"x"}, false, [][]float64{{1}}, []float64{2}},
		{"Wald: negative right-hand side", "x = -1.5e-2", []string{"x"}, false, [][]float64{{1}}, []float64{-0.015}},
		{"Wald: backquoted name", "`x y` = 1", []string{"x y", "z"}, false, [][]float64{{1, 0}}, []float64{1}},
		{"Wald: backquoted name with operators", "2*`a-b` - z = 0", []string{"a-b", "z"}, false, [][]float64{{2, -1}}, []float64{0}},
		{"Wald: longest name first", "x10 - x1 = 0", []string{"x1", "x10"}, false, [][]float64{{-1, 1}}, []float64{0}},
		{"Wald: name with a comma and digits", "lag(x, 2) + 3 = 1", []string{"lag(x, 2)", "x"}, false, [][]float64{{1, 0}}, []float64{-2}},
		{"Wald: name with an operator", "d-x = 1", []string{"d-x", "d"}, false, [][]float64{{1, 0}}, []float64{1}},
		{"Wald: trailing number digits", "2. a + .5b = 3", []string{"a", "b"}, false, [][]float64{{2, 0.5}}, []float64{3}},
		{"Wald: signs multiply", "a - -b = 0", []string{"a", "b"}, false, [][]float64{{1, 1}}, []float64{0}},
		{"Wald: constants on both sides", "a + 1 = 2*b + 3", []string{"a", "b"}, false, [][]float64{{1, -2}}, []float64{2}},
		{"Wald: three equations", "a = 1; b = 2 ; a + b = 3", []string{"a", "b"}, false, [][]float64{{1, 0}, {0, 1}, {1, 1}}, []float64{1, 2, 3}},
		{"homogeneous constants that cancel", "a + 1 = 1", []string{"a"}, true, [][]float64{{1}}, []float64{0}},
	} {
		got, err := Parse(tc.text, tc.names, Options{Homogeneous: tc.homog})
		if err != nil {
			t.Errorf("%s: %q: %v", tc.name, tc.text, err)
			continue
		}
		if len(got.R) != len(tc.R) || len(got.Rhs) != len(tc.r) || len(got.Equations) != len(tc.R) {
			t.Errorf("%s: %d rows, %d rhs, %d equations; want %d", tc.name, len(got.R), len(got.Rhs), len(got.Equations), len(tc.R))
			continue
		}
		for i := range tc.R {
			if len(got.R[i]) != len(tc.names) {
				t.Errorf("%s: row %d has %d entries", tc.name, i, len(got.R[i]))
				continue
			}
			for j := range tc.R[i] {
				if math.Abs(got.R[i][j]-tc.R[i][j]) > 1e-15 {
					t.Errorf("%s: R = %v, want %v", tc.name, got.R, tc.R)
				}
			}
			if math.Abs(got.Rhs[i]-tc.r[i]) > 1e-15 {
				t.Errorf("%s: r = %v, want %v", tc.name, got.Rhs, tc.r)
			}
		}
	}
}

func TestParseErrors(t *testing.T) {
	beta := []string{"log(north)", "log(south)", "log(fuel)", "const"}
	for _, tc := range []struct {
		text  string
		names []string
		homog bool
		kind  error
		index int
		term  string // the offending term the error carries (unknown terms)
		msg   string // a fragment of Error()
	}{
		// The bad inputs of the two earlier parsers' tests.
		{"log(north) = 1", beta, true, ErrNotHomogeneous, 0, "", "homogeneous"},
		{"log(north) = log(north)", beta, true, ErrNoTerm, 0, "", "cancel"},
		{"log(north) +", beta, true, ErrSyntax, 0, "", `one "="`},
		{"log(north) + = 0", beta, true, ErrSyntax, 0, "", "missing"},
		{"log(north = 0", beta, true, ErrSyntax, 0, "", "parentheses"},
		{"a = b = c", []string{"a", "b", "c"}, true, ErrSyntax, 0, "", `one "="`},
		{"LRM = -LRZ", []string{"LRM", "LRY", "IBO"}, true, ErrUnknownTerm, 0, "LRZ", `"LRZ" is not one of the terms`},
		{"trend = 0", beta, true, ErrUnknownTerm, 0, "trend", `"trend"`},
		{"LRM + LRY", []string{"LRM", "LRY"}, true, ErrSyntax, 0, "", `one "="`},
		{"x = 2; z = 1", []string{"x"}, false, ErrUnknownTerm, 1, "z", `"z" is not one of the terms`},
		{"x == 1", []string{"x"}, false, ErrSyntax, 0, "", `one "="`},
		// The further cases the brief names.
		{"log(fual) = 1", beta, false, ErrUnknownTerm, 0, "log(fual)", `"log(fual)" is not one of the terms`},
		{"a + a = 1", []string{"a", "b"}, false, ErrDuplicateTerm, 0, "", "named twice"},
		{"2*b - 3*b = 0", []string{"a", "b"}, false, ErrDuplicateTerm, 0, "", "named twice"},
		{"1 = 1", []string{"a"}, false, ErrNoTerm, 0, "", "no term"},
		{"0 = 0", []string{"a"}, true, ErrNoTerm, 0, "", "no term"},
		{"a = b 1", []string{"a", "b"}, false, ErrSyntax, 0, "", "expected + or −"},
		{"a b = 1", []string{"a", "b"}, false, ErrSyntax, 0, "", "expected + or −"},
		{"a = 1)", []string{"a"}, false, ErrSyntax, 0, "", "parentheses"},
		{"a = 1;", []string{"a"}, false, ErrSyntax, 1, "", "empty"},
		{"", []string{"a"}, false, ErrSyntax, 0, "", "no equation"},
		{" = 1", []string{"a"}, false, ErrSyntax, 0, "", "left-hand side is empty"},
		{"a = ", []string{"a"}, false, ErrSyntax, 0, "", "right-hand side is empty"},
		{"2* = 1", []string{"a"}, false, ErrSyntax, 0, "", "needs a term"},
		{"a = 1e999", []string{"a"}, false, ErrSyntax, 0, "", "finite"},
		{"`q` = 1", []string{"a"}, false, ErrUnknownTerm, 0, "q", `"q"`},
		{"`zzzz` = 1", []string{"a"}, false, ErrUnknownTerm, 0, "zzzz", `"zzzz"`},
		{"`a = 1", []string{"a"}, false, ErrSyntax, 0, "", "backquote"},
		{"a * b = 1", []string{"a", "b"}, false, ErrSyntax, 0, "", "expected + or −"},
		{"a = b", nil, false, ErrUnknownTerm, 0, "a", `"a"`},
		{"a = *", []string{"a"}, false, ErrSyntax, 0, "", `unexpected "*"`},
	} {
		_, err := Parse(tc.text, tc.names, Options{Homogeneous: tc.homog})
		if err == nil {
			t.Errorf("%q: no error", tc.text)
			continue
		}
		if !errors.Is(err, tc.kind) {
			t.Errorf("%q: %v is not %v", tc.text, err, tc.kind)
		}
		var e *Error
		if !errors.As(err, &e) {
			t.Errorf("%q: %T is not *Error", tc.text, err)
			continue
		}
		if e.Index != tc.index {
			t.Errorf("%q: equation index %d, want %d", tc.text, e.Index, tc.index)
		}
		if tc.kind == ErrUnknownTerm && e.Term != tc.term {
			t.Errorf("%q: term %q, want %q", tc.text, e.Term, tc.term)
		}
		if !strings.Contains(err.Error(), tc.msg) {
			t.Errorf("%q: %q does not say %q", tc.text, err.Error(), tc.msg)
		}
	}
}

// format writes R and r back as equations in the grammar, each name in
// backquotes, so that a parse can be checked by parsing its rendering.
func format(l *Linear, names []string) string {
	var eqs []string
	for i, row := range l.R {
		var b strings.Builder
		for j, v := range row {
			if v == 0 {
				continue
			}
			b.WriteString(" + ")
			b.WriteString(strconv.FormatFloat(math.Abs(v), 'g', -1, 64))
			b.WriteString("*`" + names[j] + "`")
			if v < 0 {
				// " + c*" becomes " - c*"
				s := b.String()
				k := strings.LastIndex(s, " + ")
				b.Reset()
				b.WriteString(s[:k] + " - " + s[k+3:])
			}
		}
		eqs = append(eqs, b.String()+" = "+strconv.FormatFloat(l.Rhs[i], 'g', -1, 64))
	}
	return strings.Join(eqs, "; ")
}

// FuzzParse: never a panic; a successful parse has one finite row of
// len(names) per equation with a non-zero entry, a finite r, and reads
// back to the same R and r from its canonical rendering.
func FuzzParse(f *testing.F) {
	for _, s := range []string{
		"log(north) = -log(fuel)", "-log(north) + 0.8*log(fuel) = const", "2 log( fuel ) = 0",
		"1e-1*log(south) = log(south) - log(north)", "log(north) - log(fuel) = 0; log(fuel) = 0",
		"log(north) + 0.5 log(fuel) = 1", "`x y` = 1", "lag(x, 2) + 3 = 1", "a = b = c", "log(north = 0",
		"−−a = .5e+3", "a;;", "((", "`", "2*", "= =",
	} {
		f.Add(s)
	}
	names := []string{"log(north)", "log(south)", "log(fuel)", "const", "x y", "lag(x, 2)", "a", "b", "x1", "x10"}
	f.Fuzz(func(t *testing.T, s string) {
		for _, homog := range []bool{false, true} {
			l, err := Parse(s, names, Options{Homogeneous: homog})
			if err != nil {
				var e *Error
				if !errors.As(err, &e) || e.Kind == nil || e.Error() == "" {
					t.Fatalf("%q: error %v is not a described *Error", s, err)
				}
				continue
			}
			if len(l.R) == 0 || len(l.R) != len(l.Rhs) || len(l.R) != len(l.Equations) {
				t.Fatalf("%q: %d rows, %d rhs, %d equations", s, len(l.R), len(l.Rhs), len(l.Equations))
			}
			for i, row := range l.R {
				nonzero := false
				for _, v := range row {
					if math.IsNaN(v) || math.IsInf(v, 0) {
						t.Fatalf("%q: non-finite R %v", s, l.R)
					}
					nonzero = nonzero || v != 0
				}
				if len(row) != len(names) || !nonzero {
					t.Fatalf("%q: row %d = %v", s, i, row)
				}
				if math.IsNaN(l.Rhs[i]) || math.IsInf(l.Rhs[i], 0) || (homog && l.Rhs[i] != 0) {
					t.Fatalf("%q: r = %v", s, l.Rhs)
				}
			}
			again, err := Parse(format(l, names), names, Options{})
			if err != nil {
				t.Fatalf("%q rendered as %q: %v", s, format(l, names), err)
			}
			for i := range l.R {
				for j := range l.R[i] {
					if again.R[i][j] != l.R[i][j] {
						t.Fatalf("%q: R %v read back as %v", s, l.R, again.R)
					}
				}
				if again.Rhs[i] != l.Rhs[i] {
					t.Fatalf("%q: r %v read back as %v", s, l.Rhs, again.Rhs)
				}
			}
		}
	})
}
