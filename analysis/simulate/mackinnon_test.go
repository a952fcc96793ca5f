package simulate

import (
	"context"
	"math"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"

	"github.com/galley-econ/galley/analysis/critical"
	"github.com/galley-econ/galley/internal/longtest"
)

// Simulated τ critical values against MacKinnon's (2010) response surfaces
// (package critical, itself checked against statsmodels 0.13.5
// mackinnoncrit) at the same T, the number of observations in the DF
// regression, at the 1 %, 5 % and 10 % levels.
//
// Each comparison passes when |sim − MacKinnon| < z·MCSE + δ. z is the
// Bonferroni value Φ⁻¹(1 − α/(2m)) for m comparisons and a family-wise
// false-alarm rate α = 0.001 (if the simulation and the surface agreed
// exactly in distribution, all m comparisons would pass with probability
// at least 99.9 %). δ = 0.005 allows for the response surface's own
// error, its Monte Carlo error and misfit at finite T, which MacKinnon
// reports to be of order 10⁻³ (an allowance from memory of the paper, not
// a figure taken from it). Seeds are fixed, so the outcome is
// deterministic.

type tauCheck struct {
	test string
	c    string
	n, t int
}

func checkMacKinnon(t *testing.T, checks []tauCheck, reps int) {
	m := 3 * len(checks)
	const alpha = 0.001
	z := distuv.UnitNormal.Quantile(1 - alpha/(2*float64(m)))
	const delta = 0.005
	for k, ck := range checks {
		s := Spec{Test: ck.test, Case: ck.c, N: ck.n, T: ck.t, Reps: reps, Seed: 2010 + uint64(k)}
		r, err := Run(context.Background(), s, nil)
		if err != nil {
			t.Fatal(err)
		}
		c, _ := critical.ParseCase(ck.c)
		for i, l := range r.Levels {
			if l == 0.025 {
				continue // not in MacKinnon (2010)
			}
			want, err := critical.MacKinnonTau(ck.n, c, r.NObs, l)
			if err != nil {
				t.Fatal(err)
			}
			d := math.Abs(r.Values[i] - want)
			tol := z*r.MCSE[i] + delta
			t.Logf("%s %s N=%d T=%d level %.2f: sim %.4f ± %.4f, MacKinnon %.4f (|d|/tol %.2f)", ck.test, ck.c, ck.n, r.NObs, l, r.Values[i], r.MCSE[i], want, d/tol)
			if d > tol {
				t.Errorf("%s case %s N=%d T=%d level %g: simulated %.4f (MCSE %.4f), MacKinnon (2010) %.4f; |d| %.4f > %.4f",
					ck.test, ck.c, ck.n, r.NObs, l, r.Values[i], r.MCSE[i], want, d, tol)
			}
		}
	}
}

// TestMacKinnonLight: two configurations, 50,000 replications each
// (under a second on two cores).
func TestMacKinnonLight(t *testing.T) {
	checkMacKinnon(t, []tauCheck{{ADF, "c", 1, 100}, {EG, "c", 2, 100}}, 50_000)
}

// TestMacKinnonHeavy: every ADF case and the Engle–Granger test with 2 and
// 4 variables in cases c and ct, 200,000 replications each; a long check
// (internal/longtest).
func TestMacKinnonHeavy(t *testing.T) {
	longtest.Skip(t, "200,000 replications per configuration")
	checkMacKinnon(t, []tauCheck{
		{ADF, "n", 1, 101}, {ADF, "c", 1, 51}, {ADF, "ct", 1, 201}, {ADF, "ctt", 1, 101},
		{EG, "c", 2, 201}, {EG, "ct", 2, 101}, {EG, "c", 4, 201}, {EG, "ct", 4, 101},
	}, 200_000)
}
