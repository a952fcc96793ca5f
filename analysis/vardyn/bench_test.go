package vardyn

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
)

// simVECM draws T observations of a 4-variable VECM of rank 1 with one
// lagged difference and an unrestricted constant.
func simVECM(t, seed int) *mat.Dense {
	rng := rand.New(rand.NewPCG(uint64(seed), 99))
	k := 4
	y := mat.NewDense(t, k, nil)
	alpha := []float64{-0.2, 0.1, 0, 0.05}
	beta := []float64{1, -1, 0.5, -0.5}
	for s := 2; s < t; s++ {
		var ect float64
		for j := 0; j < k; j++ {
			ect += beta[j] * y.At(s-1, j)
		}
		for i := 0; i < k; i++ {
			d := 0.01 + alpha[i]*ect + 0.2*(y.At(s-1, i)-y.At(s-2, i)) + rng.NormFloat64()
			y.Set(s, i, y.At(s-1, i)+d)
		}
	}
	return y
}

// BenchmarkBootstrapVECM: 1,000 residual-bootstrap replications of a
// 4-variable rank-1 VECM at T = 200 (β re-estimated each time),
// orthogonalised responses to 20 horizons, every core.
func BenchmarkBootstrapVECM(b *testing.B) {
	y := simVECM(200, 1)
	r, err := johansen.Test(y, johansen.C, 1)
	if err != nil {
		b.Fatal(err)
	}
	m, err := r.Estimate(1, []int{0})
	if err != nil {
		b.Fatal(err)
	}
	resp := Responses{Horizon: 20}
	a := m.VARForm()
	theta, _ := resp.Compute(a, m.Omega)
	refit := VECMRefit(johansen.C, 1, 1, []int{0}, johansen.Extra{})
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := Bootstrap(y, a, m.Resid, refit, resp, theta, BootSpec{Reps: 1000, Seed: 1, Coverage: 0.9}); err != nil {
			b.Fatal(err)
		}
	}
}
