package simulate

import (
	"context"
	"testing"
)

// BenchmarkEG100k runs 100,000 replications of the Engle–Granger τ at
// T = 200, N = 3, case c, no lags, on every core (the target in
// bench/README.md is under 10 s per run on the 2-core machine). Run with
//
//	go test -run '^$' -bench EG100k -benchtime 3x ./analysis/simulate/
func BenchmarkEG100k(b *testing.B) {
	s := Spec{Test: EG, Case: "c", N: 3, T: 200, Reps: 100_000, Seed: 1}
	for i := 0; i < b.N; i++ {
		if _, err := Run(context.Background(), s, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkEGReplication is one Engle–Granger replication on one core.
func BenchmarkEGReplication(b *testing.B) {
	k := newEGKernel(200, 0, 1, 3)
	r := testRand()
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		k.eg(r)
	}
}

// BenchmarkJohansenAsymptoticReplication is one replication of the
// table generator (T = 1000, dimensions 1..11, five cases).
func BenchmarkJohansenAsymptoticReplication(b *testing.B) {
	w := newAsymWorker(AsymptoticSpec{T: 1000, MaxDim: 11})
	r := testRand()
	out := make([]float64, w.width)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		w.rep(r, out)
	}
}
