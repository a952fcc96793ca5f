package vardyn

import (
	"math"
	"math/rand/v2"
	"reflect"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
)

// danishVECM fits the rank-1 Danish VECM (case rc, one lagged difference).
func danishVECM(t testing.TB) (*mat.Dense, *johansen.VECM) {
	y := denmark(t)
	r, err := johansen.Test(y, johansen.RC, 1)
	if err != nil {
		t.Fatal(err)
	}
	m, err := r.Estimate(1, []int{0})
	if err != nil {
		t.Fatal(err)
	}
	return y, m
}

// The bands are the same whatever the number of workers, and Hall's
// interval is the percentile interval reflected about the estimate.
func TestBootstrapWorkersAndHall(t *testing.T) {
	y, m := danishVECM(t)
	resp := Responses{Horizon: 6, Order: []int{1, 0, 2, 3}}
	a := m.VARForm()
	theta, err := resp.Compute(a, m.Omega)
	if err != nil {
		t.Fatal(err)
	}
	run := func(workers int) *Bands {
		calls := 0
		b, err := Bootstrap(y, a, m.Resid, VECMRefit(johansen.RC, 1, 1, []int{0}, johansen.Extra{}), resp, theta,
			BootSpec{Reps: 60, Seed: 7, Workers: workers, Coverage: 0.9, Progress: func(d, n int) { calls++ }})
		if err != nil {
			t.Fatal(err)
		}
		if calls != 60 {
			t.Errorf("progress called %d times", calls)
		}
		return b
	}
	b1, b3 := run(1), run(3)
	if !reflect.DeepEqual(b1, b3) {
		t.Fatal("bands differ between 1 and 3 workers")
	}
	if b1.Reps+b1.Failed != 60 || b1.Reps < 50 {
		t.Fatalf("reps %d failed %d", b1.Reps, b1.Failed)
	}
	for s := range theta {
		for i := 0; i < 4; i++ {
			for j := 0; j < 4; j++ {
				est := theta[s].At(i, j)
				pl, ph := b1.Percentile[0][s][i][j], b1.Percentile[1][s][i][j]
				hl, hh := b1.Hall[0][s][i][j], b1.Hall[1][s][i][j]
				if pl > ph || math.Abs(hl-(2*est-ph)) > 1e-12 || math.Abs(hh-(2*est-pl)) > 1e-12 {
					t.Errorf("h=%d (%d,%d): percentile [%g, %g], Hall [%g, %g], estimate %g", s, i, j, pl, ph, hl, hh, est)
				}
			}
		}
	}
	// A different seed gives different bands.
	b2, _ := Bootstrap(y, a, m.Resid, VECMRefit(johansen.RC, 1, 1, []int{0}, johansen.Extra{}), resp, theta,
		BootSpec{Reps: 60, Seed: 8, Coverage: 0.9})
	if reflect.DeepEqual(b1.Percentile, b2.Percentile) {
		t.Error("seed does not matter")
	}
}

// The recursive design rebuilds the data exactly when the residuals are
// drawn in their own order: d_t + Σ A_i y_{t−i} + ε̂_t = y_t. Checked with a
// VAR whose residuals are exact, by a bootstrap whose every replication
// must reproduce the estimate when the residuals are all zero.
func TestBootstrapRecursiveDesign(t *testing.T) {
	// A noise-free VAR(1) with a constant: y_t = c + A y_{t−1}. The
	// residuals are zero, so every artificial sample equals y and the
	// bands collapse onto the estimate.
	a := mat.NewDense(2, 2, []float64{0.5, 0.1, -0.2, 0.3})
	n := 40
	y := mat.NewDense(n, 2, nil)
	rng := rand.New(rand.NewPCG(1, 2))
	y.Set(0, 0, 1)
	y.Set(0, 1, -1)
	for t := 1; t < n; t++ {
		for i := 0; i < 2; i++ {
			v := 0.3 * float64(i+1)
			for j := 0; j < 2; j++ {
				v += a.At(i, j) * y.At(t-1, j)
			}
			y.Set(t, i, v+1e-3*rng.NormFloat64())
		}
	}
	v, err := Fit(y, 1, Const)
	if err != nil {
		t.Fatal(err)
	}
	resp := Responses{Horizon: 3}
	theta, _ := resp.Compute(v.A, v.Sigma)
	zero := mat.NewDense(n-1, 2, nil)
	// With zero residuals the artificial data are the fitted path; the
	// fitted path's own regression is exact, so refit sees a singular
	// covariance: make refit return the estimate to isolate the design.
	var got []*mat.Dense
	refit := func(ys *mat.Dense) ([]*mat.Dense, mat.Symmetric, error) {
		got = append(got, mat.DenseCopyOf(ys))
		return v.A, v.Sigma, nil
	}
	if _, err := Bootstrap(y, v.A, zero, refit, resp, theta, BootSpec{Reps: 10, Seed: 1, Workers: 1, Coverage: 0.9}); err != nil {
		t.Fatal(err)
	}
	// Expected path: y*_0 = y_0, y*_t = d_t + A y*_{t−1}, d_t = y_t − A y_{t−1}
	// (residuals zero), so y*_t = y_t.
	for _, ys := range got {
		for r := 0; r < n; r++ {
			for i := 0; i < 2; i++ {
				if math.Abs(ys.At(r, i)-y.At(r, i)) > 1e-10 {
					t.Fatalf("row %d series %d: artificial %g, data %g", r, i, ys.At(r, i), y.At(r, i))
				}
			}
		}
	}
	if len(got) != 10 {
		t.Fatalf("refit ran %d times", len(got))
	}
}

func TestQuantileType7(t *testing.T) {
	x := []float64{1, 2, 3, 4}
	// numpy.quantile([1, 2, 3, 4], q) (linear, the default).
	for q, want := range map[float64]float64{0: 1, 0.25: 1.75, 0.5: 2.5, 0.9: 3.7, 1: 4} {
		if got := quantile(x, q); math.Abs(got-want) > 1e-12 {
			t.Errorf("quantile(%g) = %g, want %g", q, got, want)
		}
	}
}

func TestBootstrapBadInput(t *testing.T) {
	y, m := danishVECM(t)
	a := m.VARForm()
	resp := Responses{Horizon: 2}
	theta, _ := resp.Compute(a, m.Omega)
	refit := VECMRefit(johansen.RC, 1, 1, []int{0}, johansen.Extra{})
	if _, err := Bootstrap(y, a, m.Resid, refit, resp, theta, BootSpec{Reps: 5, Coverage: 0.9}); err == nil {
		t.Error("5 replications accepted")
	}
	if _, err := Bootstrap(y, a, m.Resid, refit, resp, theta, BootSpec{Reps: 50, Coverage: 1.5}); err == nil {
		t.Error("coverage 1.5 accepted")
	}
	if _, err := Bootstrap(y, a[:1], m.Resid, refit, resp, theta, BootSpec{Reps: 50, Coverage: 0.9}); err == nil {
		t.Error("residual rows that do not match the lags accepted")
	}
	bad := func(*mat.Dense) ([]*mat.Dense, mat.Symmetric, error) { return nil, nil, errFail }
	if _, err := Bootstrap(y, a, m.Resid, bad, resp, theta, BootSpec{Reps: 20, Coverage: 0.9}); err == nil {
		t.Error("all replications failing accepted")
	}
}

var errFail = &failErr{}

type failErr struct{}

func (*failErr) Error() string { return "fail" }
