package householder

import (
	"math"
	"math/rand/v2"
	"runtime"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// adfLike returns the columns of a Dickey–Fuller comparison design on a
// random walk of length n+13 (constant, level, 12 lagged differences,
// then the response Δy), each column scaled to unit length as nested
// least squares scales them.
func adfLike(n int, seed uint64) [][]float64 {
	r := rand.New(rand.NewPCG(seed, 7))
	y := make([]float64, n+13)
	for i := 1; i < len(y); i++ {
		y[i] = y[i-1] + r.NormFloat64()
	}
	cols := make([][]float64, 15)
	for j := range cols {
		cols[j] = make([]float64, n)
	}
	for i := 0; i < n; i++ {
		t := i + 13
		cols[0][i] = 1
		cols[1][i] = y[t-1]
		for l := 1; l <= 12; l++ {
			cols[1+l][i] = y[t-l] - y[t-l-1]
		}
		cols[14][i] = y[t] - y[t-1]
	}
	for _, c := range cols[:14] {
		s := 0.0
		for _, v := range c {
			s += v * v
		}
		s = math.Sqrt(s)
		for i := range c {
			c[i] /= s
		}
	}
	return cols
}

func clone(cols [][]float64) [][]float64 {
	out := make([][]float64, len(cols))
	for j, c := range cols {
		out[j] = append([]float64(nil), c...)
	}
	return out
}

// reference: one Householder QR over whole columns.
func nestedRef(t *testing.T, cols [][]float64) (ssr, tt []float64, indep int) {
	m := len(cols) - 1
	var f QR
	if err := f.Factor(clone(cols), m); err != nil {
		t.Fatal(err)
	}
	ssr, tt = make([]float64, m), make([]float64, m)
	if err := f.Nested(m, ssr, tt); err != nil {
		t.Fatal(err)
	}
	return ssr, tt, f.Indep()
}

func relDiff(a, b float64) float64 {
	if a == b || math.IsNaN(a) && math.IsNaN(b) {
		return 0
	}
	return math.Abs(a-b) / math.Max(math.Abs(a), math.Abs(b))
}

// TestNestedTallMatchesFactor: the row-blocked factorisation gives the
// SSR and t-ratios of one QR over whole columns to 1e-12 relative, for
// blocks of many sizes (one block, blocks that do not divide n, the
// smallest block), and leaves the columns unchanged.
func TestNestedTallMatchesFactor(t *testing.T) {
	cols := adfLike(5000, 1)
	ssr0, t0, ind0 := nestedRef(t, cols)
	keep := clone(cols)
	for _, block := range []int{15, 16, 97, 1000, 2500, 4999, 5000, 100000} {
		ssr, tt := make([]float64, 14), make([]float64, 14)
		ind, err := nestedTall(cols, nil, ssr, tt, block)
		if err != nil {
			t.Fatal(err)
		}
		if ind != ind0 {
			t.Errorf("block %d: Indep %d, want %d", block, ind, ind0)
		}
		for j := range ssr {
			if d := relDiff(ssr[j], ssr0[j]); d > 1e-12 {
				t.Errorf("block %d: SSR_%d %v, one QR %v (rel. %.1e)", block, j+1, ssr[j], ssr0[j], d)
			}
			if d := relDiff(tt[j], t0[j]); d > 1e-12 {
				t.Errorf("block %d: t_%d %v, one QR %v (rel. %.1e)", block, j+1, tt[j], t0[j], d)
			}
		}
	}
	for j := range cols {
		for i := range cols[j] {
			if cols[j][i] != keep[j][i] {
				t.Fatal("NestedTall changed its input")
			}
		}
	}
}

// TestNestedTallPieces: a design of several pieces (TallChunk rows, the
// last shorter) gives the SSR and t-ratios of one QR to 1e-12 relative,
// the same bit for bit on one core and on several.
func TestNestedTallPieces(t *testing.T) {
	cols := adfLike(2*TallChunk+1000, 2)
	ssr0, t0, ind0 := nestedRef(t, cols)
	run := func() ([]float64, []float64, int) {
		ssr, tt := make([]float64, 14), make([]float64, 14)
		ind, err := NestedTall(cols, ssr, tt)
		if err != nil {
			t.Fatal(err)
		}
		return ssr, tt, ind
	}
	ssr, tt, ind := run()
	if ind != ind0 {
		t.Errorf("Indep %d, want %d", ind, ind0)
	}
	for j := range ssr {
		if d := relDiff(ssr[j], ssr0[j]); d > 1e-12 {
			t.Errorf("SSR_%d %v, one QR %v (rel. %.1e)", j+1, ssr[j], ssr0[j], d)
		}
		if d := relDiff(tt[j], t0[j]); d > 1e-12 {
			t.Errorf("t_%d %v, one QR %v (rel. %.1e)", j+1, tt[j], t0[j], d)
		}
	}
	prev := runtime.GOMAXPROCS(1)
	ssr1, tt1, _ := run()
	runtime.GOMAXPROCS(prev)
	for j := range ssr {
		if ssr1[j] != ssr[j] || tt1[j] != tt[j] {
			t.Fatalf("sub-design %d: one core gives SSR %v t %v, several %v %v", j+1, ssr1[j], tt1[j], ssr[j], tt[j])
		}
	}
}

// TestNestedTallRank: a column that repeats an earlier one is found by
// the rank rule as by Factor; a non-finite entry and bad shapes are
// errors.
func TestNestedTallRank(t *testing.T) {
	cols := adfLike(3000, 2)
	copy(cols[5], cols[3])
	_, _, ind0 := nestedRef(t, cols)
	ssr, tt := make([]float64, 14), make([]float64, 14)
	ind, err := nestedTall(cols, nil, ssr, tt, 100)
	if err != nil {
		t.Fatal(err)
	}
	if ind != 5 || ind0 != 5 {
		t.Errorf("Indep %d (one QR: %d), want 5", ind, ind0)
	}
	if !math.IsNaN(tt[5]) || math.IsNaN(tt[4]) {
		t.Errorf("t = %v: want NaN from the sixth sub-design on", tt)
	}
	cols[2][2500] = math.Inf(1)
	if _, err := nestedTall(cols, nil, ssr, tt, 100); err == nil {
		t.Error("an infinite entry gave no error")
	}
	if _, err := NestedTall(cols[:1], nil, nil); err == nil {
		t.Error("one column gave no error")
	}
	if _, err := NestedTall([][]float64{{1, 2}, {3, 4}, {5, 6}}, make([]float64, 2), make([]float64, 2)); err == nil {
		t.Error("fewer rows than columns gave no error")
	}
}

// BenchmarkNestedFactor and BenchmarkNestedTall: nested least squares
// for the ADF lag search (13 sub-designs, T = 100,000) by one QR over
// whole columns and by row blocks.
func BenchmarkNestedFactor(b *testing.B) {
	cols := adfLike(100_000, 3)
	work := clone(cols)
	ssr, tt := make([]float64, 14), make([]float64, 14)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		for j := range cols {
			copy(work[j], cols[j])
		}
		var f QR
		f.Factor(work, 14)
		f.Nested(14, ssr, tt)
	}
}

func BenchmarkNestedTall(b *testing.B) {
	cols := adfLike(100_000, 3)
	ssr, tt := make([]float64, 14), make([]float64, 14)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := NestedTall(cols, ssr, tt); err != nil {
			b.Fatal(err)
		}
	}
}

// TestColumnsDenseAndGeneral: Columns copies a dense matrix (read in
// place) and any other matrix (read by At) to the same columns.
func TestColumnsDenseAndGeneral(t *testing.T) {
	d := mat.NewDense(4, 3, []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12})
	view := d.Slice(1, 4, 1, 3) // a dense view with stride 3
	for _, x := range []mat.Matrix{d, d.T(), view} {
		cols := Columns(x, 1)
		r, c := x.Dims()
		if len(cols) != c+1 || len(cols[c]) != r {
			t.Fatalf("shape %d×%d", len(cols[0]), len(cols))
		}
		for j := 0; j < c; j++ {
			for i := 0; i < r; i++ {
				if cols[j][i] != x.At(i, j) {
					t.Fatalf("(%d,%d) = %v, want %v", i, j, cols[j][i], x.At(i, j))
				}
			}
		}
	}
}

// TestNestedTallScaledBitForBit: scaling the design columns as each
// block is copied gives what NestedTall gives on copies scaled in
// place, bit for bit, with columns that share storage (windows of one
// series, as the lags of a unit-root regression are).
func TestNestedTallScaledBitForBit(t *testing.T) {
	cols := adfLike(5000, 3)
	m := len(cols) - 1
	// the design columns become windows of one series
	long := make([]float64, 5000+m)
	copy(long[m:], cols[0])
	src := make([][]float64, m+1)
	for j := 0; j < m; j++ {
		src[j] = long[m-j : m-j+5000]
	}
	src[m] = cols[m]
	scale := make([]float64, m)
	scaled := make([][]float64, m+1)
	for j := 0; j < m; j++ {
		scale[j] = 1 / math.Sqrt(float64(j+2))
		scaled[j] = make([]float64, 5000)
		for i, v := range src[j] {
			scaled[j][i] = v * scale[j]
		}
	}
	scaled[m] = append([]float64(nil), src[m]...)
	ssr0, t0 := make([]float64, m), make([]float64, m)
	ind0, err := NestedTall(scaled, ssr0, t0)
	if err != nil {
		t.Fatal(err)
	}
	keep := append([]float64(nil), long...)
	ssr, tt := make([]float64, m), make([]float64, m)
	ind, err := NestedTallScaled(src, scale, ssr, tt)
	if err != nil {
		t.Fatal(err)
	}
	if ind != ind0 {
		t.Errorf("Indep %d, want %d", ind, ind0)
	}
	for j := 0; j < m; j++ {
		if math.Float64bits(ssr[j]) != math.Float64bits(ssr0[j]) || math.Float64bits(tt[j]) != math.Float64bits(t0[j]) {
			t.Errorf("sub-design %d: SSR %v t %v, scaled copies %v %v", j+1, ssr[j], tt[j], ssr0[j], t0[j])
		}
	}
	for i := range long {
		if long[i] != keep[i] {
			t.Fatal("NestedTallScaled changed its input")
		}
	}
	if _, err := NestedTallScaled(src, scale[1:], ssr, tt); err == nil {
		t.Error("a missing scale was accepted")
	}
}

// TestTallRMatchesFactor: TallR's triangle equals the R of one Factor of
// the whole matrix up to the signs of its rows, within 1e-12 of each
// column's norm, for a matrix of one piece, of several (the last one,
// shorter than the width, joined to the one before) and of exactly one
// block; it is the same bit for bit on one core and on several; the rank
// rule finds a repeated column and a column of zeros; a non-finite entry
// and a short matrix are errors.
func TestTallRMatchesFactor(t *testing.T) {
	for _, n := range []int{40, tallBlock(15), 3*TallChunk + 7} {
		cols := adfLike(n, uint64(n))
		w := len(cols)
		row := func(i int, dst []float64) {
			for j := range dst {
				dst[j] = cols[j][i]
			}
		}
		got, indep, err := TallR(n, w, row)
		if err != nil {
			t.Fatal(err)
		}
		if indep != w {
			t.Fatalf("n %d: indep %d, want %d", n, indep, w)
		}
		prev := runtime.GOMAXPROCS(1)
		one, _, err := TallR(n, w, row)
		runtime.GOMAXPROCS(prev)
		if err != nil || !mat.Equal(one, got) {
			t.Fatalf("n %d: the triangle on one core differs (%v)", n, err)
		}
		var f QR
		work := make([][]float64, w)
		for j := range work {
			work[j] = append([]float64(nil), cols[j]...)
		}
		if err := f.Factor(work, w); err != nil {
			t.Fatal(err)
		}
		for i := 0; i < w; i++ {
			s := math.Copysign(1, got.At(i, i)) * math.Copysign(1, f.RAt(i, i))
			for j := i; j < w; j++ {
				norm := math.Sqrt(floatsDot(cols[j], cols[j]))
				if d := math.Abs(s*got.At(i, j) - f.RAt(i, j)); d > 1e-12*norm {
					t.Fatalf("n %d: R[%d,%d] = %.17g, Factor's %.17g (column norm %g)", n, i, j, s*got.At(i, j), f.RAt(i, j), norm)
				}
			}
		}
	}
	n := 5000
	cols := adfLike(n, 3)
	w := len(cols)
	for _, c := range []struct {
		name string
		edit func([][]float64)
		want int
	}{
		{"column 6 repeats column 4", func(c [][]float64) { copy(c[6], c[4]) }, 6},
		{"column 3 is zero", func(c [][]float64) { clear(c[3]) }, 3},
	} {
		cc := make([][]float64, w)
		for j := range cc {
			cc[j] = append([]float64(nil), cols[j]...)
		}
		c.edit(cc)
		_, indep, err := TallR(n, w, func(i int, dst []float64) {
			for j := range dst {
				dst[j] = cc[j][i]
			}
		})
		if err != nil || indep != c.want {
			t.Errorf("%s: indep %d (%v), want %d", c.name, indep, err, c.want)
		}
	}
	if _, _, err := TallR(n, w, func(i int, dst []float64) {
		for j := range dst {
			dst[j] = cols[j][i]
		}
		if i == 4321 {
			dst[2] = math.NaN()
		}
	}); err == nil {
		t.Error("a NaN: no error")
	}
	if _, _, err := TallR(w-1, w, func(int, []float64) {}); err == nil {
		t.Error("fewer rows than columns: no error")
	}
}

func floatsDot(a, b []float64) float64 {
	var s float64
	for i := range a {
		s += a[i] * b[i]
	}
	return s
}
