// Command irfcoverage measures how often galley's bootstrap bands for
// impulse responses cover the true responses, in a simulated design whose
// responses are known: a 4-variable VECM of rank 1 with one lagged
// difference and a constant (the design of vardyn's bootstrap benchmark),
//
//	Δy_t = 0.01 + α β′y_{t−1} + 0.2 Δy_{t−1} + ε_t,  ε_t ~ N(0, I_4),
//	α = (−0.2, 0.1, 0, 0.05)′,  β = (1, −1, 0.5, −0.5)′,
//
// so that the VAR form is A_1 = I + 0.2 I + αβ′, A_2 = −0.2 I and, with
// Σ = I, the orthogonalised responses are the MA coefficients Φ_h. Each of
// -samples samples of length -T is estimated as a VECM (case c, one lag,
// rank 1) and bootstrapped (-reps replications, recursive design, β
// re-estimated each time); for every response, shock and horizon 0..-h
// the percentile and Hall intervals at -coverage either cover the true
// response or not. It prints the share covered by horizon, for both
// intervals, with its Monte Carlo standard error. bench/README.md has the
// figures.
//
//	go run ./bench/cmd/irfcoverage -samples 100 -reps 199 -T 200 -h 20 -coverage 0.9
package main

import (
	"flag"
	"fmt"
	"math"
	"math/rand/v2"
	"os"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/analysis/vardyn"
)

var (
	alpha = []float64{-0.2, 0.1, 0, 0.05}
	beta  = []float64{1, -1, 0.5, -0.5}
)

const k = 4

// draw simulates T observations of the design (two zero start values).
func draw(t int, rng *rand.Rand) *mat.Dense {
	y := mat.NewDense(t, k, nil)
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

// truth is the design's VAR form A_1, A_2.
func truth() []*mat.Dense {
	a1, a2 := mat.NewDense(k, k, nil), mat.NewDense(k, k, nil)
	for i := 0; i < k; i++ {
		for j := 0; j < k; j++ {
			a1.Set(i, j, alpha[i]*beta[j])
		}
		a1.Set(i, i, a1.At(i, i)+1.2)
		a2.Set(i, i, -0.2)
	}
	return []*mat.Dense{a1, a2}
}

func main() {
	samples := flag.Int("samples", 100, "simulated samples")
	reps := flag.Int("reps", 199, "bootstrap replications per sample")
	T := flag.Int("T", 200, "observations per sample")
	h := flag.Int("h", 20, "largest horizon")
	cov := flag.Float64("coverage", 0.9, "nominal coverage of the bands")
	seed := flag.Uint64("seed", 1, "seed of the simulated samples")
	flag.Parse()

	resp := vardyn.Responses{Horizon: *h}
	ident := mat.NewSymDense(k, nil)
	for i := 0; i < k; i++ {
		ident.SetSym(i, i, 1)
	}
	want, err := resp.Compute(truth(), ident)
	if err != nil {
		fail(err)
	}
	var hitP, hitH, n = make([]float64, *h+1), make([]float64, *h+1), make([]float64, *h+1)
	refit := vardyn.VECMRefit(johansen.C, 1, 1, []int{0}, johansen.Extra{})
	rng := rand.New(rand.NewPCG(*seed, 2026))
	used := 0
	var perP, perH []float64 // each sample's share covered, over all cells
	for s := 0; s < *samples; s++ {
		y := draw(*T, rng)
		r, err := johansen.Test(y, johansen.C, 1)
		if err != nil {
			fail(err)
		}
		m, err := r.Estimate(1, []int{0})
		if err != nil {
			fail(err)
		}
		a := m.VARForm()
		theta, err := resp.Compute(a, m.Omega)
		if err != nil {
			fail(err)
		}
		b, err := vardyn.Bootstrap(y, a, m.Resid, refit, resp, theta, vardyn.BootSpec{Reps: *reps, Seed: *seed*1000 + uint64(s), Coverage: *cov})
		if err != nil {
			fmt.Fprintf(os.Stderr, "sample %d: %v (skipped)\n", s, err)
			continue
		}
		used++
		var sp, sh, sn float64
		for hz := 0; hz <= *h; hz++ {
			for i := 0; i < k; i++ {
				for j := 0; j < k; j++ {
					v := want[hz].At(i, j)
					if hz == 0 && j > i {
						continue // zero by the Cholesky ordering in every sample
					}
					n[hz]++
					sn++
					if b.Percentile[0][hz][i][j] <= v && v <= b.Percentile[1][hz][i][j] {
						hitP[hz]++
						sp++
					}
					if b.Hall[0][hz][i][j] <= v && v <= b.Hall[1][hz][i][j] {
						hitH[hz]++
						sh++
					}
				}
			}
		}
		perP, perH = append(perP, sp/sn), append(perH, sh/sn)
		fmt.Fprintf(os.Stderr, "\rsample %d/%d", s+1, *samples)
	}
	fmt.Fprintln(os.Stderr)
	fmt.Printf("%d samples of T = %d, %d replications each, nominal coverage %.2f\n", used, *T, *reps, *cov)
	fmt.Println("| horizon | percentile | Hall |")
	fmt.Println("|---|---|---|")
	var tp, th, tn float64
	for hz := 0; hz <= *h; hz++ {
		if hz <= 4 || hz%5 == 0 {
			fmt.Printf("| %d | %.3f | %.3f |\n", hz, hitP[hz]/n[hz], hitH[hz]/n[hz])
		}
		tp, th, tn = tp+hitP[hz], th+hitH[hz], tn+n[hz]
	}
	// the cells of one sample are correlated: the standard error is that
	// of the mean over samples of each sample's share covered
	se := func(x []float64) float64 {
		var m, v float64
		for _, e := range x {
			m += e / float64(len(x))
		}
		for _, e := range x {
			v += (e - m) * (e - m) / float64(len(x)-1)
		}
		return math.Sqrt(v / float64(len(x)))
	}
	fmt.Printf("| all | %.3f (s.e. %.3f) | %.3f (s.e. %.3f) |\n", tp/tn, se(perP), th/tn, se(perH))
}

func fail(err error) {
	fmt.Fprintln(os.Stderr, "irfcoverage:", err)
	os.Exit(1)
}
