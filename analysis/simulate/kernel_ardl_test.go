package simulate

import (
	"context"
	"math"
	"testing"

	"github.com/galley-econ/galley/analysis/ardl"
)

// TestARDLBoundsAgainstPSS reproduces the published asymptotic bounds of
// Pesaran, Shin and Smith (2001), Tables CI (F) and CII (t), by
// simulating the bounds regressions with no lagged differences at a long
// T. Tolerance: 4 Monte Carlo standard errors of the simulated value plus
// 0.06 for F (0.04 for t), which covers PSS's own simulation error
// (40,000 replications) and the finite T. By default one case at T = 500
// with 4,000 replications; without -short every case with k = 1 and 3 at
// T = 1,000 with 8,000 replications (PSS's T).
func TestARDLBoundsAgainstPSS(t *testing.T) {
	type cfg struct {
		c    ardl.Case
		k    int
		T    int
		reps int
	}
	runs := []cfg{{ardl.Const, 2, 500, 4000}}
	if !testing.Short() {
		runs = nil
		for c := ardl.NoDet; c <= ardl.ConstTrend; c++ {
			for _, k := range []int{1, 3} {
				runs = append(runs, cfg{c, k, 1000, 8000})
			}
		}
	}
	for _, r := range runs {
		tests := []string{ARDLF0, ARDLF1}
		if r.c.HasT() {
			tests = append(tests, ARDLT0, ARDLT1)
		}
		for _, test := range tests {
			sp := Spec{Test: test, Case: r.c.String(), N: r.k, T: r.T, Reps: r.reps, Seed: 7}
			res, err := Run(context.Background(), sp, nil)
			if err != nil {
				t.Fatal(err)
			}
			var tab []ardl.Bound
			slack := 0.06
			if test == ARDLT0 || test == ARDLT1 {
				tab, _ = ardl.PSST(r.c, r.k)
				slack = 0.04
			} else {
				tab, _ = ardl.PSSF(r.c, r.k)
			}
			for i, l := range res.Levels {
				var want float64
				for _, b := range tab {
					if math.Abs(b.Level-l) < 1e-9 {
						want = b.I0
						if test == ARDLF1 || test == ARDLT1 {
							want = b.I1
						}
					}
				}
				if d := math.Abs(res.Values[i] - want); d > 4*res.MCSE[i]+slack {
					t.Errorf("%s case %s k=%d %g%%: simulated %.3f (MCSE %.3f), PSS %.2f", test, r.c, r.k, 100*l, res.Values[i], res.MCSE[i], want)
				}
			}
		}
	}
}

func TestARDLSpec(t *testing.T) {
	for _, sp := range []Spec{
		{Test: ARDLT0, Case: "rc", N: 1, T: 100, Reps: 200},
		{Test: ARDLF0, Case: "c", N: 0, T: 100, Reps: 200},
		{Test: ARDLF1, Case: "q", N: 1, T: 100, Reps: 200},
		{Test: ARDLF1, Case: "c", N: 3, T: 8, Lags: 2, Reps: 200},
	} {
		if err := sp.Validate(); err == nil {
			t.Errorf("%+v: no error", sp)
		}
	}
	a := Spec{Test: ARDLF1, Case: "c", N: 2, T: 60, Lags: 1, Reps: 256, Seed: 3}
	r1, err := Run(context.Background(), a, nil)
	if err != nil {
		t.Fatal(err)
	}
	a.Workers = 1
	r2, _ := Run(context.Background(), a, nil)
	for i := range r1.Values {
		if r1.Values[i] != r2.Values[i] {
			t.Fatal("result depends on the number of workers")
		}
	}
	if r1.NObs != 58 || r1.Lower {
		t.Errorf("NObs %d Lower %v", r1.NObs, r1.Lower)
	}
	if k := a.Key(); k == "" {
		t.Error("no key")
	}
}
