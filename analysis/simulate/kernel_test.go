package simulate

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/unitroot"
)

// The allocation-free kernels must give the statistics of the packages
// that a user's data go through. The references here are those packages
// (each checked against statsmodels and urca in its own tests), on the
// same random walks; tolerance 1e-9 relative.

func close9(a, b float64) bool {
	return math.Abs(a-b) <= 1e-9*math.Max(1, math.Abs(b))
}

func TestADFKernelMatchesUnitroot(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for _, c := range []critical.Case{critical.NoConst, critical.Const, critical.ConstTrend, critical.ConstTrendSq} {
		for _, tt := range []struct{ T, p int }{{25, 0}, {100, 0}, {100, 3}, {500, 8}} {
			k := newADFKernel(tt.T, tt.p, c.Deterministics())
			for rep := 0; rep < 3; rep++ {
				got := k.adf(r)
				want, err := unitroot.DickeyFuller(k.y, c, unitroot.LagRule{Lags: tt.p})
				if err != nil {
					t.Fatal(err)
				}
				if !close9(got, want.Stat) {
					t.Errorf("case %v T=%d p=%d: kernel τ %.12g, unitroot %.12g", c, tt.T, tt.p, got, want.Stat)
				}
			}
		}
	}
}

func TestEGKernelMatchesCoint(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for _, c := range []critical.Case{critical.NoConst, critical.Const, critical.ConstTrend, critical.ConstTrendSq} {
		for _, tt := range []struct{ T, p, n int }{{30, 0, 2}, {200, 0, 3}, {200, 2, 5}, {400, 4, 12}} {
			k := newEGKernel(tt.T, tt.p, c.Deterministics(), tt.n)
			for rep := 0; rep < 3; rep++ {
				got := k.eg(r)
				want, err := coint.EngleGranger(k.y, k.xs, c, unitroot.LagRule{Lags: tt.p})
				if err != nil {
					t.Fatal(err)
				}
				if !close9(got, want.Stat) {
					t.Errorf("case %v T=%d p=%d N=%d: kernel τ %.12g, coint %.12g", c, tt.T, tt.p, tt.n, got, want.Stat)
				}
			}
		}
	}
}

func TestJohansenKernelMatchesTest(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	for c := johansen.N; c <= johansen.CT; c++ {
		for _, tt := range []struct{ T, lags, k int }{{40, 0, 1}, {200, 0, 3}, {200, 2, 4}, {1000, 0, 11}} {
			k := newJohKernel(tt.k, tt.lags, tt.T, nil)
			k.driftLimit = false
			k.draw(r)
			nobs := k.moments(k.y, tt.T)
			y := mat.NewDense(tt.T, tt.k, nil)
			for j, col := range k.y {
				for i, v := range col {
					y.Set(i, j, v)
				}
			}
			want, err := johansen.Test(y, c, tt.lags)
			if err != nil {
				t.Fatal(err)
			}
			// Every dimension: the leading dim series.
			for dim := 1; dim <= tt.k; dim++ {
				tr, mx, ok := k.stats(c, dim, nobs)
				if !ok {
					t.Fatalf("case %s: singular", c)
				}
				w := want
				if dim < tt.k {
					if w, err = johansen.Test(y.Slice(0, tt.T, 0, dim).(*mat.Dense), c, tt.lags); err != nil {
						t.Fatal(err)
					}
				}
				// 1e-8: the moment route squares the condition number.
				if math.Abs(tr-w.Trace[0]) > 1e-8*w.Trace[0] || math.Abs(mx-w.MaxEig[0]) > 1e-8*w.MaxEig[0] {
					t.Errorf("case %s T=%d lags=%d dim=%d: trace %.12g max %.12g, johansen.Test %.12g %.12g",
						c, tt.T, tt.lags, dim, tr, mx, w.Trace[0], w.MaxEig[0])
				}
			}
		}
	}
}

// TestJohansenDriftLimit checks the drift limit of cases C and CT against
// johansen.Test on data whose last series has a large drift, y_K = W_K +
// μs (C, μ = 10⁶) or W_K + μs² (CT, μ = 10⁴), s the row number: the
// statistics differ from the limit by O(1/μ), here below 1e-4 relative.
func TestJohansenDriftLimit(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 10))
	for _, c := range []johansen.Case{johansen.C, johansen.CT} {
		for _, tt := range []struct{ T, lags, k int }{{100, 0, 1}, {200, 1, 3}} {
			k := newJohKernel(tt.k, tt.lags, tt.T, nil)
			k.draw(r)
			tr, mx, ok := k.stats(c, tt.k, k.moments(k.y, tt.T))
			if !ok {
				t.Fatal("singular")
			}
			y := mat.NewDense(tt.T, tt.k, nil)
			for j, col := range k.y {
				for i, v := range col {
					if j == tt.k-1 {
						s := float64(i)
						if c == johansen.C {
							v += 1e6 * s
						} else {
							v += 1e4 * s * s
						}
					}
					y.Set(i, j, v)
				}
			}
			w, err := johansen.Test(y, c, tt.lags)
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(tr-w.Trace[0]) > 1e-4*w.Trace[0] || math.Abs(mx-w.MaxEig[0]) > 1e-4*w.MaxEig[0] {
				t.Errorf("case %s T=%d K=%d: limit trace %.8g max %.8g, johansen.Test with drift %.8g %.8g",
					c, tt.T, tt.k, tr, mx, w.Trace[0], w.MaxEig[0])
			}
		}
	}
}

func TestKernelsDoNotAllocate(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	eg := newEGKernel(200, 1, 1, 3)
	adf := newADFKernel(200, 1, 2)
	jk := newJohKernel(4, 1, 200, nil)
	for name, f := range map[string]func(){
		"adf": func() { adf.adf(r) },
		"eg":  func() { eg.eg(r) },
		"johansen": func() {
			jk.draw(r)
			jk.stats(johansen.RT, 4, jk.moments(jk.y, 200))
		},
	} {
		if a := testing.AllocsPerRun(20, f); a != 0 {
			t.Errorf("%s: %v allocations per replication", name, a)
		}
	}
}

func testRand() *rand.Rand { return rand.New(rand.NewPCG(11, 12)) }
