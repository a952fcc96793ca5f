package simulate

import (
	"context"
	"math"
	"math/rand/v2"
	"testing"

	"github.com/galley-econ/galley/analysis/coint"
	"github.com/galley-econ/galley/analysis/unitroot"
)

// TestGHKernelMatchesCoint: the allocation-free Gregory–Hansen kernel
// gives coint.GregoryHansen's ADF*, Zt* and Zα* (fixed lags and
// bandwidth) on the same random walks, to 1e-9 relative.
func TestGHKernelMatchesCoint(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	for _, tc := range []struct {
		model   string
		T, N, p int
		trim    float64
	}{{"c", 40, 2, 0, 0.15}, {"ct", 80, 3, 2, 0.15}, {"cs", 60, 2, 1, 0.10}, {"cs", 100, 4, 3, 0.2}} {
		for _, test := range []string{GHADF, GHZt, GHZa} {
			sp := Spec{Test: test, Case: tc.model, N: tc.N, T: tc.T, Lags: tc.p, Reps: MinReps, Trim: tc.trim}
			p, err := sp.check()
			if err != nil {
				t.Fatal(err)
			}
			k := newGHKernel(sp, p)
			for rep := 0; rep < 2; rep++ {
				got := k.stat(r)
				m, _ := coint.ParseGHModel(tc.model)
				want, err := coint.GregoryHansen(k.y, k.xs, m, tc.trim, unitroot.LagRule{Lags: tc.p},
					unitroot.Bandwidth{Rule: unitroot.Given, Lags: tc.p})
				if err != nil {
					t.Fatal(err)
				}
				w := map[string]float64{GHADF: want.ADF.Stat, GHZt: want.Zt.Stat, GHZa: want.Za.Stat}[test]
				if !close9(got, w) {
					t.Errorf("%s model %s T=%d N=%d p=%d: kernel %.12g, coint %.12g", test, tc.model, tc.T, tc.N, tc.p, got, w)
				}
			}
		}
	}
}

// TestGHSpec: invalid Gregory–Hansen experiments are refused, and the
// trimming enters the key.
func TestGHSpec(t *testing.T) {
	for _, sp := range []Spec{
		{Test: GHADF, Case: "cx", N: 2, T: 100, Reps: 1000},
		{Test: GHADF, Case: "c", N: 1, T: 100, Reps: 1000},
		{Test: GHZt, Case: "cs", N: 2, T: 9, Reps: 1000},
		{Test: GHZa, Case: "c", N: 2, T: 100, Reps: 1000, Trim: 0.6},
	} {
		if err := sp.Validate(); err == nil {
			t.Errorf("%+v accepted", sp)
		}
	}
	a := Spec{Test: GHZa, Case: "c", N: 2, T: 100, Reps: 1000}
	b := a
	b.Trim = 0.1
	if a.Key() == b.Key() || a.Key() == "" {
		t.Errorf("keys %q %q", a.Key(), b.Key())
	}
}

// TestGHTable reproduces Gregory and Hansen's (1996) Table 1, as in
// coint.GHCritical, by simulation. The table approximates the asymptotic
// distribution; the simulated quantiles approach it as T grows. For
// ADF* and Zt* the distance at T = 200 is already within a few hundredths;
// Zα* = n(ρ̂* − 1) converges slowly (m = 1, model C, 5%: −38.2 at T = 200,
// −39.2 at T = 500, −39.8 at T = 1500, against the table's −40.48; model
// C/S: −43.2, −45.2, −46.5 against −47.04; 2,000 replications each), so
// it is checked at T = 600 with an allowance of 3% for the remaining
// finite-T distance. Each simulated value must lie within four Monte
// Carlo standard errors of the table plus the allowance (0.05 for ADF*
// and Zt*). No lags, no bandwidth (the statistics' asymptotic
// distributions do not depend on them). About five seconds on two cores.
func TestGHTable(t *testing.T) {
	if testing.Short() {
		t.Skip("Monte Carlo reproduction of Gregory–Hansen Table 1")
	}
	type check struct {
		test      string
		m         int
		md        coint.GHModel
		T, reps   int
		allowance float64 // absolute for τ-type, relative for Zα*
	}
	checks := []check{
		{GHADF, 1, coint.GHLevel, 200, 2000, 0.05},
		{GHZt, 1, coint.GHLevel, 200, 2000, 0.05},
		{GHADF, 1, coint.GHRegime, 200, 2000, 0.05},
		{GHZt, 1, coint.GHRegime, 200, 2000, 0.05},
		{GHADF, 2, coint.GHLevelTrend, 200, 2000, 0.05},
		{GHZa, 1, coint.GHLevel, 600, 1500, 0.03},
	}
	for _, c := range checks {
		tz, za, _ := coint.GHCritical(c.m, c.md)
		sp := Spec{Test: c.test, Case: c.md.Code(), N: c.m + 1, T: c.T, Reps: c.reps, Seed: 11}
		res, err := Run(context.Background(), sp, nil)
		if err != nil {
			t.Fatal(err)
		}
		tab := tz
		if c.test == GHZa {
			tab = za
		}
		for _, cv := range tab {
			i := levelIndex(res, cv.Level)
			allow := c.allowance
			if c.test == GHZa {
				allow *= math.Abs(cv.Value)
			}
			if d := math.Abs(res.Values[i] - cv.Value); d > 4*res.MCSE[i]+allow {
				t.Errorf("%s m=%d model %v T=%d at %g: simulated %.3f (MCSE %.3f), table %.2f", c.test, c.m, c.md, c.T, cv.Level, res.Values[i], res.MCSE[i], cv.Value)
			} else {
				t.Logf("%s m=%d model %v T=%d at %g: simulated %.3f (MCSE %.3f), table %.2f", c.test, c.m, c.md, c.T, cv.Level, res.Values[i], res.MCSE[i], cv.Value)
			}
		}
	}
}

func levelIndex(r *Result, l float64) int {
	for i, v := range r.Levels {
		if math.Abs(v-l) < 1e-9 {
			return i
		}
	}
	return -1
}
