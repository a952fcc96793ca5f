package johansen

import (
	"fmt"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestEstimateUrca compares the rank-1 model normalised on LRM with urca
// 1.3.3 cajorls (testdata/fixtures/johansen_urca.json), 1e-6 relative: β
// (its last row is the restricted constant or trend for ecdet const and
// trend), and the OLS table of the short-run equations — α (regressor
// ect1) and the unrestricted constant and lagged differences, estimates and
// standard errors. cajorls lists the regressors in our Terms order.
func TestEstimateUrca(t *testing.T) {
	f := urcaFixtureLoad(t)
	y := denmark(t)
	for _, c := range f.Cajorls {
		cs := ecdetCase[c.Ecdet]
		t.Run(fmt.Sprintf("ecdet=%s/K=%d", c.Ecdet, c.K), func(t *testing.T) {
			res, err := Test(y, cs, c.K-1)
			if err != nil {
				t.Fatal(err)
			}
			v, err := res.Estimate(c.R, []int{0})
			if err != nil {
				t.Fatal(err)
			}
			// urca 1.3.3 cajorls beta.
			checkVec(t, "beta", mat.Col(nil, 0, v.Beta), c.Beta, 1e-6, 0)
			if got, want := 1+len(v.Terms), len(c.Regressors); got != want {
				t.Fatalf("%d regressors, urca has %d (%v)", got, want, c.Regressors)
			}
			for i := 0; i < res.K; i++ {
				est := append([]float64{v.Alpha.At(i, 0)}, mat.Row(nil, i, v.Short)...)
				se := append([]float64{v.AlphaSE.At(i, 0)}, mat.Row(nil, i, v.ShortSE)...)
				// urca 1.3.3 cajorls rlm: summary coefficients, columns 1–2.
				checkVec(t, fmt.Sprintf("equation %d estimates", i), est, c.Coef[i], 1e-6, 0)
				checkVec(t, fmt.Sprintf("equation %d standard errors", i), se, c.SE[i], 1e-6, 0)
			}
			// Π = αβ' by construction; check one element against the factors.
			if got, want := v.Pi.At(1, 2), v.Alpha.At(1, 0)*v.Beta.At(2, 0); !closeRel(got, want, 1e-12, 1e-12) {
				t.Errorf("Pi[1,2] = %g, want α₁β₂ = %g", got, want)
			}
		})
	}
}

// TestBetaSEStatsmodels compares β and its asymptotic standard errors with
// statsmodels 0.13.5 VECM(coint_rank=1).fit() beta and stderr_beta
// (normalised on the first series; deterministic n, co, ci, colo, coli are
// our N, C, RC, CT, RT), 1e-6 relative. statsmodels reports only the K
// rows of the series (the restricted term's coefficient is kept apart), and
// its stderr_alpha uses a different divisor, so α's standard errors are
// checked against urca instead.
func TestBetaSEStatsmodels(t *testing.T) {
	f := statsmodelsFixture(t)
	y := denmark(t)
	cases := map[string]Case{"n": N, "co": C, "ci": RC, "colo": CT, "coli": RT}
	for _, c := range f.VECM {
		t.Run(fmt.Sprintf("%s/k_ar_diff=%d", c.Deterministic, c.KArDiff), func(t *testing.T) {
			res, err := Test(y, cases[c.Deterministic], c.KArDiff)
			if err != nil {
				t.Fatal(err)
			}
			v, err := res.Estimate(1, []int{0})
			if err != nil {
				t.Fatal(err)
			}
			for i := 0; i < res.K; i++ {
				// statsmodels 0.13.5 VECMResults.beta, stderr_beta.
				if !closeRel(v.Beta.At(i, 0), c.Beta[i][0], 1e-6, 0) {
					t.Errorf("beta[%d] = %.10g, want %.10g", i, v.Beta.At(i, 0), c.Beta[i][0])
				}
				if !closeRel(v.BetaSE.At(i, 0), c.StderrBeta[i][0], 1e-6, 0) {
					t.Errorf("se(beta[%d]) = %.10g, want %.10g", i, v.BetaSE.At(i, 0), c.StderrBeta[i][0])
				}
			}
		})
	}
}

// TestRestrictionsUrca compares the LR tests of β = Hφ and α = Aψ with urca
// 1.3.3 blrtest and alrtest, rank 1 (testdata/fixtures/johansen_urca.json):
// statistic and restricted eigenvalues 1e-6 relative, p-value 1e-6
// relative, degrees of freedom exactly.
func TestRestrictionsUrca(t *testing.T) {
	f := urcaFixtureLoad(t)
	y := denmark(t)
	for _, c := range f.Tests {
		t.Run(c.Kind+"/"+c.Ecdet+"/"+c.Name, func(t *testing.T) {
			res, err := Test(y, ecdetCase[c.Ecdet], c.K-1)
			if err != nil {
				t.Fatal(err)
			}
			m := mat.NewDense(len(c.Matrix), len(c.Matrix[0]), nil)
			for i, row := range c.Matrix {
				m.SetRow(i, row)
			}
			var lr *LR
			if c.Kind == "beta" {
				lr, err = res.TestBeta(c.R, m)
			} else {
				lr, err = res.TestAlpha(c.R, m)
			}
			if err != nil {
				t.Fatal(err)
			}
			// urca 1.3.3 blrtest/alrtest: teststat, pval[2] (df), pval[1].
			if !closeRel(lr.Stat, c.Stat, 1e-6, 0) {
				t.Errorf("LR = %.10g, want %.10g", lr.Stat, c.Stat)
			}
			if lr.DF != c.DF {
				t.Errorf("df = %d, want %d", lr.DF, c.DF)
			}
			if !closeRel(lr.P, c.P, 1e-6, 0) {
				t.Errorf("p = %.10g, want %.10g", lr.P, c.P)
			}
			// urca 1.3.3 lambda of the restricted problem (nonzero ones).
			n := min(len(lr.Eigenvalues), len(c.Lambda), c.R+1)
			checkVec(t, "restricted eigenvalues", lr.Eigenvalues[:n], c.Lambda[:n], 1e-6, 0)
		})
	}
}

// TestWeakExogeneityMatchesA checks that WeakExogeneity builds the same
// α = Aψ restriction as urca's alrtest with A = I less the LRY column
// (urca 1.3.3, testdata/fixtures/johansen_urca.json, "LRY weakly
// exogenous"), 1e-6 relative.
func TestWeakExogeneityMatchesA(t *testing.T) {
	f := urcaFixtureLoad(t)
	res, err := Test(denmark(t), RC, 1)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range f.Tests {
		if c.Name != "LRY weakly exogenous" {
			continue
		}
		lr, err := res.WeakExogeneity(1, 1)
		if err != nil {
			t.Fatal(err)
		}
		if !closeRel(lr.Stat, c.Stat, 1e-6, 0) || lr.DF != c.DF {
			t.Errorf("LR = %.10g (df %d), want %.10g (df %d)", lr.Stat, lr.DF, c.Stat, c.DF)
		}
		return
	}
	t.Fatal("fixture has no weak-exogeneity test")
}
