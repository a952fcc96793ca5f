package johansen

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestBetaLRStableUnderULP moves every observation of the Danish data by
// at most one unit in the last place and requires the LR of "LRM = −LRY"
// (case RC, one lag, rank 1; urca 1.3.3 blrtest gives 0.0346442893, see
// TestRestrictionsUrca) to stay within 1e-10 relative: the statistic is a
// small difference of logarithms, and the restricted eigenproblem must be
// solved as accurately as the unrestricted one for it to be determined by
// the data (with H'S11H formed explicitly it moved by ±1e-8).
func TestBetaLRStableUnderULP(t *testing.T) {
	y := denmark(t)
	h := mat.NewDense(5, 4, []float64{1, 0, 0, 0, -1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1})
	stat := func(y *mat.Dense) float64 {
		res, err := Test(y, RC, 1)
		if err != nil {
			t.Fatal(err)
		}
		lr, err := res.TestBeta(1, h)
		if err != nil {
			t.Fatal(err)
		}
		return lr.Stat
	}
	base := stat(y)
	r := rand.New(rand.NewPCG(1, 1))
	rows, k := y.Dims()
	for trial := 0; trial < 5; trial++ {
		yp := mat.DenseCopyOf(y)
		for i := 0; i < rows; i++ {
			for j := 0; j < k; j++ {
				if r.IntN(2) == 0 {
					yp.Set(i, j, math.Nextafter(yp.At(i, j), math.Inf(1)))
				}
			}
		}
		if got := stat(yp); !closeRel(got, base, 1e-10, 0) {
			t.Errorf("trial %d: LR %.15g after one-ulp changes, %.15g before", trial, got, base)
		}
	}
}
