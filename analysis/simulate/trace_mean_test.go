package simulate

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"github.com/galley-econ/galley/analysis/johansen"
	"github.com/galley-econ/galley/internal/longtest"
)

// The means of the asymptotic trace distributions that the bootstrap
// Bartlett correction uses (johansen.AsymptoticTraceMean, Doornik's 1998
// response surface, Table 7, as transcribed in the R packages pvars and
// tsDyn) against galley's own simulation of the same distributions:
// Gaussian random walks of length T and T/2 without lagged differences
// (the kernel behind the simulated critical-value tables), the mean
// extrapolated to T = ∞ as 2·m(T) − m(T/2) from two independent runs,
// with standard error √(4·se_T² + se_{T/2}²).
//
// A comparison passes when |sim − Doornik| < z·se + δ, z the Bonferroni
// value Φ⁻¹(1 − α/(2m)) for m comparisons and α = 0.001, and
// δ = 0.01·(d + 1) + 0.002·m_∞: the first term bounds the rounding of the
// surface's four printed two-decimal coefficients (each at most 0.005
// times a regressor ≤ d), the second allows 0.2% for the surface's own
// misfit (an allowance of judgement, not a figure from the paper). Seeds
// are fixed, so the outcome is deterministic.
func checkTraceMeans(t *testing.T, dims []int, tlen, reps int) {
	cases := []johansen.Case{johansen.N, johansen.RC, johansen.C, johansen.RT, johansen.CT}
	m := len(cases) * len(dims)
	z := distuv.UnitNormal.Quantile(1 - 0.001/(2*float64(m)))
	k := 0
	for _, c := range cases {
		for _, d := range dims {
			var mean, se [2]float64
			for i, tt := range []int{tlen, tlen / 2} {
				r, err := Run(context.Background(), Spec{Test: JohansenTrace, Case: c.String(), N: d, T: tt, Reps: reps, Seed: 1998 + uint64(2*k+i)}, nil)
				if err != nil {
					t.Fatal(err)
				}
				var s, s2 float64
				for _, v := range r.Sample {
					s += v
					s2 += v * v
				}
				n := float64(len(r.Sample))
				mean[i] = s / n
				se[i] = math.Sqrt((s2/n - mean[i]*mean[i]) / (n - 1))
			}
			k++
			sim := 2*mean[0] - mean[1]
			sse := math.Sqrt(4*se[0]*se[0] + se[1]*se[1])
			want, err := johansen.AsymptoticTraceMean(c, d)
			if err != nil {
				t.Fatal(err)
			}
			tol := z*sse + 0.01*float64(d+1) + 0.002*want
			t.Logf("case %s d=%d: simulated %.3f ± %.3f (T=%d: %.3f, T=%d: %.3f), Doornik %.3f (|d|/tol %.2f)", c, d, sim, sse, tlen, mean[0], tlen/2, mean[1], want, math.Abs(sim-want)/tol)
			if math.Abs(sim-want) > tol {
				t.Errorf("case %s d=%d: simulated asymptotic mean %.3f (s.e. %.3f), Doornik (1998) %.3f; |d| > %.3f", c, d, sim, sse, want, tol)
			}
		}
	}
}

// TestAsymptoticTraceMeanSimulated: d = 2 in every case, 4,000
// replications at T = 200 and 100 (a fraction of a second).
func TestAsymptoticTraceMeanSimulated(t *testing.T) {
	checkTraceMeans(t, []int{2}, 200, 4000)
}

// TestAsymptoticTraceMeanSimulatedHeavy: d = 1, 2, 3, 4 in every case,
// 16,000 replications at T = 300 and 150; a long check (internal/longtest).
func TestAsymptoticTraceMeanSimulatedHeavy(t *testing.T) {
	longtest.Skip(t, "asymptotic trace means, 16,000 replications per configuration")
	checkTraceMeans(t, []int{1, 2, 3, 4}, 300, 16000)
}
