package simulate

import (
	"context"
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

// TestWorkersDoNotChangeResults runs the same Spec with 1, 2 and 4
// workers; the samples (stored by replication index) must be identical
// bit for bit. 1000 replications is not a multiple of BlockSize, so the
// last block is short.
func TestWorkersDoNotChangeResults(t *testing.T) {
	for _, s := range []Spec{
		{Test: ADF, Case: "ct", N: 1, T: 60, Lags: 2, Reps: 1000, Seed: 7},
		{Test: EG, Case: "c", N: 3, T: 60, Lags: 1, Reps: 1000, Seed: 7},
		{Test: JohansenMaxEig, Case: "rt", N: 2, T: 60, Lags: 1, Reps: 1000, Seed: 7},
	} {
		var first *Result
		for _, w := range []int{1, 2, 4} {
			s.Workers = w
			r, err := Run(context.Background(), s, nil)
			if err != nil {
				t.Fatal(err)
			}
			if first == nil {
				first = r
				continue
			}
			if !slices.Equal(r.Sample, first.Sample) || !slices.Equal(r.Values, first.Values) || !slices.Equal(r.MCSE, first.MCSE) {
				t.Errorf("%s: %d workers differ from 1 worker", s.Test, w)
			}
			if r.Key != first.Key {
				t.Errorf("%s: key %q with %d workers, %q with 1", s.Test, r.Key, w, first.Key)
			}
		}
		s.Seed++
		s.Workers = 2
		other, err := Run(context.Background(), s, nil)
		if err != nil {
			t.Fatal(err)
		}
		if slices.Equal(other.Sample, first.Sample) {
			t.Errorf("%s: another seed gave the same sample", s.Test)
		}
	}
}

func TestSpecErrors(t *testing.T) {
	ok := Spec{Test: EG, Case: "c", N: 2, T: 50, Lags: 1, Reps: 100}
	for _, tc := range []struct {
		name string
		edit func(*Spec)
		want string
	}{
		{"unknown test", func(s *Spec) { s.Test = "kpss" }, `unknown test "kpss"`},
		{"unknown case", func(s *Spec) { s.Case = "q" }, `unknown deterministic case "q"`},
		{"johansen case for eg", func(s *Spec) { s.Case = "rc" }, `unknown deterministic case "rc"`},
		{"tau case for johansen", func(s *Spec) { s.Test = JohansenTrace; s.Case = "ctt" }, `unknown deterministic case "ctt"`},
		{"few reps", func(s *Spec) { s.Reps = 99 }, "99 replications; need 100"},
		{"negative lags", func(s *Spec) { s.Lags = -1 }, "lag order -1 is negative"},
		{"negative workers", func(s *Spec) { s.Workers = -2 }, "-2 workers"},
		{"eg one variable", func(s *Spec) { s.N = 1 }, "eg needs N = 2..12 variables, not 1"},
		{"eg too many", func(s *Spec) { s.N = 13 }, "not 13"},
		{"adf two variables", func(s *Spec) { s.Test = ADF }, "adf has one variable, not N = 2"},
		{"johansen zero", func(s *Spec) { s.Test = JohansenTrace; s.N = 0 }, "needs N = 1..12 variables, not 0"},
		{"T short for lags", func(s *Spec) { s.T = 6; s.Lags = 3 }, "T = 6 is too short for 3 lagged differences"},
		{"adf T short", func(s *Spec) { s.Test = ADF; s.N = 1; s.Case = "ctt"; s.T = 7; s.Lags = 1 }, "T = 7 is too short for 1 lagged differences"},
		{"johansen T short", func(s *Spec) { s.Test = JohansenTrace; s.Case = "ct"; s.N = 4; s.T = 20; s.Lags = 2 }, "T = 20 is too short for 2 lagged differences"},
		{"T huge", func(s *Spec) { s.T = MaxT + 1 }, "exceeds"},
	} {
		s := ok
		tc.edit(&s)
		_, err := Run(context.Background(), s, nil)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want it to contain %q", tc.name, err, tc.want)
		}
		if s.Key() != "" {
			t.Errorf("%s: invalid spec has key %q", tc.name, s.Key())
		}
	}
	if err := ok.Validate(); err != nil {
		t.Fatalf("valid spec rejected: %v", err)
	}
	// Boundary: the smallest T the DF regression allows is accepted.
	edge := Spec{Test: ADF, Case: "c", N: 1, T: 2*1 + 2 + 1 + 1, Lags: 1, Reps: 100}
	if err := edge.Validate(); err != nil {
		t.Errorf("T = %d with 1 lag and a constant: %v", edge.T, err)
	}
}

func TestKey(t *testing.T) {
	a := Spec{Test: "EG", Case: " Constant ", N: 3, T: 200, Reps: 1000, Seed: 5, Workers: 1}
	b := Spec{Test: "eg", Case: "c", N: 3, T: 200, Reps: 1000, Seed: 5, Workers: 4}
	if a.Key() != b.Key() || a.Key() == "" {
		t.Errorf("equivalent specs: %q and %q", a.Key(), b.Key())
	}
	want := "sim1|test=eg|case=c|n=3|t=200|lags=0|reps=1000|seed=5"
	if b.Key() != want {
		t.Errorf("key %q, want %q", b.Key(), want)
	}
	for _, c := range []Spec{{Seed: 6}, {T: 201}, {Reps: 1001}, {Lags: 1}, {N: 4}, {Case: "ct"}} {
		d := b
		if c.Seed != 0 {
			d.Seed = c.Seed
		}
		if c.T != 0 {
			d.T = c.T
		}
		if c.Reps != 0 {
			d.Reps = c.Reps
		}
		if c.Lags != 0 {
			d.Lags = c.Lags
		}
		if c.N != 0 {
			d.N = c.N
		}
		if c.Case != "" {
			d.Case = c.Case
		}
		if d.Key() == b.Key() {
			t.Errorf("%+v has the same key as %+v", d, b)
		}
	}
}

func TestCancelAndProgress(t *testing.T) {
	s := Spec{Test: ADF, Case: "c", N: 1, T: 50, Reps: 5000, Seed: 1, Workers: 2}
	last := 0
	calls := 0
	_, err := Run(context.Background(), s, func(done, total int) {
		calls++
		if done < last || total != 5000 {
			t.Errorf("progress %d/%d after %d", done, total, last)
		}
		last = done
	})
	if err != nil || last != 5000 || calls == 0 {
		t.Errorf("err %v, last progress %d after %d calls", err, last, calls)
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Run(ctx, s, nil); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled run: %v", err)
	}
}

// TestJohansenDim1ExactF checks the Johansen path against an exact finite
// sample distribution. In cases C and CT with one series and no lags, the
// drift limit makes R1 the trend τ (C) or τ² (CT) and R0 = ε, so
// ν = λ/(1−λ) satisfies (n−q)ν ~ F(1, n−q) exactly for Gaussian ε (the F
// test of one fixed regressor, q = 2 or 3 regressors in all), and
// trace = maxeig = n ln(1 + F/(n−q)). The reference quantiles are gonum's
// F distribution. 20,000 replications; tolerance 4·MCSE (8 comparisons,
// family-wise false-alarm rate below 0.1 % by Bonferroni).
func TestJohansenDim1ExactF(t *testing.T) {
	for _, tc := range []struct {
		c string
		q int
	}{{"c", 2}, {"ct", 3}} {
		s := Spec{Test: JohansenTrace, Case: tc.c, N: 1, T: 80, Reps: 20000, Seed: 3}
		r, err := Run(context.Background(), s, nil)
		if err != nil {
			t.Fatal(err)
		}
		n := float64(r.NObs)
		df2 := n - float64(tc.q)
		f := distuv.F{D1: 1, D2: df2}
		for i, l := range r.Levels {
			want := n * math.Log1p(f.Quantile(1-l)/df2)
			if d := math.Abs(r.Values[i] - want); d > 4*r.MCSE[i] {
				t.Errorf("case %s level %g: simulated %.4f (MCSE %.4f), exact %.4f", tc.c, l, r.Values[i], r.MCSE[i], want)
			}
		}
	}
}

// TestMCSECalibration checks the quantile standard errors against the
// spread of the quantile over 50 independent runs (seeds 1..50) of 2,000
// replications of the ADF τ (case c, T = 50). The standard deviation of
// 50 draws has a relative standard error of about 1/√98 ≈ 10 %, so the
// ratio of the empirical standard deviation to the mean MCSE must lie in
// [0.65, 1.5] (beyond about 3.5 standard errors on either side).
func TestMCSECalibration(t *testing.T) {
	const runs = 50
	vals := make([][]float64, len(Levels))
	ses := make([]float64, len(Levels))
	for seed := uint64(1); seed <= runs; seed++ {
		r, err := Run(context.Background(), Spec{Test: ADF, Case: "c", N: 1, T: 50, Reps: 2000, Seed: seed}, nil)
		if err != nil {
			t.Fatal(err)
		}
		for i := range Levels {
			vals[i] = append(vals[i], r.Values[i])
			ses[i] += r.MCSE[i] / runs
		}
	}
	for i, l := range Levels {
		var m, v float64
		for _, x := range vals[i] {
			m += x / runs
		}
		for _, x := range vals[i] {
			v += (x - m) * (x - m) / (runs - 1)
		}
		ratio := math.Sqrt(v) / ses[i]
		if ratio < 0.65 || ratio > 1.5 {
			t.Errorf("level %g: empirical sd %.4f, mean MCSE %.4f (ratio %.2f)", l, math.Sqrt(v), ses[i], ratio)
		}
	}
}

func TestPValue(t *testing.T) {
	r, err := Run(context.Background(), Spec{Test: ADF, Case: "c", N: 1, T: 50, Reps: 10000, Seed: 2}, nil)
	if err != nil {
		t.Fatal(err)
	}
	for i, l := range r.Levels {
		// The critical value interpolates between two order statistics,
		// so its p-value is the level to within 1/Reps.
		if p := r.PValue(r.Values[i]); math.Abs(p-l) > 1.0/10000+1e-12 {
			t.Errorf("level %g: p-value of the critical value %g", l, p)
		}
	}
	if p := r.PValue(math.Inf(-1)); p != 0 {
		t.Errorf("p(−∞) = %g", p)
	}
	if p := r.PValue(math.Inf(1)); p != 1 {
		t.Errorf("p(+∞) = %g", p)
	}
}
