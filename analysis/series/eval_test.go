package series

import (
	"math"
	"testing"
)

// evalFrame: x = 1, 2, 4, 8, 16 (quarterly 2000Q1–2001Q1), y with a
// missing value in 2000Q3, z with a zero and a negative value.
const evalCSV = "date,x,y,z\n" +
	"2000Q1,1,10,1\n" +
	"2000Q2,2,20,0\n" +
	"2000Q3,4,NA,-1\n" +
	"2000Q4,8,40,4\n" +
	"2001Q1,16,50,9\n"

func TestEval(t *testing.T) {
	f, err := ReadCSV(stringsReader(evalCSV), "e.csv")
	if err != nil {
		t.Fatal(err)
	}
	ln2 := math.Ln2
	tests := []struct {
		expr string
		want []float64
	}{
		{"x", []float64{1, 2, 4, 8, 16}},
		{"x + y", []float64{11, 22, nan, 48, 66}},
		{"y - x*2", []float64{8, 16, nan, 24, 18}},
		{"x / 2 ^ 2", []float64{0.25, 0.5, 1, 2, 4}},
		{"-x^2", []float64{-1, -4, -16, -64, -256}},
		{"2^-x", []float64{0.5, 0.25, 0.0625, 1.0 / 256, 1.0 / 65536}},
		{"log(x)", []float64{0, ln2, 2 * ln2, 3 * ln2, 4 * ln2}},
		{"exp(log(x))", []float64{1, 2, 4, 8, 16}},
		{"abs(z)", []float64{1, 0, 1, 4, 9}},
		{"sqrt(abs(z))", []float64{1, 0, 1, 2, 3}},
		{"lag(x, 1)", []float64{nan, 1, 2, 4, 8}},
		{"lag(x, 2)", []float64{nan, nan, 1, 2, 4}},
		{"lag(x, -1)", []float64{2, 4, 8, 16, nan}},
		{"lag(x, 0)", []float64{1, 2, 4, 8, 16}},
		{"lag(x, 9)", []float64{nan, nan, nan, nan, nan}},
		{"diff(x)", []float64{nan, 1, 2, 4, 8}},
		{"diff(x, 2)", []float64{nan, nan, 3, 6, 12}},
		{"sdiff(x, 4)", []float64{nan, nan, nan, nan, 15}},
		{"dlog(x)", []float64{nan, ln2, ln2, ln2, ln2}},
		{"diff(y)", []float64{nan, 10, nan, nan, 10}},
		{"log(y)", []float64{math.Log(10), math.Log(20), nan, math.Log(40), math.Log(50)}},
		{"3", []float64{3, 3, 3, 3, 3}},
	}
	for _, tc := range tests {
		e, err := ParseExpr(tc.expr)
		if err != nil {
			t.Fatal(err)
		}
		s, err := Eval(e, f)
		if err != nil {
			t.Errorf("%s: %v", tc.expr, err)
			continue
		}
		if s.Name != e.String() || len(s.Dates) != 5 || s.Dates[0].String() != "2000Q1" {
			t.Errorf("%s: name %q dates %v", tc.expr, s.Name, s.Dates)
		}
		if !closeFloats(s.Values, tc.want, 1e-14) {
			t.Errorf("%s = %v, want %v", tc.expr, s.Values, tc.want)
		}
	}
	// evaluation must not change the frame
	if v, _ := f.Column("x"); v[0] != 1 {
		t.Error("frame modified")
	}
}

func TestEvalErrors(t *testing.T) {
	f, err := ReadCSV(stringsReader(evalCSV), "e.csv")
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct{ expr, want string }{
		{"log(z)", "e.csv:3: column z: log(z) is undefined on 2000Q2: the value 0 is not positive"},
		{"dlog(z)", "e.csv:3: column z: dlog(z) is undefined on 2000Q2: the value 0 is not positive"},
		{"log(x - 3)", "e.csv:2: log(x - 3) is undefined on 2000Q1: the value -2 is not positive"},
		{"sqrt(z)", "e.csv:4: column z: sqrt(z) is undefined on 2000Q3: the value -1 is negative"},
		{"x / z", "e.csv:3: x / z is undefined on 2000Q2: division by zero"},
		{"z^0.5", "e.csv:4: z^0.5 is undefined on 2000Q3: -1^0.5 has no real value"},
		{"exp(x * 100)", "e.csv:5: exp(x * 100) is undefined on 2000Q4: exp(800) overflows"},
		{"x * 1e308 * 10", "e.csv:3: x * 1e+308 is undefined on 2000Q2: the result overflows"},
		{"log(gpd)", `e.csv: unknown column "gpd"; the columns are x, y, z`},
		{"log(X)", `e.csv: unknown column "X" (did you mean "x"?)`},
		{"log(output)", `e.csv: unknown column "output"; the columns are x, y, z`},
	}
	for _, tc := range tests {
		e, err := ParseExpr(tc.expr)
		if err != nil {
			t.Fatal(err)
		}
		_, err = Eval(e, f)
		if err == nil || err.Error() != tc.want {
			t.Errorf("%s:\n got %v\nwant %s", tc.expr, err, tc.want)
		}
		if _, ok := err.(*DataError); !ok {
			t.Errorf("%s: error type %T", tc.expr, err)
		}
	}
}

func closeFloats(a, b []float64, tol float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.IsNaN(a[i]) || math.IsNaN(b[i]) {
			if math.IsNaN(a[i]) != math.IsNaN(b[i]) {
				return false
			}
			continue
		}
		if math.Abs(a[i]-b[i]) > tol*math.Max(1, math.Abs(b[i])) {
			return false
		}
	}
	return true
}
