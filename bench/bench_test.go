package bench

import (
	"os"
	"path/filepath"
	"testing"
)

// The benchmarks below are the figures in README.md. Run them with
//
//	go test -run '^$' -bench . -benchtime 20x ./bench/
//
// and take the best of several runs on a shared machine. Speed is never
// asserted in a test (docs/CONTRIBUTING.md); TestWorkloads only checks
// that every workload runs and gives a sane answer.

var data = Generate()

// BenchmarkADFAIC12: ADF with a constant, AIC over 0..12 lagged
// differences, T = 100,000 (target: at most 1/20 of statsmodels'
// adfuller on the same series; see compare.sh).
func BenchmarkADFAIC12(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := ADF(data); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkEngleGranger: N = 3 variables, T = 1,000, case c, AIC over
// 0..12 lags in the residual regression.
func BenchmarkEngleGranger(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := EngleGranger(data); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkJohansen6: six series, T = 10,000, case c, two lagged
// differences, statistics and critical values (target: under 20 ms).
func BenchmarkJohansen6(b *testing.B) {
	y := data.JohMatrix()
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := Johansen(y); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkECM: analysis/ecm.Estimate on T = 1,000 with one lag of Δy
// and Δx_t, Δx_{t−1}.
func BenchmarkECM(b *testing.B) {
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, err := ECM(data); err != nil {
			b.Fatal(err)
		}
	}
}

// demoCopy copies examples/gridlink into a temporary folder.
func demoCopy(tb testing.TB) string {
	tb.Helper()
	p, err := CopyDemo(filepath.Join("..", "examples", "gridlink"), tb.TempDir())
	if err != nil {
		tb.Fatal(err)
	}
	return p
}

// BenchmarkDemoCold: a full build of the demo paper with an empty result
// cache (every directive runs and its result is stored), as a first
// `galley build` (target: under 300 ms).
func BenchmarkDemoCold(b *testing.B) {
	p := demoCopy(b)
	cache := filepath.Join(filepath.Dir(p), ".galley-cache")
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		b.StopTimer()
		os.RemoveAll(cache)
		b.StartTimer()
		if _, _, err := Build(p, true); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkDemoNoCache: the same build without the cache (--no-cache):
// no cache entries are read or written.
func BenchmarkDemoNoCache(b *testing.B) {
	p := demoCopy(b)
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		if _, _, err := Build(p, false); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkDemoWarm: rebuilds of the demo paper from the cache after one
// build (target: under 50 ms).
func BenchmarkDemoWarm(b *testing.B) {
	p := demoCopy(b)
	if _, _, err := Build(p, true); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		doc, _, err := Build(p, true)
		if err != nil {
			b.Fatal(err)
		}
		if ran := doc.Ran(); len(ran) != 0 {
			b.Fatalf("%d directives ran on a warm rebuild: %v", len(ran), ran)
		}
	}
}
