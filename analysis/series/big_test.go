package series

import (
	"bytes"
	"fmt"
	"testing"
	"time"

	"github.com/galley-econ/galley/internal/longtest"
)

// genCSV writes a daily file of n rows from 1700-01-01 (n = 1e6 reaches
// the 4430s) with three columns: the row number, its half, and a
// missing value every 1000th row.
func genCSV(n int) []byte {
	var b bytes.Buffer
	b.Grow(n * 40)
	b.WriteString("date,i,h,m\n")
	d := time.Date(1700, 1, 1, 0, 0, 0, 0, time.UTC)
	for i := 0; i < n; i++ {
		m := "NA"
		if i%1000 != 0 {
			m = "1.25"
		}
		fmt.Fprintf(&b, "%s,%d,%g,%s\n", d.Format("2006-01-02"), i, float64(i)/2, m)
		d = d.AddDate(0, 0, 1)
	}
	return b.Bytes()
}

func TestReadCSVMillionRows(t *testing.T) {
	longtest.Skip(t, "a million-row file")
	const n = 1_000_000
	data := genCSV(n)
	f, err := ReadCSV(bytes.NewReader(data), "big.csv")
	if err != nil {
		t.Fatal(err)
	}
	if f.Len() != n || f.Freq != Daily || f.Lines[n-1] != n+1 {
		t.Fatalf("got %d rows, %v, last line %d", f.Len(), f.Freq, f.Lines[n-1])
	}
	i, _ := f.Column("i")
	h, _ := f.Column("h")
	if i[n-1] != n-1 || h[n-1] != float64(n-1)/2 {
		t.Errorf("last row %v %v", i[n-1], h[n-1])
	}
	if want := time.Date(1700, 1, 1, 0, 0, 0, 0, time.UTC).AddDate(0, 0, n-1); !f.Dates[n-1].Day().Equal(want) {
		t.Errorf("last date %v, want %v", f.Dates[n-1], want)
	}
	// Allocations: the columns grow by doubling (a few dozen
	// allocations each) and encoding/csv makes one string per record;
	// nothing else may allocate per row.
	allocs := testing.AllocsPerRun(1, func() {
		if _, err := ReadCSV(bytes.NewReader(data), "big.csv"); err != nil {
			t.Fatal(err)
		}
	})
	if allocs > n+1000 {
		t.Errorf("%v allocations for %d rows: more than one per row", allocs, n)
	}
}

func BenchmarkReadCSV(b *testing.B) {
	data := genCSV(100_000)
	b.SetBytes(int64(len(data)))
	b.ReportAllocs()
	for b.Loop() {
		if _, err := ReadCSV(bytes.NewReader(data), "bench.csv"); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkEval(b *testing.B) {
	f, err := ReadCSV(bytes.NewReader(genCSV(100_000)), "bench.csv")
	if err != nil {
		b.Fatal(err)
	}
	e, _ := ParseExpr("100 * dlog(h + 1) - lag(i, 4) / 2")
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Eval(e, f); err != nil {
			b.Fatal(err)
		}
	}
}
