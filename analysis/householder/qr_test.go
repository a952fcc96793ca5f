package householder

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// The reference is gonum v0.17.0's mat.QR (LAPACK dgeqrf/dorgqr in Go),
// which uses the same sign convention (R_kk = −sign(x_0)‖x‖, no
// reflection for a zero subcolumn): R, Q and the least-squares solution
// must agree to rounding, 1e-12 relative to the matrix norm.

func randDense(r *rand.Rand, n, m int) *mat.Dense {
	x := mat.NewDense(n, m, nil)
	for i := 0; i < n; i++ {
		for j := 0; j < m; j++ {
			x.Set(i, j, r.NormFloat64()*math.Pow(10, float64(j%3)))
		}
	}
	return x
}

func maxAbsDiff(a, b mat.Matrix) float64 {
	r, c := a.Dims()
	var d float64
	for i := 0; i < r; i++ {
		for j := 0; j < c; j++ {
			d = math.Max(d, math.Abs(a.At(i, j)-b.At(i, j)))
		}
	}
	return d
}

func TestFactorAgainstGonum(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for _, sh := range []struct{ n, m int }{{1, 1}, {5, 1}, {5, 5}, {7, 3}, {50, 8}, {200, 40}} {
		x := randDense(r, sh.n, sh.m)
		y := make([]float64, sh.n)
		for i := range y {
			y[i] = r.NormFloat64()
		}
		cols := Columns(x, 1)
		copy(cols[sh.m], y)
		var f QR
		if err := f.Factor(cols, sh.m); err != nil {
			t.Fatal(err)
		}
		if !f.FullRank() {
			t.Fatalf("%v: random matrix flagged rank deficient at %d", sh, f.Indep())
		}
		var ref mat.QR
		ref.Factorize(x)
		var rr, qq mat.Dense
		ref.RTo(&rr)
		ref.QTo(&qq)
		scale := mat.Norm(x, math.Inf(1))
		if d := maxAbsDiff(f.R(), rr.Slice(0, sh.m, 0, sh.m)); d > 1e-12*scale {
			t.Errorf("%v: R differs from gonum by %g", sh, d)
		}
		q, err := f.Q(sh.n)
		if err != nil {
			t.Fatal(err)
		}
		if d := maxAbsDiff(q, &qq); d > 1e-12 {
			t.Errorf("%v: Q differs from gonum by %g", sh, d)
		}
		// Qᵀy carried through Factor equals QTVec and gonum's Qᵀy.
		qty := append([]float64(nil), y...)
		if err := f.QTVec(qty); err != nil {
			t.Fatal(err)
		}
		var want mat.VecDense
		want.MulVec(qq.T(), mat.NewVecDense(sh.n, y))
		for i := range qty {
			if math.Abs(qty[i]-want.AtVec(i)) > 1e-12*mat.Norm(&want, 2) ||
				math.Abs(cols[sh.m][i]-want.AtVec(i)) > 1e-12*mat.Norm(&want, 2) {
				t.Fatalf("%v: (Qᵀy)_%d = %g and %g, gonum %g", sh, i, qty[i], cols[sh.m][i], want.AtVec(i))
			}
		}
		// QVec inverts QTVec.
		if err := f.QVec(qty); err != nil {
			t.Fatal(err)
		}
		for i := range qty {
			if math.Abs(qty[i]-y[i]) > 1e-12*mat.Norm(&want, 2) {
				t.Fatalf("%v: QQᵀy differs from y in row %d", sh, i)
			}
		}
		// Least squares against gonum's solver.
		if sh.n > sh.m {
			b := append([]float64(nil), cols[sh.m][:sh.m]...)
			if err := f.Solve(b); err != nil {
				t.Fatal(err)
			}
			var bw mat.VecDense
			if err := ref.SolveVecTo(&bw, false, mat.NewVecDense(sh.n, y)); err != nil {
				t.Fatal(err)
			}
			for j := range b {
				if math.Abs(b[j]-bw.AtVec(j)) > 1e-11*math.Abs(bw.AtVec(j))+1e-14 {
					t.Errorf("%v: β_%d = %.17g, gonum %.17g", sh, j, b[j], bw.AtVec(j))
				}
			}
		}
	}
}

// A zero subcolumn takes no reflection, as LAPACK's dlarfg: the identity
// factorises as Q = I, R = I (gonum gives the same).
func TestZeroSubcolumnNoReflection(t *testing.T) {
	x := mat.NewDense(3, 2, []float64{1, 0, 0, -2, 0, 0})
	var f QR
	if err := f.Factor(Columns(x, 0), 2); err != nil {
		t.Fatal(err)
	}
	var ref mat.QR
	ref.Factorize(x)
	var rr mat.Dense
	ref.RTo(&rr)
	if f.RAt(0, 0) != rr.At(0, 0) || f.RAt(1, 1) != rr.At(1, 1) {
		t.Errorf("diag R = %g, %g; gonum %g, %g", f.RAt(0, 0), f.RAt(1, 1), rr.At(0, 0), rr.At(1, 1))
	}
	if f.RAt(0, 0) != 1 || f.RAt(1, 1) != -2 {
		t.Errorf("diag R = %g, %g, want 1, -2", f.RAt(0, 0), f.RAt(1, 1))
	}
}

func TestIndep(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for _, tc := range []struct {
		name  string
		build func(x *mat.Dense)
		want  int
	}{
		{"full rank", func(*mat.Dense) {}, 4},
		{"duplicate column 2", func(x *mat.Dense) {
			for i := 0; i < 20; i++ {
				x.Set(i, 2, x.At(i, 0))
			}
		}, 2},
		{"combination in column 3, scaled by 1e8", func(x *mat.Dense) {
			for i := 0; i < 20; i++ {
				x.Set(i, 3, 1e8*(x.At(i, 0)-3*x.At(i, 1)))
			}
		}, 3},
		{"zero column 1", func(x *mat.Dense) {
			for i := 0; i < 20; i++ {
				x.Set(i, 1, 0)
			}
		}, 1},
		// Independent but badly scaled: column 1 = column 0 plus 1e-6 noise
		// is well above the 1e-10 relative rule.
		{"near but not collinear", func(x *mat.Dense) {
			for i := 0; i < 20; i++ {
				x.Set(i, 1, x.At(i, 0)+1e-6*r.NormFloat64())
			}
		}, 4},
	} {
		x := randDense(r, 20, 4)
		tc.build(x)
		var f QR
		if err := f.Factor(Columns(x, 0), 4); err != nil {
			t.Fatal(err)
		}
		if f.Indep() != tc.want {
			t.Errorf("%s: Indep = %d, want %d", tc.name, f.Indep(), tc.want)
		}
		if tc.want < 4 {
			if err := f.Solve(make([]float64, 4)); err == nil {
				t.Errorf("%s: Solve on a rank-deficient R gave no error", tc.name)
			}
		}
	}
}

// Cond is κ₂ = σ_max/σ_min of X; for X = U diag(s) Vᵀ built from known
// singular values it is s_max/s_min (the Q factor does not change them).
func TestCond(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	var qa, qb mat.QR
	qa.Factorize(randDense(r, 30, 3))
	qb.Factorize(randDense(r, 3, 3))
	var u, v mat.Dense
	qa.QTo(&u)
	qb.QTo(&v)
	s := mat.NewDiagDense(3, []float64{1e3, 2, 0.5})
	var x, tmp mat.Dense
	tmp.Mul(u.Slice(0, 30, 0, 3), s)
	x.Mul(&tmp, v.T())
	var f QR
	if err := f.Factor(Columns(&x, 0), 3); err != nil {
		t.Fatal(err)
	}
	if c := f.Cond(); math.Abs(c-2000)/2000 > 1e-10 {
		t.Errorf("Cond = %.15g, want 2000", c)
	}
}

// Nested SSR and t-ratios equal those of separate regressions on each
// leading sub-design, fitted by gonum's QR.
func TestNestedAgainstSeparateFits(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	n, m := 40, 6
	x := randDense(r, n, m)
	y := make([]float64, n)
	for i := range y {
		y[i] = x.At(i, 0) - 0.3*x.At(i, 2) + r.NormFloat64()
	}
	cols := Columns(x, 1)
	copy(cols[m], y)
	var f QR
	if err := f.Factor(cols, m); err != nil {
		t.Fatal(err)
	}
	ssr, tr := make([]float64, m), make([]float64, m)
	if err := f.Nested(m, ssr, tr); err != nil {
		t.Fatal(err)
	}
	for j := 1; j <= m; j++ {
		xj := x.Slice(0, n, 0, j)
		var q mat.QR
		q.Factorize(xj)
		var b mat.VecDense
		if err := q.SolveVecTo(&b, false, mat.NewVecDense(n, y)); err != nil {
			t.Fatal(err)
		}
		var fit mat.VecDense
		fit.MulVec(xj, &b)
		var s float64
		for i := 0; i < n; i++ {
			e := y[i] - fit.AtVec(i)
			s += e * e
		}
		var xtx, inv mat.Dense
		xtx.Mul(xj.T(), xj)
		if err := inv.Inverse(&xtx); err != nil {
			t.Fatal(err)
		}
		tw := b.AtVec(j-1) / math.Sqrt(s/float64(n-j)*inv.At(j-1, j-1))
		if math.Abs(ssr[j-1]-s) > 1e-10*s {
			t.Errorf("j=%d: nested SSR %.15g, separate %.15g", j, ssr[j-1], s)
		}
		if math.Abs(tr[j-1]-tw) > 1e-9*math.Abs(tw) {
			t.Errorf("j=%d: nested t %.15g, separate %.15g", j, tr[j-1], tw)
		}
	}
}

func TestBadShapes(t *testing.T) {
	var f QR
	for _, tc := range []struct {
		name string
		cols [][]float64
		m    int
	}{
		{"no columns", nil, 1},
		{"m = 0", [][]float64{{1, 2}}, 0},
		{"wider than tall", [][]float64{{1}, {2}}, 2},
		{"ragged", [][]float64{{1, 2, 3}, {1, 2}}, 2},
	} {
		if err := f.Factor(tc.cols, tc.m); !errors.Is(err, ErrShape) {
			t.Errorf("%s: error %v, want ErrShape", tc.name, err)
		}
	}
	if err := f.Factor([][]float64{{1, math.NaN(), 3}}, 1); err == nil {
		t.Error("NaN entry: no error")
	}
	if err := f.Factor([][]float64{{1, 2, 3}, {4, 5, 6}}, 1); err != nil {
		t.Fatal(err)
	}
	if err := f.QTVec(make([]float64, 2)); !errors.Is(err, ErrShape) {
		t.Errorf("QTVec short vector: %v", err)
	}
	if err := f.QVec(make([]float64, 4)); !errors.Is(err, ErrShape) {
		t.Errorf("QVec long vector: %v", err)
	}
	if err := f.Solve(make([]float64, 2)); !errors.Is(err, ErrShape) {
		t.Errorf("Solve: %v", err)
	}
	if _, err := f.Q(4); !errors.Is(err, ErrShape) {
		t.Errorf("Q(4) of order 3: %v", err)
	}
	if err := f.Nested(0, make([]float64, 1), make([]float64, 1)); !errors.Is(err, ErrShape) {
		t.Errorf("Nested on a design column: %v", err)
	}
	if err := f.Nested(1, make([]float64, 2), make([]float64, 1)); !errors.Is(err, ErrShape) {
		t.Errorf("Nested with wrong output length: %v", err)
	}
}

// A reused QR allocates nothing (the simulation kernels rely on it).
func TestReuseAllocatesNothing(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 10))
	cols := Columns(randDense(r, 30, 4), 1)
	orig := make([][]float64, len(cols))
	for j := range cols {
		orig[j] = append([]float64(nil), cols[j]...)
	}
	var f QR
	allocs := testing.AllocsPerRun(20, func() {
		for j := range cols {
			copy(cols[j], orig[j])
		}
		if err := f.Factor(cols, 4); err != nil {
			t.Fatal(err)
		}
		_ = f.QTVec(cols[4])
	})
	if allocs != 0 {
		t.Errorf("%v allocations per refactorisation", allocs)
	}
}

func BenchmarkFactor200x4(b *testing.B) {
	r := rand.New(rand.NewPCG(11, 12))
	cols := Columns(randDense(r, 200, 4), 1)
	orig := make([][]float64, len(cols))
	for j := range cols {
		orig[j] = append([]float64(nil), cols[j]...)
	}
	var f QR
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		for j := range cols {
			copy(cols[j], orig[j])
		}
		_ = f.Factor(cols, 4)
	}
}

// TestFactorParallelBitForBit: applying a step's reflection to two halves
// of the columns at once (a large matrix) gives the same R, reflectors and
// Qᵀy, bit for bit, as the serial sweep.
func TestFactorParallelBitForBit(t *testing.T) {
	cols := adfLike(30_000, 11)
	m := len(cols) - 1
	run := func(min int) ([][]float64, *QR) {
		old := parallelMinEntries
		parallelMinEntries = min
		defer func() { parallelMinEntries = old }()
		c := clone(cols)
		var f QR
		if err := f.Factor(c, m); err != nil {
			t.Fatal(err)
		}
		return c, &f
	}
	serial, fs := run(math.MaxInt)
	par, fp := run(1)
	for j := range serial {
		for i := range serial[j] {
			if math.Float64bits(serial[j][i]) != math.Float64bits(par[j][i]) {
				t.Fatalf("column %d row %d: serial %v, parallel %v", j, i, serial[j][i], par[j][i])
			}
		}
	}
	for k := 0; k < m; k++ {
		if math.Float64bits(fs.diag[k]) != math.Float64bits(fp.diag[k]) || math.Float64bits(fs.tau[k]) != math.Float64bits(fp.tau[k]) {
			t.Fatalf("step %d: R_kk or τ differ", k)
		}
	}
}
