package unitroot

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/householder"
)

// TestNestedTallDesign: a lag search whose design outgrows tallBytes is
// factorised in blocks of rows; its criteria equal those of one QR over
// whole columns to 1e-12 relative, so the lag chosen is the same.
func TestNestedTallDesign(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 12))
	y := make([]float64, 30_000)
	for i := 1; i < len(y); i++ {
		y[i] = y[i-1] + r.NormFloat64() + 0.3*(y[i-1]-y[max(i-2, 0)])
	}
	det, d := caseDet(critical.Const)
	cols, n := selectionColumns(y, det, d, 12)
	if n*len(cols)*8 <= tallBytes {
		t.Fatalf("design of %d bytes is not tall", n*len(cols)*8)
	}
	ref := make([][]float64, len(cols))
	for j, c := range cols {
		ref[j] = append([]float64(nil), c...)
	}
	got := nested(cols)
	// the reference: the same scaling, one QR
	m := len(ref) - 1
	for j := 0; j < m; j++ {
		s := 0.0
		for _, v := range ref[j] {
			s += v * v
		}
		for i := range ref[j] {
			ref[j][i] /= math.Sqrt(s)
		}
	}
	var f householder.QR
	if err := f.Factor(ref, m); err != nil {
		t.Fatal(err)
	}
	ssr, tt := make([]float64, m), make([]float64, m)
	if err := f.Nested(m, ssr, tt); err != nil {
		t.Fatal(err)
	}
	for j := 0; j < m; j++ {
		if d := math.Abs(got.ssr[j]-ssr[j]) / ssr[j]; d > 1e-12 {
			t.Errorf("SSR_%d: %v, one QR %v", j+1, got.ssr[j], ssr[j])
		}
		if d := math.Abs(got.t[j]-tt[j]) / math.Abs(tt[j]); d > 1e-12 {
			t.Errorf("t_%d: %v, one QR %v", j+1, got.t[j], tt[j])
		}
		if !got.ok[j] {
			t.Errorf("sub-design %d flagged rank deficient", j+1)
		}
	}
	a, err := ADF(y, critical.Const, LagRule{Select: AIC, Max: 12})
	if err != nil {
		t.Fatal(err)
	}
	if a.Lags != 1 {
		t.Errorf("AIC chose %d lags for an AR(1) in differences, want 1", a.Lags)
	}
}

// TestSelectionSourcesBitForBit: the lag search over windows of the
// series (no copy of the design) gives the criteria of the search over
// a stored copy of the design, bit for bit.
func TestSelectionSourcesBitForBit(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	y := make([]float64, 30_000)
	for i := 1; i < len(y); i++ {
		y[i] = y[i-1] + r.NormFloat64()
	}
	for _, c := range []critical.Case{critical.NoConst, critical.Const, critical.ConstTrend, critical.ConstTrendSq} {
		det, d := caseDet(c)
		src, n := selectionSources(y, det, d, 12)
		if !tall(n, len(src)) {
			t.Fatal("not a tall design")
		}
		cols, _ := selectionColumns(y, det, d, 12)
		got, want := nested(src), nested(cols)
		for j := range want.ssr {
			if math.Float64bits(got.ssr[j]) != math.Float64bits(want.ssr[j]) || math.Float64bits(got.t[j]) != math.Float64bits(want.t[j]) || got.ok[j] != want.ok[j] {
				t.Errorf("case %v, sub-design %d: %v %v, stored design %v %v", c, j+1, got.ssr[j], got.t[j], want.ssr[j], want.t[j])
			}
		}
	}
}
