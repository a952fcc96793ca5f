package johansen

import (
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// walks returns k independent Gaussian random walks of length n (seeded).
func walks(n, k int, seed uint64) *mat.Dense {
	rng := rand.New(rand.NewPCG(seed, 1))
	y := mat.NewDense(n, k, nil)
	for j := 0; j < k; j++ {
		var s float64
		for i := 0; i < n; i++ {
			s += rng.NormFloat64()
			y.Set(i, j, s)
		}
	}
	return y
}

// TestErrors checks that bad input gives an error naming the problem.
func TestErrors(t *testing.T) {
	y := walks(100, 3, 7)
	constant := mat.DenseCopyOf(y)
	for i := 0; i < 100; i++ {
		constant.Set(i, 1, 5)
	}
	dup := mat.DenseCopyOf(y)
	for i := 0; i < 100; i++ {
		dup.Set(i, 2, y.At(i, 0))
	}
	collinear := mat.DenseCopyOf(y)
	for i := 0; i < 100; i++ {
		collinear.Set(i, 2, y.At(i, 0)+2*y.At(i, 1))
	}
	big := walks(300, 12, 3)
	fit, err := Test(y, C, 1)
	if err != nil {
		t.Fatal(err)
	}
	bigFit, err := Test(big, C, 1)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name string
		err  func() error
		want string
	}{
		{"constant series", func() error { _, e := Test(constant, C, 1); return e }, "series 1 is constant"},
		{"duplicated series", func() error { _, e := Test(dup, RC, 1); return e }, "series 0 and 2 are identical"},
		{"collinear series", func() error { _, e := Test(collinear, C, 1); return e }, "singular moment matrix"},
		{"too few observations", func() error { _, e := Test(walks(12, 3, 1), CT, 2); return e }, "too few observations"},
		{"negative lags", func() error { _, e := Test(y, C, -1); return e }, "non-negative"},
		{"K−r beyond table", func() error { _, e := bigFit.Critical(TraceStat); return e }, "K−r = 1..11, not 12"},
		{"beyond the tables", func() error { _, e := CriticalValues(N, TraceStat, MaxTabulated+1); return e }, "tabulated for K−r = 1..11, not 12"},
		{"level not tabulated", func() error { _, e := fit.Rank(0.025, false); return e }, "0.10, 0.05 and 0.01"},
		{"rank beyond K−1", func() error { _, e := fit.Estimate(3, []int{0, 1, 2}); return e }, "outside 1..K−1 = 1..2"},
		{"rank zero", func() error { _, e := fit.TestBeta(0, mat.NewDense(3, 2, nil)); return e }, "outside 1..K−1"},
		{"normalisation count", func() error { _, e := fit.Estimate(2, []int{0}); return e }, "one series per relation"},
		{"H rows", func() error { _, e := fit.TestBeta(1, mat.NewDense(4, 2, nil)); return e }, "H has 4 rows; β has 3"},
		{"A columns", func() error {
			_, e := fit.TestAlpha(1, mat.NewDense(3, 3, []float64{1, 0, 0, 0, 1, 0, 0, 0, 1}))
			return e
		}, "fewer than K = 3"},
		{"A rank", func() error { _, e := fit.TestAlpha(1, mat.NewDense(3, 2, []float64{1, 2, 1, 2, 1, 2})); return e }, "full column rank"},
		{"weak exogeneity series", func() error { _, e := fit.WeakExogeneity(1, 5); return e }, "outside 0..2"},
		{"lag table too short", func() error { _, e := LagOrder(walks(20, 3, 2), CT, 6); return e }, "too few observations"},
		{"unknown case", func() error { _, e := Test(y, Case(7), 1); return e }, "invalid deterministic case"},
	} {
		err := c.err()
		if err == nil {
			t.Errorf("%s: no error", c.name)
			continue
		}
		if !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %q does not mention %q", c.name, err, c.want)
		}
	}
}

// BenchmarkJohansen6x10000 times Test on 6 random walks of 10,000
// observations with 2 lagged differences (case C).
func BenchmarkJohansen6x10000(b *testing.B) {
	y := walks(10000, 6, 11)
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := Test(y, C, 2); err != nil {
			b.Fatal(err)
		}
	}
}
