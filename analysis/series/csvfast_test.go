package series

import (
	"bytes"
	"fmt"
	"math"
	"reflect"
	"strings"
	"testing"
)

// sameFrame reports whether two frames hold the same data (NaN equal to
// NaN; capacities ignored).
func sameFrame(a, b *Frame) bool {
	if a.Source != b.Source || a.Freq != b.Freq || a.FreqBasis != b.FreqBasis || a.Sheet != b.Sheet ||
		!reflect.DeepEqual(a.Names, b.Names) || len(a.Dates) != len(b.Dates) || len(a.cols) != len(b.cols) {
		return false
	}
	for i := range a.Dates {
		if a.Dates[i] != b.Dates[i] || a.Lines[i] != b.Lines[i] {
			return false
		}
	}
	for j := range a.cols {
		for i, v := range a.cols[j] {
			w := b.cols[j][i]
			if math.Float64bits(v) != math.Float64bits(w) && !(math.IsNaN(v) && math.IsNaN(w)) {
				return false
			}
		}
	}
	return true
}

// FuzzReadCSVBytesSame: the in-memory reader gives what the streaming
// reader gives — the same frame, or the same error — on any input.
func FuzzReadCSVBytesSame(f *testing.F) {
	for _, s := range []string{
		"date,x\n1990,1\n1991,2\n",
		"date;x;y\r\n1990Q1;1;NA\r\n1990Q2;.;2\r\n",
		"\xEF\xBB\xBFx\ty\n1\t2\n",
		"date,x\n2020-01-31,1\n2020-02-03,nan\n",
		",a\n1990M1,1\n1990M2,\"2\"\n",
		"date,x\n1990Q1,1\n1990Q3,2\n",
		"\n\ndate,x\n\n1990,1\n\n1991,2",
		"date,x\n1990,1\r\n1991,2\r",
		"date,x\n1990,1\r1991,2\n",
		"x,y\n1,2,3\n",
		"x\n",
		"",
		"\n\n",
		"date,x\n1990,1e400\n",
		"date, x \n 1990 , 1 \n1991,x\n",
		"x,x\n1,2\n",
		"a,b\n1990-02-30,1\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		want, werr := ReadCSV(bytes.NewReader(data), "f.csv")
		got, gerr := ReadCSVBytes(data, "f.csv")
		if (werr == nil) != (gerr == nil) {
			t.Fatalf("streaming: %v; in memory: %v", werr, gerr)
		}
		if werr != nil {
			if werr.Error() != gerr.Error() {
				t.Fatalf("errors differ:\nstreaming: %v\nin memory: %v", werr, gerr)
			}
			return
		}
		if !sameFrame(want, got) {
			t.Fatalf("frames differ:\nstreaming: %+v\nin memory: %+v", want, got)
		}
	})
}

func TestReadCSVBytesPlainPath(t *testing.T) {
	for _, tc := range []struct {
		in    string
		plain bool
	}{
		{"x\n1\n", true},
		{"x\r\n1\r\n", true},
		{"x\n\"1\"\n", false},
		{"x\n1\r2\n", false},
		{"x\n1\r", false},
	} {
		if got := plainCSV([]byte(tc.in)); got != tc.plain {
			t.Errorf("plainCSV(%q) = %v, want %v", tc.in, got, tc.plain)
		}
	}
}

// TestReadCSVBytesParallelSame: a file long enough to be parsed on every
// core gives the frame and the errors of the streaming reader, with bad
// values and dates early, late, at block boundaries and together (the
// earlier one must win, as in a reading in order).
func TestReadCSVBytesParallelSame(t *testing.T) {
	const n = 2*parallelCells/3 + 3 // three columns
	row := func(i int) []string {
		y, m := 1000+i/12, i%12+1
		return []string{fmt.Sprintf("%d-%02d", y, m), fmt.Sprintf("%d.5", i), fmt.Sprintf("%de-3", 2*i)}
	}
	build := func(edit func(i int, r []string) []string) []byte {
		var b bytes.Buffer
		b.WriteString("date;x;y\n")
		for i := 0; i < n; i++ {
			r := row(i)
			if edit != nil {
				r = edit(i, r)
			}
			b.WriteString(strings.Join(r, ";") + "\n")
			if i == 100 {
				b.WriteString("\n") // an empty line moves the line numbers
			}
		}
		return b.Bytes()
	}
	cases := map[string][]byte{"clean": build(nil)}
	for _, at := range []int{0, n/2 - 1, n / 2, n - 1} { // two blocks on two cores
		at := at
		cases[fmt.Sprintf("bad value at %d", at)] = build(func(i int, r []string) []string {
			if i == at {
				r[2] = "1,5"
			}
			return r
		})
		cases[fmt.Sprintf("bad date at %d", at)] = build(func(i int, r []string) []string {
			if i == at {
				r[0] = "1990-13"
			}
			return r
		})
		cases[fmt.Sprintf("short row at %d, bad value later", at)] = build(func(i int, r []string) []string {
			if i == at {
				r = r[:2]
			}
			if i == min(at+7, n-1) {
				r[1] = "x"
			}
			return r
		})
		cases[fmt.Sprintf("bad value at %d, bad date later", at)] = build(func(i int, r []string) []string {
			if i == at {
				r[1] = "inf"
			}
			if i == min(at+5000, n-1) {
				r[0] = "2990-01"
			}
			return r
		})
	}
	for name, data := range cases {
		want, werr := ReadCSV(bytes.NewReader(data), "p.csv")
		got, gerr := ReadCSVBytes(data, "p.csv")
		if (werr == nil) != (gerr == nil) || werr != nil && werr.Error() != gerr.Error() {
			t.Errorf("%s: streaming: %v; in memory: %v", name, werr, gerr)
			continue
		}
		if werr == nil && !sameFrame(want, got) {
			t.Errorf("%s: frames differ", name)
		}
		if name == "clean" && (werr != nil || got.Len() != n || got.Freq != Monthly) {
			t.Errorf("clean file: %v, %d rows", werr, got.Len())
		}
	}
}

// TestReadCSVBytesKeepsNoView: the fast reader parses a view of the
// caller's bytes, not a copy; nothing it returns may keep that view —
// the frame and an error must read the same after the bytes are
// overwritten.
func TestReadCSVBytesKeepsNoView(t *testing.T) {
	var b strings.Builder
	b.WriteString("period,alpha price,beta\n")
	for i := 0; i < 40000; i++ { // enough rows for the parallel path
		fmt.Fprintf(&b, "%d-%02d,%d.25,%d\n", 1900+i/12, i%12+1, i, -i)
	}
	raw := []byte(b.String())
	f, err := ReadCSVBytes(raw, "x.csv")
	if err != nil {
		t.Fatal(err)
	}
	bad := []byte(strings.Replace(b.String(), "1901-03,", "1901-3x,", 1))
	_, derr := ReadCSVBytes(bad, "x.csv")
	if derr == nil {
		t.Fatal("no error for a bad date")
	}
	msg := derr.Error()
	col := derr.(*DataError).Column
	for i := range raw {
		raw[i] = 'z'
	}
	for i := range bad {
		bad[i] = 'z'
	}
	if len(f.Names) != 2 || f.Names[0] != "alpha price" || f.Names[1] != "beta" {
		t.Errorf("names now %q", f.Names)
	}
	if v, _ := f.Column("alpha price"); len(v) != 40000 || v[7] != 7.25 {
		t.Errorf("values changed")
	}
	if derr.Error() != msg || derr.(*DataError).Column != col || col != "period" {
		t.Errorf("error now %q (column %q), was %q", derr.Error(), derr.(*DataError).Column, msg)
	}
}
