package series

import (
	"bytes"
	"math"
	"reflect"
	"testing"
)

// FuzzReadCSV: any input gives a frame or a *DataError, never a panic,
// and a frame obeys the invariants of ReadCSV.
func FuzzReadCSV(f *testing.F) {
	for _, s := range []string{
		"date,x\n1990,1\n1991,2\n",
		"date;x;y\r\n1990Q1;1;NA\r\n1990Q2;.;2\r\n",
		"\xEF\xBB\xBFx\ty\n1\t2\n",
		"date,x\n2020-01-31,1\n2020-02-03,nan\n",
		",a\n1990M1,1\n1990M2,\"2\"\n",
		"date,x\n1990Q1,1\n1990Q3,2\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		fr, err := ReadCSV(bytes.NewReader(data), "f.csv")
		if err != nil {
			if _, ok := err.(*DataError); !ok {
				t.Fatalf("error of type %T: %v", err, err)
			}
			return
		}
		n := fr.Len()
		if n == 0 || len(fr.Lines) != n || len(fr.cols) != len(fr.Names) {
			t.Fatalf("inconsistent frame: %d dates, %d lines, %d cols, %d names", n, len(fr.Lines), len(fr.cols), len(fr.Names))
		}
		for _, c := range fr.cols {
			if len(c) != n {
				t.Fatalf("column of %d values for %d rows", len(c), n)
			}
			for _, v := range c {
				if math.IsInf(v, 0) {
					t.Fatal("infinite value loaded")
				}
			}
		}
		for i := 1; i < n; i++ {
			if fr.Dates[i].Freq != fr.Freq || !fr.Dates[i-1].Before(fr.Dates[i]) || fr.Lines[i] <= fr.Lines[i-1] {
				t.Fatalf("rows %d, %d out of order", i-1, i)
			}
			if fr.Freq != Daily && fr.Dates[i].Index() != fr.Dates[i-1].Index()+1 {
				t.Fatalf("gap between rows %d and %d", i-1, i)
			}
		}
	})
}

// FuzzParseExpr: parsing never panics, and the canonical form of a
// parsed expression parses back to the same tree.
func FuzzParseExpr(f *testing.F) {
	for _, s := range []string{
		"dlog(gdp)", "100*diff(log(p), 4) - lag(r, -1)", "-a^-b^2", "`odd name` / (1e-3 + .5)",
		"sdiff(x, 12)", "abs(sqrt(x))+exp(-y)", "((x))", "a--b", "`a``b`",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		e, err := ParseExpr(s)
		if err != nil {
			if _, ok := err.(*ExprError); !ok {
				t.Fatalf("error of type %T", err)
			}
			return
		}
		c := e.String()
		e2, err := ParseExpr(c)
		if err != nil {
			t.Fatalf("canonical form %q of %q does not parse: %v", c, s, err)
		}
		if !reflect.DeepEqual(e, e2) {
			t.Fatalf("canonical form %q of %q parses to another tree", c, s)
		}
		if e2.String() != c {
			t.Fatalf("canonical form not stable: %q → %q", c, e2.String())
		}
	})
}

// FuzzParseDate: a parsed date prints in a form that parses back to
// the same date; Add and Index agree.
func FuzzParseDate(f *testing.F) {
	for _, s := range []string{"1990", "1990Q1", "1990-q4", "1990-01", "1990M1", "1990m12", "1990-01-31", "2000-02-29", "1000-01-01", "9999Q4"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		d, err := ParseDate(s)
		if err != nil {
			return
		}
		d2, err := ParseDate(d.String())
		if err != nil || !d2.Equal(d) || d2.Freq != d.Freq {
			t.Fatalf("%q → %s → %v, %v", s, d, d2, err)
		}
		if d.Add(3).Index() != d.Index()+3 || !d.Before(d.Add(1)) {
			t.Fatalf("%q: Add/Index disagree", s)
		}
	})
}
