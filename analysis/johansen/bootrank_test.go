package johansen

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"

	"github.com/galley-econ/galley/internal/longtest"
)

type wildbootFixture struct {
	Library, Version, Scipy string
	Cases                   []struct {
		Det     string
		Lags    int
		Rank    int
		Trace   float64
		Moduli  []float64
		Weights [][]float64
		Stats   []float64
	}
}

// TestWildBootstrapAgainstNumpy checks the model under H(r), its
// companion roots and the bootstrap statistic for given Rademacher weights
// against an independent numpy/scipy implementation of the algorithm
// (testdata/scripts/johansen_wildboot.py; numpy 1.24.2, scipy 1.10.1), to
// 1e-6 relative, on the Danish money data.
func TestWildBootstrapAgainstNumpy(t *testing.T) {
	var fx wildbootFixture
	loadJSON(t, "../../testdata/fixtures/johansen_wildboot.json", &fx)
	y := denmark(t)
	if len(fx.Cases) != 8 {
		t.Fatalf("fixture has %d cases", len(fx.Cases))
	}
	for _, c := range fx.Cases {
		cs, err := ParseCase(c.Det)
		if err != nil {
			t.Fatal(err)
		}
		res, err := Test(y, cs, c.Lags)
		if err != nil {
			t.Fatal(err)
		}
		wantRel(t, c.Det+" trace", res.Trace[c.Rank], c.Trace, 1e-6)
		m, err := res.nullModel(scaleColumns(y, res.scale), c.Rank)
		if err != nil {
			t.Fatal(err)
		}
		mods := rootModuli(m.a)
		for i, want := range c.Moduli {
			if math.Abs(mods[i]-want) > 1e-6 {
				t.Errorf("%s r=%d: root modulus %d = %.10g, numpy %.10g", c.Det, c.Rank, i, mods[i], want)
			}
		}
		buf := mat.NewDense(res.T+res.Lags+1, res.K, nil)
		for b, w := range c.Weights {
			q, err := m.replicate(w, buf, cs, Extra{})
			if err != nil {
				t.Fatal(err)
			}
			wantRel(t, c.Det+" bootstrap statistic", q, c.Stats[b], 1e-6)
		}
	}
}

func wantRel(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if d := math.Abs(got - want); d > tol*math.Max(1, math.Abs(want)) {
		t.Errorf("%s: got %.12g, want %.12g", what, got, want)
	}
}

// TestWildBootstrapWorkers: the p-values do not depend on the number of
// workers, and they lie in [0, 1]; the sequential choice reads them.
func TestWildBootstrapWorkers(t *testing.T) {
	y := denmark(t)
	res, err := Test(y, RC, 1)
	if err != nil {
		t.Fatal(err)
	}
	a, err := res.WildBootstrapRank(y, Extra{}, RankBootSpec{Reps: 49, Seed: 3, Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	b, err := res.WildBootstrapRank(y, Extra{}, RankBootSpec{Reps: 49, Seed: 3, Workers: 3})
	if err != nil {
		t.Fatal(err)
	}
	for r := range a.PValue {
		if a.PValue[r] != b.PValue[r] || a.Reps[r] != b.Reps[r] {
			t.Errorf("rank %d: %g (%d) with one worker, %g (%d) with three", r, a.PValue[r], a.Reps[r], b.PValue[r], b.Reps[r])
		}
		if a.PValue[r] < 0 || a.PValue[r] > 1 {
			t.Errorf("rank %d: p-value %g", r, a.PValue[r])
		}
	}
	c, err := res.WildBootstrapRank(y, Extra{}, RankBootSpec{Reps: 49, Seed: 4, Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	same := true
	for r := range a.PValue {
		same = same && a.PValue[r] == c.PValue[r]
	}
	if same {
		t.Error("another seed gave the same p-values at every rank")
	}
	if got := (&RankBoot{PValue: []float64{0.01, 0.2, 0.5}}).Rank(0.05); got != 1 {
		t.Errorf("sequential choice %d, want 1", got)
	}
	if got := (&RankBoot{PValue: []float64{0.01, 0.02}}).Rank(0.05); got != 2 {
		t.Errorf("sequential choice %d, want K = 2", got)
	}
	if _, err := res.WildBootstrapRank(y, Extra{}, RankBootSpec{Reps: 5}); err == nil {
		t.Error("5 replications accepted")
	}
	if _, err := res.WildBootstrapRank(y.Slice(0, 20, 0, 4).(*mat.Dense), Extra{}, RankBootSpec{Reps: 20}); err == nil {
		t.Error("levels of the wrong length accepted")
	}
}

// TestWildBootstrapSize is a Monte Carlo check of the size of the wild
// bootstrap trace test of H(1) in a bivariate VECM of rank 1 whose error
// variance doubles halfway through (heteroskedasticity, where the wild
// bootstrap is meant to hold its size): the rejection rate at 5% must lie
// within three Monte Carlo standard errors of 0.05.
func TestWildBootstrapSize(t *testing.T) {
	longtest.Skip(t, "wild bootstrap size")
	const n, T, reps = 300, 100, 199
	rng := rand.New(rand.NewPCG(11, 12))
	reject := 0
	for i := 0; i < n; i++ {
		y := mat.NewDense(T, 2, nil)
		for s := 1; s < T; s++ {
			sd := 1.0
			if s > T/2 {
				sd = 2
			}
			e1, e2 := sd*rng.NormFloat64(), sd*rng.NormFloat64()
			z := y.At(s-1, 0) - y.At(s-1, 1)
			y.Set(s, 0, y.At(s-1, 0)-0.4*z+e1)
			y.Set(s, 1, y.At(s-1, 1)+e2)
		}
		res, err := Test(y, C, 1)
		if err != nil {
			t.Fatal(err)
		}
		b, err := res.WildBootstrapRank(y, Extra{}, RankBootSpec{Reps: reps, Seed: uint64(i)})
		if err != nil {
			t.Fatal(err)
		}
		if b.PValue[1] <= 0.05 {
			reject++
		}
	}
	rate := float64(reject) / n
	se := math.Sqrt(0.05 * 0.95 / n)
	t.Logf("rejection rate %.3f over %d samples (MC s.e. %.3f)", rate, n, se)
	if math.Abs(rate-0.05) > 3*se {
		t.Errorf("rejection rate %.3f is more than three standard errors from 0.05", rate)
	}
}
