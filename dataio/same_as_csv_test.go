package dataio

import (
	"fmt"
	"math"
	"slices"
	"strings"
	"testing"

	"github.com/galley-econ/galley/analysis/series"
)

// TestReadXLSXSameAsCSV: the sheet "Data" of quarterly.xlsx and the
// same table written as CSV (from the generator's recipe in
// testdata/series/genxlsx: output 100 + 1.5 i, rate 2 + i/10, no rate
// on row 7) give the same frame, rows and all.
func TestReadXLSXSameAsCSV(t *testing.T) {
	var b strings.Builder
	b.WriteString("date,output,rate\n")
	for i := 0; i < 12; i++ {
		rate := fmt.Sprint(2 + float64(i)/10)
		if i+2 == 7 {
			rate = ""
		}
		fmt.Fprintf(&b, "%dQ%d,%v,%s\n", 2001+i/4, i%4+1, 100+1.5*float64(i), rate)
	}
	want, err := series.ReadCSV(strings.NewReader(b.String()), "q.csv")
	if err != nil {
		t.Fatal(err)
	}
	got, err := readBook(t, "quarterly.xlsx", "Data")
	if err != nil {
		t.Fatal(err)
	}
	if got.Freq != want.Freq || !slices.Equal(got.Dates, want.Dates) || !slices.Equal(got.Names, want.Names) || !slices.Equal(got.Lines, want.Lines) {
		t.Fatalf("xlsx %v %v %v %v\n csv %v %v %v %v", got.Freq, got.Dates, got.Names, got.Lines, want.Freq, want.Dates, want.Names, want.Lines)
	}
	for _, name := range want.Names {
		g, _ := got.Column(name)
		w, _ := want.Column(name)
		for i := range w {
			if math.Float64bits(g[i]) != math.Float64bits(w[i]) && !(math.IsNaN(g[i]) && math.IsNaN(w[i])) {
				t.Errorf("%s[%d]: xlsx %v, csv %v", name, i, g[i], w[i])
			}
		}
	}
}
