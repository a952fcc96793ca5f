package sysdiag

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestNullRejectionRates: on independent normal errors (K = 2, T = 200,
// residuals of a regression on a constant) each test rejects at 5% about
// 5% of the time, so the statistics are on the scale of their reference
// distributions and the degrees of freedom are right (a wrong df moves the
// rate far outside the band). 400 draws with a fixed seed: the band
// [1.5%, 9%] is about ±3.5 binomial standard errors around 5%.
func TestNullRejectionRates(t *testing.T) {
	const reps, n, k = 400, 200, 2
	r := rand.New(rand.NewPCG(11, 13))
	ones := mat.NewDense(n, 1, nil)
	for i := 0; i < n; i++ {
		ones.Set(i, 0, 1)
	}
	count := map[string]int{}
	u := mat.NewDense(n, k, nil)
	for rep := 0; rep < reps; rep++ {
		for i := 0; i < n; i++ {
			for j := 0; j < k; j++ {
				u.Set(i, j, r.NormFloat64())
			}
		}
		e := centred(u)
		s, err := SerialLM(e, ones, 2)
		if err != nil {
			t.Fatal(err)
		}
		jb, err := JarqueBera(e)
		if err != nil {
			t.Fatal(err)
		}
		dh, err := DoornikHansen(e)
		if err != nil {
			t.Fatal(err)
		}
		a, err := ARCH(e, 1)
		if err != nil {
			t.Fatal(err)
		}
		for name, p := range map[string]float64{"LM": s.LM.P, "ES F": s.F.P, "JB": jb.Joint.P, "DH": dh.Test.P, "ARCH": a.P} {
			if p < 0.05 {
				count[name]++
			}
		}
	}
	for _, name := range []string{"LM", "ES F", "JB", "DH", "ARCH"} {
		rate := float64(count[name]) / reps
		if rate < 0.015 || rate > 0.09 {
			t.Errorf("%s rejects %.3f of %d null samples at 5%%", name, rate, reps)
		}
		t.Logf("%s: %.3f", name, rate)
	}
}
